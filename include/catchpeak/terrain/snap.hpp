// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/grid.hpp"
#include "catchpeak/core/snap_rule.hpp"

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

/// How a design point is snapped.
struct SnapSettings {
    SnapRule rule = SnapRule::nearest_stream;
    double radius_m = 0.0; ///< cells whose centre lies within this distance are searched
    /// nearest_stream: a stream cell drains at least this area (accumulation x cell area); our
    /// default 1 ha (our choice, as the project's [settings] snap_stream_threshold_m2).
    double stream_threshold_m2 = 1.0e4;
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
    /// The cell under the given point: its accumulation (cells and m2).
    std::uint32_t given_accumulation = 0;
    double given_accumulation_m2 = 0.0;
    /// The smallest and largest accumulation of the cells searched (centre within the radius,
    /// and the cell under the point), nodata cells left out.
    std::uint32_t min_accumulation = 0;
    std::uint32_t max_accumulation = 0;
    double min_accumulation_m2 = 0.0;
    double max_accumulation_m2 = 0.0;
    /// nearest_stream found no stream cell within the radius: the point stays on its cell.
    bool no_stream_within_radius = false;
};

/// Throws InputError, as snap_point does, when the point lies outside the DEM or on a nodata
/// cell: the check before the terrain steps, so that a bad point is reported at once.
void check_design_point(const Grid<float> &dem, const DesignPoint &point,
                        const std::string &where = "design points");

/// Snaps a design point by `settings.rule` among the cells whose centre lies within
/// `settings.radius_m` of the point; the cell containing the point is always a candidate, even
/// when the radius is smaller than half a cell. Cells with accumulation 0 (nodata) are never
/// chosen.
/// - largest_flow: the cell of largest accumulation; ties to the nearest cell centre, then to
///   the lowest index.
/// - nearest_stream: the stream cell (accumulation x cell area >= stream_threshold_m2) nearest
///   to the point, measured to the cell's square (0 for the cell under the point, so that a
///   point on a stream cell stays there); ties to the larger accumulation, then the nearest
///   cell centre, then the lowest index. No stream cell: the cell under the point, with
///   no_stream_within_radius set.
/// - none: the cell under the point.
/// Also gives the accumulation of the cell under the point and the smallest and largest of the
/// cells searched, whatever the rule.
/// Throws InputError when the point lies outside the grid or on a nodata cell; the message
/// names the point id, its coordinates and the DEM extent. `where` starts the message (e.g.
/// the design points file).
[[nodiscard]] SnappedPoint snap_point(const Grid<std::uint32_t> &accumulation,
                                      const DesignPoint &point, const SnapSettings &settings,
                                      const std::string &where = "design points");

/// The compass direction (of 8: "north", "north-east", ... "north-west") of a move by (dx, dy)
/// metres in a north-up CRS (y grows to the north); "" for no move.
[[nodiscard]] std::string compass_direction(double dx_m, double dy_m);

} // namespace catchpeak::terrain
