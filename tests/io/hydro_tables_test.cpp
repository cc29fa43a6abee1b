// SPDX-License-Identifier: MIT
#include "catchpeak/io/hydro_tables.hpp"

#include "catchpeak/core/error.hpp"

#include "support/test_env.hpp"

#include <gtest/gtest.h>

#include <fstream>
#include <functional>
#include <string>

namespace {

using catchpeak::InputError;
namespace io = catchpeak::io;
namespace h = catchpeak::hydro;

std::filesystem::path write(const std::string &test, const std::string &name,
                            const std::string &text) {
    const auto path = catchpeak::test::scratch_dir(test) / name;
    std::ofstream(path) << text;
    return path;
}

std::string error_of(const std::function<void()> &f) {
    try {
        f();
    } catch (const InputError &e) {
        return e.what();
    }
    return "no InputError";
}

TEST(HydroTables, ShippedFrequencyFactors) {
    const auto t = io::read_frequency_factor_table(catchpeak::test::config_dir() /
                                                   "rational_frequency_factors.csv");
    ASSERT_FALSE(t.rows.empty());
    EXPECT_EQ(t.origin.file, "rational_frequency_factors.csv");
    EXPECT_NE(t.origin.status.find("memory"), std::string::npos);
    // 25/50/100-year: 1.1/1.2/1.25 (many US manuals; value from memory, not checked).
    for (const auto &r : t.rows) {
        if (r.return_period_yr == 25.0) {
            EXPECT_DOUBLE_EQ(r.cf, 1.1);
        }
        if (r.return_period_yr == 100.0) {
            EXPECT_DOUBLE_EQ(r.cf, 1.25);
        }
    }
}

TEST(HydroTables, ShippedPeakCoefficients) {
    const auto t = io::read_peak_coefficient_table(catchpeak::test::config_dir() /
                                                   "tr55_peak_coefficients.csv");
    EXPECT_NE(t.origin.source.find("TR-55"), std::string::npos);
    EXPECT_NE(t.origin.status.find("from memory"), std::string::npos);
    int type_ii = 0;
    for (const auto &r : t.rows) {
        if (r.storm_type == h::StormType::type_ii) {
            ++type_ii;
            if (r.ia_over_p == 0.10) {
                EXPECT_DOUBLE_EQ(r.c0, 2.55323); // TR-55 App. F (memory, REFERENCES 7)
            }
        }
    }
    EXPECT_EQ(type_ii, 6);
}

TEST(HydroTables, ShippedPondFactorsAndUnitHydrograph) {
    const auto dir = catchpeak::test::config_dir();
    const auto p = io::read_pond_factor_table(dir / "tr55_pond_factors.csv");
    ASSERT_EQ(p.rows.size(), 5u);
    EXPECT_DOUBLE_EQ(p.rows.front().fp, 1.0);
    EXPECT_DOUBLE_EQ(p.rows.back().pond_percent, 5.0);
    const auto u =
        io::read_dimensionless_unit_hydrograph(dir / "scs_dimensionless_unit_hydrograph.csv");
    ASSERT_EQ(u.t_over_tp.size(), 33u); // NEH 630 ch. 16 Table 16-1 has 33 ordinates
    EXPECT_DOUBLE_EQ(u.ratio_at(1.0), 1.0);
    EXPECT_DOUBLE_EQ(u.t_over_tp.back(), 5.0);
    EXPECT_NE(u.origin.status.find("checked"), std::string::npos);
}

TEST(HydroTables, RefusesATableWithoutSourceOrStatus) {
    const auto no_source =
        write("no_source", "cf.csv", "# status: x\nreturn_period_yr,cf\n10,1.0\n");
    EXPECT_NE(error_of([&] { (void)io::read_frequency_factor_table(no_source); }).find("source"),
              std::string::npos);
    const auto no_status =
        write("no_status", "cf.csv", "# source: x\nreturn_period_yr,cf\n10,1.0\n");
    EXPECT_NE(error_of([&] { (void)io::read_frequency_factor_table(no_status); }).find("status"),
              std::string::npos);
}

TEST(HydroTables, NamesFileLineColumnValueAndRange) {
    const auto bad_cf = write("bad_cf", "cf.csv",
                              "# source: x\n# status: y\nreturn_period_yr,cf\n10,1.0\n25,0.8\n");
    const auto m = error_of([&] { (void)io::read_frequency_factor_table(bad_cf); });
    EXPECT_NE(m.find("cf.csv:5"), std::string::npos) << m;
    EXPECT_NE(m.find("'cf'"), std::string::npos) << m;
    EXPECT_NE(m.find("0.8"), std::string::npos) << m;
    EXPECT_NE(m.find("1 <= Cf <= 2"), std::string::npos) << m;

    const auto unsorted = write("unsorted", "cf.csv",
                                "# source: x\n# status: y\nreturn_period_yr,cf\n25,1.1\n10,1.0\n");
    EXPECT_NE(error_of([&] { (void)io::read_frequency_factor_table(unsorted); }).find("ascending"),
              std::string::npos);

    const auto bad_type =
        write("bad_type", "peaks.csv",
              "# source: x\n# status: y\nstorm_type,ia_over_p,c0,c1,c2\nV,0.1,2,-0.5,-0.1\n");
    const auto mt = error_of([&] { (void)io::read_peak_coefficient_table(bad_type); });
    EXPECT_NE(mt.find("peaks.csv:4"), std::string::npos) << mt;

    const auto bad_ratio =
        write("bad_ratio", "peaks.csv",
              "# source: x\n# status: y\nstorm_type,ia_over_p,c0,c1,c2\nII,1.5,2,-0.5,-0.1\n");
    EXPECT_THROW((void)io::read_peak_coefficient_table(bad_ratio), InputError);

    const auto bad_fp =
        write("bad_fp", "fp.csv", "# source: x\n# status: y\npond_percent,fp\n0,1.0\n1,1.2\n");
    EXPECT_THROW((void)io::read_pond_factor_table(bad_fp), InputError);

    const auto bad_start =
        write("bad_start", "uh.csv", "# source: x\n# status: y\nt_over_tp,q_over_qp\n0.1,0\n1,1\n");
    EXPECT_NE(
        error_of([&] { (void)io::read_dimensionless_unit_hydrograph(bad_start); }).find("t/tp = 0"),
        std::string::npos);

    const auto missing_col =
        write("missing_col", "fp.csv", "# source: x\n# status: y\npond_percent,factor\n0,1.0\n");
    EXPECT_NE(error_of([&] { (void)io::read_pond_factor_table(missing_col); }).find("fp"),
              std::string::npos);
}

} // namespace
