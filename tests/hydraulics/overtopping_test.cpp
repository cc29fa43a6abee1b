// SPDX-License-Identifier: MIT
// Flow over the road, the split of the flow between barrels and road, the performance curve.
#include "catchpeak/hydraulics/overtopping.hpp"

#include "hydraulics/inlet_rows.hpp"
#include "support/calc_lines.hpp"

#include <gtest/gtest.h>

#include <cmath>

namespace catchpeak::hydraulics {
namespace {

using units::System;

Culvert pipe() {
    return {Section::circular(0.9),
            1,
            30.0,
            0.01,
            0.012,
            test::hds5_inlets().at("concrete_groove_headwall")};
}

// Inlet invert 100 m, tailwater 0.3 m, HW/D <= 2; the road crest 1.8 m above the invert.
const Site site{100.0, 0.3, {std::nullopt, 2.0}};
const RoadCrest road{101.8, 40.0, default_weir_coefficient_si()};

// The weir equation itself, Q = Cd L H^1.5 (HDS-5 (2012) ch. 2, roadway overtopping), by hand:
// Cd 3.0 ft^0.5/s, L 100 ft, H 1 ft over the crest: Q = 300 ft3/s.
TEST(RoadFlow, WeirEquationByHand) {
    const RoadCrest r{10.0, units::ft_to_m(100.0), weir_coefficient_si_from_us(3.0)};
    EXPECT_NEAR(units::m3s_to_cfs(road_flow_m3_s(r, 10.0 + units::ft_to_m(1.0))), 300.0, 1e-9);
    EXPECT_DOUBLE_EQ(road_flow_m3_s(r, 9.5), 0.0);  // below the crest
    EXPECT_DOUBLE_EQ(road_flow_m3_s(r, 10.0), 0.0); // at the crest
}

// Cd SI = 0.552 Cd US: the conversion of the units (0.3048^0.5 = 0.55209); HDS-5 prints 0.552
// (from memory, not checked).
TEST(RoadFlow, CoefficientInSiUnits) {
    EXPECT_NEAR(weir_coefficient_si_from_us(1.0), 0.552, 5e-4);
    EXPECT_NEAR(weir_coefficient_si_from_us(1.0), std::sqrt(0.3048), 1e-15);
}

TEST(FlowSplit, BelowTheCrestTheBarrelsCarryAll) {
    const auto s = split_with_road(pipe(), 0.5, site, road, System::si);
    EXPECT_FALSE(s.value.overtops);
    EXPECT_DOUBLE_EQ(s.value.culvert_flow_m3_s, 0.5);
    EXPECT_DOUBLE_EQ(s.value.road_flow_m3_s, 0.0);
    EXPECT_LE(s.value.headwater_elevation_m, road.crest_elevation_m);
    EXPECT_TRUE(s.lines.has("culvert.road_clear"));
    EXPECT_FALSE(s.lines.has(keys::road_overtops));
}

// Above the crest: Qc + Qr = Q, and the barrels at Qc give the same headwater as the road at Qr.
TEST(FlowSplit, OneHeadwaterForBarrelsAndRoad) {
    for (const System sys : {System::si, System::us_customary}) {
        const double q = 6.0;
        const auto s = split_with_road(pipe(), q, site, road, sys);
        ASSERT_TRUE(s.value.overtops);
        EXPECT_NEAR(s.value.culvert_flow_m3_s + s.value.road_flow_m3_s, q, 1e-12);
        EXPECT_GT(s.value.road_flow_m3_s, 0.0);
        const double el_barrels =
            site.inlet_invert_m + analyse(pipe(), s.value.culvert_flow_m3_s, site, sys).value.hw_m;
        EXPECT_NEAR(el_barrels, s.value.headwater_elevation_m, 1e-9);
        EXPECT_NEAR(road_flow_m3_s(road, s.value.headwater_elevation_m), s.value.road_flow_m3_s,
                    1e-9 * q);
        EXPECT_NEAR(s.value.depth_over_crest_m,
                    s.value.headwater_elevation_m - road.crest_elevation_m, 1e-12);
        // The culvert alone would stand higher than the shared headwater.
        EXPECT_GT(site.inlet_invert_m + analyse(pipe(), q, site, sys).value.hw_m,
                  s.value.headwater_elevation_m);
        EXPECT_EQ(test::line_keyed(s.lines, std::string(keys::road_overtops)).kind,
                  LineKind::warning);
        EXPECT_TRUE(s.lines.has(keys::road_flow));
        EXPECT_TRUE(s.lines.has(keys::flow_split));
        for (const auto &l : s.lines.lines()) {
            EXPECT_FALSE(test::text(l).numbers.empty()) << l.key;
        }
    }
}

TEST(FlowSplit, ACrestAtOrBelowTheInvertIsRefused) {
    RoadCrest low = road;
    low.crest_elevation_m = site.inlet_invert_m;
    EXPECT_THROW((void)split_with_road(pipe(), 2.0, site, low, System::si), InputError);
    RoadCrest no_length = road;
    no_length.length_m = 0.0;
    EXPECT_THROW((void)split_with_road(pipe(), 2.0, site, no_length, System::si), InputError);
}

TEST(PerformanceCurve, RisesAndEndsAtTheLargestFlow) {
    const double q_max = 8.0;
    const auto curve = performance_curve(pipe(), site, road, q_max, 40, System::si);
    ASSERT_EQ(curve.size(), 41U);
    EXPECT_DOUBLE_EQ(curve.front().flow_m3_s, 0.0);
    EXPECT_DOUBLE_EQ(curve.front().headwater_elevation_m, site.inlet_invert_m);
    EXPECT_NEAR(curve.back().flow_m3_s, q_max, 1e-9 * q_max);
    bool overtopped = false;
    for (std::size_t i = 1; i < curve.size(); ++i) {
        EXPECT_GT(curve[i].flow_m3_s, curve[i - 1].flow_m3_s) << i;
        EXPECT_GE(curve[i].headwater_elevation_m, curve[i - 1].headwater_elevation_m) << i;
        EXPECT_NEAR(curve[i].headwater_elevation_m - site.inlet_invert_m,
                    std::max(curve[i].hw_inlet_m, curve[i].hw_outlet_m), 1e-12);
        overtopped = overtopped || curve[i].road_m3_s > 0.0;
    }
    EXPECT_TRUE(overtopped);
    // Without the road every flow goes through the barrels, in equal steps.
    const auto plain = performance_curve(pipe(), site, std::nullopt, q_max, 8, System::si);
    for (std::size_t i = 0; i < plain.size(); ++i) {
        EXPECT_DOUBLE_EQ(plain[i].road_m3_s, 0.0);
        EXPECT_NEAR(plain[i].flow_m3_s, q_max * static_cast<double>(i) / 8.0, 1e-12);
    }
}

} // namespace
} // namespace catchpeak::hydraulics
