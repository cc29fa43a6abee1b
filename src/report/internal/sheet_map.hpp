// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/units.hpp"
#include "catchpeak/report/results.hpp"
#include "page_layout.hpp"

#include <limits>
#include <optional>
#include <string>

/// The map of a design point on the sheet: hillshade, total and local catchment, streams, the
/// longest flow path, the design point as given and as snapped, north arrow, scale bar, grid
/// coordinates along the frame and a legend. Internal to `report`.
namespace catchpeak::report {

/// A box in CRS coordinates (metres); empty until a finite point is added.
struct WorldBox {
    double min_x = std::numeric_limits<double>::infinity();
    double min_y = std::numeric_limits<double>::infinity();
    double max_x = -std::numeric_limits<double>::infinity();
    double max_y = -std::numeric_limits<double>::infinity();
    void add(double x, double y);
    void add(const Path &path);
    [[nodiscard]] bool valid() const { return min_x <= max_x && min_y <= max_y; }
};

/// A map frame on the page and the part of the world it shows, north up, one scale for both
/// axes.
struct MapFrame {
    double x = 0.0, y = 0.0, w = 0.0, h = 0.0; ///< on the page, points
    WorldBox world;                            ///< metres
    double scale = 0.0;                        ///< page points per metre
    [[nodiscard]] double px(double wx) const { return x + (wx - world.min_x) * scale; }
    [[nodiscard]] double py(double wy) const { return y + (world.max_y - wy) * scale; }
};

/// The frame at (x, y, w, h) on the page that shows the catchment, the longest flow path and
/// both positions of the design point (or, when they span no area, the hillshade's extent),
/// padded by 8 % a side and widened to the frame's shape. Nothing when there is nothing to show.
[[nodiscard]] std::optional<MapFrame> fit_map_frame(const MapData &m, double x, double y, double w,
                                                    double h);

/// The length of the scale bar (about a quarter of the frame's width, a nice number of metres,
/// feet, kilometres or miles) and its label.
struct ScaleBar {
    double length_m = 0.0;
    std::string label;
};
[[nodiscard]] ScaleBar scale_bar_for(double world_w_m, units::System system);

/// The step of the grid coordinates along a frame, in metres: a nice number of the CRS's unit
/// (`unit_m` metres), about a quarter of the frame's width.
[[nodiscard]] double grid_step_m(const MapFrame &f, double unit_m);

/// "metres", "international feet", "US survey feet": a CRS unit's name as a plural.
[[nodiscard]] std::string plural_unit(const std::string &unit);

/// Draws the map block of design point `point_id` at the layout's y (a new page when it does
/// not fit) and moves y below it; draws nothing when the map shows nothing.
void draw_map_block(PageLayout &page, const MapData &m, const std::string &point_id,
                    units::System system);

} // namespace catchpeak::report
