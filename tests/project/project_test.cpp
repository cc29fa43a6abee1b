// SPDX-License-Identifier: MIT
#include "catchpeak/project/project.hpp"

#include "catchpeak/core/error.hpp"
#include "support/test_project.hpp"

#include <gtest/gtest.h>

#include <string>

using namespace catchpeak::project;

namespace {

Project parse(const std::string &text, Problems &problems) {
    return parse_project(text, "dir/p.toml", problems);
}

std::string all(const Problems &p) {
    std::string s;
    for (const auto &m : p.list()) {
        s += m + "\n";
    }
    return s;
}

} // namespace

TEST(EditDistance, ClassicCases) {
    // Levenshtein distances worked by hand.
    EXPECT_EQ(edit_distance("kitten", "sitting"), 3u);
    EXPECT_EQ(edit_distance("", "abc"), 3u);
    EXPECT_EQ(edit_distance("units", "units"), 0u);
    EXPECT_EQ(edit_distance("unitz", "units"), 1u);
}

TEST(ClosestMatch, SuggestsOnlyLikelyTypos) {
    const std::vector<std::string> keys = {"snap_radius_m", "minimum_tc_min", "units"};
    EXPECT_EQ(closest_match("snap_radius", keys), "snap_radius_m");
    EXPECT_EQ(closest_match("unit", keys), "units");
    EXPECT_EQ(closest_match("colour", keys), "");
}

TEST(Project, TemplateParsesWithoutProblems) {
    Problems problems;
    const Project p = parse(std::string(project_template()), problems);
    EXPECT_TRUE(problems.empty()) << all(problems);
    EXPECT_EQ(p.info.name, "New project");
    ASSERT_TRUE(p.inputs.catchment_table.has_value());
    EXPECT_EQ(p.inputs.catchment_table->resolved, std::filesystem::path("dir/catchments.csv"));
}

TEST(Project, ReadsEveryTable) {
    catchpeak::test::ProjectToml toml;
    toml.project.text("name", "Alder Brook crossing")
        .text("number", "24-117")
        .text("units", "US")
        .text("revision", "B");
    toml.inputs.remove("catchment_table")
        .text("dem", "dem.tif")
        .text("design_points", "points.gpkg")
        .text("id_field", "name")
        .text("land_cover", "land.gpkg")
        .text("soils", "soils.gpkg");
    toml.rainfall.set("return_periods_yr", "[2, 25, 100]")
        .text("storm_type", "II")
        .set("depths_24h_in", "{ \"2\" = 3.0, \"25\" = 5.0, \"100\" = 6.5 }");
    toml.methods.text("tc", "nrcs_lag").set("peak", "[\"rational\", \"tr55_graphical\"]");
    toml.methods_extra = "[[methods.point]]\nid = \"CV-1\"\ntc = \"given\"\ntc_min = 22.5\n";
    toml.settings.set("snap_radius_m", "15").set("minimum_tc_min", "10");
    toml.output.text("folder", "../out");
    const std::string text = toml.toml();
    Problems problems;
    const Project p = parse(text, problems);
    EXPECT_TRUE(problems.empty()) << all(problems);
    EXPECT_EQ(p.info.number, "24-117");
    EXPECT_EQ(p.info.units, catchpeak::units::System::us_customary);
    EXPECT_EQ(p.info.page_size, catchpeak::report::PageSize::letter);
    EXPECT_EQ(p.inputs.id_field, "name");
    EXPECT_EQ(p.inputs.dem->line, 8u);
    EXPECT_EQ(p.rainfall.return_periods_yr, (std::vector<double>{2, 25, 100}));
    // 1 in = 25.4 mm exactly (NIST SP 811): 3.0 in = 76.2 mm.
    EXPECT_DOUBLE_EQ(p.rainfall.depth_24h_mm.at(2.0), 76.2);
    EXPECT_EQ(p.methods.tc_method, catchpeak::TcMethod::nrcs_lag);
    ASSERT_EQ(p.methods.points.size(), 1u);
    EXPECT_EQ(p.methods.points[0].tc_min, 22.5);
    EXPECT_EQ(p.settings.snap_radius_m, 15.0);
    EXPECT_EQ(p.output_dir, std::filesystem::path("dir/../out"));
    EXPECT_TRUE(p.uses_method(catchpeak::PeakMethod::tr55_graphical));
    EXPECT_FALSE(p.uses_method(catchpeak::PeakMethod::scs_unit_hydrograph));
}

TEST(Project, CollectsEveryProblemWithItsLine) {
    const std::string text = R"([project]
name = "x"
unitz = "SI"

[inputs]
catchment_table = 5

[rainfall]
idf = "idf.csv"
return_periods_yr = [2, -1]
)";
    Problems problems;
    (void)parse(text, problems);
    const std::string s = all(problems);
    EXPECT_EQ(problems.size(), 3u) << s;
    EXPECT_NE(s.find("dir/p.toml:3: [project]: unknown key 'unitz' (did you mean 'units'?)"),
              std::string::npos)
        << s;
    EXPECT_NE(s.find("dir/p.toml:6: [inputs] catchment_table: expected a text"), std::string::npos)
        << s;
    EXPECT_NE(s.find("dir/p.toml:10: [rainfall] return_periods_yr: -1 is out of range"),
              std::string::npos)
        << s;
    EXPECT_THROW(problems.throw_if_any(), catchpeak::InputError);
}

TEST(Project, SyntaxErrorNamesLineAndColumn) {
    Problems problems;
    (void)parse("[project]\nname = \"x\"\nunits = SI\n", problems);
    ASSERT_EQ(problems.size(), 1u);
    EXPECT_EQ(problems.list()[0].rfind("dir/p.toml:3:", 0), 0u) << problems.list()[0];
    EXPECT_NE(problems.list()[0].find("not valid TOML"), std::string::npos);
}

TEST(Project, DesignPointsCrsIsReadWithItsLineAndNeedsDesignPoints) {
    Problems problems;
    const Project p = parse(R"([project]
name = "x"

[inputs]
dem = "dem.tif"
design_points = "points.geojson"
design_points_crs = "EPSG:32617"

[rainfall]
idf = "idf.csv"
return_periods_yr = [10]
)",
                            problems);
    EXPECT_TRUE(problems.empty()) << all(problems);
    EXPECT_EQ(p.inputs.design_points_crs, "EPSG:32617");
    EXPECT_EQ(p.inputs.design_points_crs_line, 7u);

    Problems table;
    (void)parse(R"([project]
name = "x"

[inputs]
catchment_table = "catchments.csv"
design_points_crs = "EPSG:32617"

[rainfall]
idf = "idf.csv"
return_periods_yr = [10]
)",
                table);
    EXPECT_NE(all(table).find("dir/p.toml:6: [inputs] design_points_crs"), std::string::npos)
        << all(table);
}

TEST(Project, StormTableIsAPathAndOnlyWithThe24HourStorm) {
    const std::string head = "[project]\nname = \"x\"\n\n[inputs]\ncatchment_table = \"c.csv\"\n\n"
                             "[rainfall]\nidf = \"idf.csv\"\nreturn_periods_yr = [10]\n"
                             "depths_24h_mm = { \"10\" = 100.0 }\n";
    const std::string uh = "\n[methods]\npeak = [\"scs_unit_hydrograph\"]\n";
    Problems ok;
    const Project p = parse(head + "storm_table = \"storms/regional.csv\"\n" + uh, ok);
    EXPECT_TRUE(ok.empty()) << all(ok); // no storm_type needed
    ASSERT_TRUE(p.rainfall.storm_table.has_value());
    EXPECT_EQ(p.rainfall.storm_table->given, "storms/regional.csv");
    EXPECT_EQ(p.rainfall.storm_table->resolved, std::filesystem::path("dir/storms/regional.csv"));
    EXPECT_EQ(p.rainfall.storm_table->line, 11u);

    Problems block;
    (void)parse(head +
                    "storm_table = \"regional.csv\"\ndesign_storm = \"alternating_block\"\n"
                    "storm_duration_min = 60\n" +
                    uh,
                block);
    ASSERT_EQ(block.size(), 1u) << all(block);
    EXPECT_NE(all(block).find("dir/p.toml:11: [rainfall] storm_table"), std::string::npos)
        << all(block);
    EXPECT_NE(all(block).find("alternating block"), std::string::npos) << all(block);

    Problems none; // the unit hydrograph needs a storm type or a storm table
    (void)parse(head + uh, none);
    ASSERT_EQ(none.size(), 1u) << all(none);
    EXPECT_NE(all(none).find("storm_table"), std::string::npos) << all(none);
}

TEST(Project, SnapSettingsAndExpectedAreasAreRead) {
    catchpeak::test::ProjectToml toml;
    toml.inputs.remove("catchment_table").text("dem", "dem.tif").text("design_points", "p.gpkg");
    toml.settings.text("snap", "largest_flow")
        .set("snap_stream_threshold_m2", "5000")
        .set("snap_area_factor", "3")
        .set("expected_area_tolerance_percent", "10");
    toml.methods_extra = "[[methods.point]]\nid = \"A\"\nexpected_area_ac = 2.0\n";
    Problems problems;
    const Project p = parse(toml.toml(), problems);
    EXPECT_TRUE(problems.empty()) << all(problems);
    EXPECT_EQ(p.settings.snap, catchpeak::SnapRule::largest_flow);
    EXPECT_EQ(p.settings.snap_stream_threshold_m2, 5000.0);
    EXPECT_EQ(p.settings.snap_area_factor, 3.0);
    EXPECT_EQ(p.settings.expected_area_tolerance_percent, 10.0);
    ASSERT_EQ(p.methods.points.size(), 1u);
    // 1 acre = 4046.8564224 m2 exactly (international foot, NIST SP 811).
    EXPECT_DOUBLE_EQ(*p.methods.points[0].expected_area_m2, 2.0 * 4046.8564224);
    EXPECT_EQ(p.methods.points[0].expected_area_key, "expected_area_ac");
    // The defaults: nearest_stream, 1 ha, 4, 25 %.
    Problems none;
    const Project d = parse(catchpeak::test::ProjectToml{}.toml(), none);
    EXPECT_EQ(d.settings.snap, catchpeak::SnapRule::nearest_stream);
    EXPECT_EQ(d.settings.snap_stream_threshold_m2, 1.0e4);
    EXPECT_EQ(d.settings.snap_area_factor, 4.0);
    EXPECT_EQ(d.settings.expected_area_tolerance_percent, 25.0);
}

TEST(Project, AnExpectedAreaIsRefusedTwiceOrForATableCatchment) {
    catchpeak::test::ProjectToml toml; // a catchment table project
    toml.methods_extra =
        "[[methods.point]]\nid = \"A\"\nexpected_area_ha = 2.0\nexpected_area_ac = 5.0\n";
    Problems problems;
    (void)parse(toml.toml(), problems);
    const std::string s = all(problems);
    EXPECT_NE(s.find("[methods.point] expected_area_ac: an expected area is given twice"),
              std::string::npos)
        << s;
    EXPECT_NE(s.find("[methods.point] expected_area_ha: an expected area is given for a "
                     "catchment of the catchment table"),
              std::string::npos)
        << s;
}
