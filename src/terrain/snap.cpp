// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/snap.hpp"

#include "catchpeak/core/error.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <utility>

namespace catchpeak::terrain {

namespace {

std::string extent_text(const GeoTransform &t, std::size_t w, std::size_t h) {
    const double x0 = t.origin_x;
    const double x1 = t.origin_x + static_cast<double>(w) * t.pixel_width;
    const double y0 = t.origin_y;
    const double y1 = t.origin_y + static_cast<double>(h) * t.pixel_height;
    return fmt::format("x {:.3f} to {:.3f}, y {:.3f} to {:.3f}", std::min(x0, x1), std::max(x0, x1),
                       std::min(y0, y1), std::max(y0, y1));
}

/// The cell holding a design point; throws InputError when the point lies outside the grid or
/// on a cell where has_data(cell) is false. The message names the point id, its coordinates
/// and the DEM extent.
std::pair<std::size_t, std::size_t> cell_of(const GeoTransform &t, std::size_t w, std::size_t h,
                                            const DesignPoint &point, const std::string &where,
                                            const auto &has_data) {
    const double fc = (point.x - t.origin_x) / t.pixel_width;
    const double fr = (point.y - t.origin_y) / t.pixel_height;
    // Formatted only for a message: thousands of points are checked in one run.
    const auto at = [&] {
        return fmt::format("design point '{}' at ({:.3f}, {:.3f})", point.id, point.x, point.y);
    };
    if (!(fc >= 0.0 && fr >= 0.0 && fc < static_cast<double>(w) && fr < static_cast<double>(h))) {
        throw_input_error(where, at() + " lies outside the DEM extent",
                          "points inside the DEM extent, " + extent_text(t, w, h));
    }
    const auto c = static_cast<std::size_t>(fc);
    const auto r = static_cast<std::size_t>(fr);
    if (!has_data(r * w + c)) {
        throw_input_error(where, at() + " lies on a nodata cell of the DEM",
                          "points on cells with elevation data (DEM extent " +
                              extent_text(t, w, h) + ")");
    }
    return {c, r};
}

} // namespace

void check_design_point(const Grid<float> &dem, const DesignPoint &point,
                        const std::string &where) {
    (void)cell_of(dem.transform, dem.width(), dem.height(), point, where,
                  [&](std::size_t i) { return dem.is_valid(i); });
}

SnappedPoint snap_point(const Grid<std::uint32_t> &acc, const DesignPoint &point, double radius_m,
                        const std::string &where) {
    const GeoTransform &t = acc.transform;
    const auto [c0, r0] = cell_of(t, acc.width(), acc.height(), point, where,
                                  [&](std::size_t i) { return acc[i] != 0; });
    const double dx = t.cell_dx();
    const double dy = t.cell_dy();
    const double radius = std::max(0.0, radius_m);
    const auto reach_c = static_cast<long long>(std::ceil(radius / dx)) + 1;
    const auto reach_r = static_cast<long long>(std::ceil(radius / dy)) + 1;
    SnappedPoint best;
    bool found = false;
    double best_d = 0.0;
    for (long long r = static_cast<long long>(r0) - reach_r;
         r <= static_cast<long long>(r0) + reach_r; ++r) {
        for (long long c = static_cast<long long>(c0) - reach_c;
             c <= static_cast<long long>(c0) + reach_c; ++c) {
            if (!acc.in_bounds(c, r)) {
                continue;
            }
            const auto uc = static_cast<std::size_t>(c);
            const auto ur = static_cast<std::size_t>(r);
            const std::uint32_t a = acc(uc, ur);
            if (a == 0) {
                continue;
            }
            if (found && a < best.accumulation) {
                continue; // cannot win; skip the distance
            }
            const auto [x, y] = t.cell_centre(uc, ur);
            const double d = std::hypot(x - point.x, y - point.y);
            const bool own = (uc == c0 && ur == r0);
            if (!own && d > radius) {
                continue;
            }
            const std::size_t i = acc.index(uc, ur);
            const bool better =
                !found || a > best.accumulation ||
                (a == best.accumulation && (d < best_d || (d == best_d && i < best.cell)));
            if (better) {
                found = true;
                best_d = d;
                best.cell = i;
                best.col = uc;
                best.row = ur;
                best.x = x;
                best.y = y;
                best.distance_m = d;
                best.accumulation = a;
            }
        }
    }
    best.accumulation_m2 = static_cast<double>(best.accumulation) * t.cell_area();
    return best;
}

} // namespace catchpeak::terrain
