// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/units.hpp"
#include "catchpeak/report/results.hpp"
#include "sheet_document.hpp"

#include <string>
#include <string_view>
#include <vector>

/// The culvert of a design point on the sheet: a summary table with one row per flow checked
/// and its performance curve (the curve drawn by `draw_culvert_curve_block`). Internal to
/// `report`.
namespace catchpeak::report {

/// Title of the performance curve's heading.
inline constexpr std::string_view culvert_curve_title =
    "Culvert performance curve: headwater elevation against flow";

/// The heading, the description, the summary table and the curve of `p`'s culvert (nothing
/// when `p` has none). The curve block points into `p`.
void culvert_blocks(const DesignPointResult &p, units::System system, std::vector<SheetBlock> &out);

/// An elevation as the sheet prints it: 3 decimals in m, 2 in ft, with no unit.
[[nodiscard]] std::string elevation_text(double elevation_m, units::System system);

/// Scales of a performance curve: flow from 0 and elevation from the inlet invert, in the
/// sheet's units, each with room for the road crest and the largest point.
struct CurveScales {
    double flow_step = 1.0, flow_max = 1.0;
    double elev_step = 1.0, elev_min = 0.0, elev_max = 1.0;
};

[[nodiscard]] CurveScales curve_scales(const CulvertResult &c, units::System system);

/// Draws the curve under its heading at the layout's y (a new page when it does not fit) and
/// moves y below it.
void draw_culvert_curve_block(PageLayout &page, const std::string &title, const CulvertResult &c,
                              units::System system);

} // namespace catchpeak::report
