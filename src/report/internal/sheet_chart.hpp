// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/units.hpp"
#include "catchpeak/report/results.hpp"
#include "page_layout.hpp"

#include <cstddef>
#include <string>

/// The chart of a hydrograph on the sheet: the hyetograph (rainfall and rainfall excess per
/// step, drawn down from the top) above the hydrograph at the design point, on one time axis,
/// with the peak marked. Values in the sheet's unit system. Internal to `report`.
namespace catchpeak::report {

/// A value axis from 0 to `max` in ticks of `step` (both in the sheet's unit).
struct ValueAxis {
    double step = 1.0;
    double max = 1.0;
};

/// The time axis: in minutes, or in hours once the storm is longer than
/// `style::hours_axis_from_min`.
struct TimeAxis {
    bool hours = false;
    double unit_min = 1.0; ///< minutes per unit of the axis (60 in hours)
    double bar_min = 0.0;  ///< minutes of one step of the hydrograph
    double end = 0.0;      ///< end of the axis, in its unit
    double step = 1.0;     ///< between ticks, in its unit
};

/// Scales of a chart, and where its peak lies.
struct ChartScales {
    TimeAxis time;
    ValueAxis rain; ///< depth per step
    ValueAxis flow;
    double q_max = 0.0;    ///< largest flow, in the sheet's unit (0 when none is positive)
    std::size_t k_max = 0; ///< its step: the flow at the end of step k_max
};

[[nodiscard]] ValueAxis rain_axis(double rain_max);
[[nodiscard]] ValueAxis flow_axis(double q_max);
[[nodiscard]] TimeAxis time_axis(double step_s, std::size_t steps);
[[nodiscard]] ChartScales chart_scales(const Hydrograph &hg, units::System system);

/// Draws the chart under its heading `title` at the layout's y (a new page when it does not
/// fit) and moves y below it.
void draw_chart_block(PageLayout &page, const std::string &title, const Hydrograph &hg,
                      const std::string &point_id, units::System system);

} // namespace catchpeak::report
