// SPDX-License-Identifier: MIT
#include "catchpeak/hydro/rational.hpp"
#include "support/calc_lines.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/core/units.hpp"

#include <gtest/gtest.h>

#include <string>

namespace {

using catchpeak::InputError;
using catchpeak::units::System;
namespace u = catchpeak::units;
namespace h = catchpeak::hydro;

h::FrequencyFactorTable sample_table() {
    h::FrequencyFactorTable t;
    t.rows = {{10.0, 1.0}, {25.0, 1.1}, {50.0, 1.2}, {100.0, 1.25}};
    t.origin.source = "sample manual";
    t.origin.status = "invented for a test";
    return t;
}

TEST(Rational, SiFormByHand) {
    // Q = C i A / 360: 0.5 x 100 mm/h x 10 ha / 360.
    const auto r = h::rational_peak_m3_s(0.5, 1.0, 100.0, u::ha_to_m2(10.0), System::si);
    EXPECT_NEAR(r.value, 0.5 * 100.0 * 10.0 / 360.0, 1e-12);
    EXPECT_EQ(catchpeak::test::text(r.lines.lines().back()).symbols,
              "Q = Cf C i A / 360 (i mm/h, A ha)");
    EXPECT_EQ(r.lines.warning_count(), 0u);
}

TEST(Rational, UsFormShowsTheExactAcreInchFactorAsItsOwnLine) {
    // 0.5 x 2 in/h x 10 ac = 10 ac-in/h = 10 x 43560 ft2 x 1/12 ft / 3600 s = 10.0833 ft3/s
    // (exact conversion; issue 17: the rounded 1.008 gave 10.08).
    const auto r = h::rational_peak_m3_s(0.5, 1.0, u::in_per_h_to_mm_per_h(2.0),
                                         u::acre_to_m2(10.0), System::us_customary);
    const auto &lines = r.lines.lines();
    ASSERT_GE(lines.size(), 3u);
    EXPECT_EQ(catchpeak::test::text(lines[lines.size() - 2]).unit, "ac-in/h");
    EXPECT_NEAR(lines[lines.size() - 2].value(), 10.0, 1e-9);
    EXPECT_EQ(catchpeak::test::text(lines.back()).unit, "ft3/s");
    EXPECT_EQ(catchpeak::test::text(lines.back()).numbers, "Q = 10.00 x 43560/43200");
    EXPECT_NEAR(u::m3s_to_cfs(r.value), 10.0 * 43560.0 / 43200.0, 1e-9);
}

TEST(Rational, UsAndSiSheetsGiveTheSamePeak) {
    // Both forms use exact conversions (1 acre-in/h = 43560/12/3600 ft3/s; 1 mm/h on 1 ha =
    // 1/360 m3/s), so the peaks agree to floating point (issue 17: the US form used 1.008 and
    // was 0.033 % low).
    const double a = u::ha_to_m2(20.0);
    const double us = h::rational_peak_m3_s(0.6, 1.0, 80.0, a, System::us_customary).value;
    const double si = h::rational_peak_m3_s(0.6, 1.0, 80.0, a, System::si).value;
    EXPECT_NEAR(us / si, 1.0, 1e-12);
}

TEST(Rational, CfCIsCappedAtOne) {
    const auto r = h::rational_peak_m3_s(0.95, 1.25, 100.0, u::ha_to_m2(1.0), System::si);
    EXPECT_NEAR(r.value, 1.0 * 100.0 * 1.0 / 360.0, 1e-12);
    const auto &capped = catchpeak::test::line_keyed(r.lines, "rational.cf_c_capped");
    EXPECT_TRUE(capped.flags.capped);
    EXPECT_NE(catchpeak::test::text(capped).label.find("capped"), std::string::npos);
    EXPECT_DOUBLE_EQ(capped.value(), 1.0);
    const auto uncapped = h::rational_peak_m3_s(0.5, 1.25, 100.0, u::ha_to_m2(1.0), System::si);
    EXPECT_EQ(uncapped.lines.size(), 2u);
}

TEST(Rational, AreaLimitWarningIsASetting) {
    EXPECT_EQ(
        h::rational_peak_m3_s(0.5, 1.0, 50.0, u::ha_to_m2(81.0), System::si).lines.warning_count(),
        1u);
    EXPECT_EQ(
        h::rational_peak_m3_s(0.5, 1.0, 50.0, u::ha_to_m2(79.0), System::si).lines.warning_count(),
        0u);
    EXPECT_EQ(h::rational_peak_m3_s(0.5, 1.0, 50.0, u::acre_to_m2(199.0), System::us_customary)
                  .lines.warning_count(),
              0u);
    EXPECT_EQ(h::rational_peak_m3_s(0.5, 1.0, 50.0, u::acre_to_m2(201.0), System::us_customary)
                  .lines.warning_count(),
              1u);
    h::RationalSettings s;
    s.max_area_m2 = u::ha_to_m2(40.0);
    EXPECT_EQ(h::rational_peak_m3_s(0.5, 1.0, 50.0, u::ha_to_m2(50.0), System::si, s)
                  .lines.warning_count(),
              1u);
}

TEST(Rational, RefusesBadInput) {
    try {
        (void)h::rational_peak_m3_s(1.2, 1.0, 50.0, 1e4, System::si);
        FAIL() << "no InputError";
    } catch (const InputError &e) {
        const std::string m = e.what();
        EXPECT_NE(m.find("runoff coefficient C"), std::string::npos) << m;
        EXPECT_NE(m.find("1.2"), std::string::npos) << m;
        EXPECT_NE(m.find("0 < C <= 1"), std::string::npos) << m;
    }
    EXPECT_THROW((void)h::rational_peak_m3_s(0.0, 1.0, 50.0, 1e4, System::si), InputError);
    EXPECT_THROW((void)h::rational_peak_m3_s(0.5, 0.9, 50.0, 1e4, System::si), InputError);
    EXPECT_THROW((void)h::rational_peak_m3_s(0.5, 1.0, 0.0, 1e4, System::si), InputError);
    EXPECT_THROW((void)h::rational_peak_m3_s(0.5, 1.0, 50.0, -1.0, System::si), InputError);
}

TEST(FrequencyFactor, ListedNextLongerAndBeyond) {
    const auto t = sample_table();
    EXPECT_DOUBLE_EQ(h::frequency_factor(t, 25.0).value, 1.1);
    EXPECT_DOUBLE_EQ(h::frequency_factor(t, 30.0).value, 1.2); // next longer: the larger factor
    EXPECT_DOUBLE_EQ(h::frequency_factor(t, 2.0).value, 1.0);
    EXPECT_DOUBLE_EQ(h::frequency_factor(t, 500.0).value, 1.25);
    const auto l = h::frequency_factor(t, 30.0).lines.lines().front();
    EXPECT_NE(catchpeak::test::text(l).source.find("invented for a test"), std::string::npos);
    EXPECT_NE(catchpeak::test::text(l).numbers.find("not listed"), std::string::npos);
    EXPECT_THROW((void)h::frequency_factor(h::FrequencyFactorTable{}, 10.0), InputError);
    EXPECT_THROW((void)h::frequency_factor(t, 0.0), InputError);
}

} // namespace
