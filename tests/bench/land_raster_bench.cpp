// SPDX-License-Identifier: MIT
// Benchmark of land cover given as a raster of class codes: a 2,000 x 1,500 raster of 10 m cells
// (the size of the demo's DEM) with 8 classes in irregular patches (a fixed seed), read and
// polygonized by `read_land_input` over windows of several sizes, then 100 square catchments
// of 1 km2 weighted against it. Prints the time and the number of polygons of each step; the
// clipped window shows what reading only the catchments' extent saves. Times are processor
// time of the process. Target: reading and polygonizing the whole raster under 10 s.
//
// Usage: land_raster_bench [scratch folder (default: the current folder)]
#include "catchpeak/app/land_inputs.hpp"
#include "catchpeak/land/overlay.hpp"
#include "catchpeak/land/tables.hpp"
#include "io/class_raster_data.hpp"
#include "support/wkb.hpp"

#include <fmt/format.h>

#include <cstdlib>
#include <ctime>
#include <filesystem>
#include <fstream>
#include <random>
#include <string>
#include <vector>

namespace {

/// Processor time of this process, s: on a shared machine the wall time says little.
struct Clock {
    using time_point = std::clock_t;
    static time_point now() { return std::clock(); }
};

double seconds_since(Clock::time_point t0) {
    return static_cast<double>(std::clock() - t0) / CLOCKS_PER_SEC;
}

} // namespace

int main(int argc, char **argv) {
    namespace t = catchpeak::test;
    using namespace catchpeak;
    const std::filesystem::path dir = argc > 1 ? argv[1] : ".";
    constexpr int width = 2000;
    constexpr int height = 1500;
    constexpr double x0 = 500000.0;
    constexpr double y0 = 4015000.0;

    // Patches: 8 x 8 cell blocks of a random class, every cell swapped to another random class
    // with a 10 % chance (the speckle of a classified image).
    std::mt19937 rng(42);
    std::uniform_int_distribution<int> cls(1, 8);
    std::uniform_real_distribution<double> u(0.0, 1.0);
    constexpr int blocks_x = (width + 7) / 8;
    std::vector<int> blocks(static_cast<std::size_t>(blocks_x * ((height + 7) / 8)));
    for (auto &b : blocks) {
        b = cls(rng);
    }
    t::ClassRasterSpec s;
    s.width = width;
    s.height = height;
    s.gt = {x0, 10.0, 0.0, y0, 0.0, -10.0};
    s.crs_wkt = t::crs_wkt("EPSG:32633");
    s.codes = t::codes_of(width, height, [&](int col, int row) {
        const int b = blocks[static_cast<std::size_t>((row / 8) * blocks_x + col / 8)];
        return u(rng) < 0.1 ? cls(rng) : b;
    });
    s.categories = {"",
                    "meadow",
                    "woods_good",
                    "pasture_good",
                    "commercial",
                    "open_space_good",
                    "residential_1_4_ac",
                    "industrial",
                    "residential_1_2_ac"};
    t::make_class_raster(dir / "bench_land.tif", s);
    t::ClassRasterSpec soils = s;
    soils.codes = t::codes_of(width, height, [](int col, int) { return col < width / 2 ? 2 : 3; });
    soils.categories = {"", "A", "B", "C", "D"};
    t::make_class_raster(dir / "bench_soils.tif", soils);

    project::Project p;
    p.file = dir / "project.toml";
    p.inputs.land_cover = project::InputPath{"bench_land.tif", dir / "bench_land.tif", 1};
    p.inputs.soils = project::InputPath{"bench_soils.tif", dir / "bench_soils.tif", 2};
    const std::string crs = s.crs_wkt;

    for (const double side_m : {20000.0, 5000.0, 1000.0}) {
        const io::Extent window{x0, y0 - side_m * 0.75, x0 + side_m, y0};
        const auto t0 = Clock::now();
        const auto layer = app::read_land_input(p, app::LandInput::land_cover, crs, window);
        fmt::print("window {:>6.0f} m x {:>6.0f} m: read and polygonized in {:7.3f} s, {} "
                   "polygons\n",
                   side_m, side_m * 0.75, seconds_since(t0), layer.features.size());
    }

    // 100 catchments of 1 km x 1 km over the whole raster.
    std::vector<std::vector<unsigned char>> catchments;
    for (int j = 0; j < 10; ++j) {
        for (int i = 0; i < 10; ++i) {
            const double ax = x0 + 500.0 + i * 1900.0;
            const double ay = y0 - 1500.0 - j * 1350.0;
            catchments.push_back(t::rect_wkb(ax, ay, ax + 1000.0, ay + 1000.0));
        }
    }
    auto t0 = Clock::now();
    const auto window = app::extent_of(catchments);
    const auto land_layer = app::read_land_input(p, app::LandInput::land_cover, crs, window);
    const auto soil_layer = app::read_land_input(p, app::LandInput::soils, crs, window);
    fmt::print("both rasters over the catchments' extent: {:7.3f} s, {} + {} polygons\n",
               seconds_since(t0), land_layer.features.size(), soil_layer.features.size());
    t0 = Clock::now();
    const char *config = std::getenv("CATCHPEAK_CONFIG_DIR");
    const land::LandOverlay overlay(
        land_layer, soil_layer,
        land::read_default_land_tables(config != nullptr ? config : CATCHPEAK_BENCH_CONFIG_DIR),
        land::OverlaySettings{});
    fmt::print("overlay built: {:7.3f} s\n", seconds_since(t0));
    t0 = Clock::now();
    std::size_t parts = 0;
    for (std::size_t i = 0; i < catchments.size(); ++i) {
        parts += overlay.weight(catchments[i], fmt::format("C{}", i), 0.02).weighting.parts.size();
    }
    fmt::print("100 catchments of 1 km2 weighted: {:7.3f} s, {} parts\n", seconds_since(t0), parts);
    std::filesystem::remove(dir / "bench_land.tif");
    std::filesystem::remove(dir / "bench_land.tif.aux.xml");
    std::filesystem::remove(dir / "bench_soils.tif");
    std::filesystem::remove(dir / "bench_soils.tif.aux.xml");
    return 0;
}
