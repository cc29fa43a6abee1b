// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/slope.hpp"

#include "catchpeak/terrain/flow_direction.hpp"
#include "internal.hpp"

#include <cmath>
#include <limits>
#include <mutex>

namespace catchpeak::terrain {

namespace {

constexpr double fixed_scale = 16777216.0; // 2^24: sums in units of 2^-24 m/m

/// Horn's formula on the 3x3 window a b c / d e f / g h i (one expression for every caller, so
/// the fast path and the general one give the same bits).
inline double horn_window(double a, double b, double c, double d, double f, double g, double hh,
                          double i, double dx, double dy) noexcept {
    const double dzdx = ((c + 2.0 * f + i) - (a + 2.0 * d + g)) / (8.0 * dx);
    const double dzdy = ((g + 2.0 * hh + i) - (a + 2.0 * b + c)) / (8.0 * dy);
    return std::sqrt(dzdx * dzdx + dzdy * dzdy);
}

inline double horn_at(const Grid<float> &dem, const detail::ValidTest &valid, double dx, double dy,
                      std::size_t col, std::size_t row) {
    const std::size_t w = dem.width();
    const std::size_t h = dem.height();
    const double e = static_cast<double>(dem[row * w + col]);
    const auto z = [&](int dc, int dr) {
        const long long c = static_cast<long long>(col) + dc;
        const long long r = static_cast<long long>(row) + dr;
        if (c < 0 || r < 0 || static_cast<std::size_t>(c) >= w ||
            static_cast<std::size_t>(r) >= h) {
            return e;
        }
        const float v = dem[static_cast<std::size_t>(r) * w + static_cast<std::size_t>(c)];
        return valid(v) ? static_cast<double>(v) : e;
    };
    return horn_window(z(-1, -1), z(0, -1), z(1, -1), z(-1, 0), z(1, 0), z(-1, 1), z(0, 1), z(1, 1),
                       dx, dy);
}

/// Calls slope(col, value) for every valid cell of row `row` for which wanted(col) holds: cells
/// away from the raster's edge read their window without bounds checks, the others go through
/// horn_at.
template <typename Slope, typename Wanted>
inline void horn_row(const Grid<float> &dem, const detail::ValidTest &valid, double dx, double dy,
                     std::size_t row, Slope slope, Wanted wanted) {
    const std::size_t w = dem.width();
    const std::size_t h = dem.height();
    const auto general = [&](std::size_t c) {
        if (wanted(c) && valid(dem[row * w + c])) {
            slope(c, horn_at(dem, valid, dx, dy, c, row));
        }
    };
    if (row == 0 || row + 1 >= h || w < 3) {
        for (std::size_t c = 0; c < w; ++c) {
            general(c);
        }
        return;
    }
    general(0);
    const float *up = &dem[(row - 1) * w];
    const float *mid = &dem[row * w];
    const float *down = &dem[(row + 1) * w];
    for (std::size_t c = 1; c + 1 < w; ++c) {
        const float ze = mid[c];
        if (!wanted(c) || !valid(ze)) {
            continue;
        }
        const double e = static_cast<double>(ze);
        const auto z = [&](float v) { return valid(v) ? static_cast<double>(v) : e; };
        slope(c, horn_window(z(up[c - 1]), z(up[c]), z(up[c + 1]), z(mid[c - 1]), z(mid[c + 1]),
                             z(down[c - 1]), z(down[c]), z(down[c + 1]), dx, dy));
    }
    general(w - 1);
}

/// std::llround for a value >= 0 (half away from zero), without the library call: the
/// truncation and the difference are exact for values below 2^52.
inline std::uint64_t round_non_negative(double v) noexcept {
    const auto t = static_cast<std::uint64_t>(v);
    return t + (v - static_cast<double>(t) >= 0.5 ? 1U : 0U);
}

} // namespace

double horn_slope(const Grid<float> &dem, std::size_t col, std::size_t row) {
    const detail::ValidTest valid(dem);
    return horn_at(dem, valid, dem.transform.cell_dx(), dem.transform.cell_dy(), col, row);
}

Grid<float> horn_slope_grid(const Grid<float> &dem, unsigned threads) {
    Grid<float> out(dem.width(), dem.height(), std::numeric_limits<float>::quiet_NaN());
    out.copy_georef_from(dem);
    const detail::ValidTest valid(dem);
    const double dx = dem.transform.cell_dx();
    const double dy = dem.transform.cell_dy();
    const std::size_t w = dem.width();
    detail::for_row_blocks(
        dem.height(), thread_count(threads), 64, [&](std::size_t, std::size_t r0, std::size_t r1) {
            for (std::size_t r = r0; r < r1; ++r) {
                horn_row(
                    dem, valid, dx, dy, r,
                    [&](std::size_t c, double v) { out[r * w + c] = static_cast<float>(v); },
                    [](std::size_t) { return true; });
            }
        });
    return out;
}

SlopeSums slope_sums_by_label(const Grid<float> &dem, const Grid<std::uint32_t> &labels,
                              std::uint32_t max_label, unsigned threads) {
    return detail::slope_sums_by_label(dem, labels, max_label, threads, true);
}

SlopeSums detail::slope_sums_by_label(const Grid<float> &dem, const Grid<std::uint32_t> &labels,
                                      std::uint32_t max_label, unsigned threads,
                                      bool with_unlabelled) {
    const detail::ValidTest valid(dem);
    const double dx = dem.transform.cell_dx();
    const double dy = dem.transform.cell_dy();
    const std::size_t w = dem.width();
    const std::size_t slots = static_cast<std::size_t>(max_label) + 1;
    std::vector<std::uint64_t> sum(slots, 0);
    std::vector<std::uint64_t> count(slots, 0);
    std::mutex merge;
    const unsigned n_threads = thread_count(threads);
    // Each worker keeps its own integer sums; integer addition makes the merge order irrelevant.
    detail::for_row_blocks(dem.height(), n_threads, (dem.height() + n_threads - 1) / n_threads,
                           [&](std::size_t, std::size_t r0, std::size_t r1) {
                               std::vector<std::uint64_t> s(slots, 0);
                               std::vector<std::uint64_t> n(slots, 0);
                               for (std::size_t r = r0; r < r1; ++r) {
                                   const std::uint32_t *row_labels = &labels[r * w];
                                   horn_row(
                                       dem, valid, dx, dy, r,
                                       [&](std::size_t c, double v) {
                                           const std::uint32_t lab = row_labels[c];
                                           s[lab] += round_non_negative(v * fixed_scale);
                                           ++n[lab];
                                       },
                                       [&](std::size_t c) {
                                           const std::uint32_t lab = row_labels[c];
                                           return lab <= max_label && (lab != 0 || with_unlabelled);
                                       });
                               }
                               const std::lock_guard<std::mutex> lock(merge);
                               for (std::size_t k = 0; k < slots; ++k) {
                                   sum[k] += s[k];
                                   count[k] += n[k];
                               }
                           });
    SlopeSums out;
    out.sum_m_per_m.resize(slots);
    out.count = std::move(count);
    for (std::size_t k = 0; k < slots; ++k) {
        out.sum_m_per_m[k] = static_cast<double>(sum[k]) / fixed_scale;
    }
    return out;
}

} // namespace catchpeak::terrain
