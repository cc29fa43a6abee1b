// SPDX-License-Identifier: MIT
// Gutter flow: spread and depth for a uniform cross slope and a composite gutter (HEC-22 ch. 4).
#include "catchpeak/hydraulics/gutter.hpp"

#include "catchpeak/core/error.hpp"

#include "support/calc_lines.hpp"

#include <gtest/gtest.h>

#include <cmath>

namespace catchpeak::hydraulics {
namespace {

using units::System;

/// HEC-22 eq. 4-2 as printed (FHWA HEC-22, 3rd ed. (2009); REFERENCES: checked in several
/// secondary copies): Q = (Ku/n) Sx^1.67 SL^0.5 T^2.67, Ku = 0.376 SI.
double eq_4_2_si(double n, double sx, double sl, double t) {
    return 0.376 / n * std::pow(sx, 1.67) * std::sqrt(sl) * std::pow(t, 2.67);
}

Gutter uniform(double n, double sx, double sl) { return {sx, sl, n, 0.0, 0.0}; }

// HEC-22, 3rd ed. (2009), Example 4-1, part 1 (inputs and result from memory, not checked):
// n = 0.016, Sx = 0.02, SL = 0.01, T = 2.5 m (8.2 ft): Q = 0.039 m3/s (1.4 ft3/s).
// Tolerance: one unit in the last printed digit.
TEST(Gutter, Hec22Example4_1FlowAtTheDesignSpread) {
    const auto si = gutter_flow_at_spread(uniform(0.016, 0.02, 0.01), 2.5, System::si);
    EXPECT_NEAR(si.value.flow_m3_s, 0.039, 0.001);
    const auto us = gutter_flow_at_spread(uniform(0.016, 0.02, 0.01), units::ft_to_m(8.2),
                                          System::us_customary);
    EXPECT_NEAR(units::m3s_to_cfs(us.value.flow_m3_s), 1.4, 0.1);
    // The line cites the equation and shows its numbers in the sheet's units.
    const auto text = test::text(test::line_keyed(si.lines, "gutter.flow_uniform"));
    EXPECT_EQ(text.source, "FHWA HEC-22, 3rd ed. (2009) eq. 4-2");
    EXPECT_EQ(text.numbers, "Q = (0.376/0.01600) x 0.02000^1.67 x 0.01000^0.5 x 2.500^2.67");
}

// Eq. 4-2 solved for T in closed form, and d = T Sx (HEC-22 (2009) ch. 4): the spread of the
// flow that eq. 4-2 gives at T is T, the depth T Sx. Tolerance: rounding of double powers.
TEST(Gutter, UniformSpreadIsEquation4_2SolvedForT) {
    const auto g = uniform(0.015, 0.025, 0.004);
    const double q = eq_4_2_si(0.015, 0.025, 0.004, 3.2);
    const auto r = gutter_spread(g, q, System::si);
    EXPECT_NEAR(r.value.spread_m, 3.2, 1e-12);
    EXPECT_NEAR(r.value.depth_m, 3.2 * 0.025, 1e-12);
    EXPECT_TRUE(r.lines.has("gutter.spread_uniform"));
    EXPECT_TRUE(r.lines.has("gutter.depth"));
}

// The SI and US constants of eq. 4-2 (0.376 and 0.56) are the same equation: 0.56 ft^(1/3)/s
// is 0.56 x 3.2808^2.67 / 35.315 = 0.378 in SI. Tolerance: the published constants' rounding,
// about 0.5 %, taken as 1 %.
TEST(Gutter, SiAndUsConstantsAgree) {
    const auto g = uniform(0.016, 0.02, 0.01);
    const auto si = gutter_spread(g, 0.05, System::si);
    const auto us = gutter_spread(g, 0.05, System::us_customary);
    EXPECT_NEAR(us.value.spread_m, si.value.spread_m, 0.01 * si.value.spread_m);
    EXPECT_NEAR(us.value.depth_m, si.value.depth_m, 0.01 * si.value.depth_m);
}

// Eq. 4-4 for Sw = Sx (no depression) is the frontal flow ratio of a uniform gutter, Eo = 1 -
// (1 - W/T)^2.67 (HEC-22 (2009) eq. 4-16, the number from memory, not checked): an algebraic
// identity. Tolerance: rounding of double powers.
TEST(Gutter, FrontalRatioWithoutDepressionIsTheUniformOne) {
    for (const double t_over_w : {1.5, 2.0, 4.0, 10.0}) {
        EXPECT_NEAR(composite_frontal_ratio(1.0, t_over_w),
                    1.0 - std::pow(1.0 - 1.0 / t_over_w, 2.67), 1e-12);
    }
}

// Eq. 4-4 is the share of the flow in W when the composite section is split at W: the flow
// beyond W is eq. 4-2 over Ts = T - W at Sx, the flow in W the difference of two triangles of
// cross slope Sw, with depths T Sx + a and Ts Sx at the curb (the derivation of eq. 4-4,
// HEC-22 (2009) ch. 4). Composite gutter: W = 0.6 m, a = 50 mm, Sx = 0.02.
TEST(Gutter, CompositeFlowSplitsAtTheGutterWidth) {
    const Gutter g{0.02, 0.01, 0.016, 0.6, 0.05};
    const double sw = 0.02 + 0.05 / 0.6;
    const double t = 2.5;
    const double ts = t - 0.6;
    const double qs = eq_4_2_si(0.016, 0.02, 0.01, ts);
    const double d = t * 0.02 + 0.05;
    const double qw =
        eq_4_2_si(0.016, sw, 0.01, d / sw) - eq_4_2_si(0.016, sw, 0.01, ts * 0.02 / sw);
    const auto r = gutter_flow_at_spread(g, t, System::si);
    EXPECT_NEAR(r.value.frontal_ratio, qw / (qw + qs), 1e-12);
    EXPECT_NEAR(r.value.flow_m3_s, qw + qs, 1e-12);
    EXPECT_NEAR(r.value.depth_m, d, 1e-12);
    EXPECT_TRUE(r.lines.has("gutter.frontal_ratio"));
    EXPECT_EQ(test::text(test::line_keyed(r.lines, "gutter.frontal_ratio")).source,
              "FHWA HEC-22, 3rd ed. (2009) eq. 4-4");
}

// The composite gutter's spread solved numerically returns the spread whose flow it was given,
// beyond W and within it (there a triangle of cross slope Sw, eq. 4-2). Tolerance: the
// solver's relative 2^-43 on T, widened for the power 2.67.
TEST(Gutter, CompositeSpreadInvertsTheFlow) {
    const Gutter g{0.02, 0.01, 0.016, 0.6, 0.05};
    for (const double t : {0.3, 0.6, 0.61, 1.2, 2.5, 6.0}) {
        const double q = gutter_flow_at_spread(g, t, System::si).value.flow_m3_s;
        const auto r = gutter_spread(g, q, System::si);
        EXPECT_NEAR(r.value.spread_m, t, 1e-9 * t) << "T = " << t;
        EXPECT_EQ(r.lines.has("gutter.spread_composite"), t > 0.6) << "T = " << t;
    }
    // Within W: the closed form with Sw.
    const double sw = 0.02 + 0.05 / 0.6;
    const auto within = gutter_spread(g, eq_4_2_si(0.016, sw, 0.01, 0.4), System::si);
    EXPECT_NEAR(within.value.spread_m, 0.4, 1e-12);
    EXPECT_DOUBLE_EQ(within.value.frontal_ratio, 1.0);
}

TEST(Gutter, RefusesWhatIsNotAGutter) {
    EXPECT_THROW((void)gutter_spread(uniform(0.016, 0.0, 0.01), 0.05, System::si), InputError);
    EXPECT_THROW((void)gutter_spread(uniform(0.016, 0.02, -0.01), 0.05, System::si), InputError);
    EXPECT_THROW((void)gutter_spread(uniform(0.0, 0.02, 0.01), 0.05, System::si), InputError);
    EXPECT_THROW((void)gutter_spread(uniform(0.016, 0.02, 0.01), 0.0, System::si), InputError);
    const Gutter depression_without_width{0.02, 0.01, 0.016, 0.0, 0.05};
    EXPECT_THROW((void)gutter_spread(depression_without_width, 0.05, System::si), InputError);
}

} // namespace
} // namespace catchpeak::hydraulics
