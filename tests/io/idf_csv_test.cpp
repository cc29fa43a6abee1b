// SPDX-License-Identifier: MIT
#include "catchpeak/io/idf_csv.hpp"
#include "support/calc_lines.hpp"
#include "support/input_error.hpp"

#include "catchpeak/core/error.hpp"

#include "support/test_env.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <string>

using catchpeak::InputError;
using catchpeak::parse_csv;
using catchpeak::io::idf_from_csv;
using catchpeak::units::System;

namespace {

const char *table_mm = "# name: test table\n"
                       "# unit: mm/h\n"
                       "duration_min,2,10\n"
                       "5,100,150\n"
                       "10,80,120\n"
                       "60,30,45\n";

} // namespace

TEST(IdfCsv, ReadsTheTableForm) {
    const auto idf = idf_from_csv(parse_csv(table_mm, "rain.csv"));
    EXPECT_EQ(idf.name(), "test table");
    EXPECT_TRUE(idf.is_table());
    EXPECT_EQ(idf.return_periods_yr(), (std::vector<double>{2.0, 10.0}));
    EXPECT_DOUBLE_EQ(idf.intensity_mm_per_h(10.0, 10.0), 120.0);
    EXPECT_DOUBLE_EQ(idf.intensity_mm_per_h(60.0, 2.0), 30.0);
}

TEST(IdfCsv, ConvertsATableInInchesPerHour) {
    const auto idf = idf_from_csv(parse_csv("# unit: in/h\n"
                                            "duration_min,5,25\n"
                                            "10,4.0,5.5\n"
                                            "30,2.0,2.8\n",
                                            "inches.csv"));
    EXPECT_EQ(idf.name(), "inches"); // the file name without extension
    EXPECT_NEAR(idf.intensity_mm_per_h(10.0, 25.0), 5.5 * 25.4, 1e-12); // 1 in = 25.4 mm
    const auto us = idf.intensity(30.0, 5.0, System::us_customary);
    EXPECT_NEAR(us.lines.lines()[0].value(), 2.0, 1e-12); // shown as given, in in/h
}

TEST(IdfCsv, ReadsTheFormulaForm) {
    const auto idf = idf_from_csv(parse_csv("# name: test formula\n"
                                            "# unit: in/h\n"
                                            "# min_duration_min: 5\n"
                                            "# max_duration_min: 120\n"
                                            "return_period_yr,a,b_min,c\n"
                                            "2,40,8,0.8\n"
                                            "10,60,9,0.8\n",
                                            "formula.csv"));
    EXPECT_FALSE(idf.is_table());
    const double expected_in_h = 60.0 / std::pow(20.0 + 9.0, 0.8); // i = a/(t+b)^c
    EXPECT_NEAR(idf.intensity_mm_per_h(20.0, 10.0), expected_in_h * 25.4, 1e-10);
    EXPECT_EQ(idf.intensity(240.0, 10.0, System::us_customary).lines.warning_count(), 1U);
}

TEST(IdfCsv, ReadsTheSampleFileInConfig) {
    const auto idf =
        catchpeak::io::read_idf_csv(catchpeak::test::source_dir() / "config" / "idf_example.csv");
    EXPECT_EQ(idf.return_periods_yr(), (std::vector<double>{2, 5, 10, 25, 50, 100}));
    // A value printed in the file (row 60 min, column 100 yr).
    EXPECT_DOUBLE_EQ(idf.intensity_mm_per_h(60.0, 100.0), 73.8);
}

TEST(IdfCsv, MessagesNameFileLineAndColumn) {
    // Intensity that grows with duration: line 5, column '10'.
    auto msg = catchpeak::test::input_error_of([] {
        (void)idf_from_csv(parse_csv("# unit: mm/h\n"
                                     "duration_min,2,10\n"
                                     "5,100,150\n"
                                     "10,80,120\n"
                                     "60,30,130\n",
                                     "rain.csv"));
    });
    EXPECT_NE(msg.find("rain.csv:5: column '10'"), std::string::npos) << msg;
    EXPECT_NE(msg.find("not less than 120.0 mm/h"), std::string::npos) << msg;

    // Intensity that falls with return period: line 3, column '10'.
    msg = catchpeak::test::input_error_of([] {
        (void)idf_from_csv(parse_csv("# unit: mm/h\nduration_min,2,10\n5,100,90\n", "rain.csv"));
    });
    EXPECT_NE(msg.find("rain.csv:3: column '10'"), std::string::npos) << msg;
    EXPECT_NE(msg.find("not greater than 100.0 mm/h"), std::string::npos) << msg;

    // Not a number.
    msg = catchpeak::test::input_error_of(
        [] { (void)idf_from_csv(parse_csv("# unit: mm/h\nduration_min,2\n5,abc\n", "rain.csv")); });
    EXPECT_NE(msg.find("rain.csv:3: column '2'"), std::string::npos) << msg;
    EXPECT_NE(msg.find("'abc' is not a number"), std::string::npos) << msg;

    // Negative intensity.
    msg = catchpeak::test::input_error_of(
        [] { (void)idf_from_csv(parse_csv("# unit: mm/h\nduration_min,2\n5,-3\n", "rain.csv")); });
    EXPECT_NE(msg.find("rain.csv:3: column '2': intensity -3.000 is not positive"),
              std::string::npos)
        << msg;

    // Durations out of order.
    msg = catchpeak::test::input_error_of([] {
        (void)idf_from_csv(parse_csv("# unit: mm/h\nduration_min,2\n10,50\n5,60\n", "rain.csv"));
    });
    EXPECT_NE(msg.find("rain.csv:4: column 'duration_min': duration 5.000 min after 10.00 min"),
              std::string::npos)
        << msg;

    // A return period header that is not a number.
    msg = catchpeak::test::input_error_of([] {
        (void)idf_from_csv(parse_csv("# unit: mm/h\nduration_min,2,ten\n5,50,60\n", "rain.csv"));
    });
    EXPECT_NE(msg.find("rain.csv: header, column 3"), std::string::npos) << msg;

    // Missing or unknown unit.
    msg = catchpeak::test::input_error_of(
        [] { (void)idf_from_csv(parse_csv("duration_min,2\n5,50\n", "rain.csv")); });
    EXPECT_NE(msg.find("rain.csv: no '# unit:' line"), std::string::npos) << msg;
    msg = catchpeak::test::input_error_of(
        [] { (void)idf_from_csv(parse_csv("# unit: cm/h\nduration_min,2\n5,50\n", "rain.csv")); });
    EXPECT_NE(msg.find("unit 'cm/h'; accepted: mm/h or in/h"), std::string::npos) << msg;

    // Unknown header.
    msg = catchpeak::test::input_error_of(
        [] { (void)idf_from_csv(parse_csv("# unit: mm/h\nminutes,2\n5,50\n", "rain.csv")); });
    EXPECT_NE(msg.find("header starts with 'minutes'"), std::string::npos) << msg;

    // Formula: constants that do not grow with the return period name the file.
    msg = catchpeak::test::input_error_of([] {
        (void)idf_from_csv(parse_csv("# unit: mm/h\nreturn_period_yr,a,b_min,c\n"
                                     "2,900,10,0.8\n10,800,10,0.8\n",
                                     "formula.csv"));
    });
    EXPECT_NE(msg.find("formula.csv: IDF formula 'formula'"), std::string::npos) << msg;
    EXPECT_NE(msg.find("does not increase with return period"), std::string::npos) << msg;

    // Formula: a negative b names its line and column.
    msg = catchpeak::test::input_error_of([] {
        (void)idf_from_csv(
            parse_csv("# unit: mm/h\nreturn_period_yr,a,b_min,c\n2,900,-1,0.8\n", "formula.csv"));
    });
    EXPECT_NE(msg.find("formula.csv:3: column 'b_min'"), std::string::npos) << msg;
}

TEST(IdfCsv, MissingFileIsAnInputError) {
    EXPECT_THROW((void)catchpeak::io::read_idf_csv(catchpeak::test::source_dir() / "config" /
                                                   "no_such_idf.csv"),
                 InputError);
}
