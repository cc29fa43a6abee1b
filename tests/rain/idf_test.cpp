// SPDX-License-Identifier: MIT
#include "catchpeak/rain/idf.hpp"
#include "support/calc_lines.hpp"
#include "support/input_error.hpp"

#include "catchpeak/core/csv.hpp"
#include "catchpeak/core/error.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <string>

using catchpeak::InputError;
using catchpeak::LineKind;
using catchpeak::rain::Idf;
using catchpeak::rain::IdfFormula;
using catchpeak::rain::IdfTable;
using catchpeak::rain::IntensityUnit;
using catchpeak::units::System;

namespace {

// Floating-point round-off of a few operations (pow, log): relative.
constexpr double rel_eps = 1e-12;

/// An invented table following i = A_T t^-0.6 exactly, so that log-log interpolation between
/// its rows must reproduce the power law at any duration in between (computed from the law).
IdfTable power_law_table() {
    IdfTable t;
    t.name = "power law";
    t.durations_min = {5.0, 10.0, 30.0, 60.0};
    t.return_periods_yr = {2.0, 10.0, 100.0};
    for (double a : {300.0, 450.0, 700.0}) {
        std::vector<double> col;
        for (double d : t.durations_min) {
            col.push_back(a * std::pow(d, -0.6));
        }
        t.intensity_mm_per_h.push_back(col);
    }
    return t;
}

} // namespace

TEST(IdfTable, TableValueAtListedDuration) {
    const Idf idf(power_law_table());
    const auto r = idf.intensity(10.0, 10.0, System::si);
    EXPECT_NEAR(r.value, 450.0 * std::pow(10.0, -0.6), 450.0 * rel_eps);
    ASSERT_EQ(r.lines.size(), 1U);
    EXPECT_EQ(r.lines.lines()[0].key, "idf.table_value");
    EXPECT_EQ(catchpeak::test::text(r.lines.lines()[0]).unit, "mm/h");
    EXPECT_NE(
        catchpeak::test::text(r.lines.lines()[0]).source.find("project input: IDF table power law"),
        std::string::npos);
}

TEST(IdfTable, LogLogInterpolationReproducesAPowerLaw) {
    const Idf idf(power_law_table());
    for (double d : {6.0, 7.5, 20.0, 45.0, 59.0}) {
        const double expected = 700.0 * std::pow(d, -0.6); // computed from the law
        EXPECT_NEAR(idf.intensity_mm_per_h(d, 100.0), expected, expected * 1e-12) << d;
    }
}

TEST(IdfTable, InterpolationLineShowsBracketingValuesInSheetUnits) {
    const Idf idf(power_law_table());
    const auto si = idf.intensity(20.0, 2.0, System::si);
    const auto us = idf.intensity(20.0, 2.0, System::us_customary);
    EXPECT_NEAR(us.value, si.value, si.value * rel_eps); // always mm/h
    ASSERT_EQ(us.lines.size(), 1U);
    const auto &line = catchpeak::test::line_keyed(us.lines, "idf.table_interpolated");
    EXPECT_EQ(catchpeak::test::text(line).unit, "in/h");
    EXPECT_NEAR(line.value(), si.value / 25.4, si.value / 25.4 * rel_eps);
    // The two bracketing table values (10 and 30 min), converted to in/h, are in the line.
    const double i1_in = 300.0 * std::pow(10.0, -0.6) / 25.4;
    const double i2_in = 300.0 * std::pow(30.0, -0.6) / 25.4;
    EXPECT_NE(catchpeak::test::text(line).numbers.find(catchpeak::sig(i1_in)), std::string::npos)
        << catchpeak::test::text(line).numbers;
    EXPECT_NE(catchpeak::test::text(line).numbers.find(catchpeak::sig(i2_in)), std::string::npos)
        << catchpeak::test::text(line).numbers;
    EXPECT_NE(catchpeak::test::text(line).source.find("between 10.00 and 30.00 min"),
              std::string::npos)
        << catchpeak::test::text(line).source;
    // A checker reproduces the value from the numbers shown: i1 (t/t1)^(ln(i2/i1)/ln(t2/t1))
    // with the 4-figure numbers agrees to 4 figures (rounding of the shown values).
    const double i1s = catchpeak::parse_number(catchpeak::sig(i1_in), "i1");
    const double i2s = catchpeak::parse_number(catchpeak::sig(i2_in), "i2");
    const double rechecked = i1s * std::pow(20.0 / 10.0, std::log(i2s / i1s) / std::log(3.0));
    EXPECT_NEAR(rechecked, line.value(), line.value() * 1e-3);
}

TEST(IdfTable, RefusesDurationsOutsideTheTable) {
    const Idf idf(power_law_table());
    const auto msg =
        catchpeak::test::input_error_of([&] { (void)idf.intensity(2.0, 10.0, System::si); });
    EXPECT_NE(msg.find("duration 2.000 min"), std::string::npos) << msg;
    EXPECT_NE(msg.find("5.000 to 60.00 min"), std::string::npos) << msg;
    EXPECT_NE(msg.find("power law"), std::string::npos) << msg;
    EXPECT_THROW((void)idf.intensity(61.0, 10.0, System::si), InputError);
    EXPECT_THROW((void)idf.intensity(0.0, 10.0, System::si), InputError);
}

TEST(IdfTable, MissingReturnPeriodListsTheOnesItHas) {
    const Idf idf(power_law_table());
    const auto msg =
        catchpeak::test::input_error_of([&] { (void)idf.intensity(10.0, 25.0, System::si); });
    EXPECT_NE(msg.find("25.00 yr"), std::string::npos) << msg;
    EXPECT_NE(msg.find("2.000, 10.00, 100.0 yr"), std::string::npos) << msg;
}

TEST(IdfTable, ValidationMessages) {
    {
        auto t = power_law_table();
        t.intensity_mm_per_h[1][2] = -1.0;
        const auto msg = catchpeak::test::input_error_of([&] { Idf idf(t); });
        EXPECT_NE(msg.find("not positive"), std::string::npos) << msg;
        EXPECT_NE(msg.find("30.00 min, 10.00 yr"), std::string::npos) << msg;
    }
    {
        auto t = power_law_table();
        t.intensity_mm_per_h[0][2] = t.intensity_mm_per_h[0][1] * 1.01;
        const auto msg = catchpeak::test::input_error_of([&] { Idf idf(t); });
        EXPECT_NE(msg.find("does not decrease with duration for 2.000 yr"), std::string::npos)
            << msg;
    }
    {
        auto t = power_law_table();
        t.intensity_mm_per_h[2][0] = t.intensity_mm_per_h[1][0];
        const auto msg = catchpeak::test::input_error_of([&] { Idf idf(t); });
        EXPECT_NE(msg.find("does not increase with return period at 5.000 min"), std::string::npos)
            << msg;
    }
    {
        auto t = power_law_table();
        t.durations_min[2] = 10.0;
        const auto msg = catchpeak::test::input_error_of([&] { Idf idf(t); });
        EXPECT_NE(msg.find("durations not strictly increasing"), std::string::npos) << msg;
    }
    {
        auto t = power_law_table();
        t.return_periods_yr[0] = 0.0;
        const auto msg = catchpeak::test::input_error_of([&] { Idf idf(t); });
        EXPECT_NE(msg.find("return period 0 yr is not positive"), std::string::npos) << msg;
    }
    {
        auto t = power_law_table();
        t.intensity_mm_per_h[1].pop_back();
        const auto msg = catchpeak::test::input_error_of([&] { Idf idf(t); });
        EXPECT_NE(msg.find("3 intensities for the 10.00 yr return period but 4 durations"),
                  std::string::npos)
            << msg;
    }
}

namespace {
IdfFormula us_formula() {
    IdfFormula f;
    f.name = "us constants";
    f.unit = IntensityUnit::in_per_h;
    f.constants = {{2.0, 40.0, 8.0, 0.8}, {10.0, 60.0, 9.0, 0.8}};
    f.min_duration_min = 5.0;
    f.max_duration_min = 1440.0;
    return f;
}
} // namespace

TEST(IdfFormula, EvaluatesInTheConstantsUnitAndConverts) {
    const Idf idf(us_formula());
    const double in_h = 60.0 / std::pow(15.0 + 9.0, 0.8); // computed from i = a/(t+b)^c
    const auto us = idf.intensity(15.0, 10.0, System::us_customary);
    EXPECT_NEAR(us.value, in_h * 25.4, in_h * 25.4 * rel_eps);
    ASSERT_EQ(us.lines.size(), 1U); // no conversion line: sheet and constants in in/h
    EXPECT_EQ(catchpeak::test::text(us.lines.lines()[0]).unit, "in/h");
    EXPECT_EQ(catchpeak::test::text(us.lines.lines()[0]).numbers,
              "i = 60.00 / (15.00 + 9.000)^0.8000");

    const auto si = idf.intensity(15.0, 10.0, System::si);
    ASSERT_EQ(si.lines.size(), 2U); // formula in in/h, then the conversion to mm/h
    const auto &to_mm = si.lines.lines()[1];
    EXPECT_EQ(to_mm.key, "idf.to_mm_per_h");
    EXPECT_EQ(catchpeak::test::text(to_mm).unit, "mm/h");
    EXPECT_NEAR(to_mm.value(), in_h * 25.4, in_h * 25.4 * rel_eps);
}

TEST(IdfFormula, WarnsOutsideTheFittedDurations) {
    const Idf idf(us_formula());
    const auto r = idf.intensity(2.0, 2.0, System::us_customary);
    EXPECT_EQ(r.lines.warning_count(), 1U);
    const auto &warning = catchpeak::test::line_keyed(r.lines, "idf.outside_fitted_durations");
    EXPECT_NE(catchpeak::test::text(warning).numbers.find("outside 5.000 to 1440 min"),
              std::string::npos)
        << catchpeak::test::text(warning).numbers;
    EXPECT_EQ(idf.intensity(30.0, 2.0, System::us_customary).lines.warning_count(), 0U);
}

TEST(IdfFormula, ValidationMessages) {
    {
        auto f = us_formula();
        f.constants[1].a = 30.0; // lower than the 2-yr curve everywhere
        const auto msg = catchpeak::test::input_error_of([&] { Idf idf(f); });
        EXPECT_NE(msg.find("does not increase with return period"), std::string::npos) << msg;
        EXPECT_NE(msg.find("IDF formula 'us constants'"), std::string::npos) << msg;
    }
    {
        auto f = us_formula();
        f.constants[0].c = 0.0;
        const auto msg = catchpeak::test::input_error_of([&] { Idf idf(f); });
        EXPECT_NE(msg.find("constants for 2.000 yr: c = 0 is not positive"), std::string::npos)
            << msg;
    }
    {
        auto f = us_formula();
        f.constants[0].b_min = -1.0;
        const auto msg = catchpeak::test::input_error_of([&] { Idf idf(f); });
        EXPECT_NE(msg.find("b = -1.000 min is negative"), std::string::npos) << msg;
    }
    {
        auto f = us_formula();
        const auto msg =
            catchpeak::test::input_error_of([&] { (void)Idf(f).intensity(10.0, 5.0, System::si); });
        EXPECT_NE(msg.find("2.000, 10.00 yr"), std::string::npos) << msg;
    }
}

TEST(Idf, DepthIsIntensityTimesDuration) {
    const Idf idf(power_law_table());
    const double i = 450.0 * std::pow(20.0, -0.6); // computed from the law
    const auto si = idf.depth(20.0, 10.0, System::si);
    EXPECT_NEAR(si.value, i * 20.0 / 60.0, i * rel_eps);
    EXPECT_EQ(catchpeak::test::text(catchpeak::test::line_keyed(si.lines, "idf.depth")).unit, "mm");
    const auto us = idf.depth(20.0, 10.0, System::us_customary);
    EXPECT_NEAR(us.value, si.value, si.value * rel_eps);
    const auto &depth = catchpeak::test::line_keyed(us.lines, "idf.depth");
    EXPECT_EQ(catchpeak::test::text(depth).unit, "in");
    EXPECT_NEAR(depth.value(), si.value / 25.4, si.value * rel_eps);
    EXPECT_EQ(us.lines.size(), 2U); // the intensity line, then the depth line
}
