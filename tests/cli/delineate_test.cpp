// SPDX-License-Identifier: MIT
// `catchpeak delineate`, called as a function. Inputs are made here with GDAL in the scratch
// folder: an invented valley DEM, design points, and broken variants of both.
//
// Cases: arguments, expected exit code (by name), text expected in the message. Then checks
// of the results against outside references: polygon areas from GEOS/OGR against cell count x
// cell area, and mean slope against GDAL's own Horn slope (GDALDEMProcessing "slope").
#include "catchpeak/cli/run.hpp"
#include "catchpeak/core/error.hpp"
#include "io/gdal_test_data.hpp"
#include "support/test_env.hpp"

#include <fmt/format.h>
#include <gdal_utils.h>
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <fstream>
#include <sstream>

using catchpeak::ExitCode;
namespace fs = std::filesystem;
namespace t = catchpeak::test;

namespace {

constexpr int width = 60;
constexpr int height = 80;
constexpr double cell_m = 10.0;
constexpr double origin_x = 500000.0;
constexpr double origin_y = 4000800.0;
constexpr int channel_col = 30; // valley bottom: the DEM is lowest along this column

/// Elevation of the invented valley: side slopes 0.2 toward the channel column, a fall of
/// 0.05 toward the south edge (row 79), and gentle waves so that slopes vary from cell to cell.
float valley_z(int c, int r) {
    const double side = 0.2 * cell_m * std::abs(c - channel_col);
    const double fall = 0.05 * cell_m * (height - 1 - r);
    const double waves = 1.5 * std::sin(c * 0.35) * std::cos(r * 0.21);
    return static_cast<float>(50.0 + side + fall + (c == channel_col ? 0.0 : waves + 1.5));
}

std::string utm33() { return t::crs_wkt("EPSG:32633"); }

double cell_centre_x(int c) { return origin_x + (c + 0.5) * cell_m; }
double cell_centre_y(int r) { return origin_y - (r + 0.5) * cell_m; }

fs::path data;

void make_inputs() {
    data = t::scratch_dir("inputs");
    t::RasterSpec s;
    s.width = width;
    s.height = height;
    s.gt = {origin_x, cell_m, 0.0, origin_y, 0.0, -cell_m};
    s.crs_wkt = utm33();
    s.unit = "m";
    for (int r = 0; r < height; ++r) {
        for (int c = 0; c < width; ++c) {
            s.values.push_back(valley_z(c, r));
        }
    }
    t::make_raster(data / "valley.tif", s);

    t::RasterSpec hole = s; // a nodata patch in the north-west corner
    hole.has_nodata = true;
    hole.nodata = -9999.0;
    for (int r = 0; r < 5; ++r) {
        for (int c = 0; c < 5; ++c) {
            hole.values[static_cast<std::size_t>(r * width + c)] = -9999.0f;
        }
    }
    t::make_raster(data / "valley_hole.tif", hole);

    // The valley inside a one-cell ring of nodata. On a nodata neighbour GDAL's slope (with
    // -compute_edges) takes the centre cell's elevation, as catchpeak does; at the raster's own
    // edge GDAL extrapolates linearly instead, so the slope comparison uses this DEM.
    t::RasterSpec ringed = hole;
    ringed.values = s.values;
    for (int r = 0; r < height; ++r) {
        for (int c = 0; c < width; ++c) {
            if (r == 0 || c == 0 || r == height - 1 || c == width - 1) {
                ringed.values[static_cast<std::size_t>(r * width + c)] = -9999.0f;
            }
        }
    }
    t::make_raster(data / "valley_ringed.tif", ringed);

    t::RasterSpec empty = hole;
    std::fill(empty.values.begin(), empty.values.end(), -9999.0f);
    t::make_raster(data / "all_nodata.tif", empty);

    t::RasterSpec geo = s;
    geo.crs_wkt = t::crs_wkt("EPSG:4326");
    geo.gt = {15.0, 0.0001, 0.0, 36.0, 0.0, -0.0001};
    t::make_raster(data / "geographic.tif", geo);

    std::ofstream(data / "notes.txt") << "not a raster\n";

    // A breach line across the valley near the outlet, and a polygon where lines belong.
    t::make_layer(data / "breach.gpkg", "breach", {"name"},
                  {{"LINESTRING (500250 4000100, 500350 4000100)", {"culvert"}}}, "EPSG:32633");
    t::make_layer(data / "breach_polygon.gpkg", "breach", {"name"},
                  {{"POLYGON ((500250 4000100, 500350 4000100, 500350 4000200, 500250 4000100))",
                    {"culvert"}}},
                  "EPSG:32633");

    // DP-1 near the outlet, DP-2 upstream on the same channel; both given 12 m off the channel.
    const double x_off = cell_centre_x(channel_col) + 12.0;
    t::make_points(data / "points.gpkg",
                   {{x_off, cell_centre_y(70), "DP-1"}, {x_off, cell_centre_y(30), "DP-2"}},
                   "EPSG:32633");
    t::make_points(data / "points_dup.gpkg",
                   {{x_off, cell_centre_y(70), "DP-1"}, {x_off, cell_centre_y(30), "DP-1"}},
                   "EPSG:32633");
    t::make_points(data / "points_noid.gpkg",
                   {{x_off, cell_centre_y(70), "DP-1"}, {x_off, cell_centre_y(30), ""}},
                   "EPSG:32633");
    t::make_points(data / "points_empty.gpkg", {}, "EPSG:32633");
    t::make_points(data / "points_outside.gpkg",
                   {{x_off, cell_centre_y(70), "DP-1"}, {origin_x - 500.0, 4000000.0, "DP-9"}},
                   "EPSG:32633");
    t::make_points(data / "points_nodata.gpkg", {{cell_centre_x(2), cell_centre_y(2), "DP-5"}},
                   "EPSG:32633");
    // The two points in UTM coordinates in a GeoJSON file without a "crs" member (RFC 7946:
    // GeoJSON is WGS 84 longitude/latitude), and breach lines 100 km north of the DEM.
    std::ofstream(data / "points_utm.geojson")
        << fmt::format("{{\"type\":\"FeatureCollection\",\"features\":[{{\"type\":"
                       "\"Feature\",\"properties\":{{\"id\":\"DP-1\"}},\"geometry\":{{"
                       "\"type\":\"Point\",\"coordinates\":[{:.3f},{:.3f}]}}}}]}}\n",
                       x_off, cell_centre_y(70));
    t::make_layer(data / "breach_far.gpkg", "breach", {"name"},
                  {{"LINESTRING (500250 4100100, 500350 4100100)", {"culvert"}}}, "EPSG:32633");
    // The same two points in WGS 84 longitude/latitude, reprojected with GDAL here.
    {
        OGRSpatialReference utm;
        utm.importFromEPSG(32633);
        utm.SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
        OGRSpatialReference wgs;
        wgs.importFromEPSG(4326);
        wgs.SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
        std::unique_ptr<OGRCoordinateTransformation> ct(
            OGRCreateCoordinateTransformation(&utm, &wgs));
        double xs[2] = {x_off, x_off};
        double ys[2] = {cell_centre_y(70), cell_centre_y(30)};
        ct->Transform(2, xs, ys);
        t::make_points(data / "points_wgs84.geojson",
                       {{xs[0], ys[0], "DP-1"}, {xs[1], ys[1], "DP-2"}}, "EPSG:4326", "id",
                       "GeoJSON");
    }
}

struct DelineateCase {
    std::string name;
    std::vector<std::string> args; // "{in}" = the inputs folder, "{out}" = this case's out
    ExitCode code;
    std::vector<std::string> expect_err; // each must appear on stderr
};

[[maybe_unused]] void PrintTo(const DelineateCase &c, std::ostream *os) { *os << c.name; }

std::vector<std::string> args_with(std::vector<std::string> extra) {
    std::vector<std::string> a = {
        "delineate",  "--dem", "{in}/valley.tif", "--points", "{in}/points.gpkg",
        "--id-field", "id",    "--snap-radius",   "25",       "--out",
        "{out}"};
    for (std::size_t i = 0; i + 1 < extra.size(); i += 2) {
        auto it = std::find(a.begin(), a.end(), extra[i]);
        if (it != a.end()) {
            *(it + 1) = extra[i + 1];
        } else {
            a.push_back(extra[i]);
            a.push_back(extra[i + 1]);
        }
    }
    return a;
}

const std::vector<DelineateCase> &cases() {
    static const std::vector<DelineateCase> c = {
        {"dem_missing",
         args_with({"--dem", "{in}/none.tif"}),
         ExitCode::bad_input,
         {"none.tif: file not found"}},
        {"dem_not_a_raster",
         args_with({"--dem", "{in}/notes.txt"}),
         ExitCode::bad_input,
         {"notes.txt", "cannot be read as a raster"}},
        {"dem_all_nodata",
         args_with({"--dem", "{in}/all_nodata.tif"}),
         ExitCode::bad_input,
         {"all_nodata.tif", "every cell is nodata"}},
        {"dem_geographic",
         args_with({"--dem", "{in}/geographic.tif"}),
         ExitCode::bad_input,
         {"geographic.tif", "geographic CRS", "gdalwarp -t_srs EPSG:"}},
        {"point_outside_dem",
         args_with({"--points", "{in}/points_outside.gpkg"}),
         ExitCode::bad_input,
         {"points_outside.gpkg", "DP-9", "outside the DEM extent"}},
        {"point_on_nodata",
         args_with({"--dem", "{in}/valley_hole.tif", "--points", "{in}/points_nodata.gpkg"}),
         ExitCode::bad_input,
         {"points_nodata.gpkg", "DP-5", "nodata"}},
        {"duplicate_ids",
         args_with({"--points", "{in}/points_dup.gpkg"}),
         ExitCode::bad_input,
         {"points_dup.gpkg", "'DP-1'", "also used by feature 1"}},
        {"missing_id",
         args_with({"--points", "{in}/points_noid.gpkg"}),
         ExitCode::bad_input,
         {"points_noid.gpkg", "feature 2", "field 'id' is empty"}},
        {"empty_point_layer",
         args_with({"--points", "{in}/points_empty.gpkg"}),
         ExitCode::bad_input,
         {"points_empty.gpkg", "holds no design point"}},
        {"id_field_missing",
         args_with({"--id-field", "name_of_point"}),
         ExitCode::bad_input,
         {"points.gpkg", "has no field 'name_of_point'", "'id', 'name'"}},
        {"snap_radius_negative",
         args_with({"--snap-radius", "-5"}),
         ExitCode::bad_input,
         {"--snap-radius", "-5 m"}},
        {"snap_radius_absurd",
         args_with({"--snap-radius", "400"}),
         ExitCode::bad_input,
         {"--snap-radius", "more than half the DEM's extent", "600.0 m x 800.0 m"}},
        {"snap_rule_unknown",
         args_with({"--snap", "largest_flw"}),
         ExitCode::bad_input,
         {"--snap", "'largest_flw' is not known (did you mean 'largest_flow'?)",
          "nearest_stream, largest_flow, none"}},
        {"snap_stream_threshold_negative",
         args_with({"--snap-stream-threshold", "-1"}),
         ExitCode::bad_input,
         {"--snap-stream-threshold", "-1 m2"}},
        {"snap_area_factor_one",
         args_with({"--snap-area-factor", "1"}),
         ExitCode::bad_input,
         {"--snap-area-factor", "a factor > 1"}},
        {"stream_threshold_negative",
         args_with({"--stream-threshold", "-1"}),
         ExitCode::bad_input,
         {"--stream-threshold"}},
        {"dem_option_missing",
         {"delineate", "--points", "{in}/points.gpkg", "--id-field", "id", "--snap-radius", "5",
          "--out", "{out}"},
         ExitCode::bad_input,
         {"--dem is required"}},
        {"points_in_another_crs_are_reprojected",
         args_with({"--points", "{in}/points_wgs84.geojson"}),
         ExitCode::success,
         {"reprojected", "100 - done."}},
        {"geojson_in_utm_without_crs_member",
         args_with({"--points", "{in}/points_utm.geojson"}),
         ExitCode::bad_input,
         {"points_utm.geojson", "without a \"crs\" member", "RFC 7946", "--points-crs"}},
        {"geojson_in_utm_declared",
         args_with({"--points", "{in}/points_utm.geojson", "--points-crs", "EPSG:32633"}),
         ExitCode::success,
         {"writing results: 0"}},
        {"breach_lines_off_the_dem",
         args_with({"--breach-lines", "{in}/breach_far.gpkg"}),
         ExitCode::bad_input,
         {"breach_far.gpkg", "breach lines", "does not overlap the DEM's extent"}},
        {"breach_lines_used",
         args_with({"--breach-lines", "{in}/breach.gpkg"}),
         ExitCode::success,
         {"reading breach lines: 0"}},
        {"breach_lines_not_lines",
         args_with({"--breach-lines", "{in}/breach_polygon.gpkg"}),
         ExitCode::bad_input,
         {"breach_polygon.gpkg", "feature 1", "Polygon", "LineString"}},
        {"quiet_prints_no_progress", args_with({"--quiet", "true"}), ExitCode::success, {}},
    };
    return c;
}

std::vector<std::string> expand(const std::vector<std::string> &args, const fs::path &out) {
    std::vector<std::string> a;
    for (auto s : args) {
        for (const auto &[key, value] :
             {std::pair<std::string, std::string>{"{in}", data.string()},
              std::pair<std::string, std::string>{"{out}", out.string()}}) {
            if (auto p = s.find(key); p != std::string::npos) {
                s.replace(p, key.size(), value);
            }
        }
        if (s != "true") { // "--quiet true" in the table stands for the bare flag
            a.push_back(s);
        }
    }
    return a;
}

class DelineateCli : public ::testing::TestWithParam<DelineateCase> {
  protected:
    static void SetUpTestSuite() {
        if (data.empty()) {
            make_inputs();
        }
    }
};

} // namespace

TEST_P(DelineateCli, ExitCodeAndMessage) {
    const auto &c = GetParam();
    const auto out_dir = t::scratch_dir("case_" + c.name) / "results";
    std::ostringstream out;
    std::ostringstream err;
    const int code = catchpeak::cli::run(expand(c.args, out_dir), out, err);
    EXPECT_EQ(code, static_cast<int>(c.code)) << "stderr:\n" << err.str();
    for (const auto &e : c.expect_err) {
        EXPECT_NE(err.str().find(e), std::string::npos) << "'" << e << "' not in:\n" << err.str();
    }
    if (c.code == ExitCode::success) {
        EXPECT_TRUE(fs::exists(out_dir / "catchments.json"));
        EXPECT_TRUE(fs::exists(out_dir / "catchments.gpkg"));
        if (c.name == "quiet_prints_no_progress") {
            EXPECT_EQ(err.str().find("done."), std::string::npos) << err.str();
        }
    } else if (fs::exists(out_dir)) {
        // Nothing half-written: the folder holds no file at all.
        EXPECT_TRUE(fs::is_empty(out_dir)) << out_dir;
    }
}

INSTANTIATE_TEST_SUITE_P(Cases, DelineateCli, ::testing::ValuesIn(cases()),
                         [](const ::testing::TestParamInfo<DelineateCase> &i) {
                             return i.param.name;
                         });

namespace {

class DelineateResults : public ::testing::Test {
  protected:
    static void SetUpTestSuite() {
        if (data.empty()) {
            make_inputs();
        }
        out_dir = t::scratch_dir("results") / "out";
        std::ostringstream out;
        std::ostringstream err;
        const int code = catchpeak::cli::run(
            expand(args_with({"--dem", "{in}/valley_ringed.tif", "--snap", "largest_flow"}),
                   out_dir),
            out, err);
        ASSERT_EQ(code, 0) << err.str();
        std::ifstream in(out_dir / "catchments.json");
        json = nlohmann::json::parse(in);
    }
    static const nlohmann::json &point(const std::string &id) {
        for (const auto &p : json.at("design_points")) {
            if (p.at("id") == id) {
                return p;
            }
        }
        throw std::runtime_error("no design point " + id);
    }
    static inline fs::path out_dir;
    static inline nlohmann::json json;
};

/// The catchment polygon of design point `id` from catchments.gpkg.
std::unique_ptr<OGRGeometry> catchment_polygon(const fs::path &gpkg, const std::string &id) {
    GDALDatasetUniquePtr ds(GDALDataset::Open(gpkg.string().c_str(), GDAL_OF_VECTOR));
    if (!ds) {
        throw std::runtime_error("cannot open " + gpkg.string());
    }
    OGRLayer *layer = ds->GetLayerByName("catchments");
    for (auto &f : *layer) {
        if (std::string(f->GetFieldAsString("id")) == id) {
            return std::unique_ptr<OGRGeometry>(f->StealGeometry());
        }
    }
    throw std::runtime_error("no catchment " + id);
}

double area_of(const OGRGeometry &g) {
    const auto type = wkbFlatten(g.getGeometryType());
    return type == wkbMultiPolygon ? g.toMultiPolygon()->get_Area() : g.toPolygon()->get_Area();
}

} // namespace

TEST(DelineateSnap, NearestStreamByDefaultMovesThePointStraightOntoTheChannel) {
    if (data.empty()) {
        make_inputs();
    }
    // DP-1 was given 12 m east of the channel cell of row 70. The channel drains the valley
    // above (tens of hectares); the side cells drain their row's side slope, far below 1 ha.
    // The nearest stream cell is the channel cell of row 70, 12 m west; largest_flow (the
    // fixture above) takes row 72 instead.
    const auto out_dir = t::scratch_dir("snap_default") / "out";
    std::ostringstream out;
    std::ostringstream err;
    ASSERT_EQ(catchpeak::cli::run(expand(args_with({"--dem", "{in}/valley_ringed.tif"}), out_dir),
                                  out, err),
              0)
        << err.str();
    std::ifstream in(out_dir / "catchments.json");
    const auto doc = nlohmann::json::parse(in);
    EXPECT_EQ(doc.at("snap_rule"), "nearest_stream");
    const auto &dp1 = doc.at("design_points").at(0);
    ASSERT_EQ(dp1.at("id"), "DP-1");
    EXPECT_DOUBLE_EQ(dp1.at("snapped_x_m").get<double>(), cell_centre_x(channel_col));
    EXPECT_DOUBLE_EQ(dp1.at("snapped_y_m").get<double>(), cell_centre_y(70));
    EXPECT_NEAR(dp1.at("snap_distance_m").get<double>(), 12.0, 1e-9); // rounding only
    // The figures of the snap are in the file, and the move onto the channel is warned of.
    EXPECT_LT(dp1.at("given_cell_area_m2").get<double>(), 1.0e4);
    EXPECT_GE(dp1.at("max_area_within_radius_m2").get<double>(), dp1.at("area_m2").get<double>());
    EXPECT_TRUE(dp1.at("expected_area_m2").is_null()); // the layer has no such field
    EXPECT_NE(err.str().find("design point 'DP-1': the snap moved the point 12.0 m to the west"),
              std::string::npos)
        << err.str();
}

TEST_F(DelineateResults, SnapsToTheChannelAndNestsTheUpstreamPoint) {
    const auto &dp1 = point("DP-1");
    const auto &dp2 = point("DP-2");
    // The valley bottom is column 30 by construction of the DEM, flowing south; DP-1 was given
    // 12 m east of the centre of row 70. The largest accumulation within 25 m is the channel
    // cell furthest downstream inside the circle: row 72, 20 m south (row 73 is 30 m away).
    EXPECT_DOUBLE_EQ(dp1.at("snapped_x_m").get<double>(), cell_centre_x(channel_col));
    EXPECT_DOUBLE_EQ(dp1.at("snapped_y_m").get<double>(), cell_centre_y(72));
    // sqrt(12^2 + 20^2) m, computed from the construction; tolerance: rounding.
    EXPECT_NEAR(dp1.at("snap_distance_m").get<double>(), std::sqrt(12.0 * 12.0 + 20.0 * 20.0),
                1e-9);
    EXPECT_DOUBLE_EQ(dp1.at("given_x_m").get<double>(), cell_centre_x(channel_col) + 12.0);
    EXPECT_EQ(dp1.at("upstream_design_points"), nlohmann::json::array({"DP-2"}));
    EXPECT_EQ(dp2.at("downstream_design_point"), "DP-1");
    EXPECT_LT(dp2.at("area_m2").get<double>(), dp1.at("area_m2").get<double>());
    // Local = total minus the nested catchment (cells counted from the same grid).
    EXPECT_DOUBLE_EQ(dp1.at("local_area_m2").get<double>(),
                     dp1.at("area_m2").get<double>() - dp2.at("area_m2").get<double>());
    // Every cell upstream drains through the outlet: accumulation = catchment cell count.
    EXPECT_EQ(dp1.at("accumulation_cells").get<std::uint64_t>(),
              dp1.at("total_cells").get<std::uint64_t>());
    const auto keys = {"id",
                       "given_x_m",
                       "given_y_m",
                       "snapped_x_m",
                       "snapped_y_m",
                       "snap_distance_m",
                       "accumulation_cells",
                       "area_m2",
                       "local_area_m2",
                       "longest_flow_path_m",
                       "elevation_top_m",
                       "elevation_outlet_m",
                       "slope_flow_path_m_per_m",
                       "slope_10_85_m_per_m",
                       "mean_slope_m_per_m",
                       "upstream_design_points",
                       "warnings"};
    for (const char *k : keys) {
        EXPECT_TRUE(dp1.contains(k)) << k;
    }
}

TEST_F(DelineateResults, PolygonAreasEqualCellCountTimesCellArea) {
    for (const std::string id : {"DP-1", "DP-2"}) {
        const auto g = catchment_polygon(out_dir / "catchments.gpkg", id);
        EXPECT_TRUE(g->IsValid()) << id;
        const double expected = point(id).at("total_cells").get<double>() * cell_m * cell_m;
        // GEOS/OGR area of the polygon against cell count x 100 m2; tolerance: floating-point
        // rounding (relative 1e-9).
        EXPECT_NEAR(area_of(*g), expected, expected * 1e-9) << id;
        EXPECT_DOUBLE_EQ(point(id).at("area_m2").get<double>(), expected) << id;
    }
}

TEST_F(DelineateResults, MeanSlopeEqualsGdalHornSlopeAveragedOverTheCatchment) {
    // GDAL's own slope (gdaldem slope, Horn 1981 is its default algorithm), in percent, with
    // the edges computed: GDAL then takes a missing neighbour's elevation as the centre cell's.
    const auto slope_path = t::scratch_dir("gdal_slope") / "slope.tif";
    GDALDatasetUniquePtr dem(
        GDALDataset::Open((data / "valley_ringed.tif").string().c_str(), GDAL_OF_RASTER));
    ASSERT_TRUE(dem);
    const char *opts[] = {"-alg", "Horn", "-p", "-compute_edges", nullptr};
    GDALDEMProcessingOptions *o = GDALDEMProcessingOptionsNew(const_cast<char **>(opts), nullptr);
    int usage_error = 0;
    GDALDatasetH slope =
        GDALDEMProcessing(slope_path.string().c_str(), GDALDataset::ToHandle(dem.get()), "slope",
                          nullptr, o, &usage_error);
    GDALDEMProcessingOptionsFree(o);
    ASSERT_NE(slope, nullptr);
    std::vector<float> pct(static_cast<std::size_t>(width * height));
    ASSERT_EQ(GDALRasterIO(GDALGetRasterBand(slope, 1), GF_Read, 0, 0, width, height, pct.data(),
                           width, height, GDT_Float32, 0, 0),
              CE_None);
    GDALClose(slope);

    for (const std::string id : {"DP-1", "DP-2"}) {
        const auto g = catchment_polygon(out_dir / "catchments.gpkg", id);
        double sum = 0.0;
        std::size_t count = 0;
        for (int r = 0; r < height; ++r) {
            for (int c = 0; c < width; ++c) {
                OGRPoint centre(cell_centre_x(c), cell_centre_y(r));
                if (centre.Within(g.get())) {
                    sum +=
                        static_cast<double>(pct[static_cast<std::size_t>(r * width + c)]) / 100.0;
                    ++count;
                }
            }
        }
        ASSERT_EQ(count, point(id).at("total_cells").get<std::size_t>()) << id;
        // Tolerance 1e-5 m/m: GDAL computes in float32 and writes float32.
        EXPECT_NEAR(point(id).at("mean_slope_m_per_m").get<double>(),
                    sum / static_cast<double>(count), 1e-5)
            << id;
    }
}

TEST_F(DelineateResults, GeoPackageHasTheFiveLayers) {
    GDALDatasetUniquePtr ds(
        GDALDataset::Open((out_dir / "catchments.gpkg").string().c_str(), GDAL_OF_VECTOR));
    ASSERT_TRUE(ds);
    for (const char *name :
         {"catchments", "local_catchments", "flow_paths", "design_points", "streams"}) {
        OGRLayer *l = ds->GetLayerByName(name);
        ASSERT_NE(l, nullptr) << name;
        if (std::string(name) != "streams") {
            EXPECT_EQ(l->GetFeatureCount(), 2) << name;
        }
    }
    OGRLayer *dps = ds->GetLayerByName("design_points");
    OGRFeatureUniquePtr f(dps->GetNextFeature());
    EXPECT_NEAR(f->GetFieldAsDouble("snap_distance_m"), std::sqrt(12.0 * 12.0 + 20.0 * 20.0),
                1e-9); // as in SnapsToTheChannelAndNestsTheUpstreamPoint
}
