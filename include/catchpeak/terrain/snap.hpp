// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/grid.hpp"

#include <cstddef>
#include <cstdint>
#include <string>
#include <vector>

namespace catchpeak::terrain {

/// A design point as given: id and CRS coordinates (metres).
struct DesignPoint {
    std::string id;
    double x = 0.0;
    double y = 0.0;
};

struct SnappedPoint {
    std::size_t cell = 0; ///< index into the grid
    std::size_t col = 0;
    std::size_t row = 0;
    double x = 0.0; ///< centre of the snapped cell
    double y = 0.0;
    double distance_m = 0.0;        ///< from the given point to the snapped cell centre
    std::uint32_t accumulation = 0; ///< cells
    double accumulation_m2 = 0.0;   ///< accumulation x cell area
};

/// Throws InputError, as snap_point does, when the point lies outside the DEM or on a nodata
/// cell: the check before the terrain steps, so that a bad point is reported at once.
void check_design_point(const Grid<float> &dem, const DesignPoint &point,
                        const std::string &where = "design points");

/// Snaps a design point to the cell of largest accumulation whose centre lies within
/// `radius_m` of the point. Ties go to the nearest cell centre, then to the lowest index. The
/// cell containing the point is always a candidate, even when radius_m is smaller than half a
/// cell. Cells with accumulation 0 (nodata) are never chosen.
/// Throws InputError when the point lies outside the grid or on a nodata cell; the message
/// names the point id, its coordinates and the DEM extent. `where` starts the message (e.g.
/// the design points file).
[[nodiscard]] SnappedPoint snap_point(const Grid<std::uint32_t> &accumulation,
                                      const DesignPoint &point, double radius_m,
                                      const std::string &where = "design points");

} // namespace catchpeak::terrain
