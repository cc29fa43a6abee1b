// SPDX-License-Identifier: MIT
#include "catchpeak/rain/design_storm.hpp"
#include "support/input_error.hpp"

#include "catchpeak/core/error.hpp"
#include "support/calc_lines.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <string>
#include <vector>

using catchpeak::InputError;
using catchpeak::test::line_keyed;
using catchpeak::test::line_labelled;
using catchpeak::units::System;
namespace rain = catchpeak::rain;

namespace {

// Round-off of sums of a few hundred terms: relative.
constexpr double rel_eps = 1e-12;

/// An invented 6-hour distribution.
rain::StormDistribution six_hour() {
    rain::StormDistribution d;
    d.name = "invented 6 h";
    d.hours = {0.0, 1.0, 2.0, 3.0, 6.0};
    d.cumulative_fraction = {0.0, 0.1, 0.3, 0.8, 1.0};
    d.source = "invented for the test";
    d.status = "checked (invented)";
    return d;
}

rain::Idf formula_idf() {
    rain::IdfFormula f;
    f.name = "invented formula";
    f.unit = rain::IntensityUnit::mm_per_h;
    f.constants = {{10.0, 1500.0, 10.0, 0.8}};
    return rain::Idf(f);
}

} // namespace

TEST(StormDistribution, LinearInterpolation) {
    const auto d = six_hour();
    EXPECT_DOUBLE_EQ(rain::cumulative_fraction_at(d, 2.0), 0.3);
    EXPECT_NEAR(rain::cumulative_fraction_at(d, 2.5), 0.55, 1e-15); // halfway 0.3 -> 0.8
    EXPECT_NEAR(rain::cumulative_fraction_at(d, 4.5), 0.9, 1e-15);  // halfway 0.8 -> 1.0
    EXPECT_DOUBLE_EQ(rain::cumulative_fraction_at(d, 6.0), 1.0);
}

TEST(StormDistribution, ValidationMessages) {
    auto d = six_hour();
    d.cumulative_fraction[2] = 0.05;
    EXPECT_NE(catchpeak::test::input_error_of([&] {
                  rain::validate(d);
              }).find("cumulative fraction decreases from 0.1000 at 1.000 h to 0.05000 at 2.000 h"),
              std::string::npos);
    d = six_hour();
    d.cumulative_fraction.back() = 0.99;
    EXPECT_NE(catchpeak::test::input_error_of([&] {
                  rain::validate(d);
              }).find("the last cumulative fraction is 0.990000"),
              std::string::npos);
    d = six_hour();
    d.hours[0] = 0.5;
    EXPECT_NE(catchpeak::test::input_error_of([&] {
                  rain::validate(d);
              }).find("the first point is (0.5000 h, 0)"),
              std::string::npos);
    d = six_hour();
    d.hours[3] = 2.0;
    EXPECT_NE(catchpeak::test::input_error_of([&] {
                  rain::validate(d);
              }).find("hours not strictly increasing"),
              std::string::npos);
    d = six_hour();
    d.hours.pop_back();
    EXPECT_NE(catchpeak::test::input_error_of([&] {
                  rain::validate(d);
              }).find("4 hours but 5 cumulative fractions"),
              std::string::npos);
}

TEST(StormHyetograph, SumsToTheDepthAndFollowsTheCurve) {
    const auto d = six_hour();
    const double p_mm = 80.0;
    const auto r = rain::storm_hyetograph(d, p_mm, 15.0, System::si);
    ASSERT_EQ(r.value.steps(), 24U);
    EXPECT_DOUBLE_EQ(r.value.step_s, 900.0);
    EXPECT_NEAR(r.value.total_mm(), p_mm, p_mm * rel_eps);
    // Each hour of the table: the cumulative depth equals P F(hour).
    double cum = 0.0;
    for (std::size_t k = 0; k < r.value.steps(); ++k) {
        cum += r.value.depth_mm[k];
        if ((k + 1) % 4 == 0) {
            const double hour = static_cast<double>(k + 1) / 4.0;
            EXPECT_NEAR(cum, p_mm * rain::cumulative_fraction_at(d, hour), p_mm * rel_eps) << hour;
        }
    }
    // The steepest part (2 h to 3 h: 0.5 of P in 1 h) gives the largest step, 0.5 P / 4: the
    // 2-3 h interval's average, which peak_table_interval names (whoever uses the storm decides
    // whether that matters; the hyetograph itself has no warning).
    EXPECT_EQ(r.lines.warning_count(), 0U);
    EXPECT_NEAR(line_keyed(r.lines, "storm.peak_intensity").value(), 0.5 * p_mm, p_mm * rel_eps);
    const auto interval = rain::peak_table_interval(d, r.value);
    ASSERT_TRUE(interval.has_value());
    EXPECT_DOUBLE_EQ(interval->start_h, 2.0);
    EXPECT_DOUBLE_EQ(interval->end_h, 3.0);
}

TEST(StormHyetograph, NoTableIntervalWhenStepsMatchTheTable) {
    const auto d = six_hour();
    const auto r = rain::storm_hyetograph(d, 80.0, 60.0, System::si);
    EXPECT_EQ(r.lines.warning_count(), 0U);
    EXPECT_FALSE(rain::peak_table_interval(d, r.value).has_value());
}

TEST(StormHyetograph, UncheckedTableGivesAWarning) {
    auto d = six_hour();
    d.status = "from memory, not checked";
    const auto r = rain::storm_hyetograph(d, 50.0, 30.0, System::us_customary);
    ASSERT_EQ(r.lines.warning_count(), 1U); // the unchecked table
    EXPECT_NE(catchpeak::test::text(line_keyed(r.lines, "storm.not_checked"))
                  .numbers.find("from memory, not checked"),
              std::string::npos);
    EXPECT_EQ(catchpeak::test::text(line_keyed(r.lines, "storm.peak_intensity")).unit, "in/h");
}

TEST(StormHyetograph, ValidationMessages) {
    const auto d = six_hour();
    EXPECT_NE(catchpeak::test::input_error_of([&] {
                  (void)rain::storm_hyetograph(d, 50.0, 7.0, System::si);
              }).find("time step 7.000 min does not divide the storm duration of 360.0 min"),
              std::string::npos);
    EXPECT_NE(catchpeak::test::input_error_of([&] {
                  (void)rain::storm_hyetograph(d, 0.0, 6.0, System::si);
              }).find("storm depth 0 mm is not positive"),
              std::string::npos);
    EXPECT_NE(catchpeak::test::input_error_of([&] {
                  (void)rain::storm_hyetograph(d, 10.0, -6.0, System::si);
              }).find("time step -6.000 min is not positive"),
              std::string::npos);
}

TEST(AlternatingBlock, PeakBlockAndWindowSumsMatchTheIdf) {
    const auto idf = formula_idf();
    const double dt = 10.0;
    for (std::size_t n : {1U, 5U, 12U}) {
        const double td = dt * static_cast<double>(n);
        const auto r = rain::alternating_block_hyetograph(idf, td, dt, 10.0, System::si);
        ASSERT_EQ(r.value.steps(), n);
        const std::size_t centre = (n - 1) / 2;
        // The peak block is i(dt) dt (Chow et al. 1988, sec. 14.4).
        const double peak = idf.intensity_mm_per_h(dt, 10.0) * dt / 60.0;
        EXPECT_NEAR(r.value.depth_mm[centre], peak, peak * rel_eps);
        // The k blocks placed first (centre, right, left, ...) form the window
        // [centre - (k-1)/2, centre + k/2] and sum to the IDF depth i(k dt) k dt.
        for (std::size_t k = 1; k <= n; ++k) {
            double sum = 0.0;
            for (std::size_t j = centre - (k - 1) / 2; j <= centre + k / 2; ++j) {
                sum += r.value.depth_mm[j];
            }
            const double t = dt * static_cast<double>(k);
            const double depth = idf.intensity_mm_per_h(t, 10.0) * t / 60.0;
            EXPECT_NEAR(sum, depth, depth * rel_eps) << "n " << n << " k " << k;
        }
    }
}

TEST(AlternatingBlock, ReordersIncrementsThatDoNotDecrease) {
    // A table whose depth grows faster between 20 and 30 min than between 10 and 20 min.
    rain::IdfTable t;
    t.name = "kinked";
    t.durations_min = {10.0, 20.0, 30.0};
    t.return_periods_yr = {10.0};
    t.intensity_mm_per_h = {{60.0, 33.0, 30.0}}; // depths 10, 11, 15 mm: increments 10, 1, 4
    const rain::Idf idf(t);
    const auto r = rain::alternating_block_hyetograph(idf, 30.0, 10.0, 10.0, System::si);
    ASSERT_EQ(r.value.steps(), 3U);
    EXPECT_NEAR(r.value.depth_mm[1], 10.0, 1e-12); // centre: the largest
    EXPECT_NEAR(r.value.depth_mm[2], 4.0, 1e-12);  // right of it: the second largest
    EXPECT_NEAR(r.value.depth_mm[0], 1.0, 1e-12);
    EXPECT_EQ(catchpeak::test::text(line_keyed(r.lines, "storm.blocks_reordered")).label,
              "Blocks reordered");
}

TEST(AlternatingBlock, ValidationMessages) {
    const auto idf = formula_idf();
    EXPECT_NE(catchpeak::test::input_error_of([&] {
                  (void)rain::alternating_block_hyetograph(idf, 60.0, 25.0, 10.0, System::si);
              }).find("time step 25.00 min does not divide the storm duration of 60.00 min"),
              std::string::npos);
    rain::IdfTable t;
    t.name = "falling depth";
    t.durations_min = {10.0, 20.0};
    t.return_periods_yr = {10.0};
    t.intensity_mm_per_h = {{60.0, 20.0}}; // depth 10 mm at 10 min, 6.667 mm at 20 min
    const rain::Idf falling(t);
    EXPECT_NE(catchpeak::test::input_error_of([&] {
                  (void)rain::alternating_block_hyetograph(falling, 20.0, 10.0, 10.0, System::si);
              }).find("the IDF depth falls from 10.00 mm at 10.00 min to 6.667 mm at 20.00 min"),
              std::string::npos);
    // A table does not reach 5-min blocks when it starts at 10 min: the Idf's error passes.
    EXPECT_NE(catchpeak::test::input_error_of([&] {
                  (void)rain::alternating_block_hyetograph(falling, 20.0, 5.0, 10.0, System::si);
              }).find("outside the table's durations"),
              std::string::npos);
}

namespace {

/// An invented 10-year IDF table whose depths i t are round numbers:
/// 10 min 120 mm/h (20 mm), 20 min 84 (28 mm), 30 min 66 (33 mm), 40 min 54 (36 mm),
/// 50 min 45.6 (38 mm).
rain::Idf round_depth_idf() {
    rain::IdfTable t;
    t.name = "round depths";
    t.durations_min = {10.0, 20.0, 30.0, 40.0, 50.0};
    t.return_periods_yr = {10.0};
    t.intensity_mm_per_h = {{120.0, 84.0, 66.0, 54.0, 45.6}};
    return rain::Idf(t);
}

} // namespace

// Block depths computed by hand in this test (Chow, Maidment & Mays 1988, sec. 14.4): the depth
// for k blocks is D_k = i(k dt) k dt = 20, 28, 33, 36, 38 mm; the blocks are the differences,
// 20, 8, 5, 3, 2 mm; the largest goes in the centre and the others alternately right and left
// of it. (Chow et al.'s worked example is not used: its values are recalled from memory only,
// not checked, so they are no check.)
TEST(AlternatingBlock, BlockDepthsByHandFromASmallIdf) {
    const auto idf = round_depth_idf();
    // Five blocks of 10 min: centre block 3 (index 2) = 20, right 8, left 5, right 3, left 2.
    const auto five = rain::alternating_block_hyetograph(idf, 50.0, 10.0, 10.0, System::si);
    const std::vector<double> expect5 = {2.0, 5.0, 20.0, 8.0, 3.0};
    ASSERT_EQ(five.value.steps(), expect5.size());
    EXPECT_DOUBLE_EQ(five.value.step_s, 600.0);
    for (std::size_t k = 0; k < expect5.size(); ++k) {
        // 1e-12 mm: floating point of i t / 60 and the differences only.
        EXPECT_NEAR(five.value.depth_mm[k], expect5[k], 1e-12) << "block " << k + 1;
    }
    EXPECT_NEAR(five.value.total_mm(), 38.0, 1e-12);
    // Four blocks (even): the largest in the earlier middle block (index 1), then right 8,
    // left 5, right 3.
    const auto four = rain::alternating_block_hyetograph(idf, 40.0, 10.0, 10.0, System::si);
    const std::vector<double> expect4 = {5.0, 20.0, 8.0, 3.0};
    ASSERT_EQ(four.value.steps(), expect4.size());
    for (std::size_t k = 0; k < expect4.size(); ++k) {
        EXPECT_NEAR(four.value.depth_mm[k], expect4[k], 1e-12) << "block " << k + 1;
    }

    // The sheet's lines: every block's depth with where it is placed, the storm depth and the
    // peak intensity 20 mm / (10/60 h) = 120 mm/h.
    struct Expected {
        std::string label;
        double value;
        std::string numbers; // "" when not compared
    };
    const std::vector<Expected> expected = {
        {"Block depth 1 of 5, placed 20.00 to 30.00 min", 20.0, "dD_1 = 120.0 x 10.00 / 60"},
        {"Block depth 2 of 5, placed 30.00 to 40.00 min", 8.0,
         "dD_2 = 84.00 x 20.00 / 60 - 120.0 x 10.00 / 60"},
        {"Block depth 5 of 5, placed 0 to 10.00 min", 2.0, ""},
        {"Storm depth", 38.0, "D = 45.60 x 50.00 / 60"},
        {"Peak intensity of the design storm", 120.0, "i = 20.00 / (10.00 / 60)"},
    };
    for (const auto &e : expected) {
        const auto *l = line_labelled(five.lines, e.label);
        ASSERT_NE(l, nullptr) << e.label;
        EXPECT_NEAR(l->value(), e.value, 1e-9) << e.label; // floating point only
        if (!e.numbers.empty()) {
            EXPECT_EQ(catchpeak::test::text(*l).numbers, e.numbers);
        }
    }
    // Every line names its source.
    for (const auto &l : five.lines.lines()) {
        EXPECT_FALSE(catchpeak::test::text(l).source.empty()) << catchpeak::test::text(l).label;
    }
}

TEST(AlternatingBlock, LongStormShowsTheFirstBlocksAndANote) {
    // 24 h in 60-min blocks of the invented formula: 24 blocks, more than the sheet lists.
    const auto idf = formula_idf();
    const auto r =
        rain::alternating_block_hyetograph(idf, 1440.0, 60.0, 10.0, System::us_customary);
    ASSERT_EQ(r.value.steps(), 24U);
    std::size_t block_lines = 0;
    for (const auto &l : r.lines.lines()) {
        if (l.key == "storm.block_first" || l.key == "storm.block") {
            ++block_lines;
            EXPECT_EQ(catchpeak::test::text(l).unit, "in");
        }
    }
    EXPECT_EQ(block_lines, 6U);
    EXPECT_EQ(catchpeak::test::text(line_keyed(r.lines, "storm.other_blocks")).label,
              "Other blocks");
    // The storm depth line, in inches: i(1440) x 1440 / 60 h, i = 1500 / (1450)^0.8 mm/h.
    const double depth_in = 1500.0 / std::pow(1450.0, 0.8) * 24.0 / 25.4;
    const auto &total = line_keyed(r.lines, "storm.block_total");
    EXPECT_EQ(catchpeak::test::text(total).label, "Storm depth");
    EXPECT_NEAR(total.value(), depth_in, depth_in * rel_eps);
    EXPECT_NEAR(r.value.total_mm() / 25.4, depth_in, depth_in * 1e-9);
}
