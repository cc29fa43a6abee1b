// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/conditioning.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/terrain/flow_direction.hpp"
#include "internal.hpp"

#include <algorithm>
#include <cmath>
#include <functional>
#include <limits>
#include <queue>

namespace catchpeak::terrain {

namespace {

constexpr std::uint8_t closed_flag = 1;

/// Index of the neighbour k of cell (c, r), or no_cell when off the grid.
inline std::size_t neighbour(std::size_t w, std::size_t h, std::size_t c, std::size_t r,
                             std::uint8_t k) noexcept {
    const long long nc = static_cast<long long>(c) + d8::dcol[k];
    const long long nr = static_cast<long long>(r) + d8::drow[k];
    if (nc < 0 || nr < 0 || static_cast<std::size_t>(nc) >= w ||
        static_cast<std::size_t>(nr) >= h) {
        return no_cell;
    }
    return static_cast<std::size_t>(nr) * w + static_cast<std::size_t>(nc);
}

struct QueueItem {
    float z;
    std::size_t i;
};
struct HigherFirst {
    bool operator()(const QueueItem &a, const QueueItem &b) const noexcept {
        return a.z > b.z || (a.z == b.z && a.i > b.i);
    }
};

} // namespace

std::vector<std::size_t> rasterize_polyline(const GeoTransform &transform, std::size_t width,
                                            std::size_t height,
                                            const std::vector<std::pair<double, double>> &xy) {
    std::vector<std::size_t> cells;
    if (xy.empty() || width == 0 || height == 0) {
        return cells;
    }
    const auto to_cell = [&](double x, double y) {
        return std::pair<double, double>{(x - transform.origin_x) / transform.pixel_width,
                                         (y - transform.origin_y) / transform.pixel_height};
    };
    const auto add = [&](double fc, double fr) {
        const double c = std::floor(fc);
        const double r = std::floor(fr);
        if (c < 0.0 || r < 0.0 || c >= static_cast<double>(width) ||
            r >= static_cast<double>(height)) {
            return;
        }
        const std::size_t i = static_cast<std::size_t>(r) * width + static_cast<std::size_t>(c);
        if (cells.empty() || cells.back() != i) {
            cells.push_back(i);
        }
    };
    auto [c0, r0] = to_cell(xy.front().first, xy.front().second);
    add(c0, r0);
    for (std::size_t v = 1; v < xy.size(); ++v) {
        const auto [c1, r1] = to_cell(xy[v].first, xy[v].second);
        // Samples at most half a cell apart in each axis, so consecutive cells are neighbours.
        const double span = std::max(std::abs(c1 - c0), std::abs(r1 - r0));
        const auto steps = static_cast<std::size_t>(std::ceil(span * 2.0)) + 1;
        for (std::size_t s = 1; s <= steps; ++s) {
            const double t = static_cast<double>(s) / static_cast<double>(steps);
            add(c0 + (c1 - c0) * t, r0 + (r1 - r0) * t);
        }
        c0 = c1;
        r0 = r1;
    }
    return cells;
}

void apply_breach_lines(Grid<float> &dem, const std::vector<BreachLine> &lines) {
    const detail::ValidTest valid(dem);
    for (const auto &line : lines) {
        auto cells = rasterize_polyline(dem.transform, dem.width(), dem.height(), line.vertices_xy);
        // Drop nodata cells; the walk continues past them.
        std::erase_if(cells, [&](std::size_t i) { return !valid(dem[i]); });
        if (cells.size() < 2) {
            continue;
        }
        if (dem[cells.back()] > dem[cells.front()]) {
            std::reverse(cells.begin(), cells.end());
        }
        float level = dem[cells.front()];
        for (const std::size_t i : cells) {
            level = std::min(level, dem[i]);
            dem[i] = level;
        }
    }
}

void fill_depressions(Grid<float> &dem) {
    Grid<std::uint8_t> marks(dem.width(), dem.height(), 0);
    fill_depressions(dem, marks);
}

void fill_depressions(Grid<float> &dem, Grid<std::uint8_t> &marks) {
    const std::size_t w = dem.width();
    const std::size_t h = dem.height();
    if (marks.width() != w || marks.height() != h) {
        throw InternalError("fill_depressions: scratch grid size differs from the DEM");
    }
    std::fill(marks.cells().begin(), marks.cells().end(), std::uint8_t{0});
    const detail::ValidTest valid(dem);
    std::priority_queue<QueueItem, std::vector<QueueItem>, HigherFirst> open;
    std::vector<std::size_t> pit; // plain FIFO for cells inside depressions
    std::size_t pit_head = 0;

    // Seeds: valid cells on the raster edge or next to a nodata cell.
    for (std::size_t r = 0; r < h; ++r) {
        for (std::size_t c = 0; c < w; ++c) {
            const std::size_t i = r * w + c;
            if (!valid(dem[i])) {
                continue;
            }
            bool edge = (r == 0 || c == 0 || r + 1 == h || c + 1 == w);
            for (std::uint8_t k = 1; k <= 8 && !edge; ++k) {
                const std::size_t n = neighbour(w, h, c, r, k);
                edge = (n == no_cell || !valid(dem[n]));
            }
            if (edge) {
                marks[i] = closed_flag;
                open.push({dem[i], i});
            }
        }
    }
    while (true) {
        std::size_t i = 0;
        if (pit_head < pit.size()) {
            i = pit[pit_head++];
            if (pit_head == pit.size()) {
                pit.clear();
                pit_head = 0;
            }
        } else if (!open.empty()) {
            i = open.top().i;
            open.pop();
        } else {
            break;
        }
        const std::size_t c = i % w;
        const std::size_t r = i / w;
        const float z = dem[i];
        for (std::uint8_t k = 1; k <= 8; ++k) {
            const std::size_t n = neighbour(w, h, c, r, k);
            if (n == no_cell || marks[n] != 0 || !valid(dem[n])) {
                continue;
            }
            marks[n] = closed_flag;
            if (dem[n] <= z) {
                dem[n] = z;
                pit.push_back(n);
            } else {
                open.push({dem[n], n});
            }
        }
    }
}

void resolve_flats(const Grid<float> &dem, Grid<std::uint8_t> &dirs) {
    const std::size_t w = dem.width();
    const std::size_t h = dem.height();
    const detail::ValidTest valid(dem);
    constexpr std::uint8_t flat_flag = 0x40; // a flat cell (set while resolving)
    constexpr std::uint8_t code_mask = 0x0F;

    // Flat cells: valid, no direction. High edges: flat cells next to higher terrain.
    std::vector<std::size_t> frontier;
    bool any_flat = false;
    for (std::size_t i = 0; i < dem.size(); ++i) {
        if (dirs[i] == d8::none && valid(dem[i])) {
            dirs[i] = flat_flag;
            any_flat = true;
        }
    }
    if (!any_flat) {
        return;
    }
    Grid<std::int32_t> mask(w, h, 0);
    for (std::size_t i = 0; i < dem.size(); ++i) {
        if (dirs[i] != flat_flag) {
            continue;
        }
        const std::size_t c = i % w;
        const std::size_t r = i / w;
        for (std::uint8_t k = 1; k <= 8; ++k) {
            const std::size_t n = neighbour(w, h, c, r, k);
            if (n != no_cell && valid(dem[n]) && dem[n] > dem[i]) {
                frontier.push_back(i);
                mask[i] = 1;
                break;
            }
        }
    }
    // Gradient away from higher terrain: BFS distance from the high edges (1 at the edge),
    // within each flat (equal elevation, flat cells). 0 where a flat has no higher edge.
    std::vector<std::size_t> next;
    while (!frontier.empty()) {
        next.clear();
        for (const std::size_t i : frontier) {
            const std::size_t c = i % w;
            const std::size_t r = i / w;
            for (std::uint8_t k = 1; k <= 8; ++k) {
                const std::size_t n = neighbour(w, h, c, r, k);
                if (n != no_cell && dirs[n] == flat_flag && mask[n] == 0 && dem[n] == dem[i]) {
                    mask[n] = mask[i] + 1;
                    next.push_back(n);
                }
            }
        }
        frontier.swap(next);
    }
    // Gradient toward lower terrain: BFS distance t from the low edges (cells with a direction
    // next to a flat cell of the same elevation). Combined value 2 t - away; the constant
    // "highest away value of the flat" of Barnes et al. cancels when cells of one flat are
    // compared, so it is left out.
    constexpr std::uint8_t visited_flag = 0x20;
    frontier.clear();
    for (std::size_t i = 0; i < dem.size(); ++i) {
        if (dirs[i] == d8::none || (dirs[i] & flat_flag) != 0) {
            continue;
        }
        const std::size_t c = i % w;
        const std::size_t r = i / w;
        for (std::uint8_t k = 1; k <= 8; ++k) {
            const std::size_t n = neighbour(w, h, c, r, k);
            if (n != no_cell && dirs[n] == flat_flag && dem[n] == dem[i]) {
                frontier.push_back(i);
                break;
            }
        }
    }
    std::int32_t t = 0;
    while (!frontier.empty()) {
        ++t;
        next.clear();
        for (const std::size_t i : frontier) {
            const std::size_t c = i % w;
            const std::size_t r = i / w;
            for (std::uint8_t k = 1; k <= 8; ++k) {
                const std::size_t n = neighbour(w, h, c, r, k);
                if (n != no_cell && dirs[n] == flat_flag && dem[n] == dem[i]) {
                    dirs[n] = flat_flag | visited_flag;
                    mask[n] = 2 * t - mask[n];
                    next.push_back(n);
                }
            }
        }
        frontier.swap(next);
    }
    // Directions of flat cells: to a low edge when one is adjacent, otherwise to the flat
    // neighbour of smallest combined value below the cell's own.
    std::vector<std::uint8_t> chosen_codes;
    for (std::size_t i = 0; i < dem.size(); ++i) {
        if ((dirs[i] & flat_flag) == 0) {
            continue;
        }
        if ((dirs[i] & visited_flag) == 0) {
            throw InternalError("resolve_flats: a flat has no outlet (was the DEM filled?)");
        }
        const std::size_t c = i % w;
        const std::size_t r = i / w;
        std::uint8_t low_edge = d8::none;
        std::uint8_t best = d8::none;
        std::int32_t best_mask = mask[i];
        for (std::uint8_t k = 1; k <= 8; ++k) {
            const std::size_t n = neighbour(w, h, c, r, k);
            if (n == no_cell || dem[n] != dem[i]) {
                continue;
            }
            if ((dirs[n] & flat_flag) == 0) {
                if (dirs[n] != d8::none && low_edge == d8::none) {
                    low_edge = k;
                }
            } else if (mask[n] < best_mask) {
                best_mask = mask[n];
                best = k;
            }
        }
        const std::uint8_t code = low_edge != d8::none ? low_edge : best;
        if (code == d8::none) {
            throw InternalError("resolve_flats: no lower neighbour on a flat gradient");
        }
        dirs[i] = static_cast<std::uint8_t>(flat_flag | visited_flag | code);
    }
    for (auto &d : dirs.cells()) {
        d = static_cast<std::uint8_t>(d & code_mask);
    }
}

Grid<std::uint8_t> conditioned_directions(const Grid<float> &dem,
                                          const std::vector<BreachLine> &lines, unsigned threads) {
    Grid<float> work(dem.width(), dem.height());
    work.copy_georef_from(dem);
    const detail::ValidTest valid(dem);
    constexpr float nan = std::numeric_limits<float>::quiet_NaN();
    for (std::size_t i = 0; i < dem.size(); ++i) {
        work[i] = valid(dem[i]) ? dem[i] : nan;
    }
    apply_breach_lines(work, lines);
    Grid<std::uint8_t> dirs(dem.width(), dem.height(), 0);
    dirs.copy_georef_from(dem);
    fill_depressions(work, dirs);
    detail::d8_directions_into(work, dirs, threads);
    resolve_flats(work, dirs);
    return dirs;
}

} // namespace catchpeak::terrain
