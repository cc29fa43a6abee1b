// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/streams.hpp"

#include "catchpeak/terrain/flow_direction.hpp"

#include <algorithm>
#include <cmath>

namespace catchpeak::terrain {

namespace {

/// Takes the stream segments (sorted by first cell, each ending at a junction, the raster's
/// edge or a cell below the threshold); gives each its Strahler order, segments taken in
/// topological order via the junction links.
void set_strahler_orders(std::vector<Stream> &streams) {
    const std::size_t count = streams.size();
    const auto find_start = [&](std::size_t cell) {
        const auto it =
            std::lower_bound(streams.begin(), streams.end(), cell,
                             [](const Stream &s, std::size_t c) { return s.first_cell < c; });
        return (it != streams.end() && it->first_cell == cell)
                   ? static_cast<std::size_t>(it - streams.begin())
                   : count;
    };
    std::vector<std::size_t> down(count, count);
    std::vector<int> pending(count, 0);
    std::vector<int> max_in(count, 0);
    std::vector<int> max_in_count(count, 0);
    for (std::size_t k = 0; k < count; ++k) {
        if (streams[k].last_cell != streams[k].first_cell) {
            down[k] = find_start(streams[k].last_cell);
        }
        if (down[k] != count) {
            ++pending[down[k]];
        }
    }
    for (std::size_t k = 0; k < count; ++k) {
        if (pending[k] != 0) {
            continue;
        }
        std::size_t j = k;
        while (true) {
            pending[j] = -1;
            streams[j].strahler_order =
                max_in[j] == 0 ? 1 : (max_in_count[j] >= 2 ? max_in[j] + 1 : max_in[j]);
            const std::size_t d = down[j];
            if (d == count) {
                break;
            }
            if (streams[j].strahler_order > max_in[d]) {
                max_in[d] = streams[j].strahler_order;
                max_in_count[d] = 1;
            } else if (streams[j].strahler_order == max_in[d]) {
                ++max_in_count[d];
            }
            if (--pending[d] != 0) {
                break;
            }
            j = d;
        }
    }
}

} // namespace

std::vector<Stream> extract_streams(const Grid<std::uint8_t> &dirs, const Grid<std::uint32_t> &acc,
                                    double threshold_m2) {
    std::vector<Stream> streams;
    const std::size_t w = dirs.width();
    const double cell_area = dirs.transform.cell_area();
    const double dx = dirs.transform.cell_dx();
    const double dy = dirs.transform.cell_dy();
    // Smallest accumulation (cells) that makes a stream; at least 1.
    const double need = std::ceil(threshold_m2 / cell_area - 1e-9);
    const std::uint32_t min_cells =
        need <= 1.0 ? 1U : (need >= 4294967295.0 ? 4294967295U : static_cast<std::uint32_t>(need));
    const auto is_stream = [&](std::size_t i) { return acc[i] >= min_cells; };
    const auto upstream_streams = [&](std::size_t i) {
        int count = 0;
        const long long c = static_cast<long long>(i % w);
        const long long r = static_cast<long long>(i / w);
        for (std::uint8_t k = 1; k <= 8; ++k) {
            const long long nc = c + d8::dcol[k];
            const long long nr = r + d8::drow[k];
            if (!dirs.in_bounds(nc, nr)) {
                continue;
            }
            const std::size_t n = static_cast<std::size_t>(nr) * w + static_cast<std::size_t>(nc);
            if (dirs[n] == d8::opposite[k] && is_stream(n)) {
                ++count;
            }
        }
        return count;
    };
    for (std::size_t i = 0; i < dirs.size(); ++i) {
        if (!is_stream(i) || upstream_streams(i) == 1) {
            continue;
        }
        Stream s;
        s.first_cell = i;
        std::size_t cur = i;
        s.vertices_xy.push_back(dirs.transform.cell_centre(cur % w, cur / w));
        while (true) {
            const std::size_t d = downstream_cell(dirs, cur);
            if (d == no_cell || dirs[d] == d8::none || !is_stream(d)) {
                break;
            }
            s.length_m += step_length_m(dirs[cur], dx, dy);
            s.vertices_xy.push_back(dirs.transform.cell_centre(d % w, d / w));
            cur = d;
            if (upstream_streams(d) != 1) {
                break; // a junction: the next segment starts here
            }
        }
        s.last_cell = cur;
        s.accumulation_end = acc[cur];
        s.accumulation_end_m2 = static_cast<double>(acc[cur]) * cell_area;
        streams.push_back(std::move(s));
    }
    set_strahler_orders(streams);
    return streams;
}

} // namespace catchpeak::terrain
