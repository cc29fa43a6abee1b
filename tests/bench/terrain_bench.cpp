// SPDX-License-Identifier: MIT
// Benchmark of the terrain chain (not a test: it prints figures, it asserts nothing).
//
//   terrain_bench generate <file.tif> <cells>   synthetic DEM (valleys, pits, flats), GeoTIFF
//   terrain_bench run <file.tif> <points> [threads [check]]
//                                               read + whole terrain chain with N design points;
//                                               "check" also prints hashes of the directions
//                                               and labels (to compare builds and thread counts)
//   terrain_bench gdal-slope <file.tif> <out.tif>  GDAL's slope (GDALDEMProcessing) for scale
//
// Each command is meant to run in a fresh process (run_terrain_bench.sh does that), so the peak
// resident memory it prints (VmHWM) belongs to that case alone.
#include "catchpeak/core/grid.hpp"
#include "catchpeak/io/raster.hpp"
#include "catchpeak/terrain/delineation.hpp"

#include <cpl_conv.h>
#include <fmt/format.h>
#include <gdal.h>
#include <gdal_utils.h>
#include <ogr_srs_api.h>

#include <sys/resource.h>

#include <chrono>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <fstream>
#include <random>
#include <stdexcept>
#include <string>
#include <vector>

namespace {

using Clock = std::chrono::steady_clock;

double seconds_since(Clock::time_point t0) {
    return std::chrono::duration<double>(Clock::now() - t0).count();
}

/// Peak resident set size of this process, bytes (VmHWM of /proc/self/status).
/// User + system CPU time of this process, seconds.
double cpu_seconds() {
    rusage u{};
    getrusage(RUSAGE_SELF, &u);
    return static_cast<double>(u.ru_utime.tv_sec + u.ru_stime.tv_sec) +
           static_cast<double>(u.ru_utime.tv_usec + u.ru_stime.tv_usec) * 1e-6;
}

double peak_rss_bytes() {
    std::ifstream in("/proc/self/status");
    std::string line;
    while (std::getline(in, line)) {
        if (line.rfind("VmHWM:", 0) == 0) {
            return std::stod(line.substr(6)) * 1024.0; // kB
        }
    }
    return 0.0;
}

constexpr double cell_m = 10.0;
constexpr float nodata = -9999.0F;

int generate(const std::string &path, std::size_t cells) {
    const auto side = static_cast<std::size_t>(std::llround(std::sqrt(static_cast<double>(cells))));
    GDALAllRegister();
    GDALDriverH drv = GDALGetDriverByName("GTiff");
    const char *options[] = {"BIGTIFF=YES", "TILED=YES", nullptr};
    GDALDatasetH ds = GDALCreate(drv, path.c_str(), static_cast<int>(side), static_cast<int>(side),
                                 1, GDT_Float32, const_cast<char **>(options));
    if (ds == nullptr) {
        throw std::runtime_error("cannot create " + path);
    }
    double gt[6] = {500000.0, cell_m, 0.0, 4000000.0, 0.0, -cell_m};
    GDALSetGeoTransform(ds, gt);
    // A projected CRS in metres (UTM zone 32N), as catchpeak's DEM reader requires.
    OGRSpatialReferenceH srs = OSRNewSpatialReference(nullptr);
    char *wkt = nullptr;
    if (OSRImportFromEPSG(srs, 32632) != OGRERR_NONE || OSRExportToWkt(srs, &wkt) != OGRERR_NONE ||
        GDALSetProjection(ds, wkt) != CE_None) {
        throw std::runtime_error("cannot set the CRS of " + path);
    }
    CPLFree(wkt);
    OSRDestroySpatialReference(srs);
    GDALRasterBandH band = GDALGetRasterBand(ds, 1);
    GDALSetRasterNoDataValue(band, static_cast<double>(nodata));
    std::mt19937 rng(12345);
    std::vector<float> row(side);
    const double s = static_cast<double>(side);
    for (std::size_t r = 0; r < side; ++r) {
        const double y = static_cast<double>(r);
        for (std::size_t c = 0; c < side; ++c) {
            const double x = static_cast<double>(c);
            // Valleys: ridges and troughs across a surface falling to the south and east (the
            // troughs hold closed basins that the fill turns into lakes), 0.3 m of noise (small
            // pits everywhere), single-cell pits 3 m deep (one cell in 2000), flat terraces where
            // the surface is rounded to 2 m, and a nodata hole.
            double z = 0.04 * (s - y) + 0.02 * (s - x);
            z += 25.0 * std::sin(x / 90.0) * std::cos(y / 130.0) + 6.0 * std::sin((x + y) / 31.0);
            const std::uint32_t u = static_cast<std::uint32_t>(rng());
            z += static_cast<double>(u % 1000U) / 1000.0 * 0.3;
            if ((u >> 10) % 2000U == 0) {
                z -= 3.0;
            }
            if (((c / 256) + (r / 256)) % 5 == 0) {
                z = 2.0 * std::floor(z / 2.0);
            }
            const double hx = x - 0.7 * s;
            const double hy = y - 0.3 * s;
            if (hx * hx + hy * hy < (0.02 * s) * (0.02 * s)) {
                row[c] = nodata;
            } else {
                row[c] = static_cast<float>(z);
            }
        }
        if (GDALRasterIO(band, GF_Write, 0, static_cast<int>(r), static_cast<int>(side), 1,
                         row.data(), static_cast<int>(side), 1, GDT_Float32, 0, 0) != CE_None) {
            throw std::runtime_error("write failed");
        }
    }
    GDALClose(ds);
    fmt::print("generated {} ({} x {} = {} cells)\n", path, side, side, side * side);
    return 0;
}

/// The DEM through catchpeak's own reader (as `catchpeak delineate` reads it).
catchpeak::Grid<float> read_dem(const std::string &path) {
    return catchpeak::io::read_dem(path).elevation_m;
}

/// FNV-1a hash of a grid's bytes, to compare results between builds or thread counts.
template <typename T> std::uint64_t fnv1a(const catchpeak::Grid<T> &g) {
    std::uint64_t hash = 14695981039346656037ULL;
    const auto *p = reinterpret_cast<const unsigned char *>(g.cells().data());
    for (std::size_t b = 0; b < g.size() * sizeof(T); ++b) {
        hash = (hash ^ p[b]) * 1099511628211ULL;
    }
    return hash;
}

int run(const std::string &path, std::size_t n_points, unsigned threads, bool check) {
    GDALAllRegister(); // libraries and drivers loaded before the baseline is taken
    const double rss0 = peak_rss_bytes();
    const double cpu0 = cpu_seconds();
    const auto t0 = Clock::now();
    const catchpeak::Grid<float> dem = read_dem(path);
    const double t_read = seconds_since(t0);
    // Design points at random valid cells (fixed seed).
    std::mt19937_64 rng(777);
    std::vector<catchpeak::terrain::DesignPoint> pts;
    while (pts.size() < n_points) {
        const std::size_t i = rng() % dem.size();
        if (!dem.is_valid(i)) {
            continue;
        }
        const auto [x, y] = dem.transform.cell_centre(i % dem.width(), i / dem.width());
        pts.push_back({fmt::format("DP{}", pts.size() + 1), x + 3.0, y - 2.0});
    }
    catchpeak::terrain::TerrainSettings s;
    s.snap_radius_m = 50.0;
    s.stream_threshold_m2 = 1.0e6;
    s.threads = threads;
    s.keep_directions = check; // costs a byte a cell: only when hashes are asked for
    std::vector<std::pair<std::string, double>> steps;
    std::vector<double> step_cpu;
    auto last = Clock::now();
    double last_cpu = cpu_seconds();
    std::string last_step;
    const auto t1 = Clock::now();
    const auto result =
        catchpeak::terrain::run_terrain(dem, pts, {}, s, [&](std::string_view step, double) {
            const auto now = Clock::now();
            const double now_cpu = cpu_seconds();
            if (!last_step.empty()) {
                steps.emplace_back(last_step, std::chrono::duration<double>(now - last).count());
                step_cpu.push_back(now_cpu - last_cpu);
            }
            last_step = std::string(step);
            last = now;
            last_cpu = now_cpu;
        });
    const double t_terrain = seconds_since(t1);
    const double cpu = cpu_seconds() - cpu0;
    const double rss = peak_rss_bytes();
    const double cells = static_cast<double>(dem.size());
    double longest = 0.0;
    for (const auto &p : result.points) {
        longest = std::max(longest, p.longest_flow_path.length_m);
    }
    fmt::print("RESULT cells={} points={} threads={} read_s={:.3f} terrain_s={:.3f} "
               "total_s={:.3f} cpu_s={:.3f} ns_per_cell={:.1f} peak_bytes_per_cell={:.2f} "
               "net_bytes_per_cell={:.2f} baseline_mb={:.1f} streams={} longest_path_m={:.0f}\n",
               dem.size(), n_points, threads, t_read, t_terrain, t_read + t_terrain, cpu,
               (t_read + t_terrain) * 1e9 / cells, rss / cells, (rss - rss0) / cells,
               rss0 / 1048576.0, result.streams.size(), longest);
    std::string breakdown = "STEPS";
    for (const auto &[name, secs] : steps) {
        breakdown += fmt::format(" [{}]={:.3f}", name, secs);
    }
    fmt::print("{}\n", breakdown);
    std::string cpu_breakdown = "STEPS_CPU";
    for (std::size_t k = 0; k < steps.size(); ++k) {
        cpu_breakdown += fmt::format(" [{}]={:.3f}", steps[k].first, step_cpu[k]);
    }
    fmt::print("{}\n", cpu_breakdown);
    if (check) {
        double slope_sum = 0.0;
        for (const auto &p : result.points) {
            slope_sum += p.mean_slope_m_per_m + p.longest_flow_path.length_m + p.area_m2;
        }
        fmt::print("CHECK directions_fnv={:016x} labels_fnv={:016x} point_sum={:.17g}\n",
                   fnv1a(result.directions), fnv1a(result.labels), slope_sum);
    }
    return 0;
}

int gdal_slope(const std::string &in, const std::string &out) {
    GDALAllRegister();
    GDALSetCacheMax64(std::int64_t{64} << 20); // a block cache of 64 MiB for GDAL's own tool
    const auto t0 = Clock::now();
    const double cpu0 = cpu_seconds();
    GDALDatasetH src = GDALOpen(in.c_str(), GA_ReadOnly);
    if (src == nullptr) {
        throw std::runtime_error("cannot open " + in);
    }
    const char *args[] = {"-of", "GTiff", "-co", "BIGTIFF=YES", "-co", "TILED=YES", nullptr};
    GDALDEMProcessingOptions *opts =
        GDALDEMProcessingOptionsNew(const_cast<char **>(args), nullptr);
    int usage_error = 0;
    GDALDatasetH dst = GDALDEMProcessing(out.c_str(), src, "slope", nullptr, opts, &usage_error);
    GDALDEMProcessingOptionsFree(opts);
    if (dst == nullptr) {
        throw std::runtime_error("GDALDEMProcessing failed");
    }
    GDALClose(dst);
    GDALClose(src);
    const double t = seconds_since(t0);
    const double rss = peak_rss_bytes();
    fmt::print("GDALSLOPE total_s={:.3f} cpu_s={:.3f} peak_mb={:.1f}\n", t, cpu_seconds() - cpu0,
               rss / 1048576.0);
    return 0;
}

} // namespace

int main(int argc, char **argv) {
    try {
        const std::vector<std::string> a(argv + 1, argv + argc);
        if (a.size() >= 3 && a[0] == "generate") {
            return generate(a[1], std::stoull(a[2]));
        }
        if (a.size() >= 3 && a[0] == "run") {
            const unsigned threads = a.size() >= 4 ? static_cast<unsigned>(std::stoul(a[3])) : 0U;
            const bool check = a.size() >= 5 && a[4] == "check";
            return run(a[1], std::stoull(a[2]), threads, check);
        }
        if (a.size() >= 3 && a[0] == "gdal-slope") {
            return gdal_slope(a[1], a[2]);
        }
        std::fputs(
            "usage: terrain_bench generate <tif> <cells> | run <tif> <points> [threads [check]] | "
            "gdal-slope <tif> <out.tif>\n",
            stderr);
        return 2;
    } catch (const std::exception &e) {
        std::fprintf(stderr, "terrain_bench: %s\n", e.what());
        return 1;
    }
}
