// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/grid.hpp"

#include <cstddef>
#include <cstdint>
#include <utility>
#include <vector>

namespace catchpeak::terrain {

/// The longest flow path of a (total) catchment and its slopes.
struct FlowPath {
    /// Cell centres (CRS metres) from the remotest cell to the outlet. Only the first and last
    /// cell and the cells where the D8 direction turns are listed: the cells between lie on the
    /// straight runs, so the line is the same and large grids need less memory.
    std::vector<std::pair<double, double>> vertices_xy;
    std::vector<std::size_t> cells;  ///< the same vertices, as cell indices
    std::size_t cell_count = 0;      ///< number of cells on the path (all of them)
    double length_m = 0.0;           ///< sum of the D8 step lengths
    double elevation_top_m = 0.0;    ///< unconditioned DEM at the remotest cell
    double elevation_outlet_m = 0.0; ///< unconditioned DEM at the outlet
    /// (elevation_top - elevation_outlet) / length, m/m; 0 when the length is 0.
    double slope_m_per_m = 0.0;
    /// Slope between the points at 10 % and 85 % of the length measured from the outlet (USGS
    /// practice), elevations interpolated linearly between cell centres along the path, m/m;
    /// 0 when the length is 0.
    double slope_10_85_m_per_m = 0.0;
    double elevation_10_m = 0.0; ///< at 10 % of the length from the outlet
    double elevation_85_m = 0.0; ///< at 85 % of the length from the outlet
};

/// Traces the longest flow path to `outlet` back upstream on `upstream_length_m` (from
/// `accumulation_and_length`): at each cell, the upstream neighbour u maximising
/// upstream_length(u) + step(u) (ties: lowest direction code) until a cell nothing drains into.
/// Elevations come from `dem` (the unconditioned DEM; every cell with a direction holds data).
[[nodiscard]] FlowPath longest_flow_path(const Grid<std::uint8_t> &dirs,
                                         const Grid<float> &upstream_length_m,
                                         const Grid<float> &dem, std::size_t outlet);
/// The same path traced on AccumulationAndLength::longest_upstream (one step per cell, no
/// search; the result is identical).
[[nodiscard]] FlowPath longest_flow_path(const Grid<std::uint8_t> &dirs,
                                         const Grid<std::uint8_t> &longest_upstream,
                                         const Grid<float> &dem, std::size_t outlet);

/// Slope between the points at 10 % and 85 % of a path's length from its outlet, from the
/// path's vertices given by distance from the outlet (ascending, the outlet first at 0) and
/// elevation; elevations interpolated linearly between vertices. Exposed for tests.
struct Slope1085 {
    double slope_m_per_m = 0.0;
    double elevation_10_m = 0.0;
    double elevation_85_m = 0.0;
};
[[nodiscard]] Slope1085 slope_10_85(const std::vector<double> &distance_from_outlet_m,
                                    const std::vector<double> &elevation_m);

} // namespace catchpeak::terrain
