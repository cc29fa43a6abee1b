// SPDX-License-Identifier: MIT
// Inlet control headwater, HDS-5 (2012) appendix A. The expected values are the published
// equations (eq. A.1 to A.3) evaluated by hand in the test with the Table A.1 coefficients.
#include "catchpeak/hydraulics/culvert.hpp"

#include "hydraulics/inlet_rows.hpp"
#include "support/calc_lines.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

namespace catchpeak::hydraulics {
namespace {

using units::System;

Culvert pipe(double d_ft, const char *inlet) {
    return {Section::circular(units::ft_to_m(d_ft)),
            1,
            units::ft_to_m(200.0),
            0.01,
            0.012,
            test::hds5_inlets().at(inlet)};
}

// Submerged, 36-in concrete pipe, square edge with headwall, Q = 100 ft3/s, S = 0.01:
// X = 100/(7.0686 x 3^0.5) = 8.168; HWi/D = 0.0398 X^2 + 0.67 - 0.5 x 0.01 (eq. A.3).
TEST(InletControl, SubmergedConcretePipe) {
    const double a = std::numbers::pi * 9.0 / 4.0;
    const double x = 100.0 / (a * std::sqrt(3.0));
    const double expected = 0.0398 * x * x + 0.67 - 0.005;
    const auto r = inlet_control(pipe(3.0, "concrete_square_headwall"), units::cfs_to_m3s(100.0),
                                 System::us_customary);
    EXPECT_EQ(r.value.regime, InletRegime::submerged);
    EXPECT_NEAR(r.value.x, x, 1e-9);
    EXPECT_NEAR(r.value.hw_over_d, expected, 1e-9);
    EXPECT_NEAR(units::m_to_ft(r.value.hw_m), 3.0 * expected, 1e-8);
    EXPECT_EQ(test::text(test::line_keyed(r.lines, "culvert.inlet_submerged")).source,
              "HDS-5 (2012) eq. A.3; Table A.1, circular concrete, square edge with headwall");
}

// Unsubmerged form 1, 5 ft x 4 ft box with 30-75 degree wingwalls, Q = 100 ft3/s, S = 0.01:
// X = 100/(20 x 2) = 2.5; dc = (q^2/g)^(1/3) with q = 20 ft2/s, Hc = 1.5 dc for a rectangle;
// HWi/D = Hc/D + 0.026 X^1.0 - 0.5 x 0.01 (eq. A.1).
TEST(InletControl, UnsubmergedBoxForm1) {
    Culvert box{Section::box(units::ft_to_m(5.0), units::ft_to_m(4.0)),
                1,
                units::ft_to_m(100.0),
                0.01,
                0.012,
                test::hds5_inlets().at("box_wingwall_30_75")};
    const double dc = std::cbrt(20.0 * 20.0 / 32.2);
    const double expected = 1.5 * dc / 4.0 + 0.026 * 2.5 - 0.005;
    const auto r = inlet_control(box, units::cfs_to_m3s(100.0), System::us_customary);
    EXPECT_EQ(r.value.regime, InletRegime::unsubmerged);
    EXPECT_NEAR(r.value.x, 2.5, 1e-9);
    EXPECT_NEAR(r.value.hw_over_d, expected, 1e-9);
}

// The SI form (Ku = 1.811) and the US form (Ku = 1.0) give the same headwater: 1.811 is
// 0.3048^-0.5 x 0.3048^2 / 0.3048^3 rounded (1.8113), g 9.81 against 32.2 ft/s2 (0.05 %).
// Tolerance 0.1 %.
TEST(InletControl, SiAndUsFormsAgree) {
    for (const double q_cfs : {20.0, 60.0, 75.0, 150.0}) {
        const Culvert c = pipe(3.0, "cmp_mitered");
        const auto si = inlet_control(c, units::cfs_to_m3s(q_cfs), System::si);
        const auto us = inlet_control(c, units::cfs_to_m3s(q_cfs), System::us_customary);
        EXPECT_NEAR(si.value.hw_m, us.value.hw_m, 1e-3 * us.value.hw_m) << q_cfs;
        EXPECT_EQ(si.value.regime, us.value.regime) << q_cfs;
    }
}

// Between X = 3.5 and 4.0 the headwater lies on the straight line between eq. A.1 at 3.5 and
// eq. A.3 at 4.0 (HDS-5 (2012) A.2, transition zone); at X = 3.5 it equals eq. A.1.
TEST(InletControl, TransitionJoinsTheTwoEquations) {
    const Culvert c = pipe(3.0, "concrete_groove_headwall");
    const double a_rd = std::numbers::pi * 9.0 / 4.0 * std::sqrt(3.0);
    const auto at = [&](double x) {
        return inlet_control(c, units::cfs_to_m3s(x * a_rd), System::us_customary);
    };
    const auto low = at(3.5);
    const auto mid = at(3.75);
    const auto high = at(4.0);
    EXPECT_EQ(low.value.regime, InletRegime::unsubmerged);
    EXPECT_EQ(mid.value.regime, InletRegime::transition);
    EXPECT_EQ(high.value.regime, InletRegime::submerged);
    EXPECT_NEAR(mid.value.hw_over_d, 0.5 * (low.value.hw_over_d + high.value.hw_over_d), 1e-9);
    EXPECT_NEAR(high.value.hw_over_d, 0.0292 * 16.0 + 0.74 - 0.005, 1e-9);
}

// Form 2 has no critical head and no slope term: HWi/D = K X^M (eq. A.2).
TEST(InletControl, Form2) {
    Culvert c = pipe(3.0, "concrete_square_headwall");
    c.inlet.form = InletForm::form2;
    c.inlet.k = 0.515; // HDS-5 (2012) Table A.1, box with 90 degree headwall and 3/4 in chamfers
    c.inlet.m = 0.667;
    const double x = 30.0 / (std::numbers::pi * 9.0 / 4.0 * std::sqrt(3.0));
    const auto r = inlet_control(c, units::cfs_to_m3s(30.0), System::us_customary);
    EXPECT_NEAR(r.value.hw_over_d, 0.515 * std::pow(x, 0.667), 1e-9);
}

TEST(InletTable, RefusesBadRows) {
    const auto t = test::hds5_inlets();
    EXPECT_EQ(t.rows().size(), 8U);
    EXPECT_THROW((void)t.at("no_such_inlet"), InputError);
    auto rows = t.rows();
    rows.push_back(rows.front());
    EXPECT_THROW(InletTable{rows}, InputError);
    rows.pop_back();
    rows.front().k = 0.0;
    EXPECT_THROW(InletTable{rows}, InputError);
}

} // namespace
} // namespace catchpeak::hydraulics
