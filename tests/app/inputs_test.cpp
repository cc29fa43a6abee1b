// SPDX-License-Identifier: MIT
#include "catchpeak/app/inputs.hpp"

#include "catchpeak/core/error.hpp"
#include "support/test_project.hpp"

#include <gtest/gtest.h>

#include <string>

using namespace catchpeak::app;
namespace fs = std::filesystem;

using catchpeak::test::write_file;

TEST(CatchmentTable, ConvertsUnitsFromColumnNames) {
    const auto dir = catchpeak::test::scratch_dir("catchment_units");
    const auto f = dir / "c.csv";
    write_file(f, "id,area_ac,length_ft,relief_ft,c,cn,tc_min\n"
                  "A,2.5,1000,20,0.4,,\n"
                  "B,1,500,,0.9,98,7\n");
    // Row B has no relief: the file is rejected, naming line 3 and the column.
    try {
        (void)read_catchment_table(f);
        FAIL() << "expected an InputError";
    } catch (const catchpeak::InputError &e) {
        EXPECT_NE(std::string(e.what()).find("c.csv:3: column 'relief_ft'"), std::string::npos)
            << e.what();
    }
    write_file(f, "id,area_ac,length_ft,slope_percent,c,cn,tc_min\n"
                  "A,2.5,1000,2,0.4,,\n"
                  "B,1,500,1,0.9,98,7\n");
    const auto rows = read_catchment_table(f);
    ASSERT_EQ(rows.size(), 2u);
    // 1 acre = 4046.8564224 m2 and 1 ft = 0.3048 m exactly (NIST SP 811).
    EXPECT_DOUBLE_EQ(rows[0].area_m2, 2.5 * 4046.8564224);
    EXPECT_DOUBLE_EQ(rows[0].longest_flow_path_m, 304.8);
    EXPECT_DOUBLE_EQ(rows[0].slope, 0.02);
    EXPECT_FALSE(rows[0].cn.has_value());
    EXPECT_EQ(rows[1].cn, 98.0);
    EXPECT_EQ(rows[1].tc_min, 7.0);
    EXPECT_EQ(rows[1].line, 3u);
}

TEST(CatchmentTable, RejectsAMissingAreaColumn) {
    const auto dir = catchpeak::test::scratch_dir("catchment_no_area");
    const auto f = dir / "c.csv";
    write_file(f, "id,length_m,relief_m\nA,100,2\n");
    try {
        (void)read_catchment_table(f);
        FAIL() << "expected an InputError";
    } catch (const catchpeak::InputError &e) {
        EXPECT_NE(std::string(e.what()).find("no column for the area"), std::string::npos)
            << e.what();
    }
}

TEST(ConfigDir, HoldsTheFrequencyFactorTable) {
    EXPECT_TRUE(fs::exists(config_dir() / "rational_frequency_factors.csv")) << config_dir();
}
