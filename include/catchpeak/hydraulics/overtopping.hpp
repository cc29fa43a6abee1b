// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/hydraulics/culvert.hpp"

#include <optional>
#include <string_view>
#include <vector>

/// Flow over the road at a culvert crossing: the weir equation of HDS-5 (2012) ch. 2, the
/// split of the flow between the barrels and the road at one headwater, and the performance
/// curve (headwater against flow) of a crossing.
namespace catchpeak::hydraulics {

namespace keys {
inline constexpr std::string_view road_overtops = "culvert.road_overtops";
inline constexpr std::string_view road_flow = "culvert.road_flow";
inline constexpr std::string_view flow_split = "culvert.flow_split";
} // namespace keys

/// The weir coefficient Cd of Q = Cd L HWr^1.5 in SI (m^0.5/s) from one in US customary units
/// (ft^0.5/s): Cd SI = Cd US x 0.3048^0.5 (the units alone: Q ft3/s -> m3/s by 0.3048^3, L and
/// HWr^1.5 ft -> m by 0.3048^-2.5).
[[nodiscard]] double weir_coefficient_si_from_us(double cd_us) noexcept;

/// The default weir coefficient, SI: 3.0 ft^0.5/s, deep flow over a paved road crest with no
/// submergence (kt = 1). HDS-5 (2012) ch. 2, roadway overtopping (from memory, not checked).
[[nodiscard]] double default_weir_coefficient_si() noexcept;

/// The road crest over the culvert: its lowest elevation, the length of road that overflows
/// (a single horizontal segment, HDS-5 (2012) ch. 2), and Cd in SI.
struct RoadCrest {
    double crest_elevation_m = 0.0;
    double length_m = 0.0;
    double weir_coefficient_si = 0.0;
};

/// Flow over the road at a headwater elevation: Qr = Cd L HWr^1.5, HWr = ELhw - ELcrest (zero
/// below the crest). SI in and out.
[[nodiscard]] double road_flow_m3_s(const RoadCrest &road, double headwater_elevation_m);

struct FlowSplit {
    double culvert_flow_m3_s = 0.0;
    double road_flow_m3_s = 0.0;
    double headwater_elevation_m = 0.0;
    double depth_over_crest_m = 0.0; ///< HWr, 0 when the road does not overtop
    bool overtops = false;
    CulvertResult culvert; ///< the barrels at culvert_flow_m3_s
};

/// The culvert alone with the whole flow; when its headwater rises above the crest, the split
/// Qc + Qr = Q at one headwater elevation found by root finding (TOMS 748, Boost.Math), with a
/// line for each step and the culvert's lines at its share Qc.
[[nodiscard]] WithLines<FlowSplit> split_with_road(const Culvert &c, double q_m3_s,
                                                   const Site &site, const RoadCrest &road,
                                                   units::System system);

/// One point of the performance curve: for a total flow, the headwater of each control and
/// the one that governs, and the flow over the road.
struct CurvePoint {
    double flow_m3_s = 0.0;    ///< total flow at the crossing
    double culvert_m3_s = 0.0; ///< through the barrels
    double road_m3_s = 0.0;    ///< over the road
    double hw_inlet_m = 0.0;   ///< inlet control headwater at culvert_m3_s, over the inlet invert
    double hw_outlet_m = 0.0;  ///< outlet control headwater at culvert_m3_s
    double headwater_elevation_m = 0.0;
};

/// The performance curve from zero to `q_max_m3_s` in `steps` equal steps (steps + 1 points;
/// the first is zero flow at the inlet invert), with the road when one is given.
[[nodiscard]] std::vector<CurvePoint> performance_curve(const Culvert &c, const Site &site,
                                                        const std::optional<RoadCrest> &road,
                                                        double q_max_m3_s, int steps,
                                                        units::System system);

} // namespace catchpeak::hydraulics
