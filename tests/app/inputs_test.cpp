// SPDX-License-Identifier: MIT
#include "catchpeak/app/inputs.hpp"

#include "catchpeak/app/pipeline.hpp"
#include "catchpeak/core/error.hpp"
#include "support/test_env.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <string>

using namespace catchpeak::app;
namespace fs = std::filesystem;

namespace {

fs::path write(const fs::path &dir, const std::string &name, const std::string &text) {
    std::ofstream(dir / name, std::ios::binary) << text;
    return dir / name;
}

} // namespace

TEST(CatchmentTable, ConvertsUnitsFromColumnNames) {
    const auto dir = catchpeak::test::scratch_dir("catchment_units");
    const auto f = write(dir, "c.csv",
                         "id,area_ac,length_ft,relief_ft,c,cn,tc_min\n"
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
    write(dir, "c.csv",
          "id,area_ac,length_ft,slope_percent,c,cn,tc_min\n"
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

TEST(IdfTable, ReadsInchesAndInterpolatesLogLog) {
    const auto dir = catchpeak::test::scratch_dir("idf_read");
    const auto f = write(dir, "idf.csv",
                         "# source: invented test table\n"
                         "duration_min,10yr_in_per_h,100yr_in_per_h\n"
                         "10,4.0,6.0\n"
                         "40,2.0,3.0\n");
    const IdfTable idf = read_idf_table(f);
    ASSERT_EQ(idf.durations_min.size(), 2u);
    // 4.0 in/h = 101.6 mm/h (1 in = 25.4 mm).
    EXPECT_DOUBLE_EQ(idf.intensity_mm_per_h.at(10.0)[0], 101.6);
    // Log-log: halving over a factor 4 in duration is i ~ t^-0.5, so at 20 min
    // i = 4.0 / sqrt(2) in/h = 2.828427 in/h = 71.842 mm/h (computed by hand).
    EXPECT_NEAR(idf_intensity_mm_per_h(idf, 10.0, 20.0), 4.0 / std::sqrt(2.0) * 25.4, 1e-9);
    EXPECT_DOUBLE_EQ(idf_intensity_mm_per_h(idf, 100.0, 40.0), 76.2);
    EXPECT_THROW((void)idf_intensity_mm_per_h(idf, 10.0, 5.0), catchpeak::InputError);
    EXPECT_THROW((void)idf_intensity_mm_per_h(idf, 25.0, 20.0), catchpeak::InputError);
}
