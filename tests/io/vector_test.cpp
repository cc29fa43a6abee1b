// SPDX-License-Identifier: MIT
#include "catchpeak/io/raster.hpp"
#include "catchpeak/io/vector.hpp"
#include "support/input_error.hpp"

#include "catchpeak/core/error.hpp"
#include "gdal_test_data.hpp"
#include "support/test_env.hpp"

#include <gtest/gtest.h>
#include <ogr_geometry.h>

#include <fmt/format.h>

#include <fstream>
#include <memory>

using catchpeak::InputError;
namespace io = catchpeak::io;
namespace t = catchpeak::test;

namespace {

std::unique_ptr<OGRGeometry> geometry(const std::vector<unsigned char> &wkb) {
    OGRGeometry *g = nullptr;
    EXPECT_EQ(OGRGeometryFactory::createFromWkb(wkb.data(), nullptr, &g, wkb.size()), OGRERR_NONE);
    return std::unique_ptr<OGRGeometry>(g);
}

const std::string utm33 = "EPSG:32633";

} // namespace

TEST(ReadVectorLayer, SameCrsKeepsCoordinatesAndAttributes) {
    const auto dir = t::scratch_dir("same_crs");
    const auto p = t::make_layer(
        dir / "a.gpkg", "things", {"id", "kind"},
        {{"POINT (500100 4000200)", {"A", "inlet"}}, {"LINESTRING (0 0, 10 0)", {"B", ""}}}, utm33);
    std::vector<std::string> notes;
    const auto layer = io::read_vector_layer(p, t::crs_wkt(utm33), {}, &notes);
    ASSERT_EQ(layer.features.size(), 2u);
    EXPECT_TRUE(notes.empty());
    const auto g = geometry(layer.features[0].wkb);
    EXPECT_DOUBLE_EQ(g->toPoint()->getX(), 500100.0);
    EXPECT_DOUBLE_EQ(g->toPoint()->getY(), 4000200.0);
    EXPECT_EQ(layer.features[0].attributes.at("kind"), "inlet");
    EXPECT_EQ(layer.features[1].attributes.count("kind"), 0u); // null field left out
    EXPECT_EQ(layer.features[0].wkb[0], 1);                    // little-endian WKB
}

TEST(ReadVectorLayer, ReprojectsFromGeographic) {
    const auto dir = t::scratch_dir("reproject");
    // GeoJSON is WGS 84 longitude/latitude.
    const auto p =
        t::make_layer(dir / "p.geojson", "p", {"id"},
                      {{"POINT (15 0)", {"on the equator"}}, {"POINT (15 45)", {"mid latitude"}}},
                      "EPSG:4326", "GeoJSON");
    std::vector<std::string> notes;
    const auto layer = io::read_vector_layer(p, t::crs_wkt(utm33), {}, &notes);
    ASSERT_EQ(layer.features.size(), 2u);
    ASSERT_EQ(notes.size(), 1u);
    EXPECT_NE(notes[0].find("reprojected"), std::string::npos);
    // UTM zone 33's central meridian is 15 deg E; there easting = false easting = 500000 m and
    // on the equator northing = 0 m (definition of UTM, northern hemisphere zones).
    // Tolerance 1 mm: floating-point rounding of the projection formulas.
    const auto a = geometry(layer.features[0].wkb);
    EXPECT_NEAR(a->toPoint()->getX(), 500000.0, 1e-3);
    EXPECT_NEAR(a->toPoint()->getY(), 0.0, 1e-3);
    const auto b = geometry(layer.features[1].wkb);
    EXPECT_NEAR(b->toPoint()->getX(), 500000.0, 1e-3);
    // 0.9996 x meridian arc from the equator to 45 deg on WGS 84 (4 984 944.38 m) =
    // 4 982 950.40 m: value from memory, not checked against the source; tolerance 1 m.
    EXPECT_NEAR(b->toPoint()->getY(), 4982950.40, 1.0);
}

TEST(ReadVectorLayer, LayerWithoutCrsIsTakenToBeInTheTargetCrsWithANote) {
    const auto dir = t::scratch_dir("no_crs");
    const auto p =
        t::make_layer(dir / "p.shp", "p", {"id"}, {{"POINT (1 2)", {"A"}}}, "", "ESRI Shapefile");
    std::vector<std::string> notes;
    const auto layer = io::read_vector_layer(p, t::crs_wkt(utm33), {}, &notes);
    ASSERT_EQ(notes.size(), 1u);
    EXPECT_NE(notes[0].find("no coordinate reference system"), std::string::npos);
    EXPECT_DOUBLE_EQ(geometry(layer.features[0].wkb)->toPoint()->getX(), 1.0);
}

TEST(ReadVectorLayer, GeoPackageLayerWrittenWithoutCrsIsTreatedAsHavingNone) {
    // A GeoPackage layer created without a CRS carries a placeholder ("Undefined ... SRS",
    // srs_id 0 or -1 of the OGC GeoPackage standard), not a CRS to reproject from.
    const auto dir = t::scratch_dir("no_crs_gpkg");
    const auto p = t::make_layer(dir / "p.gpkg", "p", {"id"}, {{"POINT (1 2)", {"A"}}}, "", "GPKG");
    std::vector<std::string> notes;
    const auto layer = io::read_vector_layer(p, t::crs_wkt(utm33), {}, &notes);
    ASSERT_EQ(notes.size(), 1u);
    EXPECT_NE(notes[0].find("no coordinate reference system"), std::string::npos) << notes[0];
    EXPECT_DOUBLE_EQ(geometry(layer.features[0].wkb)->toPoint()->getX(), 1.0);
}

TEST(ReadVectorLayer, SeveralLayersNeedAName) {
    const auto dir = t::scratch_dir("layers");
    const auto p = dir / "two.gpkg";
    GDALAllRegister();
    GDALDataset *ds = GetGDALDriverManager()->GetDriverByName("GPKG")->Create(
        p.string().c_str(), 0, 0, 0, GDT_Unknown, nullptr);
    t::make_layer(p, "first", {"id"}, {{"POINT (1 1)", {"A"}}}, utm33, "GPKG", ds);
    t::make_layer(p, "second", {"id"}, {{"POINT (2 2)", {"B"}}}, utm33, "GPKG", ds);
    GDALClose(ds);
    const auto msg = catchpeak::test::input_error_of([&] { (void)io::read_vector_layer(p, ""); });
    EXPECT_NE(msg.find("2 layers ('first', 'second')"), std::string::npos) << msg;
    const auto second = io::read_vector_layer(p, "", "second");
    ASSERT_EQ(second.features.size(), 1u);
    EXPECT_NE(second.source.find("layer 'second'"), std::string::npos);
}

TEST(ReadVectorLayer, NotAVectorFile) {
    const auto dir = t::scratch_dir("not_vector");
    const auto msg = catchpeak::test::input_error_of(
        [&] { (void)io::read_vector_layer(dir / "none.gpkg", ""); });
    EXPECT_NE(msg.find("none.gpkg: file not found"), std::string::npos) << msg;
}

TEST(ReadDesignPoints, ReadsIdsAndCoordinates) {
    const auto dir = t::scratch_dir("dp_ok");
    const auto p = t::make_points(dir / "dp.gpkg",
                                  {{500010, 4000020, "DP-1"}, {500030, 4000040, " DP-2 "}}, utm33);
    const auto dp = io::read_design_points(p, "id", t::crs_wkt(utm33));
    ASSERT_EQ(dp.points.size(), 2u);
    EXPECT_EQ(dp.points[0].id, "DP-1");
    EXPECT_EQ(dp.points[1].id, "DP-2"); // blanks trimmed
    EXPECT_DOUBLE_EQ(dp.points[1].x, 500030.0);
    EXPECT_DOUBLE_EQ(dp.points[1].y, 4000040.0);
}

struct BadPointsCase {
    std::string name;
    std::vector<t::RowSpec> rows;
    std::string id_field;
    std::vector<std::string> expected; // all must appear in the message
};

[[maybe_unused]] void PrintTo(const BadPointsCase &c, std::ostream *os) { *os << c.name; }

class ReadDesignPointsRefuses : public ::testing::TestWithParam<BadPointsCase> {};

TEST_P(ReadDesignPointsRefuses, WithAMessageNamingFileFieldAndFeature) {
    const auto &c = GetParam();
    const auto dir = t::scratch_dir("dp_bad_" + c.name);
    const auto p = t::make_layer(dir / "dp.gpkg", "dp", {"id", "note"}, c.rows, utm33);
    const auto msg = catchpeak::test::input_error_of(
        [&] { (void)io::read_design_points(p, c.id_field, t::crs_wkt(utm33)); });
    EXPECT_NE(msg.find(p.string()), std::string::npos) << msg;
    for (const auto &e : c.expected) {
        EXPECT_NE(msg.find(e), std::string::npos) << "'" << e << "' not in: " << msg;
    }
}

INSTANTIATE_TEST_SUITE_P(
    Cases, ReadDesignPointsRefuses,
    ::testing::Values(
        BadPointsCase{"missing_field",
                      {{"POINT (1 1)", {"A", "x"}}},
                      "dp_id",
                      {"has no field 'dp_id'", "fields present: 'id', 'note'"}},
        BadPointsCase{"empty_layer", {}, "id", {"holds no design point"}},
        BadPointsCase{"duplicate_id",
                      {{"POINT (1 1)", {"A", ""}}, {"POINT (2 2)", {"A", ""}}},
                      "id",
                      {"feature 2", "'A'", "also used by feature 1"}},
        BadPointsCase{"missing_id",
                      {{"POINT (1 1)", {"A", ""}}, {"POINT (2 2)", {"", "x"}}},
                      "id",
                      {"feature 2", "field 'id' is empty"}},
        BadPointsCase{"line_geometry",
                      {{"LINESTRING (1 1, 2 2)", {"A", ""}}},
                      "id",
                      {"feature 1", "design point 'A'", "LineString", "Point"}},
        BadPointsCase{"no_geometry", {{"", {"A", ""}}}, "id", {"design point 'A'", "no geometry"}}),
    [](const ::testing::TestParamInfo<BadPointsCase> &i) { return i.param.name; });

TEST(ReadLines, LineStringsAndPartsOfMultiLineStrings) {
    const auto dir = t::scratch_dir("lines");
    const auto p = t::make_layer(dir / "l.gpkg", "l", {"name"},
                                 {{"LINESTRING (0 0, 10 0, 10 10)", {"a"}},
                                  {"MULTILINESTRING ((0 0, 1 1), (5 5, 6 6, 7 7))", {"b"}}},
                                 utm33);
    const auto lines = io::read_lines(p, t::crs_wkt(utm33));
    ASSERT_EQ(lines.lines.size(), 3u);
    EXPECT_EQ(lines.lines[0].vertices.size(), 3u);
    EXPECT_EQ(lines.lines[2].vertices.size(), 3u);
    EXPECT_EQ(lines.lines[2].fid, 2);
    EXPECT_DOUBLE_EQ(lines.lines[0].vertices[2].second, 10.0);
}

TEST(ReadLines, RefusesPolygons) {
    const auto dir = t::scratch_dir("lines_bad");
    const auto p = t::make_layer(dir / "l.gpkg", "l", {"name"},
                                 {{"POLYGON ((0 0, 1 0, 1 1, 0 0))", {"a"}}}, utm33);
    const auto msg =
        catchpeak::test::input_error_of([&] { (void)io::read_lines(p, t::crs_wkt(utm33)); });
    EXPECT_NE(msg.find("feature 1"), std::string::npos) << msg;
    EXPECT_NE(msg.find("Polygon"), std::string::npos) << msg;
}

TEST(ReadPolygons, RepairsInvalidPolygonsAndSaysSo) {
    const auto dir = t::scratch_dir("polygons");
    const auto p = t::make_layer(dir / "soils.gpkg", "soils", {"hsg"},
                                 {{"POLYGON ((0 0, 4 0, 4 4, 0 4, 0 0))", {"B"}},
                                  // a bow-tie: its ring crosses itself at (1, 1)
                                  {"POLYGON ((0 0, 2 2, 2 0, 0 2, 0 0))", {"C"}}},
                                 utm33);
    const auto layer = io::read_polygons(p, "hsg", t::crs_wkt(utm33));
    ASSERT_EQ(layer.polygons.size(), 2u);
    EXPECT_EQ(layer.polygons[1].class_value, "C");
    ASSERT_EQ(layer.notes.size(), 1u);
    EXPECT_NE(layer.notes[0].find("feature 2"), std::string::npos) << layer.notes[0];
    EXPECT_NE(layer.notes[0].find("MakeValid"), std::string::npos) << layer.notes[0];
    const auto fixed = geometry(layer.polygons[1].wkb);
    EXPECT_TRUE(fixed->IsValid());
    // The bow-tie's two triangles, (0 0, 1 1, 2 0) and (0 2, 1 1, 2 2), have area 1 m2 each
    // (1/2 x base 2 x height 1, computed by hand). Tolerance: floating-point rounding.
    const auto type = wkbFlatten(fixed->getGeometryType());
    ASSERT_TRUE(type == wkbMultiPolygon || type == wkbPolygon);
    const double area = type == wkbMultiPolygon ? fixed->toMultiPolygon()->get_Area()
                                                : fixed->toPolygon()->get_Area();
    EXPECT_NEAR(area, 2.0, 1e-9);
}

TEST(ReadPolygons, RefusesMissingClassFieldAndPoints) {
    const auto dir = t::scratch_dir("polygons_bad");
    const auto p = t::make_layer(dir / "lc.gpkg", "lc", {"cover"},
                                 {{"POLYGON ((0 0, 1 0, 1 1, 0 0))", {"grass"}}}, utm33);
    const auto msg = catchpeak::test::input_error_of(
        [&] { (void)io::read_polygons(p, "class", t::crs_wkt(utm33)); });
    EXPECT_NE(msg.find("has no field 'class'"), std::string::npos) << msg;
    EXPECT_NE(msg.find("'cover'"), std::string::npos) << msg;
    const auto q =
        t::make_layer(dir / "pts.gpkg", "pts", {"cover"}, {{"POINT (0 0)", {"x"}}}, utm33);
    const auto msg2 =
        catchpeak::test::input_error_of([&] { (void)io::read_polygons(q, "cover", ""); });
    EXPECT_NE(msg2.find("Point geometry"), std::string::npos) << msg2;
}

TEST(ReadDesignPoints, PointsInAFeetCrsComeInTheMetreCrsOfAFeetDem) {
    const auto dir = t::scratch_dir("dp_feet");
    const std::string feet = t::utm_in_unit(SRS_UL_FOOT, 0.3048);
    t::RasterSpec s;
    s.crs_wkt = feet;
    s.gt = {1000.0, 10.0, 0.0, 20000.0, 0.0, -10.0};
    const auto dem = catchpeak::io::read_dem(t::make_raster(dir / "dem_ft.tif", s));
    const auto p =
        t::make_layer(dir / "dp.shp", "dp", {"id"}, {{"POINT (1500 19000)", {"A"}}}, feet,
                      "ESRI Shapefile"); // its .prj keeps this custom CRS in feet as it is
    const auto dp = io::read_design_points(p, "id", dem.elevation_m.crs_wkt);
    ASSERT_EQ(dp.points.size(), 1u);
    // 1 ft = 0.3048 m exactly; tolerance 1 mm: rounding through PROJ's unit conversion.
    EXPECT_NEAR(dp.points[0].x, 1500.0 * 0.3048, 1e-3);
    EXPECT_NEAR(dp.points[0].y, 19000.0 * 0.3048, 1e-3);
}

namespace {

/// A GeoJSON file without a "crs" member holding one point at (x, y) with id "DP-1".
std::filesystem::path geojson_point(const std::filesystem::path &path, double x, double y) {
    std::ofstream(path) << fmt::format(
        "{{\"type\":\"FeatureCollection\",\"features\":[{{\"type\":\"Feature\","
        "\"properties\":{{\"id\":\"DP-1\"}},\"geometry\":{{\"type\":\"Point\","
        "\"coordinates\":[{:.3f},{:.3f}]}}}}]}}\n",
        x, y);
    return path;
}

io::DeclaredCrs declared(const std::string &text) {
    return {text, "[inputs] design_points_crs", "project.toml:7: [inputs] design_points_crs"};
}

} // namespace

// A GeoJSON file in UTM without a "crs" member gave a PROJ error that did not say what to do.
TEST(ReadDesignPoints, AGeoJsonWithoutCrsMemberWhoseCoordinatesAreNotLonLatIsToldHowToDeclare) {
    const auto dir = t::scratch_dir("geojson_utm");
    const auto p = geojson_point(dir / "points.geojson", 500100.0, 4000200.0);
    // RFC 7946, section 4: GeoJSON coordinates are WGS 84 longitude and latitude.
    const auto msg = t::input_error_of(
        [&] { (void)io::read_design_points(p, "id", t::crs_wkt(utm33), declared("")); });
    EXPECT_NE(msg.find("points.geojson"), std::string::npos) << msg;
    EXPECT_NE(msg.find("without a \"crs\" member"), std::string::npos) << msg;
    EXPECT_NE(msg.find("RFC 7946"), std::string::npos) << msg;
    EXPECT_NE(msg.find("x 500100 to 500100, y 4000200 to 4000200"), std::string::npos) << msg;
    EXPECT_NE(msg.find("[inputs] design_points_crs"), std::string::npos) << msg;
    // Without a key to declare it (the land layers): the file's own ways.
    const auto plain =
        t::input_error_of([&] { (void)io::read_vector_layer(p, t::crs_wkt(utm33)); });
    EXPECT_NE(plain.find("a \"crs\" member"), std::string::npos) << plain;
    EXPECT_EQ(plain.find("[inputs]"), std::string::npos) << plain;
}

TEST(ReadDesignPoints, ADeclaredCrsReplacesTheWgs84OfAGeoJsonWithoutCrsMember) {
    const auto dir = t::scratch_dir("geojson_declared");
    const auto p = geojson_point(dir / "points.geojson", 500100.0, 4000200.0);
    const auto same = io::read_design_points(p, "id", t::crs_wkt(utm33), declared(utm33));
    ASSERT_EQ(same.points.size(), 1u);
    EXPECT_DOUBLE_EQ(same.points[0].x, 500100.0);
    EXPECT_DOUBLE_EQ(same.points[0].y, 4000200.0);
    EXPECT_FALSE(same.reprojection.has_value());
    ASSERT_TRUE(same.extent.has_value());
    EXPECT_DOUBLE_EQ(same.extent->min_x, 500100.0);
    EXPECT_DOUBLE_EQ(same.extent->max_y, 4000200.0);
    // Declared in zone 33N, read into zone 34N: reprojected, and the line says who declared it.
    const auto other = io::read_design_points(p, "id", t::crs_wkt("EPSG:32634"), declared(utm33));
    ASSERT_TRUE(other.reprojection.has_value());
    EXPECT_EQ(other.reprojection->from, "WGS 84 / UTM zone 33N");
    EXPECT_EQ(other.reprojection->to, "WGS 84 / UTM zone 34N");
    EXPECT_EQ(other.reprojection->declared_by, "[inputs] design_points_crs");
}

TEST(ReadDesignPoints, AReprojectionIsReportedWithBothCrss) {
    const auto dir = t::scratch_dir("points_reprojected");
    const auto p = t::make_points(dir / "p.gpkg", {{15.0, 45.0, "DP-1"}}, "EPSG:4326");
    const auto dp = io::read_design_points(p, "id", t::crs_wkt(utm33));
    ASSERT_TRUE(dp.reprojection.has_value());
    EXPECT_EQ(dp.reprojection->from, "WGS 84");
    EXPECT_EQ(dp.reprojection->to, "WGS 84 / UTM zone 33N");
    EXPECT_TRUE(dp.reprojection->declared_by.empty());
    const auto same = io::read_design_points(p, "id", t::crs_wkt("EPSG:4326"));
    EXPECT_FALSE(same.reprojection.has_value());
}

TEST(ReadDesignPoints, ADeclaredCrsThatTheFileContradictsIsRefusedAtTheKey) {
    const auto dir = t::scratch_dir("declared_contradicted");
    const auto p = t::make_points(dir / "p.gpkg", {{500100.0, 4000200.0, "DP-1"}}, utm33);
    const auto msg = t::input_error_of(
        [&] { (void)io::read_design_points(p, "id", t::crs_wkt(utm33), declared("EPSG:32634")); });
    EXPECT_NE(msg.find("project.toml:7: [inputs] design_points_crs"), std::string::npos) << msg;
    EXPECT_NE(msg.find("UTM zone 34N"), std::string::npos) << msg;
    EXPECT_NE(msg.find("UTM zone 33N"), std::string::npos) << msg;
    // The same CRS as the file's is no contradiction.
    EXPECT_EQ(io::read_design_points(p, "id", t::crs_wkt(utm33), declared(utm33)).points.size(),
              1u);
}

TEST(ReadVectorLayer, FactsGiveTheExtentInTheTargetCrsAndTheReprojection) {
    const auto dir = t::scratch_dir("vector_facts");
    const auto p = t::make_layer(
        dir / "a.gpkg", "things", {"id"},
        {{"POINT (500100 4000200)", {"A"}}, {"LINESTRING (500000 4000000, 500300 4000100)", {"B"}}},
        utm33);
    io::LayerFacts facts;
    (void)io::read_vector_layer(p, t::crs_wkt(utm33), {}, nullptr, {}, &facts);
    ASSERT_TRUE(facts.extent.has_value());
    EXPECT_DOUBLE_EQ(facts.extent->min_x, 500000.0);
    EXPECT_DOUBLE_EQ(facts.extent->max_x, 500300.0);
    EXPECT_DOUBLE_EQ(facts.extent->min_y, 4000000.0);
    EXPECT_DOUBLE_EQ(facts.extent->max_y, 4000200.0);
    EXPECT_FALSE(facts.reprojection.has_value());
}
