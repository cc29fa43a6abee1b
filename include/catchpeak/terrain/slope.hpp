// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/grid.hpp"

#include <cstddef>
#include <cstdint>
#include <vector>

/// Cell slope by Horn (1981), the 3x3 weighted finite difference:
///   dz/dx = ((c + 2f + i) - (a + 2d + g)) / (8 dx),  dz/dy = ((g + 2h + i) - (a + 2b + c)) / (8
///   dy)
/// with a b c / d e f / g h i the 3x3 window, slope = sqrt(dz/dx^2 + dz/dy^2) in m/m.
/// A neighbour that is off the raster or nodata takes the centre cell's elevation (so edge
/// cells have a slope too); nodata cells have none.
namespace catchpeak::terrain {

/// Horn slope of one cell, m/m. The cell must be valid.
[[nodiscard]] double horn_slope(const Grid<float> &dem, std::size_t col, std::size_t row);

/// Horn slope grid, m/m (NaN on nodata). Row blocks on `threads` threads (0 = all cores).
[[nodiscard]] Grid<float> horn_slope_grid(const Grid<float> &dem, unsigned threads = 0);

/// Sum and count of the Horn slope of the cells of each label (index k for label k; index 0 is
/// the unlabelled cells). Sums are accumulated in fixed point (2^-24 m/m) so that the result
/// is the same whatever the thread count and block order.
struct SlopeSums {
    std::vector<double> sum_m_per_m;
    std::vector<std::uint64_t> count;
};
[[nodiscard]] SlopeSums slope_sums_by_label(const Grid<float> &dem,
                                            const Grid<std::uint32_t> &labels,
                                            std::uint32_t max_label, unsigned threads = 0);

} // namespace catchpeak::terrain
