// SPDX-License-Identifier: MIT
// Land cover and soils given as rasters of class codes, read for the overlay and weighted over
// catchments whose parts can be computed by hand.
#include "catchpeak/app/land_inputs.hpp"
#include "support/calc_lines.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/land/overlay.hpp"
#include "catchpeak/land/tables.hpp"
#include "io/class_raster_data.hpp"
#include "support/input_error.hpp"
#include "support/test_env.hpp"
#include "support/wkb.hpp"

#include <gtest/gtest.h>

#include <fstream>

using namespace catchpeak::app;
using namespace catchpeak::project;
namespace fs = std::filesystem;
namespace t = catchpeak::test;
namespace land = catchpeak::land;

namespace {

const std::string &utm33() {
    static const std::string wkt = t::crs_wkt("EPSG:32633");
    return wkt;
}

InputPath input(const fs::path &dir, const std::string &name, std::size_t line) {
    return {name, dir / name, line};
}

/// The 4 x 4 rasters of 10 m cells from (500000, 4000040) (top left) to (500040, 4000000):
/// - land.tif: column 0 code 1, columns 1..3 code 2; codes.csv: 1 commercial,
///   2 residential_1_4_ac;
/// - soils.tif: rows 0..1 (y > 4000020) code 2, rows 2..3 code 3; category names: 2 B, 3 C.
struct FourByFour {
    fs::path dir;
    Project project;
};

FourByFour four_by_four(const std::string &name,
                        const t::ClassRasterSpec *land_override = nullptr) {
    FourByFour f;
    f.dir = t::scratch_dir(name);
    t::ClassRasterSpec land;
    land.crs_wkt = utm33();
    land.codes = t::codes_of(4, 4, [](int col, int) { return col == 0 ? 1 : 2; });
    t::make_class_raster(f.dir / "land.tif", land_override != nullptr ? *land_override : land);
    t::ClassRasterSpec soils;
    soils.crs_wkt = utm33();
    soils.codes = t::codes_of(4, 4, [](int, int row) { return row < 2 ? 2 : 3; });
    soils.categories = {"", "A", "B", "C", "D"};
    t::make_class_raster(f.dir / "soils.tif", soils);
    std::ofstream(f.dir / "codes.csv") << "# land-cover codes of the test raster\n"
                                          "code,class\n1,commercial\n2,residential_1_4_ac\n";
    Project &p = f.project;
    p.file = f.dir / "project.toml";
    p.dir = f.dir;
    p.inputs.land_cover = input(f.dir, "land.tif", 7);
    p.inputs.land_cover_codes = input(f.dir, "codes.csv", 8);
    p.inputs.soils = input(f.dir, "soils.tif", 9);
    return f;
}

/// The square catchment 500005..500035 x 4000005..4000035 (30 m a side, 900 m2): it cuts the
/// cells of the rasters' outer ring in half.
std::vector<unsigned char> square() {
    return t::rect_wkb(500005.0, 4000005.0, 500035.0, 4000035.0);
}

land::OverlaySettings settings_of(const Project &p) {
    land::OverlaySettings s;
    s.class_field = p.inputs.class_field;
    s.soil_group_field = p.inputs.soil_group_field;
    if (const auto *c = std::get_if<UncoveredAsClass>(&p.settings.uncovered_land)) {
        s.uncovered = land::Uncovered::use_default;
        s.default_class = c->land_class;
    }
    return s;
}

land::CatchmentLand weigh(const Project &p, const std::vector<unsigned char> &catchment) {
    const auto window = extent_of({catchment});
    const auto lc = read_land_input(p, LandInput::land_cover, utm33(), window);
    const auto so = read_land_input(p, LandInput::soils, utm33(), window);
    const land::LandOverlay overlay(lc, so, land::read_default_land_tables(t::config_dir()),
                                    settings_of(p));
    return overlay.weight(catchment, "square", 0.02);
}

const catchpeak::report::LandPart &part(const land::CatchmentLand &r, const std::string &cls,
                                        const std::string &group) {
    for (const auto &p : r.weighting.parts) {
        if (p.land_class == cls && p.soil_group == group) {
            return p;
        }
    }
    throw std::runtime_error("no part " + cls + " " + group);
}

// Areas follow from cell edges and the square's edges: exact up to the overlay's rounding.
constexpr double overlay_rounding = 1e-9;

} // namespace

TEST(LandInputs, FourByFourRastersUnderASquareGiveTheHandComputedPartsCAndCn) {
    const auto f = four_by_four("land_raster_4x4");
    const auto r = weigh(f.project, square());
    // Commercial: x 500005..500010 (5 m) x 30 m; residential: x 500010..500035 (25 m) x 30 m.
    // Soil B: y 4000020..4000035 (15 m); soil C: y 4000005..4000020 (15 m).
    ASSERT_EQ(r.weighting.parts.size(), 4u);
    EXPECT_NEAR(part(r, "commercial", "B").area_m2, 75.0, 75.0 * overlay_rounding);
    EXPECT_NEAR(part(r, "commercial", "C").area_m2, 75.0, 75.0 * overlay_rounding);
    EXPECT_NEAR(part(r, "residential_1_4_ac", "B").area_m2, 375.0, 375.0 * overlay_rounding);
    EXPECT_NEAR(part(r, "residential_1_4_ac", "C").area_m2, 375.0, 375.0 * overlay_rounding);
    EXPECT_NEAR(r.area_m2, 900.0, 900.0 * overlay_rounding);
    EXPECT_EQ(r.uncovered_land_cover_m2, 0.0);
    // C (ASCE midpoints of config/land/runoff_coefficients.csv: commercial 0.825, residential
    // 1/4 ac 0.40): (150 x 0.825 + 750 x 0.40) / 900 = 423.75 / 900.
    EXPECT_NEAR(r.weighting.c_weighted, 423.75 / 900.0, 1e-12);
    // CN (TR-55 Table 2-2a: commercial B 92, C 94; residential 1/4 ac B 75, C 83):
    // (75 x 92 + 75 x 94 + 375 x 75 + 375 x 83) / 900 = 73200 / 900 = 81.33.
    EXPECT_NEAR(r.weighting.cn_weighted, 73200.0 / 900.0, 1e-9);
    // The lines say that the weighting came from rasters of 10 m cells, and how codes were named.
    bool raster_source = false;
    for (const auto &l : r.lines.lines()) {
        if (catchpeak::test::text(l).source.find(
                "land.tif (raster of 10.00 x 10.00 m cells; codes to classes by the code "
                "table 'codes.csv'") != std::string::npos &&
            catchpeak::test::text(l).source.find(
                "soils.tif (raster of 10.00 x 10.00 m cells; codes to soil groups by its "
                "category names)") != std::string::npos) {
            raster_source = true;
        }
    }
    EXPECT_TRUE(raster_source);
}

TEST(LandInputs, TheRasterIsReadOverTheCatchmentsAndAMarginOnly) {
    // 200 x 200 cells of 1 m; a 4 m square catchment: the polygons stay within the square and
    // two cells of margin.
    const auto dir = t::scratch_dir("land_raster_clip");
    t::ClassRasterSpec s;
    s.width = 200;
    s.height = 200;
    s.gt = {500000.0, 1.0, 0.0, 4000200.0, 0.0, -1.0};
    s.crs_wkt = utm33();
    s.codes = t::codes_of(200, 200, [](int col, int row) { return (col + row) % 2 + 1; });
    s.categories = {"", "meadow", "woods_good"};
    t::make_class_raster(dir / "land.tif", s);
    Project p;
    p.file = dir / "project.toml";
    p.inputs.land_cover = input(dir, "land.tif", 3);
    const auto catchment = t::rect_wkb(500100.0, 4000100.0, 500104.0, 4000104.0);
    const auto layer = read_land_input(p, LandInput::land_cover, utm33(), extent_of({catchment}));
    // A checkerboard: one polygon per cell, 8 x 8 cells (4 + 2 x 2 of margin).
    EXPECT_EQ(layer.features.size(), 64u);
    const auto e = extent_of([&] {
        std::vector<std::vector<unsigned char>> all;
        for (const auto &f : layer.features) {
            all.push_back(f.wkb);
        }
        return all;
    }());
    EXPECT_DOUBLE_EQ(e.min_x, 500098.0);
    EXPECT_DOUBLE_EQ(e.max_x, 500106.0);
    EXPECT_DOUBLE_EQ(e.min_y, 4000098.0);
    EXPECT_DOUBLE_EQ(e.max_y, 4000106.0);
    EXPECT_EQ(layer.feature_noun, "code");
    EXPECT_EQ(layer.features.front().attributes.at("class"), "meadow");
}

TEST(LandInputs, NodataCellsAreNotCoveredRefusedOrGivenTheDefaultWithTheirArea) {
    // Cell (column 3, row 0), x 500030..500040, y 4000030..4000040, is nodata: 5 x 5 = 25 m2 of
    // the square are not covered.
    t::ClassRasterSpec land;
    land.crs_wkt = utm33();
    land.codes = t::codes_of(4, 4, [](int col, int) { return col == 0 ? 1 : 2; });
    land.codes[3] = 0.0;
    land.nodata = 0.0;
    auto f = four_by_four("land_raster_nodata", &land);
    const std::string m = t::input_error_of([&] { (void)weigh(f.project, square()); });
    EXPECT_NE(m.find("land.tif"), std::string::npos) << m;
    EXPECT_NE(m.find("25.00 m2 (2.778 % of catchment 'square') is not covered"), std::string::npos)
        << m;

    f.project.settings.uncovered_land = UncoveredAsClass{"meadow"};
    const auto r = weigh(f.project, square());
    EXPECT_NEAR(r.uncovered_land_cover_m2, 25.0, 25.0 * overlay_rounding);
    EXPECT_NEAR(part(r, "meadow", "B").area_m2, 25.0, 25.0 * overlay_rounding);
    EXPECT_NEAR(part(r, "residential_1_4_ac", "B").area_m2, 350.0, 350.0 * overlay_rounding);
    bool warned = false;
    for (const auto &l : r.lines.lines()) {
        if (l.kind == catchpeak::LineKind::warning &&
            catchpeak::test::text(l).numbers.find("25.00 m2") != std::string::npos) {
            warned = true;
        }
    }
    EXPECT_TRUE(warned);
}

TEST(LandInputs, ACodeInNoTableIsRefusedNamingTheCodeTheRasterAndTheTable) {
    t::ClassRasterSpec land;
    land.crs_wkt = utm33();
    land.codes = t::codes_of(4, 4, [](int col, int) { return col == 0 ? 1 : 7; });
    const auto f = four_by_four("land_raster_unknown_code", &land);
    const std::string m = t::input_error_of([&] { (void)weigh(f.project, square()); });
    EXPECT_NE(m.find("land.tif"), std::string::npos) << m;
    EXPECT_NE(m.find("code 7 (12 cells within the catchments' extent) is not named by the code "
                     "table 'codes.csv' ([inputs] land_cover_codes)"),
              std::string::npos)
        << m;
}

TEST(LandInputs, ARasterWithoutNamesOrTableIsRefused) {
    auto f = four_by_four("land_raster_no_names");
    f.project.inputs.land_cover_codes.reset();
    const std::string m = t::input_error_of([&] { (void)weigh(f.project, square()); });
    EXPECT_NE(m.find("land.tif"), std::string::npos) << m;
    EXPECT_NE(m.find("without category names or an attribute table"), std::string::npos) << m;
    EXPECT_NE(m.find("land_cover_codes"), std::string::npos) << m;
}

TEST(LandInputs, ASoilNameThatIsNoSoilGroupIsRefused) {
    auto f = four_by_four("land_raster_bad_soil");
    std::ofstream(f.dir / "soil_codes.csv") << "code,soil_group\n2,B\n3,clay\n";
    f.project.inputs.soil_group_codes = input(f.dir, "soil_codes.csv", 10);
    const std::string m = t::input_error_of([&] { (void)weigh(f.project, square()); });
    EXPECT_NE(m.find("soils.tif: code 3"), std::string::npos) << m;
    EXPECT_NE(m.find("'clay'"), std::string::npos) << m;
    EXPECT_NE(m.find("soil_codes.csv"), std::string::npos) << m;
}

TEST(LandInputs, ACodeTableForAPolygonLayerIsRefused) {
    auto f = four_by_four("land_raster_table_for_vector");
    t::make_layer(
        f.dir / "land.gpkg", "land", {"class"},
        {{"POLYGON((500000 4000000,500040 4000000,500040 4000040,500000 4000000))", {"meadow"}}},
        "EPSG:32633");
    f.project.inputs.land_cover = input(f.dir, "land.gpkg", 7);
    const std::string m = t::input_error_of(
        [&] { (void)read_land_input(f.project, LandInput::land_cover, utm33(), {}); });
    EXPECT_NE(m.find("project.toml:8: [inputs] land_cover_codes"), std::string::npos) << m;
    EXPECT_NE(m.find("is a vector layer"), std::string::npos) << m;
}

TEST(LandInputs, CodeTablesRefuseNonIntegerAndRepeatedCodes) {
    const auto dir = t::scratch_dir("land_code_tables");
    std::ofstream(dir / "frac.csv") << "code,class\n1.5,meadow\n";
    std::ofstream(dir / "twice.csv") << "code,class\n1,meadow\n2,woods_good\n1,commercial\n";
    std::ofstream(dir / "ok.csv") << "# codes\ncode,class\n-1,meadow\n20,woods_good\n";
    const std::string m1 =
        t::input_error_of([&] { (void)read_code_table(input(dir, "frac.csv", 1), "class"); });
    EXPECT_NE(m1.find("frac.csv:2"), std::string::npos) << m1;
    EXPECT_NE(m1.find("'1.5' is not an integer code"), std::string::npos) << m1;
    const std::string m2 =
        t::input_error_of([&] { (void)read_code_table(input(dir, "twice.csv", 1), "class"); });
    EXPECT_NE(m2.find("code 1 is listed twice (lines 2 and 4)"), std::string::npos) << m2;
    const auto ok = read_code_table(input(dir, "ok.csv", 1), "class");
    ASSERT_EQ(ok.size(), 2u);
    EXPECT_EQ(ok.at(-1), "meadow");
    EXPECT_EQ(ok.at(20), "woods_good");
}

TEST(LandInputs, AReprojectedRasterGivesPartsThatAddUpToTheCatchment) {
    // Land cover in WGS 84 (degrees), two classes split along a meridian that crosses the
    // catchment; the catchment is a 300 m square in UTM 33N. Whatever the warped cells, every
    // part of the square lies in one class: the parts add up to the square's area.
    const auto dir = t::scratch_dir("land_raster_reprojected");
    t::ClassRasterSpec land;
    land.width = 100;
    land.height = 100;
    // Around (15.0 E, 36.14 N), about where (500000, 4000000) of UTM 33N lies; cells of about
    // 0.0001 degree (9 m x 11 m).
    land.gt = {14.995, 0.0001, 0.0, 36.1465, 0.0, -0.0001};
    land.crs_wkt = t::crs_wkt("EPSG:4326");
    land.codes = t::codes_of(100, 100, [](int col, int) { return col < 50 ? 1 : 2; });
    land.categories = {"", "meadow", "woods_good"};
    t::make_class_raster(dir / "land.tif", land);
    t::ClassRasterSpec soils;
    soils.width = 1;
    soils.height = 1;
    soils.gt = {499000.0, 2000.0, 0.0, 4001000.0, 0.0, -2000.0};
    soils.crs_wkt = utm33();
    soils.codes = {2.0};
    soils.categories = {"", "A", "B"};
    t::make_class_raster(dir / "soils.tif", soils);
    Project p;
    p.file = dir / "project.toml";
    p.inputs.land_cover = input(dir, "land.tif", 3);
    p.inputs.soils = input(dir, "soils.tif", 4);
    const auto catchment = t::rect_wkb(499850.0, 3999850.0, 500150.0, 4000150.0);
    const auto lc = read_land_input(p, LandInput::land_cover, utm33(), extent_of({catchment}));
    EXPECT_NE(lc.source.find("reprojected to"), std::string::npos) << lc.source;
    EXPECT_NE(lc.source.find("by nearest neighbour"), std::string::npos) << lc.source;
    const auto r = weigh(p, catchment);
    ASSERT_EQ(r.weighting.parts.size(), 2u); // the meridian 15 E crosses the square
    double sum = 0.0;
    for (const auto &pt : r.weighting.parts) {
        sum += pt.area_m2;
    }
    EXPECT_NEAR(r.area_m2, 90000.0, 90000.0 * overlay_rounding);
    EXPECT_NEAR(sum, r.area_m2, r.area_m2 * overlay_rounding);
    EXPECT_EQ(r.uncovered_land_cover_m2, 0.0);
}
