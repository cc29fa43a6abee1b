// SPDX-License-Identifier: MIT
// Benchmark of the land overlay: 1,000 catchments against a land-cover layer of 50,000
// polygons and a soils layer of 5,000 polygons, generated in memory with a fixed seed
// (jittered quadrilateral grids over a 20 km x 10 km area, so that envelopes overlap as in
// real data). Prints the time of each stage. Target: under 10 s in total.
//
// Usage: land_bench [catchments_x catchments_y land_x land_y soil_x soil_y [exact]]
// With `exact`, the union of the land-cover pieces is computed for every catchment
// (OverlaySettings::exact_coverage_check).
#include "catchpeak/core/csv.hpp"
#include "catchpeak/land/overlay.hpp"
#include "support/wkb.hpp"

#include <fmt/format.h>

#include <chrono>
#include <cstdlib>
#include <random>
#include <string>
#include <vector>

namespace {

using Clock = std::chrono::steady_clock;

double seconds_since(Clock::time_point t0) {
    return std::chrono::duration<double>(Clock::now() - t0).count();
}

/// An nx x ny grid of quadrilaterals over [0, w] x [0, h] whose inner vertices are moved by up
/// to 30 % of a cell: a partition without gaps or overlaps.
std::vector<catchpeak::io::VectorFeature> jittered_grid(int nx, int ny, double w, double h,
                                                        std::mt19937 &rng,
                                                        const std::vector<std::string> &values,
                                                        const std::string &field) {
    std::uniform_real_distribution<double> jitter(-0.3, 0.3);
    const double dx = w / nx;
    const double dy = h / ny;
    const auto ux = static_cast<std::size_t>(nx) + 1;
    std::vector<std::pair<double, double>> pts(ux * (static_cast<std::size_t>(ny) + 1));
    for (int j = 0; j <= ny; ++j) {
        for (int i = 0; i <= nx; ++i) {
            const bool edge_x = i == 0 || i == nx;
            const bool edge_y = j == 0 || j == ny;
            pts[static_cast<std::size_t>(j) * ux + static_cast<std::size_t>(i)] = {
                (i + (edge_x ? 0.0 : jitter(rng))) * dx, (j + (edge_y ? 0.0 : jitter(rng))) * dy};
        }
    }
    std::uniform_int_distribution<std::size_t> pick(0, values.size() - 1);
    std::vector<catchpeak::io::VectorFeature> out;
    out.reserve(static_cast<std::size_t>(nx) * static_cast<std::size_t>(ny));
    for (int j = 0; j < ny; ++j) {
        for (int i = 0; i < nx; ++i) {
            const auto at = [&](int a, int b) {
                return pts[static_cast<std::size_t>(b) * ux + static_cast<std::size_t>(a)];
            };
            out.push_back(catchpeak::test::feature(
                j * nx + i,
                catchpeak::test::polygon_wkb(
                    {{at(i, j), at(i + 1, j), at(i + 1, j + 1), at(i, j + 1)}}),
                field, values[pick(rng)]));
        }
    }
    return out;
}

int arg(int argc, char **argv, int i, int fallback) {
    return argc > i ? std::atoi(argv[i]) : fallback;
}

} // namespace

int main(int argc, char **argv) {
    using namespace catchpeak::land;
    const int cx = arg(argc, argv, 1, 40), cy = arg(argc, argv, 2, 25);
    const int lx = arg(argc, argv, 3, 250), ly = arg(argc, argv, 4, 200);
    const int sx = arg(argc, argv, 5, 100), sy = arg(argc, argv, 6, 50);
    const double w = 20000.0, h = 10000.0;

    std::mt19937 rng(20261202);
    const auto t_gen = Clock::now();
    catchpeak::io::VectorLayer land{"synthetic land cover", "", {}};
    land.features =
        jittered_grid(lx, ly, w, h, rng, {"roof", "grass", "wood", "street", "field"}, "class");
    catchpeak::io::VectorLayer soils{"synthetic soils", "", {}};
    soils.features = jittered_grid(sx, sy, w, h, rng, {"A", "B", "C", "D", "C/D"}, "hsg");
    const auto catchments = jittered_grid(cx, cy, w, h, rng, {"x"}, "id");
    const double gen_s = seconds_since(t_gen);

    LandTables tables;
    tables.c = RunoffCoefficientTable::from_csv(catchpeak::parse_csv(
        "class,soil_group,slope_min_percent,slope_max_percent,c\n"
        "roof,any,,,0.9\ngrass,any,,,0.2\nwood,any,,,0.15\nstreet,any,,,0.85\nfield,any,,,0.3\n",
        "bench_c.csv"));
    tables.cn = CurveNumberTable::from_csv(
        catchpeak::parse_csv("class,A,B,C,D\nroof,98,98,98,98\ngrass,39,61,74,80\n"
                             "wood,30,55,70,77\nstreet,98,98,98,98\nfield,67,78,85,89\n",
                             "bench_cn.csv"));
    tables.impervious = ImperviousShareTable::from_csv(
        catchpeak::parse_csv("class,impervious_percent\nroof,100\ngrass,0\nwood,0\n"
                             "street,100\nfield,0\n",
                             "bench_imp.csv"));

    const auto t_load = Clock::now();
    OverlaySettings settings;
    settings.exact_coverage_check = argc > 7 && std::string(argv[7]) == "exact";
    const LandOverlay overlay(land, soils, std::move(tables), settings);
    const double load_s = seconds_since(t_load);

    const auto t_weight = Clock::now();
    double area_sum = 0.0, parts_sum = 0.0, cn_sum = 0.0;
    std::size_t parts = 0;
    for (const auto &c : catchments) {
        const auto r = overlay.weight(c.wkb, fmt::format("C{}", c.fid), 0.02);
        area_sum += r.area_m2;
        cn_sum += r.weighting.cn_weighted;
        for (const auto &p : r.weighting.parts) {
            parts_sum += p.area_m2;
        }
        parts += r.weighting.parts.size();
    }
    const double weight_s = seconds_since(t_weight);

    fmt::print("land_bench: {} catchments, {} land-cover polygons, {} soil polygons{}\n",
               catchments.size(), land.features.size(), soils.features.size(),
               settings.exact_coverage_check ? " (exact coverage check)" : "");
    fmt::print("  generate layers (not timed in total): {:.3f} s\n", gen_s);
    fmt::print("  read layers, build STRtrees:          {:.3f} s\n", load_s);
    fmt::print("  weight all catchments:                {:.3f} s ({:.2f} ms per catchment)\n",
               weight_s, 1000.0 * weight_s / static_cast<double>(catchments.size()));
    fmt::print("  total (read + weight):                {:.3f} s (target < 10 s)\n",
               load_s + weight_s);
    fmt::print("  parts: {} ({:.1f} per catchment); mean composite CN {:.2f}\n", parts,
               static_cast<double>(parts) / static_cast<double>(catchments.size()),
               cn_sum / static_cast<double>(catchments.size()));
    fmt::print("  area check: catchments {:.3f} m2, parts {:.3f} m2, difference {:.3e} m2\n",
               area_sum, parts_sum, parts_sum - area_sum);
    return 0;
}
