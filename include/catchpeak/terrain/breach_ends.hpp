// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/grid.hpp"
#include "catchpeak/terrain/conditioning.hpp"

#include <cstddef>
#include <optional>
#include <string>
#include <utility>
#include <vector>

/// The two ends of the breach line at a design point, where a culvert's inverts are read from
/// the DEM when the culvert table leaves them out.
namespace catchpeak::terrain {

/// One end of a breach line: the cell under its end vertex and the DEM there.
struct LineEnd {
    std::pair<double, double> xy{0.0, 0.0}; ///< the end vertex
    std::size_t col = 0, row = 0;           ///< the cell under it
    std::optional<double> elevation_m;      ///< the DEM in that cell; unset: nodata or off grid
};

/// The breach line nearest to a design point and its ends, inlet (the higher end) first.
struct BreachEnds {
    std::size_t line = 0;    ///< index into the breach lines
    std::string line_id;     ///< BreachLine::id, for messages
    double distance_m = 0.0; ///< from the point to the line (nearest segment)
    double length_m = 0.0;   ///< along the line, vertex to vertex
    LineEnd inlet;           ///< the higher end (the first vertex when both are equal)
    LineEnd outlet;          ///< the lower end
};

/// The breach line nearest to (x, y) and its ends, the inlet being the end where the DEM is
/// higher (the rule of apply_breach_lines, so that the lowered path and the barrel agree).
/// Elevations are the DEM's value in the cell under each end vertex (the DEM as given, not
/// conditioned). Unset when there are no lines (or none with two vertices).
[[nodiscard]] std::optional<BreachEnds> nearest_breach_ends(const Grid<float> &dem,
                                                            const std::vector<BreachLine> &lines,
                                                            double x, double y);

} // namespace catchpeak::terrain
