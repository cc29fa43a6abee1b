// SPDX-License-Identifier: MIT
// Barrel sections: geometry, critical depth, Manning capacity; the outlet channel's normal depth.
#include "catchpeak/hydraulics/channel.hpp"
#include "catchpeak/hydraulics/section.hpp"

#include "support/calc_lines.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

namespace catchpeak::hydraulics {
namespace {

using units::System;
constexpr double pi = std::numbers::pi;

TEST(Section, FullFlowGeometryAndItsLines) {
    const auto c = full_flow(Section::circular(1.2), System::si);
    EXPECT_NEAR(c.value.area, pi * 1.44 / 4.0, 1e-12);
    EXPECT_NEAR(c.value.hydraulic_radius(), 0.3, 1e-12); // R = D/4 for a full circle
    EXPECT_EQ(test::text(test::line_keyed(c.lines, "culvert.area_full")).numbers,
              "A = pi x 1.200^2/4");
    const auto b = full_flow(Section::box(3.0, 2.0), System::us_customary);
    EXPECT_NEAR(b.value.area, 6.0, 1e-12);
    EXPECT_NEAR(b.value.wetted_perimeter, 10.0, 1e-12);
    EXPECT_EQ(test::text(test::line_keyed(b.lines, "culvert.perimeter_full")).numbers,
              "P = 2 x (9.843 + 6.562)"); // 3 m = 9.843 ft, 2 m = 6.562 ft
}

// Box: dc = (q^2/g)^(1/3) with q = Q/B is exact for a rectangle (Chow (1959) ch. 4); g as the
// sheet evaluates it, 9.81 m/s2 and 32.2 ft/s2. Tolerance: the solver's, 2^-43 relative.
TEST(Section, BoxCriticalDepthIsTheClosedForm) {
    const auto si = critical_depth_m(Section::box(2.0, 2.0), 3.0, System::si);
    EXPECT_NEAR(si.value, std::cbrt(1.5 * 1.5 / 9.81), 1e-11);
    const double q_cfs = units::m3s_to_cfs(3.0);
    const double b_ft = units::m_to_ft(2.0);
    const auto us = critical_depth_m(Section::box(2.0, 2.0), 3.0, System::us_customary);
    EXPECT_NEAR(units::m_to_ft(us.value), std::cbrt(q_cfs * q_cfs / (b_ft * b_ft * 32.2)), 1e-10);
}

// Circle half full: A = pi D^2/8, T = D, so Q^2 T = g A^3 gives Q = g^0.5 (pi/8)^1.5 D^2.5 for
// dc = D/2 exactly (Chow (1959) ch. 4, critical-flow criterion).
TEST(Section, CircularCriticalDepthHalfFull) {
    const double d = 1.5;
    const double q = std::sqrt(9.81) * std::pow(pi / 8.0, 1.5) * std::pow(d, 2.5);
    const auto dc = critical_depth_m(Section::circular(d), q, System::si);
    EXPECT_NEAR(dc.value, d / 2.0, 1e-10);
    EXPECT_FALSE(test::line_keyed(dc.lines, "culvert.critical_depth").flags.capped);
    // A flow far beyond the section's: the top width closes at the crown, so dc reaches the
    // rise; a box has no crown in the criterion, and dc is capped at the rise by a line.
    const auto big = critical_depth_m(Section::circular(0.3), 10.0, System::si);
    EXPECT_NEAR(big.value, 0.3, 1e-6);
    const auto box = critical_depth_m(Section::box(1.0, 0.3), 10.0, System::si);
    EXPECT_DOUBLE_EQ(box.value, 0.3);
    EXPECT_TRUE(test::line_keyed(box.lines, "culvert.critical_depth_capped").flags.capped);
}

// Manning full-flow capacity, Q = (1/n) A R^(2/3) S^(1/2) (Chow (1959) ch. 5): D = 1 m, n =
// 0.013, S = 0.01 gives (1/0.013) x 0.7854 x 0.25^(2/3) x 0.1 = 2.398 m3/s; in US units
// 1.486/n, D = 3 ft: 114.3 x 7.069 x 0.75^(2/3) x 0.1 = 66.70 ft3/s. Tolerance: the printed
// 4 figures.
TEST(Section, ManningFullFlowCapacity) {
    const auto si = full_flow_capacity_m3_s(Section::circular(1.0), 0.013, 0.01, System::si);
    EXPECT_NEAR(si.value, 2.398, 0.0005);
    EXPECT_EQ(test::text(test::line_keyed(si.lines, "culvert.full_capacity")).numbers,
              "Qfull = (1/0.01300) x 0.7854 x 0.2500^(2/3) x 0.01000^0.5");
    const auto us = full_flow_capacity_m3_s(Section::circular(units::ft_to_m(3.0)), 0.013, 0.01,
                                            System::us_customary);
    EXPECT_NEAR(units::m3s_to_cfs(us.value), 66.70, 0.005);
}

// Chow (1959) Example 6.2 (example number from memory): trapezoidal channel b = 20 ft, z = 2,
// n = 0.025, S = 0.0016, Q = 400 ft3/s; normal depth 3.36 ft. Tolerance: the printed 2 decimals.
TEST(Channel, NormalDepthOfChowsTrapezoid) {
    const Trapezoid ch{units::ft_to_m(20.0), 2.0, 0.025, 0.0016};
    const auto yn = normal_depth_m(ch, units::cfs_to_m3s(400.0), System::us_customary);
    EXPECT_NEAR(units::m_to_ft(yn.value), 3.36, 0.005);
    EXPECT_EQ(yn.lines.lines().at(0).key, "culvert.tailwater_normal_depth");
    EXPECT_THROW((void)normal_depth_m({0.0, 0.0, 0.03, 0.01}, 1.0, System::si), InputError);
}

// The normal depth in a barrel satisfies Manning's formula; beyond the part-full maximum
// (about 0.94 D for a circle, Chow (1959) ch. 5) the barrel is taken as full.
TEST(Section, BarrelNormalDepth) {
    const Section s = Section::circular(1.0);
    const auto yn = barrel_normal_depth_m(s, 1.0, 0.013, 0.01, System::si);
    const FlowArea f = flow_area_at(s, yn.value);
    EXPECT_NEAR(f.area * std::pow(f.hydraulic_radius(), 2.0 / 3.0) * 0.1 / 0.013, 1.0, 1e-9);
    const auto full = barrel_normal_depth_m(s, 5.0, 0.013, 0.01, System::si);
    EXPECT_DOUBLE_EQ(full.value, 1.0);
    EXPECT_TRUE(full.lines.lines().back().flags.capped);
}

} // namespace
} // namespace catchpeak::hydraulics
