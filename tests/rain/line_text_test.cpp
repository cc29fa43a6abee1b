// SPDX-License-Identifier: MIT
// Every calculation line rain builds renders without a template error, in both unit systems:
// IDF lookups (table value, interpolation, formula with its warning and unit conversions,
// depth), both AMS fits (Gumbel and GEV, with every warning and the Gumbel limit of the GEV)
// and both design storms.
#include "catchpeak/rain/design_storm.hpp"
#include "catchpeak/rain/frequency.hpp"
#include "catchpeak/rain/idf.hpp"
#include "support/calc_lines.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <string>
#include <vector>

using catchpeak::CalcLines;
using catchpeak::units::System;
namespace rain = catchpeak::rain;
namespace test = catchpeak::test;

namespace {

constexpr System both_systems[] = {System::si, System::us_customary};

/// An invented series of 25 annual maxima, mm.
const std::vector<double> series25 = {62.0, 48.5, 71.2, 55.0, 90.3, 44.1, 58.7,  66.6, 52.9,
                                      80.4, 47.3, 61.8, 73.5, 50.2, 57.6, 101.9, 45.8, 63.3,
                                      69.0, 54.4, 77.7, 49.9, 59.1, 84.6, 56.2};

/// An invented 10-year table: name, durations (min), return periods (yr), intensities (mm/h).
rain::IdfTable invented_table() {
    return {"invented table",
            {10.0, 20.0, 30.0, 40.0, 50.0},
            {10.0},
            {{120.0, 84.0, 66.0, 54.0, 45.6}}};
}

rain::IdfFormula invented_formula(rain::IntensityUnit unit) {
    rain::IdfFormula f;
    f.name = "invented formula";
    f.unit = unit;
    f.constants = {{10.0, 1500.0, 10.0, 0.8}};
    f.min_duration_min = 5.0;
    f.max_duration_min = 1440.0;
    return f;
}

/// An invented 3-hour distribution whose steepest part (1 h to 2 h) is one table interval.
rain::StormDistribution unchecked_three_hour() {
    return {"invented 3 h",
            {0.0, 1.0, 2.0, 3.0},
            {0.0, 0.2, 0.9, 1.0},
            "invented for the test",
            "not checked (invented)"};
}

/// The series25 with its value 101.9 replaced so that the sample L-skewness is the Gumbel
/// distribution's, tau3 = 2 ln 3 / ln 2 - 3 (c = 0 in Hosking, Wallis & Wood 1985): found by
/// bisection, tau3 being continuous in the value and on either side of it at 80 and 101.9.
std::vector<double> gumbel_skewed_series() {
    const double target = 2.0 * std::log(3.0) / std::log(2.0) - 3.0;
    auto v = series25;
    double lo = 80.0;
    double hi = 101.9;
    for (int i = 0; i < 200; ++i) {
        v[15] = 0.5 * (lo + hi);
        (rain::sample_l_moments(v).tau3 < target ? lo : hi) = v[15];
    }
    return v;
}

/// Every line renders; its text holds no placeholder; it has a label and a source; its key is
/// one of rain's.
void expect_renders(const CalcLines &lines, const std::string &what) {
    ASSERT_FALSE(lines.empty()) << what;
    for (const auto &l : lines.lines()) {
        catchpeak::LineText t;
        ASSERT_NO_THROW(t = test::text(l)) << what << ": " << l.key;
        for (const auto *part : {&t.label, &t.symbols, &t.numbers, &t.unit, &t.source}) {
            EXPECT_EQ(part->find_first_of("{}"), std::string::npos) << what << ": " << *part;
        }
        EXPECT_FALSE(t.label.empty()) << what << ": " << l.key;
        EXPECT_FALSE(t.source.empty()) << what << ": " << l.key;
        const bool rain_key = l.key.rfind("idf.", 0) == 0 || l.key.rfind("ams.", 0) == 0 ||
                              l.key.rfind("storm.", 0) == 0;
        EXPECT_TRUE(rain_key) << what << ": " << l.key;
    }
}

bool has_key(const std::vector<CalcLines> &all, const std::string &key) {
    for (const auto &lines : all) {
        if (lines.has(key)) {
            return true;
        }
    }
    return false;
}

} // namespace

TEST(RainLineText, IdfLookupsRender) {
    const rain::Idf table(invented_table());
    const rain::Idf in_h(invented_formula(rain::IntensityUnit::in_per_h));
    const rain::Idf mm_h(invented_formula(rain::IntensityUnit::mm_per_h));
    std::vector<CalcLines> all;
    for (const auto s : both_systems) {
        all.push_back(table.intensity(20.0, 10.0, s).lines); // a table value
        all.push_back(table.depth(25.0, 10.0, s).lines);     // interpolated, then the depth
        all.push_back(in_h.intensity(2.0, 10.0, s).lines);   // outside the fitted durations
        all.push_back(mm_h.depth(30.0, 10.0, s).lines);
    }
    for (const auto &lines : all) {
        expect_renders(lines, "IDF");
    }
    for (const char *key :
         {"idf.table_value", "idf.table_interpolated", "idf.outside_fitted_durations",
          "idf.formula", "idf.to_mm_per_h", "idf.to_in_per_h", "idf.depth"}) {
        EXPECT_TRUE(has_key(all, key)) << key;
    }
}

TEST(RainLineText, AmsFitsRender) {
    const std::vector<double> twelve(series25.begin(), series25.begin() + 12);
    // A short, strongly skewed invented series: tau3 above 0.5, k still above -1.
    const std::vector<double> skewed = {10.0, 11.0, 12.0, 13.0, 14.0, 15.0,
                                        16.0, 17.0, 18.0, 19.0, 20.0, 200.0};
    const auto gumbel_like = gumbel_skewed_series();
    ASSERT_EQ(rain::gev_from_l_moments(rain::sample_l_moments(gumbel_like)).shape, 0.0);
    std::vector<CalcLines> all;
    for (const auto s : both_systems) {
        for (double t : {2.0, 100.0}) {
            all.push_back(rain::gumbel_depth(series25, t, s).lines);
            all.push_back(rain::gev_depth(series25, t, s).lines);
        }
        all.push_back(rain::gumbel_depth(twelve, 10.0, s).lines);
        all.push_back(rain::gev_depth(skewed, 10.0, s).lines);
        all.push_back(rain::gev_depth(gumbel_like, 10.0, s).lines);
    }
    for (const auto &lines : all) {
        expect_renders(lines, "AMS");
    }
    for (const char *key : {"ams.short_record",
                            "ams.beyond_record",
                            "ams.mean",
                            "ams.standard_deviation",
                            "ams.gumbel_frequency_factor",
                            "ams.gumbel_depth",
                            "ams.pwm_b0",
                            "ams.pwm_b1",
                            "ams.pwm_b2",
                            "ams.l1",
                            "ams.l2",
                            "ams.l3",
                            "ams.tau3",
                            "ams.gev_c",
                            "ams.gev_k",
                            "ams.gev_k_outside_range",
                            "ams.gev_k_zero",
                            "ams.gev_scale_k_zero",
                            "ams.gev_location_k_zero",
                            "ams.gev_gamma",
                            "ams.gev_scale",
                            "ams.gev_location",
                            "ams.non_exceedance",
                            "ams.gev_depth_k_zero",
                            "ams.gev_depth"}) {
        EXPECT_TRUE(has_key(all, key)) << key;
    }
}

TEST(RainLineText, GumbelLimitOfTheGevShowsTheGumbelForms) {
    // With k = 0 the GEV is the Gumbel distribution: alpha = l2 / ln 2, xi = l1 - 0.5772 alpha
    // and x_T = xi - alpha ln(-ln F) (Hosking 1990).
    const auto r = rain::gev_depth(gumbel_skewed_series(), 10.0, System::si);
    EXPECT_EQ(test::text(test::line_keyed(r.lines, "ams.gev_scale_k_zero")).symbols,
              "alpha = l2 / ln 2");
    EXPECT_EQ(test::text(r.lines.lines().back()).symbols, "x_T = xi - alpha ln(-ln F)");
    EXPECT_FALSE(r.lines.has("ams.gev_gamma"));
}

TEST(RainLineText, DesignStormsRender) {
    const rain::Idf table(invented_table());
    const rain::Idf formula(invented_formula(rain::IntensityUnit::mm_per_h));
    // Depth increments 10, 1, 4 mm: not decreasing, so the blocks are reordered.
    rain::IdfTable kinked;
    kinked.name = "kinked";
    kinked.durations_min = {10.0, 20.0, 30.0};
    kinked.return_periods_yr = {10.0};
    kinked.intensity_mm_per_h = {{60.0, 33.0, 30.0}};
    const rain::Idf kinked_idf(kinked);
    std::vector<CalcLines> all;
    for (const auto s : both_systems) {
        all.push_back(rain::storm_hyetograph(unchecked_three_hour(), 80.0, 15.0, s).lines);
        auto own = unchecked_three_hour();
        own.project_file = "storms/regional.csv";
        all.push_back(rain::storm_hyetograph(own, 80.0, 15.0, s).lines);
        all.push_back(rain::alternating_block_hyetograph(table, 50.0, 10.0, 10.0, s).lines);
        all.push_back(rain::alternating_block_hyetograph(formula, 1440.0, 60.0, 10.0, s).lines);
        all.push_back(rain::alternating_block_hyetograph(kinked_idf, 30.0, 10.0, 10.0, s).lines);
    }
    for (const auto &lines : all) {
        expect_renders(lines, "storm");
    }
    for (const char *key :
         {"storm.distribution", "storm.distribution_project", "storm.not_checked", "storm.depth",
          "storm.time_step", "storm.largest_step", "storm.peak_intensity",
          "storm.alternating_block", "storm.block_first", "storm.block", "storm.other_blocks",
          "storm.block_total", "storm.blocks_reordered", "storm.block_peak_intensity"}) {
        EXPECT_TRUE(has_key(all, key)) << key;
    }
}
