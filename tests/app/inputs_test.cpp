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

namespace {

/// The message read_catchment_table gives for a table of one catchment with these columns and
/// values ("" and a test failure when it accepts it).
std::string catchment_table_error(const std::string &header, const std::string &row) {
    const auto f = catchpeak::test::scratch_dir("catchment_bounds") / "catchments.csv";
    write_file(f, header + "\n" + row + "\n");
    try {
        (void)read_catchment_table(f);
    } catch (const catchpeak::InputError &e) {
        return e.what();
    }
    ADD_FAILURE() << "accepted: " << header << " / " << row;
    return {};
}

} // namespace

// A physically impossible area (1e12 ha) ran with exit 0. Bounds: core/limits.hpp (the largest
// river basin, the longest river, the highest summit above the lowest shore, a cliff).
TEST(CatchmentTable, FiguresBeyondPhysicalBoundsAreRefusedWithTheBoundInTheColumnsUnit) {
    struct Case {
        std::string header, row, where, bound;
    };
    const Case cases[] = {
        {"id,area_ha,length_m,slope_m_per_m", "A,1e12,300,0.02", "column 'area_ha'",
         "at most 1e+09 ha"},
        {"id,area_km2,length_m,slope_m_per_m", "A,2e7,300,0.02", "column 'area_km2'",
         "at most 1e+07 km2"},
        {"id,area_ac,length_ft,slope_percent", "A,0,300,2", "column 'area_ac'", "above 0"},
        {"id,area_ha,length_m,slope_m_per_m", "A,2,8e6,0.02", "column 'length_m'",
         "at most 7e+06 m"},
        {"id,area_ha,length_ft,slope_m_per_m", "A,2,-5,0.02", "column 'length_ft'", "above 0"},
        {"id,area_ha,length_m,slope_m_per_m", "A,2,300,11", "column 'slope_m_per_m'",
         "at most 10 m/m"},
        {"id,area_ha,length_m,slope_percent", "A,2,300,1500", "column 'slope_percent'",
         "at most 1000 %"},
        {"id,area_ha,length_m,slope_percent", "A,2,300,0", "column 'slope_percent'", "above 0"},
        {"id,area_ha,length_m,relief_m", "A,2,30000,12000", "column 'relief_m'", "at most 10000 m"},
        {"id,area_ha,length_m,relief_m", "A,2,300,nan", "column 'relief_m'", "finite"},
        // What the given figure implies: a relief of 500 m over 10 m, a slope of 5 m/m over
        // 100 km.
        {"id,area_ha,length_m,relief_m", "A,2,10,500", "catchments.csv:2",
         "a slope of at most 10 m/m"},
        {"id,area_ha,length_m,slope_m_per_m", "A,2,1e5,5", "catchments.csv:2",
         "a relief of at most 10000 m"},
    };
    for (const auto &c : cases) {
        const std::string msg = catchment_table_error(c.header, c.row);
        EXPECT_NE(msg.find(c.where), std::string::npos) << c.row << ": " << msg;
        EXPECT_NE(msg.find(c.bound), std::string::npos) << c.row << ": " << msg;
    }
}

TEST(CatchmentTable, SteepButPossibleSlopesAreAccepted) {
    // 2 m/m (63 degrees) used to be refused as "steeper than 1:1"; it is possible on a rock
    // face, and the tc methods warn outside their ranges.
    const auto f = catchpeak::test::scratch_dir("catchment_steep") / "catchments.csv";
    write_file(f, "id,area_ha,length_m,slope_m_per_m\nA,0.5,50,2\n");
    const auto rows = read_catchment_table(f);
    ASSERT_EQ(rows.size(), 1u);
    EXPECT_DOUBLE_EQ(rows[0].slope, 2.0);
    EXPECT_DOUBLE_EQ(rows[0].relief_m, 100.0);
}

TEST(CatchmentLandTable, APartBeyondThePhysicalBoundIsRefusedWithTheBound) {
    const auto f = catchpeak::test::scratch_dir("land_part_bounds") / "land.csv";
    write_file(f, "id,class,soil_group,area_ha\nA,lawn,B,1e12\n");
    try {
        (void)read_catchment_land_table(f, false);
        FAIL() << "expected an InputError";
    } catch (const catchpeak::InputError &e) {
        const std::string msg = e.what();
        EXPECT_NE(msg.find("land.csv:2: column 'area_ha'"), std::string::npos) << msg;
        EXPECT_NE(msg.find("at most 1e+09 ha"), std::string::npos) << msg;
    }
}

// "CSV UTF-8" from a spreadsheet program: a byte-order mark before 'id' was refused with
// "no column 'id'" while listing `id`.
TEST(CatchmentTable, ACsvWithAByteOrderMarkIsRead) {
    const auto f = catchpeak::test::scratch_dir("catchment_bom") / "catchments.csv";
    write_file(f, "\xEF\xBB\xBFid,area_ha,length_m,slope_m_per_m,c\r\nA,2,300,0.02,0.5\r\n");
    const auto rows = read_catchment_table(f);
    ASSERT_EQ(rows.size(), 1u);
    EXPECT_EQ(rows[0].id, "A");
    EXPECT_EQ(rows[0].c, 0.5);
}

TEST(CatchmentTable, ASemicolonSeparatedCsvIsToldToUseCommas) {
    const auto f = catchpeak::test::scratch_dir("catchment_semicolon") / "catchments.csv";
    write_file(f, "id;area_ha;length_m;slope_m_per_m\nA;2,5;300;0,02\n");
    try {
        (void)read_catchment_table(f);
        FAIL() << "expected an InputError";
    } catch (const catchpeak::InputError &e) {
        const std::string msg = e.what();
        EXPECT_NE(msg.find("catchments.csv:1"), std::string::npos) << msg;
        EXPECT_NE(msg.find("semicolons"), std::string::npos) << msg;
        EXPECT_NE(msg.find("commas"), std::string::npos) << msg;
        EXPECT_EQ(msg.find("no column"), std::string::npos) << msg;
    }
}

// The run itself: 1e12 ha ran with exit 0.
TEST(CatchmentTable, ARunOnAnImpossibleAreaStopsWithExitTwo) {
    catchpeak::test::TestProject p("catchment_bounds_run");
    p.methods.text("tc", "kirpich").set("peak", "[\"rational\"]");
    p.catchments("id,area_ha,length_m,relief_m,c\nA,1e12,500,5,0.45\n");
    p.idf("# unit: mm/h\nduration_min,10\n5,150\n10,120\n60,40\n");
    try {
        (void)p.run_app();
        FAIL() << "expected an InputError";
    } catch (const catchpeak::InputError &e) {
        const std::string msg = e.what();
        EXPECT_NE(msg.find("column 'area_ha'"), std::string::npos) << msg;
        EXPECT_NE(msg.find("at most 1e+09 ha"), std::string::npos) << msg;
    }
    EXPECT_FALSE(fs::exists(p.out_dir() / "results.json"));
}
