// SPDX-License-Identifier: MIT
// A crossing designed for its flows: the size, each flow checked, tailwater, road and curve.
#include "catchpeak/hydraulics/crossing.hpp"

#include "hydraulics/inlet_rows.hpp"
#include "support/calc_lines.hpp"

#include <gtest/gtest.h>

namespace catchpeak::hydraulics {
namespace {

using units::System;

Crossing crossing() {
    Crossing x;
    x.culvert = {Section::circular(0.9),
                 1,
                 35.0,
                 0.008,
                 0.012,
                 test::hds5_inlets().at("concrete_square_headwall")};
    x.site = {50.0, 0.0, {std::nullopt, 1.5}};
    return x;
}

std::vector<Section> sizes() {
    std::vector<Section> s;
    for (const double d : {0.45, 0.6, 0.75, 0.9, 1.05, 1.2, 1.5, 1.8}) {
        s.push_back(Section::circular(d));
    }
    s.push_back(Section::box(1.8, 1.2)); // another shape: never chosen for a pipe
    return s;
}

const std::vector<FlowCase> flows{{2, 0.6, false}, {25, 1.4, true}, {100, 2.0, false}};

TEST(Crossing, AGivenSizeIsCheckedAtEveryFlow) {
    Crossing x = crossing();
    x.size = Section::circular(1.05);
    const auto d = design_crossing(x, flows, {}, System::si);
    EXPECT_FALSE(d.sized);
    EXPECT_DOUBLE_EQ(d.size.rise_m, 1.05);
    ASSERT_EQ(d.cases.size(), 3U);
    for (const auto &c : d.cases) {
        EXPECT_EQ(c.passes, c.split.culvert.hw_m <= c.split.culvert.allowed_hw_m);
        EXPECT_DOUBLE_EQ(c.split.culvert_flow_m3_s, c.flow.q_m3_s);
    }
    // Headwater rises with the flow.
    EXPECT_LT(d.cases[0].split.culvert.hw_m, d.cases[2].split.culvert.hw_m);
}

// Sized for the design flow (the 25-year one), not the largest.
TEST(Crossing, SizedForTheDesignFlow) {
    const auto d = design_crossing(crossing(), flows, sizes(), System::si);
    ASSERT_TRUE(d.sized);
    ASSERT_TRUE(d.sizing && d.sizing->chosen);
    EXPECT_EQ(d.size.shape, Shape::circular);
    EXPECT_TRUE(d.cases[1].passes);
    Culvert smaller = crossing().culvert;
    for (const auto &s : sizes()) {
        if (s.shape == Shape::circular && s.rise_m < d.size.rise_m) {
            smaller.section = s;
            EXPECT_FALSE(analyse(smaller, 1.4, crossing().site, System::si).value.passes)
                << s.rise_m;
        }
    }
    EXPECT_TRUE(d.sizing_lines.has("culvert.size_chosen"));
}

TEST(Crossing, TailwaterGivenFromTheChannelOrNone) {
    Crossing x = crossing();
    x.size = Section::circular(0.9);
    const auto none = design_crossing(x, flows, {}, System::si);
    EXPECT_DOUBLE_EQ(none.cases[0].tailwater_m, 0.0);
    EXPECT_EQ(test::line_keyed(none.cases[0].lines, std::string(keys::tailwater)).kind,
              LineKind::note);
    x.tailwater_m = 0.4;
    EXPECT_DOUBLE_EQ(design_crossing(x, flows, {}, System::si).cases[2].tailwater_m, 0.4);
    x.tailwater_m.reset();
    x.channel = Trapezoid{2.0, 2.0, 0.035, 0.005};
    const auto ch = design_crossing(x, flows, {}, System::si);
    for (const auto &c : ch.cases) {
        EXPECT_NEAR(c.tailwater_m, normal_depth_m(*x.channel, c.flow.q_m3_s, System::si).value,
                    1e-12);
    }
    EXPECT_LT(ch.cases[0].tailwater_m, ch.cases[2].tailwater_m);
}

TEST(Crossing, OutletVelocityOverTheLimitIsWarned) {
    Crossing x = crossing();
    x.size = Section::circular(0.9);
    EXPECT_FALSE(design_crossing(x, flows, {}, System::si).cases[2].lines.has(keys::velocity_over));
    x.outlet_velocity_max_m_s = 0.5;
    const auto d = design_crossing(x, flows, {}, System::us_customary);
    EXPECT_EQ(test::line_keyed(d.cases[2].lines, std::string(keys::velocity_over)).kind,
              LineKind::warning);
}

TEST(Crossing, RoadAndCurve) {
    Crossing x = crossing();
    x.size = Section::circular(0.6);
    x.road = RoadCrest{51.2, 25.0, default_weir_coefficient_si()};
    const auto d = design_crossing(x, flows, {}, System::si, 20);
    EXPECT_TRUE(d.cases[2].split.overtops);
    EXPECT_NEAR(d.cases[2].split.culvert_flow_m3_s + d.cases[2].split.road_flow_m3_s, 2.0, 1e-12);
    ASSERT_EQ(d.curve.size(), 21U);
    EXPECT_NEAR(d.curve.back().flow_m3_s, 3.0, 1e-9); // 1.5 x the largest flow
}

} // namespace
} // namespace catchpeak::hydraulics
