// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/hydraulics/channel.hpp"
#include "catchpeak/hydraulics/culvert.hpp"
#include "catchpeak/hydraulics/overtopping.hpp"

#include <optional>
#include <string_view>
#include <vector>

/// A culvert crossing designed for its flows: the size (given, or the smallest standard size
/// that passes the design flow), then every flow checked at that size with its tailwater and
/// the road, and the performance curve. Pure computation, SI in and out.
namespace catchpeak::hydraulics {

namespace keys {
inline constexpr std::string_view tailwater = "culvert.tailwater";
inline constexpr std::string_view velocity_over = "culvert.velocity_over_limit";
} // namespace keys

/// The outlet velocity above which a warning asks for outlet protection: 4.5 m/s (about
/// 15 ft/s), common practice, no source; [design] outlet_velocity_max_m_per_s sets it.
inline constexpr double default_outlet_velocity_max_m_s = 4.5;

struct Crossing {
    Culvert culvert;                   ///< its section is used when `size` is given
    std::optional<Section> size;       ///< unset: sized from `sizes` for the design flow
    Site site;                         ///< inlet invert and limit; its tailwater is set per flow
    std::optional<double> tailwater_m; ///< a given tailwater depth over the outlet invert
    std::optional<Trapezoid> channel;  ///< else the normal depth of the outlet channel
    std::optional<RoadCrest> road;
    double outlet_velocity_max_m_s = default_outlet_velocity_max_m_s;
};

/// One flow at the crossing: its return period and whether it is the design flow.
struct FlowCase {
    double return_period_yr = 0.0;
    double q_m3_s = 0.0;
    bool design = false;
};

struct CaseResult {
    FlowCase flow;
    double tailwater_m = 0.0;
    FlowSplit split; ///< the barrels' result and the road's share
    bool passes = false;
    CalcLines lines;
};

struct CrossingDesign {
    Section size;
    bool sized = false; ///< chosen from the list (not given)
    std::optional<Sizing> sizing;
    CalcLines sizing_lines;
    std::vector<CaseResult> cases; ///< in the order of the flows given
    std::vector<CurvePoint> curve; ///< zero to 1.5 times the largest flow
};

/// Designs the crossing: sizes it for the design flow when no size is given (sizes must then
/// not be empty; when none passes, the largest is checked and fails), then checks every flow.
[[nodiscard]] CrossingDesign design_crossing(const Crossing &crossing,
                                             const std::vector<FlowCase> &flows,
                                             const std::vector<Section> &sizes,
                                             units::System system, int curve_steps = 40);

} // namespace catchpeak::hydraulics
