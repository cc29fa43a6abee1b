// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/grid.hpp"

#include <cstddef>
#include <cstdint>
#include <vector>

/// Catchments of all design points in one pass.
namespace catchpeak::terrain {

/// Local catchments and the tree of outlets.
///
/// `labels` holds, for every cell, the outlet (1-based) of the nearest design point downstream
/// of it (the outlet cell included), 0 where no outlet lies downstream (and on nodata). The
/// cells labelled k form outlet k's local catchment; its total catchment is its own local part
/// plus the local parts of all outlets upstream of it (the subtree rooted at k).
struct Catchments {
    Grid<std::uint32_t> labels;
    /// Per outlet (index k-1 for label k): the label of the next outlet downstream, 0 if none.
    std::vector<std::uint32_t> downstream_label;
    /// Per outlet: cells labelled with it (local catchment).
    std::vector<std::uint64_t> local_cells;
    /// Per outlet: cells of the total catchment (local + all upstream locals).
    std::vector<std::uint64_t> total_cells;
    /// Per outlet: labels of the outlets directly upstream (children in the tree), ascending.
    std::vector<std::vector<std::uint32_t>> upstream_labels;
};

/// How delineate_catchments finds the cells of each outlet; both give the same result.
enum class CatchmentSearch {
    /// Every cell's path is followed downstream once and labelled on the way back: a bounded
    /// number of visits per cell of the raster. Best when the catchments cover much of it.
    every_cell,
    /// Each outlet's catchment is searched upstream: only the cells draining to an outlet are
    /// visited, but each costs more. Best when the catchments are a small part of the raster.
    from_outlets,
};

/// Labels all cells with the nearest downstream outlet. `outlets` are cell indices of distinct
/// cells (outlet k is outlets[k-1]); throws InternalError on a repeated cell or one without a
/// direction. The walk from every cell runs on up to `threads` threads (0: all cores); the result
/// does not depend on the thread count.
[[nodiscard]] Catchments delineate_catchments(const Grid<std::uint8_t> &dirs,
                                              const std::vector<std::size_t> &outlets,
                                              CatchmentSearch how = CatchmentSearch::every_cell,
                                              unsigned threads = 1);

/// All labels of the total catchment of `label` (itself first, then upstream, breadth first).
[[nodiscard]] std::vector<std::uint32_t> total_catchment_labels(const Catchments &c,
                                                                std::uint32_t label);

} // namespace catchpeak::terrain
