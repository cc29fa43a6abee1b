// SPDX-License-Identifier: MIT
// Outlet control headwater, HDS-5 (2012) ch. 3: H = (1 + ke + Ku n^2 L/R^1.33) V^2/(2g) with
// Ku = 29 US, ho = max(TW, (dc + D)/2), HWo = H + ho - L So, evaluated by hand in the test.
#include "catchpeak/hydraulics/culvert.hpp"

#include "hydraulics/inlet_rows.hpp"
#include "support/calc_lines.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

namespace catchpeak::hydraulics {
namespace {

using units::System;

// 48-in concrete pipe, square edge with headwall (ke = 0.5), L = 300 ft, n = 0.012, So = 0.005,
// Q = 150 ft3/s, tailwater 3.5 ft (above (dc + D)/2 here, so it sets ho).
TEST(OutletControl, FullFlowWithHighTailwater) {
    const Culvert c{Section::circular(units::ft_to_m(4.0)),
                    1,
                    units::ft_to_m(300.0),
                    0.005,
                    0.012,
                    test::hds5_inlets().at("concrete_square_headwall")};
    const double a = std::numbers::pi * 4.0;
    const double v = 150.0 / a;
    const double h =
        (1.0 + 0.5 + 29.0 * 0.012 * 0.012 * 300.0 / std::pow(1.0, 1.33)) * v * v / (2.0 * 32.2);
    const auto r =
        outlet_control(c, units::cfs_to_m3s(150.0), units::ft_to_m(3.9), System::us_customary);
    EXPECT_NEAR(units::m_to_ft(r.value.head_loss_m), h, 1e-9);
    const double dc = units::m_to_ft(r.value.critical_depth_m);
    ASSERT_LT((dc + 4.0) / 2.0, 3.9);
    EXPECT_NEAR(units::m_to_ft(r.value.ho_m), 3.9, 1e-9);
    EXPECT_NEAR(units::m_to_ft(r.value.hw_m), h + 3.9 - 300.0 * 0.005, 1e-9);
    EXPECT_EQ(test::text(test::line_keyed(r.lines, "culvert.outlet_head_loss")).numbers,
              "H = (1 + 0.5000 + 29 x 0.01200^2 x 300.0/1.000^1.33) x 11.94^2/(2 x 32.2)");
}

// Low tailwater: ho = (dc + D)/2; a short steep barrel gives HWo below 0.75 D and a warning
// that the full-flow method only approximates a partly full barrel.
TEST(OutletControl, LowTailwaterUsesCriticalDepth) {
    const Culvert c{
        Section::box(2.0, 1.5), 2, 30.0, 0.02, 0.013, test::hds5_inlets().at("box_wingwall_0")};
    const auto r = outlet_control(c, 2.0, 0.1, System::si);
    const double dc = std::cbrt(0.5 * 0.5 / 9.81); // 1 m3/s per barrel, q = 0.5 m2/s
    EXPECT_NEAR(r.value.critical_depth_m, dc, 1e-10);
    EXPECT_NEAR(r.value.ho_m, (dc + 1.5) / 2.0, 1e-10);
    const double v = 2.0 / (2.0 * 3.0);
    const double h = (1.0 + 0.7 + 19.63 * 0.013 * 0.013 * 30.0 / std::pow(0.3 / 0.7 * 1.0, 1.33)) *
                     v * v / (2.0 * 9.81); // R = 3/7 m
    EXPECT_NEAR(r.value.head_loss_m, h, 1e-9);
    EXPECT_TRUE(r.value.partly_full);
    EXPECT_TRUE(r.lines.has("culvert.partly_full"));
}

} // namespace
} // namespace catchpeak::hydraulics
