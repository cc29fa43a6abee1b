// SPDX-License-Identifier: MIT
#include "catchpeak/io/class_raster.hpp"

#include "catchpeak/core/error.hpp"
#include "io/class_raster_data.hpp"
#include "support/input_error.hpp"
#include "support/test_env.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <fstream>

using namespace catchpeak::io;
namespace t = catchpeak::test;

namespace {

const std::string &utm33() {
    static const std::string wkt = t::crs_wkt("EPSG:32633");
    return wkt;
}

/// A 10 x 10 raster of 10 m cells at (500000, 4000100) (top left): code = column / 5 + 1
/// (code 1 west of x = 500050, code 2 east of it).
t::ClassRasterSpec ten_by_ten() {
    t::ClassRasterSpec s;
    s.width = 10;
    s.height = 10;
    s.gt = {500000.0, 10.0, 0.0, 4000100.0, 0.0, -10.0};
    s.crs_wkt = utm33();
    s.codes = t::codes_of(10, 10, [](int col, int) { return col / 5 + 1; });
    return s;
}

} // namespace

TEST(DataKind, TellsRastersFromVectorLayers) {
    const auto dir = t::scratch_dir("data_kind");
    const auto tif = t::make_class_raster(dir / "codes.tif", ten_by_ten());
    const auto gpkg = t::make_layer(dir / "land.gpkg", "land", {"class"},
                                    {{"POLYGON((0 0,1 0,1 1,0 0))", {"meadow"}}}, "EPSG:32633");
    EXPECT_EQ(data_kind(tif), DataKind::raster);
    EXPECT_EQ(data_kind(gpkg), DataKind::vector);
    const std::string missing = t::input_error_of([&] { (void)data_kind(dir / "none.tif"); });
    EXPECT_NE(missing.find("none.tif"), std::string::npos) << missing;
    EXPECT_NE(missing.find("file not found"), std::string::npos) << missing;
    std::ofstream(dir / "notes.txt") << "not a dataset\n";
    const std::string text = t::input_error_of([&] { (void)data_kind(dir / "notes.txt"); });
    EXPECT_NE(text.find("notes.txt"), std::string::npos) << text;
}

TEST(ReadClassRaster, SameCrsReadsTheFileCellsOverTheWindowAndTwoCellsOfMargin) {
    const auto dir = t::scratch_dir("class_raster_window");
    const auto tif = t::make_class_raster(dir / "codes.tif", ten_by_ten());
    // Window x 500041..500059, y 4000041..4000059: columns 4..5, rows 4..5; with two cells of
    // margin, columns 2..7 and rows 2..7 (6 x 6 cells from (500020, 4000080)).
    const auto r = read_class_raster(tif, utm33(), {500041.0, 4000041.0, 500059.0, 4000059.0}, "");
    EXPECT_FALSE(r.reprojected);
    ASSERT_EQ(r.labels.width(), 6u);
    ASSERT_EQ(r.labels.height(), 6u);
    EXPECT_DOUBLE_EQ(r.labels.transform.origin_x, 500020.0);
    EXPECT_DOUBLE_EQ(r.labels.transform.origin_y, 4000080.0);
    EXPECT_DOUBLE_EQ(r.cell_x_m, 10.0);
    EXPECT_DOUBLE_EQ(r.cell_y_m, 10.0);
    EXPECT_DOUBLE_EQ(r.file_cell_x, 10.0);
    EXPECT_EQ(r.file_unit, "metre");
    // Columns 2..4 hold code 1, columns 5..7 code 2: 3 x 6 = 18 cells each.
    ASSERT_EQ(r.codes, (std::vector<std::int64_t>{1, 2}));
    EXPECT_EQ(r.cell_counts, (std::vector<std::uint64_t>{18, 18}));
    EXPECT_EQ(r.labels(0, 0), 1u);
    EXPECT_EQ(r.labels(2, 5), 1u);
    EXPECT_EQ(r.labels(3, 0), 2u);
    EXPECT_TRUE(r.names.empty());
    EXPECT_TRUE(r.names_from.empty());
}

TEST(ReadClassRaster, WindowAtTheEdgeIsClampedAndAWindowOutsideGivesNoCells) {
    const auto dir = t::scratch_dir("class_raster_edge");
    const auto tif = t::make_class_raster(dir / "codes.tif", ten_by_ten());
    // The window reaches 50 m west of the raster: column 0 and two columns of margin east; the
    // margin west is clipped at the raster's edge.
    const auto r = read_class_raster(tif, utm33(), {499950.0, 4000001.0, 500009.0, 4000019.0}, "");
    EXPECT_EQ(r.labels.width(), 3u);  // columns 0..2
    EXPECT_EQ(r.labels.height(), 4u); // rows 8..9 plus rows 6..7 of margin; none below
    EXPECT_DOUBLE_EQ(r.labels.transform.origin_x, 500000.0);
    EXPECT_DOUBLE_EQ(r.labels.transform.origin_y, 4000040.0);
    const auto far =
        read_class_raster(tif, utm33(), {600000.0, 4000000.0, 600100.0, 4000100.0}, "");
    EXPECT_TRUE(far.labels.empty());
    EXPECT_TRUE(far.codes.empty());
}

TEST(ReadClassRaster, NodataCellsCarryNoLabel) {
    const auto dir = t::scratch_dir("class_raster_nodata");
    auto s = ten_by_ten();
    s.nodata = 255.0;
    s.codes[0] = 255.0;  // column 0, row 0
    s.codes[11] = 255.0; // column 1, row 1
    const auto tif = t::make_class_raster(dir / "codes.tif", s);
    const auto r = read_class_raster(tif, utm33(), {500000.0, 4000000.0, 500100.0, 4000100.0}, "");
    ASSERT_EQ(r.labels.width(), 10u);
    EXPECT_EQ(r.labels(0, 0), 0u);
    EXPECT_EQ(r.labels(1, 1), 0u);
    EXPECT_EQ(r.labels(1, 0), 1u);
    EXPECT_EQ(r.codes, (std::vector<std::int64_t>{1, 2}));
    EXPECT_EQ(r.cell_counts, (std::vector<std::uint64_t>{48, 50}));
}

TEST(ReadClassRaster, NamesFromCategoryNames) {
    const auto dir = t::scratch_dir("class_raster_categories");
    auto s = ten_by_ten();
    s.categories = {"", "meadow", "commercial"};
    const auto tif = t::make_class_raster(dir / "codes.tif", s);
    const auto r = read_class_raster(tif, utm33(), {500000.0, 4000000.0, 500100.0, 4000100.0}, "");
    EXPECT_EQ(r.names_from, "its category names");
    ASSERT_EQ(r.names.size(), 2u);
    EXPECT_EQ(r.names.at(1), "meadow");
    EXPECT_EQ(r.names.at(2), "commercial");
}

TEST(ReadClassRaster, NamesFromTheAttributeTableColumnOfTheFieldOrItsNameColumn) {
    const auto dir = t::scratch_dir("class_raster_rat");
    auto s = ten_by_ten();
    s.rat = {{1, "woods_good"}, {2, "meadow"}};
    s.rat_column = "landuse";
    const auto tif = t::make_class_raster(dir / "codes.tif", s);
    const Extent all{500000.0, 4000000.0, 500100.0, 4000100.0};
    const auto r = read_class_raster(tif, utm33(), all, "LandUse");
    EXPECT_EQ(r.names_from, "its attribute table, column 'landuse'");
    EXPECT_EQ(r.names.at(1), "woods_good");
    EXPECT_EQ(r.names.at(2), "meadow");
    // Another column name, not marked as the name column: no names.
    const auto none = read_class_raster(tif, utm33(), all, "class");
    EXPECT_TRUE(none.names.empty());

    s.rat_name_usage = true;
    const auto named = t::make_class_raster(dir / "named.tif", s);
    const auto r2 = read_class_raster(named, utm33(), all, "class");
    EXPECT_EQ(r2.names_from, "its attribute table, column 'landuse'");
    EXPECT_EQ(r2.names.at(2), "meadow");
}

TEST(ReadClassRaster, RefusesNonIntegerCodesMissingCrsAndSeveralBands) {
    const auto dir = t::scratch_dir("class_raster_bad");
    const Extent all{500000.0, 4000000.0, 500100.0, 4000100.0};
    auto s = ten_by_ten();
    s.codes[12] = 1.5; // column 2, row 1: centre (500025, 4000085)
    const auto frac = t::make_class_raster(dir / "frac.tif", s);
    const std::string m1 =
        t::input_error_of([&] { (void)read_class_raster(frac, utm33(), all, ""); });
    EXPECT_NE(m1.find("frac.tif"), std::string::npos) << m1;
    EXPECT_NE(m1.find("(500025.000, 4000085.000) holds 1.5"), std::string::npos) << m1;
    EXPECT_NE(m1.find("not an integer class code"), std::string::npos) << m1;

    auto no_crs = ten_by_ten();
    no_crs.crs_wkt = "";
    const auto bare = t::make_class_raster(dir / "bare.tif", no_crs);
    const std::string m2 =
        t::input_error_of([&] { (void)read_class_raster(bare, utm33(), all, ""); });
    EXPECT_NE(m2.find("bare.tif"), std::string::npos) << m2;
    EXPECT_NE(m2.find("has no coordinate reference system"), std::string::npos) << m2;
    EXPECT_NE(m2.find("gdal_edit.py -a_srs"), std::string::npos) << m2;

    auto two = ten_by_ten();
    two.bands = 2;
    const auto multi = t::make_class_raster(dir / "two.tif", two);
    const std::string m3 =
        t::input_error_of([&] { (void)read_class_raster(multi, utm33(), all, ""); });
    EXPECT_NE(m3.find("has 2 bands"), std::string::npos) << m3;
}

TEST(ReadClassRaster, AnotherCrsIsWarpedByNearestNeighbourToTheTarget) {
    // The file: UTM 33N in US survey feet, 20 x 20 cells of 32.8083333 ft (10 m), code 1 west
    // of x = 500100 m and code 2 east of it. In the target (UTM 33N in metres) the boundary is
    // the same north-south line (a change of unit only). Nearest neighbour puts every warped
    // cell whose centre lies west of it in code 1: the boundary lies within one warped cell of
    // x = 500100 m.
    const auto dir = t::scratch_dir("class_raster_warp");
    constexpr double ft = 1200.0 / 3937.0; // US survey foot, m (exact by definition)
    t::ClassRasterSpec s;
    s.width = 20;
    s.height = 20;
    s.gt = {500000.0 / ft, 10.0 / ft, 0.0, 4000200.0 / ft, 0.0, -10.0 / ft};
    s.crs_wkt = t::utm_in_unit("US survey foot", ft);
    s.codes = t::codes_of(20, 20, [](int col, int) { return col < 10 ? 1 : 2; });
    const auto tif = t::make_class_raster(dir / "feet.tif", s);
    const auto r = read_class_raster(tif, utm33(), {500050.0, 4000050.0, 500150.0, 4000150.0}, "");
    EXPECT_TRUE(r.reprojected);
    EXPECT_NEAR(r.file_cell_x, 10.0 / ft, 1e-9);
    // The suggested cell: about the file's 10 m (GDAL's suggestion; 1 % is our allowance).
    EXPECT_NEAR(r.cell_x_m, 10.0, 0.1);
    EXPECT_DOUBLE_EQ(r.cell_x_m, r.cell_y_m);
    ASSERT_EQ(r.codes, (std::vector<std::int64_t>{1, 2}));
    // Every cell is covered (the file reaches past the window and its margin on every side).
    const auto &g = r.labels;
    std::size_t covered = 0;
    for (std::size_t i = 0; i < g.size(); ++i) {
        covered += g[i] != 0 ? 1 : 0;
    }
    EXPECT_EQ(covered, g.size());
    for (std::size_t row = 0; row < g.height(); ++row) {
        for (std::size_t col = 0; col < g.width(); ++col) {
            const double x = g.transform.cell_centre(col, row).first;
            if (std::abs(x - 500100.0) > r.cell_x_m) {
                EXPECT_EQ(g(col, row), x < 500100.0 ? 1u : 2u) << "cell at x = " << x;
            }
        }
    }
}

// For the check that a layer overlaps the DEM: the whole raster's extent, in the target CRS.
TEST(ReadClassRaster, TheExtentOfTheWholeRasterIsGivenInTheTargetCrs) {
    const auto dir = t::scratch_dir("class_raster_extent");
    t::ClassRasterSpec same;
    same.crs_wkt = utm33();
    same.codes = t::codes_of(4, 4, [](int, int) { return 1; });
    const auto a = read_class_raster(t::make_class_raster(dir / "same.tif", same), utm33(),
                                     {500000.0, 4000000.0, 500010.0, 4000010.0}, "");
    // 4 x 4 cells of 10 m from (500000, 4000040) down and right (ClassRasterSpec).
    EXPECT_DOUBLE_EQ(a.extent.min_x, 500000.0);
    EXPECT_DOUBLE_EQ(a.extent.max_x, 500040.0);
    EXPECT_DOUBLE_EQ(a.extent.min_y, 4000000.0);
    EXPECT_DOUBLE_EQ(a.extent.max_y, 4000040.0);

    // UTM 33N in US survey feet: the same square, a change of unit only. Tolerance 1 mm:
    // rounding of the unit conversion.
    constexpr double ft = 1200.0 / 3937.0; // US survey foot, m (exact by definition)
    t::ClassRasterSpec feet = same;
    feet.gt = {500000.0 / ft, 10.0 / ft, 0.0, 4000040.0 / ft, 0.0, -10.0 / ft};
    feet.crs_wkt = t::utm_in_unit("US survey foot", ft);
    const auto b = read_class_raster(t::make_class_raster(dir / "feet.tif", feet), utm33(),
                                     {500000.0, 4000000.0, 500010.0, 4000010.0}, "");
    EXPECT_NEAR(b.extent.min_x, 500000.0, 1e-3);
    EXPECT_NEAR(b.extent.max_x, 500040.0, 1e-3);
    EXPECT_NEAR(b.extent.min_y, 4000000.0, 1e-3);
    EXPECT_NEAR(b.extent.max_y, 4000040.0, 1e-3);
}
