// SPDX-License-Identifier: MIT
// Coordinates and CRSs of a DEM project's layers (the V valley of dem_project_data.hpp, UTM zone
// 33N): every reprojection is a line on the sheet, a GeoJSON file in a projected CRS without a
// "crs" member is refused saying how to declare its CRS, and a layer that does not overlap the
// DEM is refused naming both extents.
#include "app/dem_project_data.hpp"
#include "catchpeak/app/pipeline.hpp"
#include "catchpeak/core/error.hpp"
#include "support/results_json.hpp"
#include "support/test_env.hpp"

#include <fmt/format.h>
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>
#include <ogr_spatialref.h>

#include <memory>
#include <sstream>
#include <string>
#include <vector>

namespace fs = std::filesystem;
namespace t = catchpeak::test;

// The LeakSanitizer suppressions of this test program are in dem_project_test.cpp.

namespace {

using S = t::DemProjectSpec;

fs::path run_quiet(const fs::path &project) {
    std::ostringstream out;
    std::ostringstream err;
    catchpeak::app::RunOptions o;
    o.quiet = true;
    o.run_time_utc = "2026-01-01T00:00:00Z";
    return catchpeak::app::run_project(project, o, out, err);
}

std::string run_error(const fs::path &project) {
    try {
        (void)run_quiet(project);
    } catch (const catchpeak::InputError &e) {
        return e.what();
    }
    ADD_FAILURE() << "the run succeeded";
    return {};
}

/// The design points of the valley (on its axis), in UTM zone 33N.
std::vector<t::PointSpec> valley_points() {
    return {{t::cell_x(S::axis_col), t::cell_y(S::upper_row), "DP-UP"},
            {t::cell_x(S::axis_col), t::cell_y(S::outlet_row), "DP-OUT"}};
}

/// The same points in WGS 84 longitude/latitude (transformed with PROJ: input preparation).
std::vector<t::PointSpec> valley_points_lon_lat() {
    t::gdal_init();
    OGRSpatialReference utm;
    utm.SetFromUserInput("EPSG:32633");
    OGRSpatialReference wgs84;
    wgs84.SetFromUserInput("EPSG:4326");
    wgs84.SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
    std::unique_ptr<OGRCoordinateTransformation> to_wgs84(
        OGRCreateCoordinateTransformation(&utm, &wgs84));
    std::vector<t::PointSpec> out = valley_points();
    for (auto &p : out) {
        EXPECT_TRUE(to_wgs84->Transform(1, &p.x, &p.y));
    }
    return out;
}

/// A GeoJSON FeatureCollection of points without a "crs" member, coordinates as given.
std::string geojson_points(const std::vector<t::PointSpec> &points) {
    std::string features;
    for (const auto &p : points) {
        features += fmt::format("{}{{\"type\":\"Feature\",\"properties\":{{\"id\":\"{}\"}},"
                                "\"geometry\":{{\"type\":\"Point\",\"coordinates\":[{:.6f},{:.6f}]"
                                "}}}}",
                                features.empty() ? "" : ",", p.id, p.x, p.y);
    }
    return "{\"type\":\"FeatureCollection\",\"features\":[" + features + "]}\n";
}

/// The lines of design point `id` whose label is `label`.
std::vector<nlohmann::json> lines_labelled(const fs::path &out, const std::string &id,
                                           const std::string &label) {
    std::vector<nlohmann::json> found;
    const nlohmann::json doc = t::read_json(out / "results.json");
    for (const auto &l : t::point(doc, id).at("lines")) {
        if (l.at("label") == label) {
            found.push_back(l);
        }
    }
    return found;
}

} // namespace

// Design points in EPSG:4326 were reprojected with no note on the sheet.
TEST(DemProjectCrs, EveryReprojectionIsALineNamingBothCrss) {
    auto dp = t::dem_project("dem_crs_lon_lat");
    t::make_points(dp.dir() / "points_wgs84.gpkg", valley_points_lon_lat(), "EPSG:4326");
    dp.inputs.text("design_points", "points_wgs84.gpkg");
    const fs::path out = run_quiet(dp.write());
    for (const std::string id : {"DP-UP", "DP-OUT"}) {
        const auto lines = lines_labelled(out, id, "Layer reprojected to the DEM's CRS");
        ASSERT_EQ(lines.size(), 1u) << id;
        const std::string numbers = lines[0].at("numbers");
        EXPECT_EQ(numbers, "[inputs] design_points 'points_wgs84.gpkg': from WGS 84 to WGS 84 / "
                           "UTM zone 33N")
            << id;
        EXPECT_EQ(lines[0].at("kind"), "note");
    }
    // The points are where they were: DP-OUT drains columns 5..35 x rows 5..54 of 10 m cells,
    // 31 x 50 x 100 m2 = 155,000 m2 (dem_project_data.hpp, by hand).
    const auto doc = t::read_json(out / "results.json");
    EXPECT_DOUBLE_EQ(t::point(doc, "DP-OUT").at("catchment").at("area_m2").get<double>(), 155000.0);
}

TEST(DemProjectCrs, LayersInTheDemsCrsGiveNoReprojectionLine) {
    auto dp = t::dem_project("dem_crs_same");
    const fs::path out = run_quiet(dp.write());
    EXPECT_TRUE(lines_labelled(out, "DP-OUT", "Layer reprojected to the DEM's CRS").empty());
}

// A GeoJSON file in UTM without a "crs" member gave a PROJ error that did not say what to do.
TEST(DemProjectCrs, AGeoJsonInAProjectedCrsWithoutCrsMemberIsToldHowToDeclareIt) {
    auto dp = t::dem_project("dem_crs_geojson");
    t::write_file(dp.dir() / "points.geojson", geojson_points(valley_points()));
    dp.inputs.text("design_points", "points.geojson");
    const std::string msg = run_error(dp.write());
    EXPECT_NE(msg.find("points.geojson"), std::string::npos) << msg;
    EXPECT_NE(msg.find("without a \"crs\" member"), std::string::npos) << msg;
    EXPECT_NE(msg.find("RFC 7946"), std::string::npos) << msg;
    EXPECT_NE(msg.find("x 500205 to 500205"), std::string::npos) << msg;
    EXPECT_NE(msg.find("[inputs] design_points_crs"), std::string::npos) << msg;
    EXPECT_EQ(msg.find("PROJ"), std::string::npos) << msg;

    // Declared, it runs in place: no reprojection (the DEM's CRS), DP-OUT drains 155,000 m2.
    dp.inputs.text("design_points_crs", "EPSG:32633");
    const fs::path out = run_quiet(dp.write());
    EXPECT_TRUE(lines_labelled(out, "DP-OUT", "Layer reprojected to the DEM's CRS").empty());
    const auto doc = t::read_json(out / "results.json");
    EXPECT_DOUBLE_EQ(t::point(doc, "DP-OUT").at("catchment").at("area_m2").get<double>(), 155000.0);
}

TEST(DemProjectCrs, ADeclaredCrsIsNamedInTheReprojectionLine) {
    // Points written in UTM zone 34N coordinates (those of the valley's points) into a GeoJSON
    // without "crs", declared as zone 34N: reprojected to the DEM's zone 33N.
    auto dp = t::dem_project("dem_crs_declared");
    t::gdal_init();
    OGRSpatialReference z33;
    z33.SetFromUserInput("EPSG:32633");
    OGRSpatialReference z34;
    z34.SetFromUserInput("EPSG:32634");
    std::unique_ptr<OGRCoordinateTransformation> to34(
        OGRCreateCoordinateTransformation(&z33, &z34));
    auto pts = valley_points();
    for (auto &p : pts) {
        ASSERT_TRUE(to34->Transform(1, &p.x, &p.y));
    }
    t::write_file(dp.dir() / "points.geojson", geojson_points(pts));
    dp.inputs.text("design_points", "points.geojson").text("design_points_crs", "EPSG:32634");
    const fs::path out = run_quiet(dp.write());
    const auto lines = lines_labelled(out, "DP-OUT", "Layer reprojected to the DEM's CRS");
    ASSERT_EQ(lines.size(), 1u);
    EXPECT_EQ(lines[0].at("numbers"),
              "[inputs] design_points 'points.geojson': from WGS 84 / UTM zone 34N (as [inputs] "
              "design_points_crs declares) to WGS 84 / UTM zone 33N");
}

TEST(DemProjectCrs, ADeclaredCrsThatTheFileContradictsIsRefused) {
    auto dp = t::dem_project("dem_crs_contradicted");
    dp.inputs.text("design_points_crs", "EPSG:32634"); // points.gpkg declares EPSG:32633
    const std::string msg = run_error(dp.write());
    EXPECT_NE(msg.find("project.toml:"), std::string::npos) << msg;
    EXPECT_NE(msg.find("[inputs] design_points_crs"), std::string::npos) << msg;
    EXPECT_NE(msg.find("UTM zone 33N"), std::string::npos) << msg;
    EXPECT_NE(msg.find("UTM zone 34N"), std::string::npos) << msg;
}

TEST(DemProjectCrs, AnUnknownDeclaredCrsIsRefusedAtItsKey) {
    auto dp = t::dem_project("dem_crs_unknown");
    dp.inputs.text("design_points_crs", "EPSG:not-a-code");
    const std::string msg = run_error(dp.write());
    EXPECT_NE(msg.find("[inputs] design_points_crs"), std::string::npos) << msg;
    EXPECT_NE(msg.find("'EPSG:not-a-code'"), std::string::npos) << msg;
}

// A layer whose extent does not overlap the DEM: land cover declared in UTM zone 34N while its
// coordinates are zone 33N's lies hundreds of kilometres west of the valley once reprojected.
TEST(DemProjectCrs, ALandLayerThatDoesNotOverlapTheDemIsRefusedNamingBothExtents) {
    t::DemProjectOptions o;
    o.land_crs = "EPSG:32634";
    auto dp = t::dem_project("dem_crs_land_elsewhere", o);
    const auto project = dp.write();
    const std::string msg = run_error(project);
    EXPECT_NE(msg.find("[inputs] land_cover 'land.gpkg'"), std::string::npos) << msg;
    EXPECT_NE(msg.find("does not overlap the DEM's extent"), std::string::npos) << msg;
    // The DEM: x 500000 to 500410, y 3999400 to 4000000 (41 x 60 cells of 10 m).
    EXPECT_NE(msg.find("(x 500000.000 to 500410.000, y 3999400.000 to 4000000.000)"),
              std::string::npos)
        << msg;
    // check finds it too.
    std::ostringstream out;
    try {
        catchpeak::app::check_project_file(project, out);
        ADD_FAILURE() << "check passed";
    } catch (const catchpeak::InputError &e) {
        EXPECT_NE(std::string(e.what()).find("does not overlap the DEM's extent"),
                  std::string::npos)
            << e.what();
    }
}

TEST(DemProjectCrs, DesignPointsThatDoNotOverlapTheDemAreRefusedNamingBothExtents) {
    auto pts = valley_points();
    for (auto &p : pts) {
        p.y += 100000.0; // 100 km north
    }
    t::DemProjectOptions o;
    o.points = pts;
    auto dp = t::dem_project("dem_crs_points_elsewhere", o);
    const std::string msg = run_error(dp.write());
    EXPECT_NE(msg.find("points.gpkg"), std::string::npos) << msg;
    EXPECT_NE(msg.find("'DP-UP', 'DP-OUT'"), std::string::npos) << msg;
    EXPECT_NE(msg.find("does not overlap the DEM's extent (x 500000.000 to 500410.000"),
              std::string::npos)
        << msg;
}
