// SPDX-License-Identifier: MIT
// A DEM project end to end (`run` as a function): the V valley of dem_project_data.hpp with two
// nested design points and two land-cover classes on soil group B. Areas, C and CN are checked
// against values computed by hand from the geometry and the shipped tables
// (config/land/runoff_coefficients.csv: commercial 0.825, residential_1_4_ac 0.40, midpoints of
// the ASCE ranges; config/land/curve_numbers.csv, TR-55 (1986) Table 2-2a, soil B: commercial 92,
// residential_1_4_ac 75). No expected value was taken from catchpeak's output.
#include "app/dem_project_data.hpp"
#include "catchpeak/app/pipeline.hpp"
#include "catchpeak/app/sha256.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/files.hpp"
#include "catchpeak/report/results_json.hpp"
#include "support/results_json.hpp"
#include "support/test_env.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <fstream>
#include <map>
#include <optional>
#include <sstream>

namespace fs = std::filesystem;
namespace t = catchpeak::test;

// Under LeakSanitizer (asan preset): fontconfig's process-lifetime caches (the sheet is rendered).
extern "C" const char *__lsan_default_suppressions() { return "leak:libfontconfig.so\n"; }

using catchpeak::test::point;
using catchpeak::test::read_json;

namespace {

/// Runs `project` quietly at a fixed run time; returns the output folder.
fs::path run_quiet(const fs::path &project, std::optional<fs::path> out_dir = {}) {
    std::ostringstream out;
    std::ostringstream err;
    catchpeak::app::RunOptions o;
    o.quiet = true;
    o.run_time_utc = "2026-01-01T00:00:00Z";
    o.out_dir = std::move(out_dir);
    return catchpeak::app::run_project(project, o, out, err);
}

} // namespace

TEST(DemProject, AreasCAndCnOfNestedPointsMatchTheHandComputation) {
    using S = t::DemProjectSpec;
    auto dp = t::dem_project("dem_project_hand");
    const auto project = dp.write();
    const fs::path written = run_quiet(project);
    ASSERT_TRUE(fs::exists(written / "results.json"));
    EXPECT_TRUE(fs::exists(written / "catchments.gpkg"));
    EXPECT_TRUE(fs::exists(written / "calculation-sheet.pdf"));
    // The run record holds the SHA-256 of the GeoPackage as written, beside the other outputs.
    const auto record = read_json(written / "run-record.json");
    ASSERT_EQ(record.at("outputs").size(), 4u) << record.dump(1);
    EXPECT_EQ(record.at("outputs").at(0).at("path"), "catchments.gpkg");
    EXPECT_EQ(record.at("outputs").at(0).at("sha256"),
              catchpeak::app::sha256_file(written / "catchments.gpkg"));
    const auto doc = read_json(written / "results.json");

    // Catchment of the axis cell of row r: 31 columns x (r - 4) rows of 100 m2 (see the
    // geometry in dem_project_data.hpp). Cell counts are exact; the tolerance is rounding.
    constexpr double cell_m2 = S::cell_m * S::cell_m;
    const double up_area = 31.0 * (S::upper_row - S::head_row + 1) * cell_m2;   // 62 000 m2
    const double out_area = 31.0 * (S::outlet_row - S::head_row + 1) * cell_m2; // 155 000 m2
    const auto &up = point(doc, "DP-UP");
    const auto &dn = point(doc, "DP-OUT");
    EXPECT_NEAR(up["catchment"]["area_m2"].get<double>(), up_area, 1e-6);
    EXPECT_NEAR(dn["catchment"]["area_m2"].get<double>(), out_area, 1e-6);
    EXPECT_NEAR(dn["catchment"]["local_area_m2"].get<double>(), out_area - up_area, 1e-6);
    EXPECT_EQ(dn["catchment_source"], "dem");
    EXPECT_NEAR(up["snap_distance_m"].get<double>(), 0.0, 1e-9); // given on the axis cell

    // Commercial: rows 5..14 (310 cells) in both catchments; residential: the rest.
    const double com_m2 = 31.0 * (S::split_row - S::head_row) * cell_m2;
    const double c_up = (com_m2 * 0.825 + (up_area - com_m2) * 0.40) / up_area;    // 0.6125
    const double cn_up = (com_m2 * 92.0 + (up_area - com_m2) * 75.0) / up_area;    // 83.5
    const double c_out = (com_m2 * 0.825 + (out_area - com_m2) * 0.40) / out_area; // 0.485
    const double cn_out = (com_m2 * 92.0 + (out_area - com_m2) * 75.0) / out_area; // 78.4
    // Tolerance: GEOS overlay of exact rectangles, rounding only.
    EXPECT_NEAR(up["land"]["c_weighted"].get<double>(), c_up, 1e-9);
    EXPECT_NEAR(up["land"]["cn_weighted"].get<double>(), cn_up, 1e-9);
    EXPECT_NEAR(dn["land"]["c_weighted"].get<double>(), c_out, 1e-9);
    EXPECT_NEAR(dn["land"]["cn_weighted"].get<double>(), cn_out, 1e-9);

    // The Rational peaks use that C (intermediate "c") for both return periods.
    ASSERT_EQ(dn["peaks"].size(), 2u);
    for (const auto &pk : dn["peaks"]) {
        EXPECT_NEAR(pk["intermediates"]["c"].get<double>(), c_out, 1e-9);
        EXPECT_FALSE(pk["line_id"].get<std::string>().empty());
    }
    // The terrain figures are lines with their sources.
    bool d8_line = false;
    for (const auto &l : dn["lines"]) {
        if (l["label"] == "Catchment area") {
            d8_line = d8_line || l["source"].get<std::string>().find("D8") != std::string::npos;
            EXPECT_NEAR(l["value"].get<double>(), out_area / 1e4, 1e-9);
        }
    }
    EXPECT_TRUE(d8_line);
}

TEST(DemProject, CheckValidatesWithoutWritingAnything) {
    auto dp = t::dem_project("dem_project_check");
    const auto &dir = dp.dir();
    const auto project = dp.write();
    std::ostringstream out;
    catchpeak::app::check_project_file(project, out);
    EXPECT_NE(out.str().find("no problems found"), std::string::npos);
    EXPECT_FALSE(fs::exists(dir / "out"));
}

TEST(DemProject, SegmentalTcTakesEachSegmentsSlopeFromTheDem) {
    // The longest flow path of DP-OUT starts on the head row at a ridge cell 15 columns from the
    // axis, runs 15 cells (150 m) across to the axis on the side slope of 2 m per 10 m cell
    // (0.2), then 49 cells (490 m) down the axis at 0.5 m per cell (0.05) to row 54: L = 640 m,
    // a fall of 30 + 24.5 m (geometry of dem_project_data.hpp, computed by hand).
    // Split: sheet flow 0-30.48 m (setting), shallow 30.48-130.48 m (shallow_length_m = 100):
    // both on the side slope, s = 0.2. Channel 130.48-640 m: (0.2 x 19.52 + 0.05 x 490) /
    // 509.52.
    auto dp = t::dem_project("dem_project_segments");
    dp.methods.text("tc", "tr55_segmental");
    dp.rainfall.text("storm_type", "II").set("depths_24h_mm", "{ \"2\" = 80.0, \"10\" = 120.0 }");
    dp.methods_extra = "\n[methods.tr55_segmental]\nshallow_length_m = 100.0\n";
    const auto project = dp.write();

    const fs::path written = run_quiet(project);
    const auto doc = read_json(written / "results.json");
    const auto &p = point(doc, "DP-OUT");
    EXPECT_NEAR(p.at("catchment").at("longest_flow_path_m").get<double>(), 640.0, 1e-9);
    std::map<std::string, double> slope;
    for (const auto &l : p.at("lines")) {
        const std::string label = l.at("label");
        if (label.rfind("Slope, ", 0) == 0 && l.at("kind") == "calculation") {
            slope[label] = l.at("value").get<double>();
        }
    }
    ASSERT_EQ(slope.size(), 3u) << p.at("lines").dump(1);
    // Elevations are float32 in the DEM: about 1e-5 m of rounding on 100-160 m.
    EXPECT_NEAR(slope.at("Slope, sheet flow"), 0.2, 1e-6);
    EXPECT_NEAR(slope.at("Slope, shallow concentrated flow"), 0.2, 1e-6);
    EXPECT_NEAR(slope.at("Slope, channel flow"), (0.2 * 19.52 + 0.05 * 490.0) / 509.52, 1e-6);
}

TEST(DemProject, CoordinatesAreGivenInTheUnitOfTheDemsCrs) {
    // The same valley in a CRS whose unit is the US survey foot (EPSG:2229, NAD83 / California
    // zone 5 (ftUS)): the design point on the axis at column 20 lies at x = 500000 + 20.5 x 10 =
    // 500205 ftUS. Inside, coordinates are metres; the lines give them back in US survey feet.
    t::DemProjectOptions opt;
    opt.dem_crs = "EPSG:2229";
    opt.land_crs = "EPSG:2229";
    opt.points_crs = "EPSG:2229";
    auto dp = t::dem_project("dem_project_feet", opt);
    const auto project = dp.write();
    const fs::path written = run_quiet(project);
    const auto doc = read_json(written / "results.json");
    bool seen = false;
    for (const auto &l : point(doc, "DP-OUT").at("lines")) {
        if (l.at("label") == "Design point as given") {
            const std::string numbers = l.at("numbers");
            EXPECT_EQ(numbers.rfind("x = 500205.00 US ft, y = ", 0), 0u) << numbers;
            seen = true;
        }
    }
    EXPECT_TRUE(seen);
}

TEST(DemProject, ResultsAreTheSameWhateverFolderItRunsFrom) {
    // The lines name input files as the project file gives them, not as resolved from the
    // working folder: a project run by its absolute path and by a relative one gives the same
    // results.json bytes.
    auto dp = t::dem_project("dem_project_cwd");
    const auto &dir = dp.dir();
    const auto project = dp.write();
    (void)run_quiet(fs::absolute(project), dir / "by_absolute");
    const auto before = fs::current_path();
    fs::current_path(dir.parent_path());
    (void)run_quiet(dir.filename() / project.filename(), dir / "by_relative");
    fs::current_path(before);
    const auto a = catchpeak::read_text_file(dir / "by_absolute" / "results.json");
    EXPECT_FALSE(a.empty());
    EXPECT_TRUE(a == catchpeak::read_text_file(dir / "by_relative" / "results.json"));
    EXPECT_EQ(a.find(dir.string()), std::string::npos) << "a path of this machine in the results";
}

namespace {

/// The valley project with one design point given on the cell beside the axis (column 21) at
/// row 24, a snap radius of 15 m (its 8 neighbours) and the snap rule `rule`.
/// Hand computation (geometry of dem_project_data.hpp): a cell d columns east of the axis
/// drains the cells d..15 of its row, 16 - d cells of 100 m2 (cell (21, 24): 1500 m2, (22, r):
/// 1400 m2); the axis cell of row r drains 31 x (r - 4) cells: row 24 62,000 m2, row 25
/// 65,100 m2.
fs::path run_beside_axis(const std::string &scratch, const std::string &rule) {
    using S = t::DemProjectSpec;
    t::DemProjectOptions opt;
    opt.points = {{t::cell_x(S::axis_col + 1), t::cell_y(S::upper_row), "DP-1"}};
    auto dp = t::dem_project(scratch, opt);
    dp.settings.set("snap_radius_m", "15.0").text("snap", rule);
    return run_quiet(dp.write());
}

/// The warning lines of a design point of results.json, by label.
std::vector<std::string> warning_numbers(const nlohmann::json &p, const std::string &label) {
    std::vector<std::string> out;
    for (const auto &l : p.at("lines")) {
        if (l.at("kind") == "warning" && l.at("label") == label) {
            out.push_back(l.at("numbers"));
        }
    }
    return out;
}

} // namespace

TEST(DemProjectSnap, NearestStreamMovesTheCellBesideTheAxisOntoTheAxis) {
    const auto doc =
        read_json(run_beside_axis("dem_snap_nearest", "nearest_stream") / "results.json");
    const auto &p = point(doc, "DP-1");
    // Stream cells (>= 1 ha) within 15 m: the axis cells of rows 23 to 25; the nearest is the
    // axis cell of row 24, 10 m west.
    EXPECT_NEAR(p.at("catchment").at("area_m2").get<double>(), 62000.0, 1e-6);
    EXPECT_NEAR(p.at("snap_distance_m").get<double>(), 10.0, 1e-9);
    const auto &s = p.at("snap");
    EXPECT_EQ(s.at("rule"), "nearest_stream");
    EXPECT_EQ(s.at("direction"), "west");
    EXPECT_NEAR(s.at("given_cell_area_m2").get<double>(), 1500.0, 1e-9);
    EXPECT_NEAR(s.at("snapped_area_m2").get<double>(), 62000.0, 1e-9);
    EXPECT_NEAR(s.at("min_area_within_radius_m2").get<double>(), 1400.0, 1e-9);
    EXPECT_NEAR(s.at("max_area_within_radius_m2").get<double>(), 65100.0, 1e-9);
    EXPECT_FALSE(s.at("no_stream_within_radius").get<bool>());
    // 6.2 ha is more than 4 times 0.15 ha: the move is a warning naming both areas, the
    // distance and the direction.
    const auto grew = warning_numbers(p, "Snapped catchment much larger than at the given point");
    ASSERT_EQ(grew.size(), 1u) << p.at("lines").dump(1);
    EXPECT_NE(grew[0].find("10.00 m to the west"), std::string::npos) << grew[0];
    EXPECT_NE(grew[0].find("6.200 ha"), std::string::npos) << grew[0];
    EXPECT_NE(grew[0].find("0.1500 ha"), std::string::npos) << grew[0];
    EXPECT_NE(grew[0].find("[settings] snap_area_factor"), std::string::npos) << grew[0];
    // The largest within the radius (6.51 ha, the axis a row downstream) is not 4 times the
    // 6.2 ha taken: the point is on the channel, no warning of a larger route nearby (the
    // smallest within the radius, 0.14 ha, is never compared: some cell beside any channel
    // drains almost nothing).
    EXPECT_TRUE(warning_numbers(p, "A much larger flow route within the snap radius").empty());
}

TEST(DemProjectSnap, LargestFlowTakesTheAxisCellDownstream) {
    const auto doc =
        read_json(run_beside_axis("dem_snap_largest", "largest_flow") / "results.json");
    const auto &p = point(doc, "DP-1");
    // The largest accumulation within 15 m: the axis cell of row 25, 14.14 m south-west.
    EXPECT_NEAR(p.at("catchment").at("area_m2").get<double>(), 65100.0, 1e-6);
    EXPECT_NEAR(p.at("snap_distance_m").get<double>(), std::hypot(10.0, 10.0), 1e-9);
    EXPECT_EQ(p.at("snap").at("direction"), "south-west");
    EXPECT_EQ(p.at("snap").at("rule"), "largest_flow");
    const auto grew = warning_numbers(p, "Snapped catchment much larger than at the given point");
    ASSERT_EQ(grew.size(), 1u);
    EXPECT_NE(grew[0].find("to the south-west"), std::string::npos) << grew[0];
}

TEST(DemProjectSnap, NoneKeepsTheCellUnderThePointWithoutTheGrowthWarning) {
    const auto doc = read_json(run_beside_axis("dem_snap_none", "none") / "results.json");
    const auto &p = point(doc, "DP-1");
    EXPECT_NEAR(p.at("catchment").at("area_m2").get<double>(), 1500.0, 1e-6);
    EXPECT_NEAR(p.at("snap_distance_m").get<double>(), 0.0, 1e-9);
    EXPECT_EQ(p.at("snap").at("direction"), "");
    EXPECT_TRUE(
        warning_numbers(p, "Snapped catchment much larger than at the given point").empty());
    // The point keeps a 0.15 ha catchment while the axis within the radius drains 6.51 ha,
    // more than 4 times as much: a warning naming both.
    const auto spread = warning_numbers(p, "A much larger flow route within the snap radius");
    ASSERT_EQ(spread.size(), 1u);
    EXPECT_NE(spread[0].find("6.510 ha"), std::string::npos) << spread[0];
    EXPECT_NE(spread[0].find("0.1500 ha"), std::string::npos) << spread[0];
}

TEST(DemProjectSnap, NoStreamWithinTheRadiusKeepsTheCellWithAWarningNamingTheKeys) {
    // Radius 5 m reaches no other cell centre: the cell beside the axis (0.15 ha) is no
    // stream (< 1 ha), so the point stays there, with a warning.
    using S = t::DemProjectSpec;
    t::DemProjectOptions opt;
    opt.points = {{t::cell_x(S::axis_col + 1), t::cell_y(S::upper_row), "DP-1"}};
    auto dp = t::dem_project("dem_snap_no_stream", opt);
    const auto doc = read_json(run_quiet(dp.write()) / "results.json");
    const auto &p = point(doc, "DP-1");
    EXPECT_NEAR(p.at("catchment").at("area_m2").get<double>(), 1500.0, 1e-6);
    EXPECT_TRUE(p.at("snap").at("no_stream_within_radius").get<bool>());
    const auto w = warning_numbers(p, "No stream cell within the snap radius");
    ASSERT_EQ(w.size(), 1u) << p.at("lines").dump(1);
    EXPECT_NE(w[0].find("[settings] snap_radius_m"), std::string::npos) << w[0];
    EXPECT_NE(w[0].find("[settings] snap_stream_threshold_m2"), std::string::npos) << w[0];
}

TEST(DemProjectSnap, TheSnapFiguresReadBackFromResultsJson) {
    const fs::path out = run_beside_axis("dem_snap_read_back", "nearest_stream");
    const auto r = catchpeak::report::read_results_json(out);
    ASSERT_EQ(r.points.size(), 1u);
    ASSERT_TRUE(r.points[0].snap.has_value());
    const auto &s = *r.points[0].snap;
    EXPECT_EQ(s.rule, catchpeak::SnapRule::nearest_stream);
    EXPECT_NEAR(s.given_cell_area_m2, 1500.0, 1e-9);
    EXPECT_NEAR(s.max_area_within_radius_m2, 65100.0, 1e-9);
    EXPECT_EQ(s.direction, "west");
}
