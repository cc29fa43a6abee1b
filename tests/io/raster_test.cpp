// SPDX-License-Identifier: MIT
#include "catchpeak/io/raster.hpp"
#include "support/input_error.hpp"

#include "catchpeak/core/error.hpp"
#include "gdal_test_data.hpp"
#include "support/test_env.hpp"

#include <gdal_utils.h>
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>

using catchpeak::InputError;
using catchpeak::io::read_dem;
namespace fs = std::filesystem;
namespace t = catchpeak::test;

namespace {

std::vector<float> ramp(int w, int h) {
    std::vector<float> v;
    for (int r = 0; r < h; ++r) {
        for (int c = 0; c < w; ++c) {
            v.push_back(static_cast<float>(100 + 10 * r + c));
        }
    }
    return v;
}

} // namespace

TEST(ReadDem, MetreGeoTiffWithNodata) {
    const auto dir = t::scratch_dir("metre_geotiff");
    t::RasterSpec s;
    s.crs_wkt = t::crs_wkt("EPSG:32633");
    s.values = ramp(4, 3);
    s.values[5] = -9999.0f;
    s.has_nodata = true;
    s.unit = "m";
    const auto dem = read_dem(t::make_raster(dir / "dem.tif", s));
    const auto &g = dem.elevation_m;
    ASSERT_EQ(g.width(), 4u);
    ASSERT_EQ(g.height(), 3u);
    EXPECT_FLOAT_EQ(g(0, 0), 100.0f);
    EXPECT_FLOAT_EQ(g(3, 2), 123.0f);
    EXPECT_FALSE(g.is_valid(5));
    EXPECT_TRUE(g.is_valid(4));
    EXPECT_EQ(dem.valid_cells, 11u);
    EXPECT_DOUBLE_EQ(g.transform.origin_x, 500000.0);
    EXPECT_DOUBLE_EQ(g.transform.pixel_height, -10.0);
    EXPECT_EQ(dem.horizontal_unit, "metre");
    EXPECT_NE(g.crs_wkt.find("32633"), std::string::npos);
}

TEST(ReadDem, InternationalFeetConvertedToMetres) {
    const auto dir = t::scratch_dir("feet");
    t::RasterSpec s;
    s.crs_wkt = t::utm_in_unit(SRS_UL_FOOT, 0.3048);
    s.gt = {1000.0, 10.0, 0.0, 20000.0, 0.0, -10.0}; // feet
    s.values = ramp(4, 3);                           // no band unit: taken as the CRS's (feet)
    const auto dem = read_dem(t::make_raster(dir / "dem_ft.tif", s));
    const auto &g = dem.elevation_m;
    // 1 ft = 0.3048 m exactly (international foot, 1959 agreement).
    EXPECT_DOUBLE_EQ(g.transform.pixel_width, 10.0 * 0.3048);
    EXPECT_DOUBLE_EQ(g.transform.origin_x, 1000.0 * 0.3048);
    EXPECT_DOUBLE_EQ(g.transform.origin_y, 20000.0 * 0.3048);
    EXPECT_FLOAT_EQ(g(1, 1), static_cast<float>(111.0 * 0.3048));
    EXPECT_EQ(dem.horizontal_unit, "international foot");
    EXPECT_EQ(dem.vertical_unit, "international foot");
    EXPECT_FALSE(dem.notes.empty());
    // The CRS handed on is in metres, so that coordinates and CRS agree.
    OGRSpatialReference srs;
    ASSERT_EQ(srs.importFromWkt(g.crs_wkt.c_str()), OGRERR_NONE);
    EXPECT_DOUBLE_EQ(srs.GetLinearUnits(), 1.0);
    // false easting 500000 m stays 500000 m
    EXPECT_NEAR(srs.GetProjParm(SRS_PP_FALSE_EASTING), 500000.0, 1e-6); // rounding of ft->m
}

TEST(ReadDem, TallRasterIsReadInStripsWithEveryRowInPlace) {
    // 2048 columns: a read strip holds 512 rows of doubles (8 MiB), so 1100 rows take three
    // strips; each cell holds its own row and column, so a row read into the wrong place shows.
    const auto dir = t::scratch_dir("tall");
    t::RasterSpec s;
    s.width = 2048;
    s.height = 1100;
    s.crs_wkt = t::crs_wkt("EPSG:32633");
    s.has_nodata = true;
    for (int r = 0; r < s.height; ++r) {
        for (int c = 0; c < s.width; ++c) {
            s.values.push_back(static_cast<float>(r) + static_cast<float>(c % 8) * 0.125f);
        }
    }
    s.values[700 * 2048 + 5] = -9999.0f;
    for (const std::string unit : {"m", "ft"}) {
        s.unit = unit;
        const auto dem = read_dem(t::make_raster(dir / ("dem_" + unit + ".tif"), s));
        const auto &g = dem.elevation_m;
        ASSERT_EQ(g.height(), 1100u);
        const double to_m = unit == "m" ? 1.0 : 0.3048; // international foot, exact
        for (const std::size_t r : {0u, 511u, 512u, 1023u, 1024u, 1099u}) {
            EXPECT_FLOAT_EQ(g(3, r), static_cast<float>((static_cast<double>(r) + 0.375) * to_m))
                << unit << " row " << r;
        }
        EXPECT_FALSE(g.is_valid(700 * 2048 + 5)) << unit;
        EXPECT_EQ(dem.valid_cells, 2048u * 1100u - 1u) << unit;
    }
}

TEST(ReadDem, UsSurveyFeetWithMetreElevations) {
    const auto dir = t::scratch_dir("us_feet");
    t::RasterSpec s;
    s.crs_wkt = t::utm_in_unit(SRS_UL_US_FOOT, 1200.0 / 3937.0);
    s.values = ramp(4, 3);
    s.unit = "metre";
    const auto dem = read_dem(t::make_raster(dir / "dem_usft.tif", s));
    // 1 US survey ft = 1200/3937 m exactly (definition of 1893).
    EXPECT_DOUBLE_EQ(dem.elevation_m.transform.pixel_width, 10.0 * 1200.0 / 3937.0);
    EXPECT_FLOAT_EQ(dem.elevation_m(2, 0), 102.0f); // band says metres: unchanged
    EXPECT_EQ(dem.horizontal_unit, "US survey foot");
    EXPECT_EQ(dem.vertical_unit, "metre");
}

TEST(ReadDem, AsciiGridWithPrj) {
    const auto dir = t::scratch_dir("ascii");
    {
        std::ofstream asc(dir / "dem.asc");
        asc << "ncols 3\nnrows 2\nxllcorner 1000\nyllcorner 2000\ncellsize 5\n"
               "NODATA_value -1\n1 2 3\n4 -1 6\n";
        OGRSpatialReference srs;
        srs.SetFromUserInput("EPSG:32633");
        srs.morphToESRI();
        char *wkt = nullptr;
        srs.exportToWkt(&wkt);
        std::ofstream prj(dir / "dem.prj");
        prj << wkt;
        CPLFree(wkt);
    }
    const auto dem = read_dem(dir / "dem.asc");
    const auto &g = dem.elevation_m;
    ASSERT_EQ(g.width(), 3u);
    ASSERT_EQ(g.height(), 2u);
    EXPECT_FLOAT_EQ(g(2, 1), 6.0f);
    EXPECT_FALSE(g.is_valid(g.index(1, 1)));
    EXPECT_DOUBLE_EQ(g.transform.origin_y, 2010.0); // top edge = yll + nrows * cellsize
}

TEST(ReadDem, VrtMosaicOfTwoTiles) {
    const auto dir = t::scratch_dir("vrt");
    t::RasterSpec a;
    a.crs_wkt = t::crs_wkt("EPSG:32633");
    a.values = std::vector<float>(12, 1.0f);
    t::RasterSpec b = a;
    b.gt[0] += 40.0; // the next 4 columns east
    b.values = std::vector<float>(12, 2.0f);
    const auto pa = t::make_raster(dir / "a.tif", a);
    const auto pb = t::make_raster(dir / "b.tif", b);
    const std::string sa = pa.string();
    const std::string sb = pb.string();
    const char *names[] = {sa.c_str(), sb.c_str()};
    int err = 0;
    GDALDatasetH vrt =
        GDALBuildVRT((dir / "mosaic.vrt").string().c_str(), 2, nullptr, names, nullptr, &err);
    ASSERT_NE(vrt, nullptr);
    GDALClose(vrt);
    const auto dem = read_dem(dir / "mosaic.vrt");
    ASSERT_EQ(dem.elevation_m.width(), 8u);
    EXPECT_FLOAT_EQ(dem.elevation_m(0, 0), 1.0f);
    EXPECT_FLOAT_EQ(dem.elevation_m(7, 2), 2.0f);
}

TEST(ReadDem, RefusesGeographicCrsAndSaysHowToReproject) {
    const auto dir = t::scratch_dir("geographic");
    t::RasterSpec s;
    s.crs_wkt = t::crs_wkt("EPSG:4326");
    s.gt = {10.0, 0.001, 0.0, 45.0, 0.0, -0.001};
    const auto p = t::make_raster(dir / "geo.tif", s);
    const auto msg = catchpeak::test::input_error_of([&] { (void)read_dem(p); });
    EXPECT_NE(msg.find(p.string()), std::string::npos) << msg;
    EXPECT_NE(msg.find("geographic"), std::string::npos) << msg;
    EXPECT_NE(msg.find("gdalwarp -t_srs EPSG:"), std::string::npos) << msg;
}

TEST(ReadDem, RefusesMissingCrs) {
    const auto dir = t::scratch_dir("no_crs");
    const auto p = t::make_raster(dir / "nocrs.tif", t::RasterSpec{});
    const auto msg = catchpeak::test::input_error_of([&] { (void)read_dem(p); });
    EXPECT_NE(msg.find("no coordinate reference system"), std::string::npos) << msg;
    EXPECT_NE(msg.find(p.string()), std::string::npos) << msg;
}

TEST(ReadDem, RefusesSeveralBands) {
    const auto dir = t::scratch_dir("bands");
    t::RasterSpec s;
    s.crs_wkt = t::crs_wkt("EPSG:32633");
    s.bands = 3;
    const auto p = t::make_raster(dir / "rgb.tif", s);
    const auto msg = catchpeak::test::input_error_of([&] { (void)read_dem(p); });
    EXPECT_NE(msg.find("3 bands"), std::string::npos) << msg;
    EXPECT_NE(msg.find("gdal_translate -b"), std::string::npos) << msg;
}

TEST(ReadDem, RefusesAllNodata) {
    const auto dir = t::scratch_dir("all_nodata");
    t::RasterSpec s;
    s.crs_wkt = t::crs_wkt("EPSG:32633");
    s.values = std::vector<float>(12, -9999.0f);
    s.has_nodata = true;
    const auto p = t::make_raster(dir / "empty.tif", s);
    const auto msg = catchpeak::test::input_error_of([&] { (void)read_dem(p); });
    EXPECT_NE(msg.find("every cell is nodata"), std::string::npos) << msg;
    EXPECT_NE(msg.find(p.string()), std::string::npos) << msg;
}

TEST(ReadDem, RefusesRotatedGeotransform) {
    const auto dir = t::scratch_dir("rotated");
    t::RasterSpec s;
    s.crs_wkt = t::crs_wkt("EPSG:32633");
    s.gt = {500000.0, 10.0, 1.0, 4000000.0, 1.0, -10.0};
    const auto p = t::make_raster(dir / "rot.tif", s);
    const auto msg = catchpeak::test::input_error_of([&] { (void)read_dem(p); });
    EXPECT_NE(msg.find("rotated"), std::string::npos) << msg;
}

TEST(ReadDem, RefusesFileThatIsNotARaster) {
    const auto dir = t::scratch_dir("not_raster");
    const auto p = dir / "notes.txt";
    std::ofstream(p) << "this is not a raster\n";
    const auto msg = catchpeak::test::input_error_of([&] { (void)read_dem(p); });
    EXPECT_NE(msg.find(p.string()), std::string::npos) << msg;
    EXPECT_NE(msg.find("cannot be read as a raster"), std::string::npos) << msg;
    const auto missing =
        catchpeak::test::input_error_of([&] { (void)read_dem(dir / "missing.tif"); });
    EXPECT_NE(missing.find("file not found"), std::string::npos) << missing;
}

TEST(ReadDem, RefusesUnknownElevationUnit) {
    const auto dir = t::scratch_dir("unit");
    t::RasterSpec s;
    s.crs_wkt = t::crs_wkt("EPSG:32633");
    s.unit = "furlong";
    const auto p = t::make_raster(dir / "furlong.tif", s);
    const auto msg = catchpeak::test::input_error_of([&] { (void)read_dem(p); });
    EXPECT_NE(msg.find("'furlong'"), std::string::npos) << msg;
}

TEST(WriteGeotiff, RoundTripsEachTypeAndLeavesNoTemporaryFile) {
    const auto dir = t::scratch_dir("write");
    catchpeak::Grid<float> f(3, 2, 5.5f);
    f.transform = {1000.0, 2.0, 0.0, 3000.0, 0.0, -2.0};
    f.crs_wkt = t::crs_wkt("EPSG:32633");
    f.nodata = std::nanf("");
    f(1, 1) = std::nanf("");
    f(2, 0) = 7.25f;
    catchpeak::io::write_geotiff(f, dir / "f.tif");
    const auto back = read_dem(dir / "f.tif");
    EXPECT_FLOAT_EQ(back.elevation_m(2, 0), 7.25f);
    EXPECT_FALSE(back.elevation_m.is_valid(back.elevation_m.index(1, 1)));
    EXPECT_DOUBLE_EQ(back.elevation_m.transform.origin_y, 3000.0);

    catchpeak::Grid<std::uint32_t> u(2, 2, 0);
    u.copy_georef_from(f);
    u(1, 0) = 4000000000u;
    catchpeak::io::write_geotiff(u, dir / "u32.tif");
    catchpeak::Grid<std::uint8_t> b(2, 2, 3);
    b.copy_georef_from(f);
    catchpeak::io::write_geotiff(b, dir / "u8.tif");

    GDALAllRegister();
    GDALDatasetUniquePtr ds(GDALDataset::Open((dir / "u32.tif").string().c_str(), GDAL_OF_RASTER));
    ASSERT_TRUE(ds);
    EXPECT_EQ(ds->GetRasterBand(1)->GetRasterDataType(), GDT_UInt32);
    std::uint32_t v = 0;
    ASSERT_EQ(
        ds->GetRasterBand(1)->RasterIO(GF_Read, 1, 0, 1, 1, &v, 1, 1, GDT_UInt32, 0, 0, nullptr),
        CE_None);
    EXPECT_EQ(v, 4000000000u);
    EXPECT_TRUE(t::pending_files(dir).empty());
}

TEST(WriteGeotiff, UnwritableFolderIsAnInputErrorAndLeavesNothing) {
    const auto dir = t::scratch_dir("unwritable");
    catchpeak::Grid<float> f(2, 2, 1.0f);
    const auto msg = catchpeak::test::input_error_of(
        [&] { catchpeak::io::write_geotiff(f, dir / "no_such_folder" / "f.tif"); });
    EXPECT_NE(msg.find("f.tif"), std::string::npos) << msg;
    EXPECT_TRUE(t::pending_files(dir).empty());
}
