// SPDX-License-Identifier: MIT
// A small DEM project made by the tests: a V valley with a closed head, two nested design points
// on its axis, two land-cover classes on one soil. The geometry is chosen so that every figure
// the tests check can be computed by hand (see the comments of dem_project).
#pragma once

#include "io/gdal_test_data.hpp"
#include "support/test_project.hpp"

#include <fmt/format.h>

#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

namespace catchpeak::test {

/// The valley: 41 columns x 60 rows of 10 m cells, north up, UTM zone 33N.
/// - Across: the axis is column 20. Cells 1 to 15 columns from the axis rise 2 m per column
///   towards the sides (20 % against 5 % down the valley: D8 sends them straight to the axis);
///   cells 16 or more columns away lie 1 m below the crest cell and fall 2 m per column
///   outwards (no tie between the two sides of a crest cell), so the ridges lie between
///   columns 4|5 and 35|36 and the valley is columns 5..35 (31 columns).
/// - Along: from row 5 southwards the ground falls 0.5 m per row (5 %); rows 0..4 fall
///   northwards (the valley head), row 4 lying 0.25 m below row 5, so the divide lies between
///   rows 4|5.
/// The catchment of the axis cell of row r is therefore columns 5..35 x rows 5..r:
/// 31 x (r - 4) cells of 100 m2.
struct DemProjectSpec {
    static constexpr int width = 41;
    static constexpr int height = 60;
    static constexpr double cell_m = 10.0;
    static constexpr double x0 = 500000.0;
    static constexpr double y0 = 4000000.0;
    static constexpr int axis_col = 20;
    static constexpr int head_row = 5;
    static constexpr int upper_row = 24;  ///< design point DP-UP
    static constexpr int outlet_row = 54; ///< design point DP-OUT
    static constexpr int split_row = 15;  ///< commercial in rows < 15, residential below
};

inline float valley_z(int col, int row) {
    const int d = std::abs(col - DemProjectSpec::axis_col);
    const double across = d <= 15 ? 2.0 * d : 31.0 - 2.0 * (d - 15);
    const int h = DemProjectSpec::head_row;
    const double along = row >= h ? 0.5 * (DemProjectSpec::height - row)
                                  : 0.5 * (DemProjectSpec::height - h) - 0.25 - 3.0 * (h - 1 - row);
    return static_cast<float>(100.0 + across + along);
}

inline double cell_x(double col) {
    return DemProjectSpec::x0 + (col + 0.5) * DemProjectSpec::cell_m;
}
inline double cell_y(double row) {
    return DemProjectSpec::y0 - (row + 0.5) * DemProjectSpec::cell_m;
}

/// What a test may change in the project.
struct DemProjectOptions {
    std::string dem_crs = "EPSG:32633";
    std::string land_crs = "EPSG:32633";   ///< "" = no CRS
    std::string points_crs = "EPSG:32633"; ///< of the design points and the soils
    std::vector<PointSpec> points;         ///< empty: the two design points on the axis
    bool empty_points = false;             ///< write a point layer without features
    std::string residential_class = "residential_1_4_ac";
};

/// The valley project in a fresh scratch folder: dem.tif, points.gpkg, land.gpkg (land.shp
/// without a CRS) and soils.gpkg are written at once; idf.csv and project.toml (an SI project
/// "Valley test", Kirpich and the Rational Method at 2 and 10 years) by write().
inline TestProject dem_project(const std::string &scratch_name, const DemProjectOptions &o = {}) {
    using S = DemProjectSpec;
    TestProject p(scratch_name);
    const std::filesystem::path &dir = p.dir();
    RasterSpec r;
    r.width = S::width;
    r.height = S::height;
    r.gt = {S::x0, S::cell_m, 0.0, S::y0, 0.0, -S::cell_m};
    r.crs_wkt = crs_wkt(o.dem_crs);
    for (int row = 0; row < S::height; ++row) {
        for (int col = 0; col < S::width; ++col) {
            r.values.push_back(valley_z(col, row));
        }
    }
    make_raster(dir / "dem.tif", r);

    std::vector<PointSpec> pts = o.points;
    if (pts.empty() && !o.empty_points) {
        pts = {{cell_x(S::axis_col), cell_y(S::upper_row), "DP-UP"},
               {cell_x(S::axis_col), cell_y(S::outlet_row), "DP-OUT"}};
    }
    make_points(dir / "points.gpkg", pts, o.points_crs);

    // Land cover: two rectangles over the whole DEM, split at the top of row split_row.
    const double x1 = S::x0 + S::width * S::cell_m;
    const double y_split = S::y0 - S::split_row * S::cell_m;
    const double y1 = S::y0 - S::height * S::cell_m;
    auto rect = [](double ax, double ay, double bx, double by) {
        return fmt::format("POLYGON(({0} {1},{2} {1},{2} {3},{0} {3},{0} {1}))", ax, ay, bx, by);
    };
    // Without a CRS: a shapefile without its .prj (a GeoPackage always records one).
    const std::string land_file = o.land_crs.empty() ? "land.shp" : "land.gpkg";
    make_layer(dir / land_file, "land", {"class"},
               {{rect(S::x0, y_split, x1, S::y0), {"commercial"}},
                {rect(S::x0, y1, x1, y_split), {o.residential_class}}},
               o.land_crs, o.land_crs.empty() ? "ESRI Shapefile" : "GPKG");
    make_layer(dir / "soils.gpkg", "soils", {"hsg"}, {{rect(S::x0, y1, x1, S::y0), {"B"}}},
               o.points_crs);
    p.idf("# unit: mm/h\nduration_min,2,10\n5,100,150\n10,80,120\n60,30,45\n");
    p.project.text("name", "Valley test");
    p.inputs.remove("catchment_table")
        .text("dem", "dem.tif")
        .text("design_points", "points.gpkg")
        .text("id_field", "id")
        .text("land_cover", land_file)
        .text("class_field", "class")
        .text("soils", "soils.gpkg")
        .text("soil_group_field", "hsg");
    p.rainfall.set("return_periods_yr", "[2, 10]");
    p.methods.text("tc", "kirpich").set("peak", "[\"rational\"]");
    p.settings.set("snap_radius_m", "5.0").set("minimum_tc_min", "5");
    return p;
}

} // namespace catchpeak::test
