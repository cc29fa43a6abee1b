// SPDX-License-Identifier: MIT
// The shared ranges (core/limits.hpp) at their boundaries: every reader of a value and the
// hydro function that uses it accept and refuse the same values.
//
// Making them agree changed what is accepted: a catchment table's CN of exactly 30 used to be
// refused (the table took CN in (30, 100]) while the land tables and the hydro functions took
// 30. TR-55 (1986) Tables 2-2a to 2-2c list CN 30 (woods in good condition and meadow on soil
// group A), so every reader now takes CN in [30, 100].
#include "catchpeak/app/inputs.hpp"
#include "catchpeak/core/csv.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/limits.hpp"
#include "catchpeak/hydro/curve_number.hpp"
#include "catchpeak/hydro/rational.hpp"
#include "catchpeak/io/hydro_tables.hpp"
#include "catchpeak/land/tables.hpp"
#include "support/test_project.hpp"

#include <fmt/format.h>
#include <gtest/gtest.h>

#include <fstream>
#include <functional>
#include <string>

namespace {

namespace fs = std::filesystem;
using catchpeak::InputError;
using catchpeak::units::System;

bool accepted(const std::function<void()> &f) {
    try {
        f();
        return true;
    } catch (const InputError &) {
        return false;
    }
}

fs::path write(const std::string &name, const std::string &text) {
    const auto file = catchpeak::test::scratch_dir("limits_agreement") / name;
    catchpeak::test::write_file(file, text);
    return file;
}

bool catchment_table_takes(const std::string &column, double v) {
    const auto f = write("catchments.csv", fmt::format("id,area_ha,length_m,slope_m_per_m,{}\n"
                                                       "A,2,300,0.02,{}\n",
                                                       column, v));
    return accepted([&] { (void)catchpeak::app::read_catchment_table(f); });
}

/// Values at and around the ends of a range: the ends, just inside and just outside.
struct Probe {
    double value;
    bool expected;
};

} // namespace

TEST(LimitsAgreement, CurveNumberAtItsBoundaries) {
    // Accepted: 30 and 100 and what lies between; refused: just below 30, just above 100.
    const Probe probes[] = {{30.0, true},   {100.0, true},   {30.001, true},
                            {99.999, true}, {29.999, false}, {100.001, false}};
    for (const auto &[cn, expected] : probes) {
        EXPECT_EQ(catchpeak::limits::curve_number.contains(cn), expected) << cn;
        EXPECT_EQ(catchment_table_takes("cn", cn), expected) << "catchment table, CN " << cn;
        const std::string row = fmt::format("x,{0},{0},{0},{0}\n", cn);
        EXPECT_EQ(accepted([&] {
                      (void)catchpeak::land::CurveNumberTable::from_csv(
                          catchpeak::parse_csv("class,A,B,C,D\n" + row, "cn.csv"));
                  }),
                  expected)
            << "land table, CN " << cn;
        EXPECT_EQ(accepted([&] { (void)catchpeak::hydro::cn_runoff(100.0, cn, System::si); }),
                  expected)
            << "hydro, CN " << cn;
    }
}

TEST(LimitsAgreement, RunoffCoefficientAtItsBoundaries) {
    // A catchment's C is in (0, 1]: 0 refused (no Rational peak), 1 accepted.
    const Probe probes[] = {
        {1.0, true}, {0.001, true}, {0.999, true}, {0.0, false}, {1.001, false}};
    for (const auto &[c, expected] : probes) {
        EXPECT_EQ(catchment_table_takes("c", c), expected) << "catchment table, C " << c;
        EXPECT_EQ(accepted([&] {
                      (void)catchpeak::hydro::rational_peak_m3_s(c, 1.0, 50.0, 10000.0, System::si);
                  }),
                  expected)
            << "hydro, C " << c;
    }
    // A land-cover class may have C = 0 (it sheds nothing); above 1 is refused alike.
    for (const auto &[c, expected] :
         {Probe{0.0, true}, Probe{1.0, true}, Probe{-0.001, false}, Probe{1.001, false}}) {
        EXPECT_EQ(accepted([&] {
                      (void)catchpeak::land::RunoffCoefficientTable::from_csv(catchpeak::parse_csv(
                          fmt::format("class,soil_group,slope_min_percent,slope_max_percent,"
                                      "c\ngrass,any,,,{}\n",
                                      c),
                          "c.csv"));
                  }),
                  expected)
            << "land table, C " << c;
    }
}

TEST(LimitsAgreement, FrequencyFactorAtItsBoundaries) {
    const Probe probes[] = {{1.0, true}, {2.0, true}, {0.999, false}, {2.001, false}};
    for (const auto &[cf, expected] : probes) {
        const auto f = write("cf.csv", fmt::format("# title: t\n# source: invented\n# status: "
                                                   "invented\nreturn_period_yr,cf\n10,{}\n",
                                                   cf));
        EXPECT_EQ(accepted([&] { (void)catchpeak::io::read_frequency_factor_table(f); }), expected)
            << "table, Cf " << cf;
        EXPECT_EQ(accepted([&] {
                      (void)catchpeak::hydro::rational_peak_m3_s(0.5, cf, 50.0, 10000.0,
                                                                 System::si);
                  }),
                  expected)
            << "hydro, Cf " << cf;
    }
}

namespace {

std::string refusal(const std::function<void()> &f) {
    try {
        f();
    } catch (const InputError &e) {
        return e.what();
    }
    return "(accepted)";
}

} // namespace

// The curve number accepted differed between inputs; every reader and hydro now name one range,
// in the same words (limits::curve_number).
TEST(LimitsAgreement, EveryCurveNumberRefusalNamesTheSameRange) {
    const std::string range = catchpeak::limits::curve_number.accepted("CN");
    EXPECT_NE(range.find("30 <= CN <= 100"), std::string::npos) << range;
    const auto table = write("catchments.csv", "id,area_ha,length_m,slope_m_per_m,cn\n"
                                               "A,2,300,0.02,29\n");
    const std::string messages[] = {
        refusal([&] { (void)catchpeak::app::read_catchment_table(table); }),
        refusal([] {
            (void)catchpeak::land::CurveNumberTable::from_csv(
                catchpeak::parse_csv("class,A,B,C,D\nx,29,40,50,60\n", "cn.csv"));
        }),
        refusal([] { (void)catchpeak::hydro::cn_runoff(100.0, 29.0, System::si); }),
    };
    for (const auto &m : messages) {
        EXPECT_NE(m.find(range), std::string::npos) << m;
        EXPECT_NE(m.find("29"), std::string::npos) << m;
    }
}
