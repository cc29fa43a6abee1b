// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/accumulation.hpp"

#include "catchpeak/terrain/flow_direction.hpp"

#include <algorithm>
#include <array>

namespace catchpeak::terrain {

namespace {

/// Walks the cells in topological order: visit(i, downstream) is called for each cell after
/// all cells draining into it; `downstream` is the downstream cell on the grid or no_cell.
template <typename Visit> void topological_walk(const Grid<std::uint8_t> &dirs, Visit visit) {
    const std::size_t n = dirs.size();
    constexpr std::uint8_t done = 0x80;
    // In-degree of each cell (0..8), then `done` once visited.
    std::vector<std::uint8_t> indegree(n, 0);
    for (std::size_t i = 0; i < n; ++i) {
        const std::size_t d = downstream_cell(dirs, i);
        if (d != no_cell) {
            ++indegree[d];
        }
    }
    for (std::size_t start = 0; start < n; ++start) {
        if (indegree[start] != 0) {
            continue;
        }
        std::size_t i = start;
        while (true) {
            indegree[i] = done;
            const std::size_t d = downstream_cell(dirs, i);
            visit(i, d);
            if (d == no_cell || indegree[d] == done) {
                break;
            }
            if (--indegree[d] != 0) {
                break;
            }
            i = d;
        }
    }
}

} // namespace

Grid<std::uint32_t> flow_accumulation(const Grid<std::uint8_t> &dirs) {
    Grid<std::uint32_t> acc(dirs.width(), dirs.height(), 0);
    acc.copy_georef_from(dirs);
    topological_walk(dirs, [&](std::size_t i, std::size_t d) {
        if (dirs[i] == d8::none) {
            return;
        }
        acc[i] += 1;
        if (d != no_cell && dirs[d] != d8::none) {
            acc[d] += acc[i];
        }
    });
    return acc;
}

AccumulationAndLength accumulation_and_length(const Grid<std::uint8_t> &dirs) {
    AccumulationAndLength out;
    out.accumulation = Grid<std::uint32_t>(dirs.width(), dirs.height(), 0);
    out.accumulation.copy_georef_from(dirs);
    out.upstream_length_m = Grid<float>(dirs.width(), dirs.height(), 0.0F);
    out.upstream_length_m.copy_georef_from(dirs);
    auto &acc = out.accumulation;
    auto &len = out.upstream_length_m;
    const double dx = dirs.transform.cell_dx();
    const double dy = dirs.transform.cell_dy();
    std::array<float, 9> step{};
    for (std::uint8_t k = 1; k <= 8; ++k) {
        step[k] = static_cast<float>(step_length_m(k, dx, dy));
    }
    topological_walk(dirs, [&](std::size_t i, std::size_t d) {
        const std::uint8_t k = dirs[i];
        if (k == d8::none) {
            return;
        }
        acc[i] += 1;
        if (d != no_cell && dirs[d] != d8::none) {
            acc[d] += acc[i];
            len[d] = std::max(len[d], len[i] + step[k]);
        }
    });
    return out;
}

} // namespace catchpeak::terrain
