// SPDX-License-Identifier: MIT
// `catchpeak run` and `check` on the valley project of app/dem_project_data.hpp with land cover
// and soils given as rasters of class codes instead of polygon layers.
#include "app/dem_project_data.hpp"
#include "catchpeak/cli/run.hpp"
#include "catchpeak/core/error.hpp"
#include "io/class_raster_data.hpp"
#include "support/results_json.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <fstream>
#include <functional>
#include <set>
#include <sstream>
#include <string>
#include <vector>

using catchpeak::ExitCode;
namespace fs = std::filesystem;
namespace t = catchpeak::test;

using catchpeak::test::point;
using catchpeak::test::read_json;

namespace {

using S = t::DemProjectSpec;

/// What a test may change in the rasters of the project.
struct RasterOptions {
    std::string land_crs = "EPSG:32633"; ///< "" = no CRS
    bool code_table = true;              ///< land_cover_codes = "codes.csv"
    int residential_code = 2;            ///< code of the cells of rows >= split_row
};

/// The land-cover raster on the DEM's grid: code 1 (commercial) in rows < split_row, the
/// residential code below; codes.csv names 1 commercial and 2 residential_1_4_ac. The soils
/// raster: code 2 everywhere, named B by its category names.
t::ClassRasterSpec land_on_dem_grid(const RasterOptions &o) {
    t::ClassRasterSpec s;
    s.width = S::width;
    s.height = S::height;
    s.gt = {S::x0, S::cell_m, 0.0, S::y0, 0.0, -S::cell_m};
    s.crs_wkt = o.land_crs.empty() ? "" : t::crs_wkt(o.land_crs);
    s.codes = t::codes_of(S::width, S::height, [&](int, int row) {
        return row < S::split_row ? 1 : o.residential_code;
    });
    return s;
}

/// The valley project with land cover and soils as rasters (land.tif, soils.tif, codes.csv).
t::TestProject raster_project(const std::string &scratch_name, const RasterOptions &o,
                              const t::ClassRasterSpec *land = nullptr) {
    auto p = t::dem_project(scratch_name);
    const auto &dir = p.dir();
    t::make_class_raster(dir / "land.tif", land != nullptr ? *land : land_on_dem_grid(o));
    t::ClassRasterSpec soils = land_on_dem_grid({});
    soils.codes.assign(soils.codes.size(), 2.0);
    soils.categories = {"", "A", "B", "C", "D"};
    t::make_class_raster(dir / "soils.tif", soils);
    p.with_file("codes.csv", "code,class\n1,commercial\n2,residential_1_4_ac\n");
    p.inputs.text("land_cover", "land.tif").text("soils", "soils.tif");
    if (o.code_table) {
        p.inputs.text("land_cover_codes", "codes.csv");
    }
    return p;
}

int run_cli(const std::vector<std::string> &args, std::string &err_text) {
    const auto r = t::cli(args);
    err_text = r.err;
    return r.code;
}

} // namespace

TEST(LandRasterRun, RastersOnTheDemGridGiveTheHandComputedCAndCn) {
    auto p = raster_project("land_raster_run", {});
    const auto &dir = p.dir();
    const auto project = p.write();
    std::string err;
    ASSERT_EQ(run_cli({"check", project.string()}, err), 0) << err;
    ASSERT_EQ(run_cli({"run", "--quiet", project.string()}, err), 0) << err;
    const auto doc = read_json(dir / "out" / "results.json");

    // DP-UP: columns 5..35 x rows 5..24 (dem_project_data.hpp); commercial in rows 5..14,
    // residential 1/4 ac in rows 15..24: 31 x 10 cells of 100 m2 each, all soil group B.
    constexpr double cell_m2 = S::cell_m * S::cell_m;
    const double com_m2 = 31.0 * (S::split_row - S::head_row) * cell_m2;      // 31 000
    const double up_m2 = 31.0 * (S::upper_row - S::head_row + 1) * cell_m2;   // 62 000
    const double out_m2 = 31.0 * (S::outlet_row - S::head_row + 1) * cell_m2; // 155 000
    const auto &up = point(doc, "DP-UP");
    const auto &dn = point(doc, "DP-OUT");
    ASSERT_EQ(up["land"]["parts"].size(), 2u);
    for (const auto &pt : up["land"]["parts"]) {
        EXPECT_EQ(pt["soil_group"], "B");
        // Cell edges on both sides: exact up to the overlay's rounding.
        EXPECT_NEAR(pt["area_m2"].get<double>(), com_m2, com_m2 * 1e-9) << pt["land_class"];
    }
    // C: commercial 0.825, residential 1/4 ac 0.40 (config/land/runoff_coefficients.csv, ASCE
    // midpoints); CN, soil B: 92 and 75 (TR-55 Table 2-2a).
    EXPECT_NEAR(up["land"]["c_weighted"].get<double>(), (0.825 + 0.40) / 2.0, 1e-9);
    EXPECT_NEAR(up["land"]["cn_weighted"].get<double>(), (92.0 + 75.0) / 2.0, 1e-9);
    EXPECT_NEAR(dn["land"]["cn_weighted"].get<double>(),
                (com_m2 * 92.0 + (out_m2 - com_m2) * 75.0) / out_m2, 1e-9);
    EXPECT_NEAR(up["catchment"]["area_m2"].get<double>(), up_m2, 1e-6);

    // The part lines state the rasters and their cell size.
    std::size_t raster_lines = 0;
    for (const auto &l : up["lines"]) {
        const std::string src = l["source"];
        if (src.find("land.tif (raster of 10.00 x 10.00 m cells; codes to classes by the code "
                     "table 'codes.csv'") != std::string::npos &&
            src.find("soils.tif (raster of 10.00 x 10.00 m cells; codes to soil groups by its "
                     "category names)") != std::string::npos) {
            ++raster_lines;
        }
    }
    EXPECT_EQ(raster_lines, 2u); // one line per part

    // The run record holds the code table and the file of the soils' category names.
    const auto record = read_json(dir / "out" / "run-record.json");
    const std::string rec = record.dump();
    EXPECT_NE(rec.find("codes.csv"), std::string::npos) << rec;
    EXPECT_NE(rec.find("soils.tif.aux.xml"), std::string::npos) << rec;
    // Input files are never modified: no .aux.xml appears beside the land-cover raster.
    EXPECT_FALSE(fs::exists(dir / "land.tif.aux.xml"));
    EXPECT_EQ(rec.find("land.tif.aux.xml"), std::string::npos) << rec;
    // recheck verifies them and reproduces every line.
    ASSERT_EQ(run_cli({"recheck", (dir / "out").string()}, err), 0) << err;
}

TEST(LandRasterRun, AReprojectedLandRasterGivesPartsThatAddUpToEachCatchment) {
    // Land cover in WGS 84: 0.0001 degree cells over the valley (about 15.000 E, 36.14 N, where
    // (500000, 4000000) of UTM 33N lies), code 1 west of 15.002 E and code 2 east of it.
    t::ClassRasterSpec land;
    land.width = 400;
    land.height = 400;
    land.gt = {14.99, 0.0001, 0.0, 36.16, 0.0, -0.0001};
    land.crs_wkt = t::crs_wkt("EPSG:4326");
    land.codes = t::codes_of(400, 400, [](int col, int) { return col < 120 ? 1 : 2; });
    auto rp = raster_project("land_raster_run_wgs84", {}, &land);
    const auto &dir = rp.dir();
    const auto project = rp.write();
    std::string err;
    ASSERT_EQ(run_cli({"run", "--quiet", project.string()}, err), 0) << err;
    const auto doc = read_json(dir / "out" / "results.json");
    for (const auto &p : doc["design_points"]) {
        double sum = 0.0;
        std::set<std::string> classes;
        for (const auto &pt : p["land"]["parts"]) {
            sum += pt["area_m2"].get<double>();
            classes.insert(pt["land_class"].get<std::string>());
        }
        const double area = p["catchment"]["area_m2"].get<double>();
        // The parts cover the catchment once: equal up to the overlay's rounding.
        EXPECT_NEAR(sum, area, area * 1e-9) << p["id"];
        EXPECT_EQ(classes.size(), 2u) << p["id"]; // 15.002 E crosses the valley
        bool stated = false;
        for (const auto &l : p["lines"]) {
            const std::string src = l["source"];
            stated = stated || (src.find("reprojected to") != std::string::npos &&
                                src.find("nearest neighbour") != std::string::npos);
        }
        EXPECT_TRUE(stated) << p["id"];
    }
}

namespace {

struct RasterCase {
    std::string name;
    std::function<void(RasterOptions &)> change;
    std::vector<std::string> expect_err; ///< every piece must appear on stderr
};

const std::vector<RasterCase> &raster_cases() {
    static const std::vector<RasterCase> c = {
        {"unknown_code",
         [](auto &o) { o.residential_code = 9; },
         {"land.tif", "code 9", "is not named by the code table 'codes.csv'"}},
        {"no_crs",
         [](auto &o) { o.land_crs = ""; },
         {"land.tif", "has no coordinate reference system"}},
        {"no_table_no_names",
         [](auto &o) { o.code_table = false; },
         {"land.tif", "without category names or an attribute table", "land_cover_codes"}},
    };
    return c;
}

[[maybe_unused]] void PrintTo(const RasterCase &c, std::ostream *os) { *os << c.name; }

class LandRasterBadInput : public ::testing::TestWithParam<RasterCase> {};

} // namespace

TEST_P(LandRasterBadInput, RunAndCheckExitTwoWithTheMessageAndNothingWritten) {
    const auto &c = GetParam();
    for (const std::string command : {"run", "check"}) {
        RasterOptions o;
        c.change(o);
        auto p = raster_project("land_raster_bad_" + c.name + "_" + command, o);
        const auto &dir = p.dir();
        const auto r = command == "run" ? p.command("run", {"--quiet"}) : p.command("check");
        const std::string &err = r.err;
        EXPECT_EQ(r.code, static_cast<int>(ExitCode::bad_input)) << command << err;
        for (const auto &piece : c.expect_err) {
            EXPECT_NE(err.find(piece), std::string::npos)
                << command << ": missing '" << piece << "' in:\n"
                << err;
        }
        EXPECT_FALSE(fs::exists(dir / "out" / "results.json"));
        EXPECT_FALSE(fs::exists(dir / "out" / "catchments.gpkg"));
    }
}

INSTANTIATE_TEST_SUITE_P(Cases, LandRasterBadInput, ::testing::ValuesIn(raster_cases()),
                         [](const auto &param_info) { return param_info.param.name; });
