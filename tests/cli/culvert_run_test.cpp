// SPDX-License-Identifier: MIT
// Culverts in a run: the culvert table read, each culvert checked at the largest peak of its
// design point for every return period, results.json's culvert object, and bad tables refused
// by check with the row and column.
#include "catchpeak/cli/run.hpp"
#include "catchpeak/core/error.hpp"
#include "support/test_project.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <fstream>
#include <string>

namespace {

using catchpeak::ExitCode;
using catchpeak::test::TestProject;

const char *const catchments = "id,area_ha,length_m,relief_m,c,cn\n"
                               "IN-1,8.0,420,6.0,0.55,80\n"
                               "IN-2,1.1,150,3.0,0.55,80\n";
const char *const idf = "# unit: mm/h\n"
                        "duration_min,2,10\n"
                        "5,100,150\n"
                        "10,80,120\n"
                        "60,30,45\n";
const char *const head = "id,shape,diameter_mm,inlet,manning_n,length_m,invert_in_m,"
                         "invert_out_m,hw_d_max\n";

TestProject culvert_project(const std::string &name, const std::string &rows) {
    TestProject p(name);
    p.catchments(catchments).idf(idf);
    p.rainfall.set("return_periods_yr", "[2, 10]");
    p.inputs.text("culvert_table", "culverts.csv");
    p.design.set("culvert_return_period_yr", "10");
    p.with_file("culverts.csv", std::string(head) + rows);
    return p;
}

nlohmann::json read_json(const std::filesystem::path &f) {
    std::ifstream in(f);
    return nlohmann::json::parse(in);
}

TEST(CulvertRun, EachFlowIsTheLargestPeakAndTheDesignFlowPasses) {
    auto p = culvert_project("culvert_run", "IN-1,circular,,concrete_groove_headwall,0.012,25,"
                                            "100.0,99.7,1.5\n");
    const auto r = p.command("run", {"--quiet"});
    ASSERT_EQ(r.code, static_cast<int>(ExitCode::success)) << r.err;
    const auto j = read_json(p.out_dir() / "results.json");
    const auto &points = j.at("design_points");
    ASSERT_EQ(points.size(), 2U);
    ASSERT_TRUE(points[0].contains("culvert"));
    EXPECT_FALSE(points[1].contains("culvert"));
    const auto &c = points[0].at("culvert");
    EXPECT_TRUE(c.at("sized").get<bool>());
    ASSERT_EQ(c.at("cases").size(), 2U);
    for (const auto &k : c.at("cases")) {
        double largest = 0.0;
        for (const auto &pk : points[0].at("peaks")) {
            if (pk.at("return_period_yr") == k.at("return_period_yr")) {
                largest = std::max(largest, pk.at("q_m3_s").get<double>());
            }
        }
        EXPECT_DOUBLE_EQ(k.at("flow_m3_per_s").get<double>(), largest);
        EXPECT_DOUBLE_EQ(k.at("headwater_m").get<double>(),
                         std::max(k.at("inlet_control_headwater_m").get<double>(),
                                  k.at("outlet_control_headwater_m").get<double>()));
        EXPECT_NEAR(k.at("headwater_elevation_m").get<double>(),
                    100.0 + k.at("headwater_m").get<double>(), 1e-9);
    }
    const auto &design = c.at("cases")[1];
    EXPECT_TRUE(design.at("design").get<bool>());
    EXPECT_TRUE(design.at("passes").get<bool>());
    // HW/D <= 1.5 of the chosen diameter.
    EXPECT_LE(design.at("headwater_m").get<double>(), 1.5 * c.at("rise_m").get<double>() + 1e-12);
    // The culvert's lines follow the point's own, numbered on.
    bool found = false;
    for (const auto &l : points[0].at("lines")) {
        found = found || l.at("label") == "Size chosen";
    }
    EXPECT_TRUE(found);
    bool caution = false;
    for (const auto &n : j.at("caution_notes")) {
        caution =
            caution || n.get<std::string>().find("fish and wildlife passage") != std::string::npos;
    }
    EXPECT_TRUE(caution);
}

TEST(CulvertRun, CheckNamesEveryBadCell) {
    auto p = culvert_project("culvert_check",
                             "IN-3,circular,600,concrete_groove_headwal,0.012,25,100,99.7,1.5\n");
    p.design.set("culvert_return_period_yr", "25");
    const auto r = p.command("check");
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::bad_input));
    EXPECT_NE(r.err.find("culverts.csv:2: column 'id'"), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("did you mean 'IN-1'?"), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("did you mean 'concrete_groove_headwall'?"), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("[design] culvert_return_period_yr"), std::string::npos) << r.err;
    EXPECT_FALSE(std::filesystem::exists(p.out_dir() / "results.json"));
}

} // namespace
