// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/flow_path.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/terrain/flow_direction.hpp"

#include <algorithm>
#include <array>

namespace catchpeak::terrain {

namespace {

double interpolate(const std::vector<double> &d, const std::vector<double> &z, double at) {
    // d ascending.
    if (at <= d.front()) {
        return z.front();
    }
    if (at >= d.back()) {
        return z.back();
    }
    const auto it = std::upper_bound(d.begin(), d.end(), at);
    const auto hi = static_cast<std::size_t>(it - d.begin());
    const std::size_t lo = hi - 1;
    const double span = d[hi] - d[lo];
    if (span <= 0.0) {
        return z[lo];
    }
    return z[lo] + (z[hi] - z[lo]) * (at - d[lo]) / span;
}

} // namespace

Slope1085 slope_10_85(const std::vector<double> &distance_from_outlet_m,
                      const std::vector<double> &elevation_m) {
    Slope1085 out;
    if (distance_from_outlet_m.empty() || distance_from_outlet_m.size() != elevation_m.size()) {
        return out;
    }
    const double length = distance_from_outlet_m.back();
    out.elevation_10_m = interpolate(distance_from_outlet_m, elevation_m, 0.10 * length);
    out.elevation_85_m = interpolate(distance_from_outlet_m, elevation_m, 0.85 * length);
    if (length > 0.0) {
        out.slope_m_per_m = (out.elevation_85_m - out.elevation_10_m) / (0.75 * length);
    }
    return out;
}

namespace {

/// Builds the FlowPath from its cells, listed from the outlet up to the top.
FlowPath finish_path(const Grid<std::uint8_t> &dirs, const Grid<float> &dem,
                     std::vector<std::size_t> cells) {
    const std::size_t w = dirs.width();
    const double dx = dirs.transform.cell_dx();
    const double dy = dirs.transform.cell_dy();
    FlowPath path;
    std::array<double, 9> step{};
    for (std::uint8_t k = 1; k <= 8; ++k) {
        step[k] = step_length_m(k, dx, dy);
    }
    // cells runs outlet -> top here.
    std::vector<double> dist(cells.size(), 0.0);
    std::vector<double> z(cells.size(), 0.0);
    for (std::size_t k = 0; k < cells.size(); ++k) {
        if (k > 0) {
            dist[k] = dist[k - 1] + step[dirs[cells[k]]];
        }
        z[k] = static_cast<double>(dem[cells[k]]);
    }
    path.length_m = dist.back();
    path.elevation_outlet_m = z.front();
    path.elevation_top_m = z.back();
    if (path.length_m > 0.0) {
        path.slope_m_per_m = (path.elevation_top_m - path.elevation_outlet_m) / path.length_m;
    }
    const Slope1085 s = slope_10_85(dist, z);
    path.slope_10_85_m_per_m = s.slope_m_per_m;
    path.elevation_10_m = s.elevation_10_m;
    path.elevation_85_m = s.elevation_85_m;
    std::reverse(cells.begin(), cells.end());
    // Keep the first and last cell and those where the D8 direction changes: the cells left
    // out lie on straight runs between kept ones, so the polyline is the same.
    std::vector<std::size_t> kept;
    for (std::size_t k = 0; k < cells.size(); ++k) {
        if (k == 0 || k + 1 == cells.size() || dirs[cells[k]] != dirs[cells[k - 1]]) {
            kept.push_back(cells[k]);
        }
    }
    path.cell_count = cells.size();
    path.vertices_xy.reserve(kept.size());
    for (const std::size_t i : kept) {
        path.vertices_xy.push_back(dirs.transform.cell_centre(i % w, i / w));
    }
    path.cells = std::move(kept);
    return path;
}

} // namespace

FlowPath longest_flow_path(const Grid<std::uint8_t> &dirs, const Grid<float> &len,
                           const Grid<float> &dem, std::size_t outlet) {
    const std::size_t w = dirs.width();
    const double dx = dirs.transform.cell_dx();
    const double dy = dirs.transform.cell_dy();
    std::array<float, 9> step{};
    for (std::uint8_t k = 1; k <= 8; ++k) {
        step[k] = static_cast<float>(step_length_m(k, dx, dy));
    }
    if (outlet >= dirs.size() || dirs[outlet] == d8::none) {
        throw InternalError("longest_flow_path: outlet is not a valid cell");
    }
    std::vector<std::size_t> cells{outlet};
    std::size_t cur = outlet;
    while (true) {
        const long long c = static_cast<long long>(cur % w);
        const long long r = static_cast<long long>(cur / w);
        std::size_t best = no_cell;
        float best_len = -1.0F;
        for (std::uint8_t k = 1; k <= 8; ++k) {
            const long long nc = c + d8::dcol[k];
            const long long nr = r + d8::drow[k];
            if (!dirs.in_bounds(nc, nr)) {
                continue;
            }
            const std::size_t n = static_cast<std::size_t>(nr) * w + static_cast<std::size_t>(nc);
            if (dirs[n] != d8::opposite[k]) {
                continue;
            }
            const float cand = len[n] + step[dirs[n]];
            if (cand > best_len) {
                best_len = cand;
                best = n;
            }
        }
        if (best == no_cell) {
            break;
        }
        cells.push_back(best);
        cur = best;
        if (cells.size() > dirs.size()) {
            throw InternalError("longest_flow_path: the directions contain a cycle");
        }
    }
    return finish_path(dirs, dem, std::move(cells));
}

FlowPath longest_flow_path(const Grid<std::uint8_t> &dirs,
                           const Grid<std::uint8_t> &longest_upstream, const Grid<float> &dem,
                           std::size_t outlet) {
    if (outlet >= dirs.size() || dirs[outlet] == d8::none) {
        throw InternalError("longest_flow_path: outlet is not a valid cell");
    }
    const std::size_t w = dirs.width();
    std::vector<std::size_t> cells{outlet};
    std::size_t cur = outlet;
    // Column and row tracked along the path, not divided out for each step.
    std::size_t row = outlet / w;
    std::size_t col = outlet - row * w;
    while (longest_upstream[cur] != d8::none) {
        const std::uint8_t k = longest_upstream[cur];
        col = static_cast<std::size_t>(static_cast<long long>(col) + d8::dcol[k]);
        row = static_cast<std::size_t>(static_cast<long long>(row) + d8::drow[k]);
        cur = row * w + col;
        cells.push_back(cur);
        if (cells.size() > dirs.size()) {
            throw InternalError("longest_flow_path: the directions contain a cycle");
        }
    }
    return finish_path(dirs, dem, std::move(cells));
}

} // namespace catchpeak::terrain
