// SPDX-License-Identifier: MIT
#include "catchpeak/rain/frequency.hpp"
#include "support/calc_lines.hpp"
#include "support/input_error.hpp"

#include "catchpeak/core/error.hpp"

#include <boost/math/distributions/extreme_value.hpp>
#include <gtest/gtest.h>

#include <cmath>
#include <numbers>
#include <string>
#include <vector>

using catchpeak::InputError;
using catchpeak::test::line_keyed;
using catchpeak::units::System;
namespace rain = catchpeak::rain;

namespace {

// Round-off of a few sums and logs: relative.
constexpr double rel_eps = 1e-12;

/// An invented series of 25 annual maxima, mm.
const std::vector<double> series25 = {62.0, 48.5, 71.2, 55.0, 90.3, 44.1, 58.7,  66.6, 52.9,
                                      80.4, 47.3, 61.8, 73.5, 50.2, 57.6, 101.9, 45.8, 63.3,
                                      69.0, 54.4, 77.7, 49.9, 59.1, 84.6, 56.2};

double mean_of(const std::vector<double> &v) {
    double s = 0.0;
    for (double x : v) {
        s += x;
    }
    return s / static_cast<double>(v.size());
}

double sd_of(const std::vector<double> &v) {
    const double m = mean_of(v);
    double s = 0.0;
    for (double x : v) {
        s += (x - m) * (x - m);
    }
    return std::sqrt(s / static_cast<double>(v.size() - 1));
}

} // namespace

TEST(Gumbel, DepthIsMeanPlusKTimesS) {
    const double t = 50.0;
    // Computed from Chow et al. (1988) eq. 12.3.8 and x_T = xbar + K_T s.
    const double k =
        -std::sqrt(6.0) / std::numbers::pi * (0.5772 + std::log(std::log(t / (t - 1))));
    const double expected = mean_of(series25) + k * sd_of(series25);
    const auto r = rain::gumbel_depth(series25, t, System::si);
    EXPECT_NEAR(r.value, expected, expected * rel_eps);
    EXPECT_EQ(r.lines.warning_count(), 0U); // 25 years, T = 50 <= 2 x 25
    EXPECT_EQ(catchpeak::test::text(line_keyed(r.lines, "ams.gumbel_depth")).unit, "mm");
}

TEST(Gumbel, AgreesWithBoostExtremeValueQuantile) {
    // Cross-check: the method-of-moments Gumbel with scale sqrt(6) s / pi and location
    // xbar - 0.5772 scale (Chow et al. 1988, sec. 12.2) evaluated with Boost.Math's quantile.
    const double s = sd_of(series25);
    const double scale = std::sqrt(6.0) * s / std::numbers::pi;
    const double location = mean_of(series25) - 0.5772 * scale;
    const boost::math::extreme_value_distribution<double> ev(location, scale);
    for (double t : {2.0, 10.0, 25.0, 50.0}) {
        const double q = boost::math::quantile(ev, 1.0 - 1.0 / t);
        EXPECT_NEAR(rain::gumbel_depth(series25, t, System::si).value, q, q * 1e-10) << t;
    }
}

TEST(Gumbel, UsSheetShowsInches) {
    const auto si = rain::gumbel_depth(series25, 10.0, System::si);
    const auto us = rain::gumbel_depth(series25, 10.0, System::us_customary);
    EXPECT_NEAR(us.value, si.value, si.value * rel_eps);
    const auto &depth = line_keyed(us.lines, "ams.gumbel_depth");
    EXPECT_EQ(catchpeak::test::text(depth).unit, "in");
    EXPECT_NEAR(depth.value(), si.value / 25.4, si.value / 25.4 * rel_eps);
}

TEST(Gumbel, RecordLengthRules) {
    const std::vector<double> nine(series25.begin(), series25.begin() + 9);
    const auto msg =
        catchpeak::test::input_error_of([&] { (void)rain::gumbel_depth(nine, 10.0, System::si); });
    EXPECT_NE(msg.find("9 values"), std::string::npos) << msg;
    EXPECT_NE(msg.find("at least 10 years"), std::string::npos) << msg;
    EXPECT_NE(msg.find("common practice, no source"), std::string::npos) << msg;

    const std::vector<double> twelve(series25.begin(), series25.begin() + 12);
    const auto r = rain::gumbel_depth(twelve, 10.0, System::si);
    ASSERT_EQ(r.lines.warning_count(), 1U);
    EXPECT_NE(catchpeak::test::text(line_keyed(r.lines, "ams.short_record"))
                  .numbers.find("12 years of annual maxima, fewer than 20"),
              std::string::npos);

    const auto far = rain::gumbel_depth(series25, 100.0, System::si);
    ASSERT_EQ(far.lines.warning_count(), 1U);
    EXPECT_NE(catchpeak::test::text(line_keyed(far.lines, "ams.beyond_record"))
                  .numbers.find("more than twice the record length"),
              std::string::npos);
}

TEST(Gumbel, ValidationMessages) {
    EXPECT_NE(catchpeak::test::input_error_of([] {
                  (void)rain::gumbel_frequency_factor(1.0);
              }).find("return period 1.000 yr"),
              std::string::npos);
    auto bad = series25;
    bad[3] = -2.0;
    EXPECT_NE(catchpeak::test::input_error_of([&] {
                  (void)rain::gumbel_depth(bad, 10.0, System::si);
              }).find("value 4 (number 4) is -2.000 mm"),
              std::string::npos);
    const std::vector<double> flat(12, 50.0);
    EXPECT_NE(catchpeak::test::input_error_of([&] {
                  (void)rain::gev_depth(flat, 10.0, System::si);
              }).find("all 12 values are equal"),
              std::string::npos);
}

TEST(SampleLMoments, MatchTheDefinitionOnASmallSample) {
    // Computed by hand from the unbiased PWMs (Hosking 1990) for x = 1, 2, 4, 8:
    // b0 = 15/4, b1 = (0*1 + 1/3*2 + 2/3*4 + 1*8)/4 = 34/12, b2 = (1/3*4 + 1*8)/4 = 28/12,
    // l2 = 2 b1 - b0 = 23/12, l3 = 6 b2 - 6 b1 + b0 = -3 + 15/4 = 3/4, tau3 = 9/23.
    const std::vector<double> x = {8.0, 1.0, 4.0, 2.0};
    const auto m = rain::sample_l_moments(x);
    EXPECT_NEAR(m.l1, 15.0 / 4.0, rel_eps);
    EXPECT_NEAR(m.l2, 23.0 / 12.0, rel_eps);
    EXPECT_NEAR(m.tau3, 9.0 / 23.0, rel_eps);
}

TEST(Gev, QuantileInvertsTheDistributionFunction) {
    // F(x) = exp(-(1 - k (x - xi)/alpha)^(1/k)) (Hosking 1990), evaluated here directly.
    const rain::GevParameters p{50.0, 12.0, -0.1};
    for (double f : {0.1, 0.5, 0.9, 0.99}) {
        const double x = rain::gev_quantile(p, f);
        const double back =
            std::exp(-std::pow(1.0 - p.shape * (x - p.location_mm) / p.scale_mm, 1.0 / p.shape));
        EXPECT_NEAR(back, f, 1e-12) << f;
    }
    const rain::GevParameters g{50.0, 12.0, 0.0};
    EXPECT_NEAR(rain::gev_quantile(g, 0.9), 50.0 - 12.0 * std::log(-std::log(0.9)), 1e-12);
}

TEST(Gev, DepthLinesEndWithTheQuantile) {
    const auto r = rain::gev_depth(series25, 25.0, System::si);
    const auto m = rain::sample_l_moments(series25);
    const auto p = rain::gev_from_l_moments(m);
    EXPECT_NEAR(r.value, rain::gev_quantile(p, 1.0 - 1.0 / 25.0), r.value * rel_eps);
    EXPECT_EQ(r.lines.lines().back().key, "ams.gev_depth");
    EXPECT_EQ(catchpeak::test::text(r.lines.lines().back()).unit, "mm");
    EXPECT_EQ(catchpeak::test::text(r.lines.lines().back()).symbols,
              "x_T = xi + alpha (1 - (-ln F)^k) / k");
    const auto us = rain::gev_depth(series25, 25.0, System::us_customary);
    EXPECT_NEAR(us.value, r.value, r.value * 1e-10);
    EXPECT_NEAR(line_keyed(us.lines, "ams.gev_depth").value(), r.value / 25.4,
                r.value / 25.4 * 1e-10);
}

TEST(Frequency, NegativeNumbersAreShownInParentheses) {
    // K_2 is negative (Chow et al. 1988, eq. 12.3.8: K_T < 0 for T = 2 yr).
    const auto g = rain::gumbel_depth(series25, 2.0, System::si);
    const auto &depth = line_keyed(g.lines, "ams.gumbel_depth");
    EXPECT_NE(catchpeak::test::text(depth).numbers.find("+ (-0.164"), std::string::npos)
        << catchpeak::test::text(depth).numbers;
    // A series with a long upper tail gives k < 0; no line may read "--", "+ -" or "x -".
    std::vector<double> tail_values = series25;
    tail_values[0] = 250.0;
    tail_values[1] = 190.0;
    const std::vector<double> &tail = tail_values;
    for (const auto *series : {&series25, &tail}) {
        const auto r = rain::gev_depth(*series, 10.0, System::si);
        for (const auto &line : r.lines.lines()) {
            EXPECT_EQ(catchpeak::test::text(line).numbers.find("--"), std::string::npos)
                << catchpeak::test::text(line).numbers;
            EXPECT_EQ(catchpeak::test::text(line).numbers.find("+ -"), std::string::npos)
                << catchpeak::test::text(line).numbers;
            EXPECT_EQ(catchpeak::test::text(line).numbers.find("x -"), std::string::npos)
                << catchpeak::test::text(line).numbers;
        }
    }
    const auto p = rain::gev_from_l_moments(rain::sample_l_moments(tail));
    EXPECT_LT(p.shape, 0.0); // the heavy tail the check relies on
}
