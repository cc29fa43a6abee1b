// SPDX-License-Identifier: MIT
// Synthetic DEMs and checks shared by the terrain tests.
#pragma once

#include "catchpeak/core/grid.hpp"
#include "catchpeak/terrain/flow_direction.hpp"

#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <random>

namespace catchpeak::test {

inline constexpr float nodata_value = -9999.0F;

/// A georeferenced grid of `w` x `h` cells of dx x dy metres, origin (1000, 5000).
inline Grid<float> blank_dem(std::size_t w, std::size_t h, double dx = 10.0, double dy = 10.0) {
    Grid<float> g(w, h, 0.0F);
    g.transform = GeoTransform{1000.0, dx, 0.0, 5000.0, 0.0, -dy};
    g.nodata = nodata_value;
    return g;
}

/// Random DEM with pits, flats (values rounded to whole metres over a trend) and nodata holes.
inline Grid<float> random_dem(std::size_t w, std::size_t h, unsigned seed,
                              bool with_nodata = true) {
    std::mt19937 rng(seed);
    Grid<float> g = blank_dem(w, h);
    for (std::size_t r = 0; r < h; ++r) {
        for (std::size_t c = 0; c < w; ++c) {
            const double trend = 0.2 * static_cast<double>(r) + 0.1 * static_cast<double>(c);
            const double noise = static_cast<double>(rng() % 1000U) / 1000.0 * 4.0;
            // Rounding to whole metres makes plateaus (flats) and closed pits.
            g(c, r) = static_cast<float>(std::floor(trend + noise));
        }
    }
    if (with_nodata) {
        // A few rectangular holes of nodata.
        for (int k = 0; k < 3; ++k) {
            const std::size_t c0 = rng() % w;
            const std::size_t r0 = rng() % h;
            for (std::size_t r = r0; r < std::min(h, r0 + 4); ++r) {
                for (std::size_t c = c0; c < std::min(w, c0 + 3); ++c) {
                    g(c, r) = nodata_value;
                }
            }
        }
    }
    return g;
}

/// Follows the directions from cell i; returns the last cell of the path (whose downstream is
/// off the raster or a cell without direction), or no_cell if the path does not end within
/// the number of cells (a cycle) or meets a valid cell without direction.
inline std::size_t path_end(const Grid<std::uint8_t> &dirs, std::size_t i) {
    for (std::size_t steps = 0; steps <= dirs.size(); ++steps) {
        if (dirs[i] == terrain::d8::none) {
            return terrain::no_cell;
        }
        const std::size_t d = terrain::downstream_cell(dirs, i);
        if (d == terrain::no_cell || dirs[d] == terrain::d8::none) {
            return i;
        }
        i = d;
    }
    return terrain::no_cell;
}

} // namespace catchpeak::test
