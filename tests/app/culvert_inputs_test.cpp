// SPDX-License-Identifier: MIT
// The culvert table: every column read in its unit, every bad cell reported at once with its
// file, line and column, and nothing returned for a row with a problem.
#include "catchpeak/app/culvert_inputs.hpp"

#include "hydraulics/inlet_rows.hpp"
#include "support/test_env.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <string>

namespace catchpeak::app {
namespace {

std::filesystem::path write(const std::string &test, const std::string &text) {
    const auto path = test::scratch_dir(test) / "culverts.csv";
    std::ofstream(path) << text;
    return path;
}

const std::vector<std::string> ids{"CV-1", "CV-2", "IN-1"};

std::vector<CulvertSpec> read(const std::string &test, const std::string &text,
                              project::Problems &problems, bool dem = false) {
    return read_culvert_table(write(test, text), test::hds5_inlets(), ids, dem, problems);
}

bool any_has(const project::Problems &p, const std::string &needle) {
    for (const auto &m : p.list()) {
        if (m.find(needle) != std::string::npos) {
            return true;
        }
    }
    return false;
}

TEST(CulvertTable, ReadsEveryColumnInItsUnit) {
    project::Problems problems;
    const auto rows = read("culvert_units",
                           "id,shape,barrels,diameter_in,span_ft,rise_ft,inlet,manning_n,"
                           "length_ft,invert_in_ft,invert_out_ft,headwater_max_ft,hw_d_max,"
                           "tailwater_ft,crest_ft,crest_length_ft,weir_coefficient_us,"
                           "design_return_period_yr\n"
                           "CV-1,circular,2,36,,,concrete_groove_headwall,0.012,100,500,498,506,"
                           "1.5,1.0,507,200,2.9,25\n"
                           "CV-2,box,,,8,6,box_wingwall_30_75,0.013,80,510,509.2,,1.2,,,,,\n",
                           problems);
    ASSERT_TRUE(problems.empty()) << problems.list().front();
    ASSERT_EQ(rows.size(), 2U);
    const auto &a = rows[0];
    EXPECT_EQ(a.barrels, 2);
    ASSERT_TRUE(a.size);
    EXPECT_NEAR(a.size->rise_m, 0.9144, 1e-12); // 36 in
    EXPECT_NEAR(a.length_m, 30.48, 1e-12);
    EXPECT_NEAR(*a.invert_in_m, 152.4, 1e-9);
    EXPECT_NEAR(*a.limit.elevation_m, 506 * 0.3048, 1e-9);
    EXPECT_DOUBLE_EQ(*a.limit.hw_over_d, 1.5);
    EXPECT_NEAR(*a.tailwater_m, 0.3048, 1e-12);
    ASSERT_TRUE(a.road);
    EXPECT_NEAR(a.road->weir_coefficient_si, 2.9 * std::sqrt(0.3048), 1e-12);
    EXPECT_DOUBLE_EQ(*a.design_return_period_yr, 25.0);
    EXPECT_EQ(a.inlet_row.key, "concrete_groove_headwall");
    const auto &b = rows[1];
    EXPECT_EQ(b.shape, hydraulics::Shape::box);
    EXPECT_EQ(b.barrels, 1);
    ASSERT_TRUE(b.size);
    EXPECT_NEAR(b.size->span_m, 8 * 0.3048, 1e-12);
    EXPECT_FALSE(b.road);
    EXPECT_FALSE(b.limit.elevation_m);
}

// Every bad cell of the table is reported in one go, each with its line and column.
TEST(CulvertTable, EveryProblemAtOnceWithLineAndColumn) {
    project::Problems problems;
    const auto rows = read("culvert_bad",
                           "id,shape,inlet,manning_n,length_m,invert_in_m,invert_out_m,hw_d_max\n"
                           "CV-3,circular,concrete_square_headwall,0.012,30,100,99,1.5\n"
                           "CV-1,oval,concrete_square_headwall,0.012,30,100,99,1.5\n"
                           "CV-2,circular,concrete_groove_headwal,0.5,-3,100,,\n",
                           problems);
    EXPECT_TRUE(rows.empty());
    EXPECT_TRUE(any_has(problems, "culverts.csv:2: column 'id'")) << problems.list().front();
    EXPECT_TRUE(any_has(problems, "(did you mean 'CV-1'?)"));
    EXPECT_TRUE(any_has(problems, "culverts.csv:3: column 'shape'"));
    EXPECT_TRUE(any_has(problems, "(did you mean 'concrete_groove_headwall'?)"));
    EXPECT_TRUE(any_has(problems, "culverts.csv:4: column 'manning_n'"));
    EXPECT_TRUE(any_has(problems, "culverts.csv:4: column 'length_m'"));
    EXPECT_TRUE(any_has(problems, "only one invert"));
    EXPECT_TRUE(any_has(problems, "no headwater limit"));
    EXPECT_GE(problems.size(), 7U);
}

TEST(CulvertTable, InvertsFromTheDemOnlyWhereThereIsOne) {
    const std::string text = "id,shape,inlet,manning_n,length_m,hw_d_max\n"
                             "CV-1,circular,cmp_headwall,0.024,30,1.5\n";
    project::Problems without;
    EXPECT_TRUE(read("culvert_no_dem", text, without, false).empty());
    EXPECT_TRUE(any_has(without, "no DEM"));
    project::Problems with;
    const auto rows = read("culvert_dem", text, with, true);
    EXPECT_TRUE(with.empty());
    ASSERT_EQ(rows.size(), 1U);
    EXPECT_FALSE(rows[0].invert_in_m);
    EXPECT_FALSE(rows[0].size); // to be sized
}

TEST(CulvertTable, ShapeAndInletAndPartsMustAgree) {
    project::Problems problems;
    (void)read("culvert_agree",
               "id,shape,diameter_mm,span_m,inlet,manning_n,length_m,invert_in_m,invert_out_m,"
               "hw_d_max,tailwater_m,channel_n,crest_m\n"
               "CV-1,circular,,2.0,box_wingwall_0,0.012,30,100,99,1.5,0.5,0.03,101\n"
               "CV-2,box,900,,box_wingwall_0,0.012,30,100,99,1.5,,0.03,99\n",
               problems);
    EXPECT_TRUE(any_has(problems, "sized by its diameter"));
    EXPECT_TRUE(any_has(problems, "not an inlet of a circular culvert"));
    EXPECT_TRUE(any_has(problems, "both a tailwater and an outlet channel"));
    EXPECT_TRUE(any_has(problems, "sized by its span and rise"));
    EXPECT_TRUE(any_has(problems, "outlet channel is given in part"));
    EXPECT_TRUE(any_has(problems, "road crest is given in part"));
}

} // namespace
} // namespace catchpeak::app
