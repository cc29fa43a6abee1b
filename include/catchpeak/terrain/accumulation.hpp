// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/grid.hpp"

#include <cstdint>

/// Flow accumulation and upstream flow length on D8 directions, in O(n): cells are taken in
/// topological order (a cell after all cells that drain into it) by counting in-degrees and
/// following each chain downstream as soon as a cell has received all its inflow.
namespace catchpeak::terrain {

/// Number of cells draining through each cell, the cell itself included (so at least 1 on a
/// valid cell; 0 on cells without direction). Multiply by transform.cell_area() for m2.
[[nodiscard]] Grid<std::uint32_t> flow_accumulation(const Grid<std::uint8_t> &dirs);

struct AccumulationAndLength {
    Grid<std::uint32_t> accumulation;
    /// Longest D8 flow length from any upstream cell centre to this cell's centre, metres (0 on
    /// a cell nothing drains into).
    Grid<float> upstream_length_m;
    /// Direction code from each cell to its upstream neighbour on the longest path (the one
    /// maximising its upstream length + step; ties: the lowest code), d8::none where nothing
    /// drains in. Tracing these codes from an outlet gives its longest flow path.
    Grid<std::uint8_t> longest_upstream;
};

/// Both in one pass.
[[nodiscard]] AccumulationAndLength accumulation_and_length(const Grid<std::uint8_t> &dirs);

} // namespace catchpeak::terrain
