// SPDX-License-Identifier: MIT
// Rainfall: checks against published values and known distributions.
#include "catchpeak/io/storm_table.hpp"
#include "catchpeak/rain/design_storm.hpp"
#include "catchpeak/rain/frequency.hpp"
#include "catchpeak/rain/idf.hpp"
#include "support/calc_lines.hpp"

#include "support/test_env.hpp"

#include <gtest/gtest.h>

#include <array>
#include <cmath>
#include <cstdint>
#include <filesystem>
#include <numbers>
#include <random>
#include <vector>

using catchpeak::units::System;
namespace rain = catchpeak::rain;

// ---------------------------------------------------------------------------------------------
// Gumbel (EV1) frequency factor, Chow, Maidment & Mays (1988), Applied Hydrology, eq. 12.3.8.

TEST(RainReference, GumbelFrequencyFactorChow1988) {
    struct Case {
        double t_yr;
        double k_t;
    };
    // Chow et al. (1988), EV1 frequency factors: value from memory, not checked against the
    // source. Tolerance 0.0005: the values are printed to 3 decimals.
    const std::array<Case, 6> cases{
        {{2.0, -0.164}, {5.0, 0.719}, {10.0, 1.305}, {25.0, 2.044}, {50.0, 2.592}, {100.0, 3.137}}};
    for (const auto &c : cases) {
        EXPECT_NEAR(rain::gumbel_frequency_factor(c.t_yr), c.k_t, 0.0005) << c.t_yr;
        // Computed from eq. 12.3.8 with Euler's constant to full precision: differs from the
        // equation's 0.5772 by 0.78 x 1.6e-5 = 1.2e-5 at most (rounding of the constant).
        const double t = c.t_yr;
        const double full = -std::sqrt(6.0) / std::numbers::pi *
                            (std::numbers::egamma + std::log(std::log(t / (t - 1.0))));
        EXPECT_NEAR(rain::gumbel_frequency_factor(t), full, 1.3e-5) << t;
    }
}

// ---------------------------------------------------------------------------------------------
// NRCS 24-hour distributions: USDA SCS (1973) TP-149, Table 1 (checked primary).

namespace {

struct Point {
    double hour;
    double fraction;
};

// TP-149 Table 1, checked primary. Type II 11.75 h is left out: copies disagree there.
const std::vector<Point> tp149_type_i = {
    {0, 0},       {2, 0.035},  {4, 0.076},    {6, 0.125},  {8, 0.194},    {9, 0.254},
    {9.5, 0.303}, {10, 0.515}, {10.5, 0.583}, {11, 0.624}, {11.5, 0.654}, {12, 0.682},
    {13, 0.727},  {14, 0.767}, {16, 0.830},   {20, 0.926}, {24, 1.0}};
const std::vector<Point> tp149_type_ii = {{0, 0},        {2, 0.022},  {4, 0.048},    {6, 0.080},
                                          {8, 0.120},    {9, 0.147},  {9.5, 0.163},  {10, 0.181},
                                          {10.5, 0.204}, {11, 0.235}, {11.5, 0.283}, {12, 0.663},
                                          {12.5, 0.735}, {13, 0.772}, {13.5, 0.799}, {14, 0.820},
                                          {16, 0.880},   {20, 0.952}, {24, 1.0}};

/// config/ of the source tree. Taken from CATCHPEAK_SOURCE_DIR: with CMake 3.25 only the first
/// variable of the ENVIRONMENT list reaches discovered tests.
std::filesystem::path config_dir() { return catchpeak::test::source_dir() / "config"; }

rain::StormDistribution load(const char *type) {
    return catchpeak::io::read_storm_table(catchpeak::io::nrcs_storm_file(
        config_dir(), catchpeak::hydro::parse_storm_type(type, "test")));
}

} // namespace

TEST(RainReference, Tp149TypeIAndIIAtTheTableHours) {
    for (const auto &[type, table] :
         {std::pair{"I", &tp149_type_i}, std::pair{"II", &tp149_type_ii}}) {
        const auto d = load(type);
        EXPECT_EQ(d.status, "checked (primary)") << type;
        EXPECT_TRUE(rain::is_checked(d));
        for (const auto &p : *table) {
            // Exact: the file holds the printed values, decimals parsed the same way.
            EXPECT_DOUBLE_EQ(rain::cumulative_fraction_at(d, p.hour), p.fraction)
                << "Type " << type << " at " << p.hour << " h";
        }
    }
}

TEST(RainReference, Tp149TypeIIHyetographReachesThePrintedFractions) {
    // A 6-min Type II hyetograph of P = 150 mm (invented depth): the cumulative depth at every
    // TP-149 table hour is P times the printed fraction, and the whole sums to P.
    const auto d = load("II");
    const double p_mm = 150.0;
    const auto r = rain::storm_hyetograph(d, p_mm, 6.0, System::si);
    ASSERT_EQ(r.value.steps(), 240U);
    EXPECT_NEAR(r.value.total_mm(), p_mm, p_mm * 1e-12); // round-off of 240 additions
    for (const auto &p : tp149_type_ii) {
        const auto steps = static_cast<std::size_t>(std::lround(p.hour * 10.0));
        double cum = 0.0;
        for (std::size_t k = 0; k < steps; ++k) {
            cum += r.value.depth_mm[k];
        }
        EXPECT_NEAR(cum, p_mm * p.fraction, p_mm * 1e-12) << p.hour; // round-off
    }
    // The table has points 0.5 h apart around the peak (11.5 to 12 h): the 6-min steps inside
    // get equal depths, and the peak is that interval's average.
    EXPECT_EQ(r.lines.warning_count(), 0U);
    const auto interval = rain::peak_table_interval(d, r.value);
    ASSERT_TRUE(interval.has_value());
    EXPECT_DOUBLE_EQ(interval->start_h, 11.5); // TP-149 Table 1's points around the peak
    EXPECT_DOUBLE_EQ(interval->end_h, 12.0);
    // Largest 6-min step: a fifth of P (0.663 - 0.283), computed from the printed fractions;
    // reported at the first of the five equal steps, 11.5 h.
    const auto &largest = catchpeak::test::line_keyed(r.lines, "storm.largest_step");
    EXPECT_EQ(catchpeak::test::text(largest).label, "Largest step depth");
    EXPECT_NEAR(largest.value(), p_mm * (0.663 - 0.283) / 5.0, p_mm * 1e-12);
    EXPECT_NE(catchpeak::test::text(largest).numbers.find("t1 = 11.50 h"), std::string::npos)
        << catchpeak::test::text(largest).numbers;
}

TEST(RainReference, RecalledTablesCarryTheirStatus) {
    for (const char *type : {"IA", "III"}) {
        const auto d = load(type);
        EXPECT_FALSE(rain::is_checked(d)) << type;
        // One warning for the unchecked table (60-min steps never fall inside a longer table
        // interval around the peak of these tables, so no averaging warning).
        const auto r = rain::storm_hyetograph(d, 100.0, 60.0, System::si);
        EXPECT_EQ(r.lines.warning_count(), 1U);
        EXPECT_EQ(
            catchpeak::test::text(catchpeak::test::line_keyed(r.lines, "storm.not_checked")).label,
            "Storm distribution not checked");
    }
}

// ---------------------------------------------------------------------------------------------
// GEV by L-moments (Hosking 1990; Hosking, Wallis & Wood 1985; Hosking & Wallis 1997).

TEST(RainReference, GevShapeApproximationFromExactLMoments) {
    // Exact GEV L-moments (Hosking 1990; value from memory, not checked against the source):
    // l1 = xi + alpha (1 - G)/k, l2 = alpha (1 - 2^-k) G / k, G = Gamma(1 + k),
    // tau3 = 2 (1 - 3^-k) / (1 - 2^-k) - 3. The approximation of k from tau3 is accurate to
    // about 9e-4 for -0.5 <= tau3 <= 0.5 (value from memory, not checked against the source).
    const double xi = 40.0;
    const double alpha = 10.0;
    for (double k : {-0.4, -0.2, -0.05, 0.05, 0.2, 0.4}) {
        const double g = std::tgamma(1.0 + k);
        rain::SampleLMoments m;
        m.l1 = xi + alpha * (1.0 - g) / k;
        m.l2 = alpha * (1.0 - std::pow(2.0, -k)) * g / k;
        m.tau3 = 2.0 * (1.0 - std::pow(3.0, -k)) / (1.0 - std::pow(2.0, -k)) - 3.0;
        const auto p = rain::gev_from_l_moments(m);
        EXPECT_NEAR(p.shape, k, 9e-4) << k;
        // alpha and xi follow from k; an error of 9e-4 in k moves them by well under 1 %.
        EXPECT_NEAR(p.scale_mm, alpha, alpha * 0.01) << k;
        EXPECT_NEAR(p.location_mm, xi, alpha * 0.01) << k;
    }
}

TEST(RainReference, GevLMomentsRecoverASyntheticSample) {
    // Samples drawn from a GEV with known parameters by the inverse distribution function
    // x = xi + alpha (1 - (-ln u)^k) / k (Hosking 1990), with a fixed-seed generator.
    const double xi = 60.0;
    const double alpha = 15.0;
    const double k = -0.1;
    constexpr std::size_t replicates = 40;
    constexpr std::size_t n = 2000;
    std::mt19937_64 gen(20260101);
    std::vector<double> ks;
    std::vector<double> alphas;
    std::vector<double> xis;
    for (std::size_t r = 0; r < replicates; ++r) {
        std::vector<double> x(n);
        for (auto &v : x) {
            // u in (0, 1) from the top 53 bits; never 0 or 1.
            const double u = (static_cast<double>(gen() >> 11) + 0.5) * 0x1.0p-53;
            v = xi + alpha * (1.0 - std::pow(-std::log(u), k)) / k;
        }
        const auto p = rain::gev_from_l_moments(rain::sample_l_moments(x));
        ks.push_back(p.shape);
        alphas.push_back(p.scale_mm);
        xis.push_back(p.location_mm);
    }
    // Tolerance from the sampling error: the spread of the estimates over the replicates gives
    // the standard error of their mean, sd / sqrt(R); allow 4 of them, plus the accuracy of
    // the k approximation (9e-4, value from memory, not checked against the source) carried
    // into alpha and xi as 1 % of alpha.
    const auto check = [](const std::vector<double> &est, double truth, double extra,
                          const char *what) {
        double mean = 0.0;
        for (double e : est) {
            mean += e;
        }
        mean /= static_cast<double>(est.size());
        double ss = 0.0;
        for (double e : est) {
            ss += (e - mean) * (e - mean);
        }
        const double sd = std::sqrt(ss / static_cast<double>(est.size() - 1));
        const double se = sd / std::sqrt(static_cast<double>(est.size()));
        EXPECT_GT(sd, 0.0) << what;
        EXPECT_NEAR(mean, truth, 4.0 * se + extra) << what << " sd " << sd;
    };
    check(ks, k, 9e-4, "k");
    check(alphas, alpha, 0.01 * alpha, "alpha");
    check(xis, xi, 0.01 * alpha, "xi");
}
