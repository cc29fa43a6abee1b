// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/grid.hpp"

#include <cstddef>
#include <cstdint>
#include <utility>
#include <vector>

namespace catchpeak::terrain {

/// A stream segment from a source or a junction to the next junction or outlet. Its last
/// vertex is the junction (or outlet) cell, so segments meet.
struct Stream {
    std::vector<std::pair<double, double>> vertices_xy; ///< cell centres, upstream to downstream
    std::size_t first_cell = 0;
    std::size_t last_cell = 0;
    std::uint32_t accumulation_end = 0; ///< cells draining through the last cell
    double accumulation_end_m2 = 0.0;
    int strahler_order = 1; ///< Strahler (1957) stream order
    double length_m = 0.0;  ///< sum of D8 step lengths
};

/// Stream cells are those with accumulation x cell area >= threshold_m2. Segments are listed
/// in ascending order of their first cell index.
[[nodiscard]] std::vector<Stream> extract_streams(const Grid<std::uint8_t> &dirs,
                                                  const Grid<std::uint32_t> &accumulation,
                                                  double threshold_m2);

} // namespace catchpeak::terrain
