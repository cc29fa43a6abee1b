// SPDX-License-Identifier: MIT
#include "../../src/report/internal/axis_ticks.hpp"

#include <gtest/gtest.h>

#include <limits>

namespace catchpeak::report {
namespace {

// Steps are powers of ten times 1, 2 or 5, computed through pow and log10: equal to the
// decimal value within a few units in the last place.
constexpr double rel = 1e-12;

TEST(AxisTicks, NiceStepIsOneTwoOrFiveTimesAPowerOfTen) {
    EXPECT_NEAR(nice_step(0.7), 0.5, 0.5 * rel);
    EXPECT_NEAR(nice_step(0.8), 1.0, rel);
    EXPECT_NEAR(nice_step(1.4), 1.0, rel);
    EXPECT_NEAR(nice_step(1.6), 2.0, 2.0 * rel);
    EXPECT_NEAR(nice_step(3.4), 2.0, 2.0 * rel);
    EXPECT_NEAR(nice_step(3.6), 5.0, 5.0 * rel);
    EXPECT_NEAR(nice_step(540.0), 500.0, 500.0 * rel);
    EXPECT_NEAR(nice_step(0.0031), 0.002, 0.002 * rel);
    EXPECT_EQ(nice_step(0.0), 1.0);
    EXPECT_EQ(nice_step(-3.0), 1.0);
    EXPECT_EQ(nice_step(std::numeric_limits<double>::quiet_NaN()), 1.0);
    EXPECT_EQ(nice_step(std::numeric_limits<double>::infinity()), 1.0);
}

TEST(AxisTicks, LabelsHaveTheDecimalsOfTheStep) {
    EXPECT_EQ(tick_label(2.0, 1.0), "2");
    EXPECT_EQ(tick_label(2000.0, 500.0), "2000");
    EXPECT_EQ(tick_label(0.5, 0.5), "0.5");
    EXPECT_EQ(tick_label(0.25, 0.05), "0.25");
    EXPECT_EQ(tick_label(-1e-17, 0.1), "0.0"); // no "-0.0" from a sum of steps
}

TEST(AxisTicks, TicksAreTheMultiplesOfTheStepInTheRange) {
    const auto t = ticks_between(-0.3, 1.0, 0.5);
    ASSERT_EQ(t.size(), 3u);
    EXPECT_DOUBLE_EQ(t[0], 0.0);
    EXPECT_DOUBLE_EQ(t[1], 0.5);
    EXPECT_DOUBLE_EQ(t[2], 1.0);
    EXPECT_EQ(ticks_between(1010.0, 1990.0, 1000.0).size(), 0u);
    EXPECT_EQ(ticks_between(0.0, 10.0, 0.0).size(), 0u);
}

} // namespace
} // namespace catchpeak::report
