// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/snap.hpp"

#include "catchpeak/core/error.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <numbers>
#include <optional>
#include <tuple>
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

namespace {

/// One searched cell.
struct Candidate {
    std::size_t cell = 0, col = 0, row = 0;
    double x = 0.0, y = 0.0;
    double centre_m = 0.0; ///< from the point to the cell centre
    double square_m = 0.0; ///< from the point to the cell's square (0 inside it)
    std::uint32_t accumulation = 0;
};

/// largest_flow: larger accumulation, then nearer centre, then lower index.
bool more_flow(const Candidate &a, const Candidate &b) {
    if (a.accumulation != b.accumulation) {
        return a.accumulation > b.accumulation;
    }
    if (a.centre_m != b.centre_m) {
        return a.centre_m < b.centre_m;
    }
    return a.cell < b.cell;
}

/// nearest_stream: nearer square, then larger accumulation, then nearer centre, lower index.
bool nearer(const Candidate &a, const Candidate &b) {
    if (a.square_m != b.square_m) {
        return a.square_m < b.square_m;
    }
    return more_flow(a, b);
}

SnappedPoint snapped_to(const Candidate &c) {
    SnappedPoint s;
    s.cell = c.cell;
    s.col = c.col;
    s.row = c.row;
    s.x = c.x;
    s.y = c.y;
    s.distance_m = c.centre_m;
    s.accumulation = c.accumulation;
    return s;
}

} // namespace

SnappedPoint snap_point(const Grid<std::uint32_t> &acc, const DesignPoint &point,
                        const SnapSettings &settings, const std::string &where) {
    const GeoTransform &t = acc.transform;
    const auto [c0, r0] = cell_of(t, acc.width(), acc.height(), point, where,
                                  [&](std::size_t i) { return acc[i] != 0; });
    const double dx = t.cell_dx();
    const double dy = t.cell_dy();
    const double cell_area = t.cell_area();
    const double radius = std::max(0.0, settings.radius_m);
    const auto reach_c = static_cast<long long>(std::ceil(radius / dx)) + 1;
    const auto reach_r = static_cast<long long>(std::ceil(radius / dy)) + 1;
    std::optional<Candidate> own, largest, stream;
    std::uint32_t min_a = 0, max_a = 0;
    for (long long r = static_cast<long long>(r0) - reach_r;
         r <= static_cast<long long>(r0) + reach_r; ++r) {
        for (long long c = static_cast<long long>(c0) - reach_c;
             c <= static_cast<long long>(c0) + reach_c; ++c) {
            if (!acc.in_bounds(c, r)) {
                continue;
            }
            Candidate k;
            k.col = static_cast<std::size_t>(c);
            k.row = static_cast<std::size_t>(r);
            k.accumulation = acc(k.col, k.row);
            if (k.accumulation == 0) {
                continue;
            }
            std::tie(k.x, k.y) = t.cell_centre(k.col, k.row);
            k.centre_m = std::hypot(k.x - point.x, k.y - point.y);
            const bool is_own = (k.col == c0 && k.row == r0);
            if (!is_own && k.centre_m > radius) {
                continue;
            }
            k.cell = acc.index(k.col, k.row);
            k.square_m = std::hypot(std::max(0.0, std::abs(k.x - point.x) - 0.5 * dx),
                                    std::max(0.0, std::abs(k.y - point.y) - 0.5 * dy));
            if (is_own) {
                k.square_m = 0.0; // the point lies in it (also on its lower and right edges)
                own = k;
            }
            min_a = (min_a == 0) ? k.accumulation : std::min(min_a, k.accumulation);
            max_a = std::max(max_a, k.accumulation);
            if (!largest || more_flow(k, *largest)) {
                largest = k;
            }
            const bool on_stream =
                static_cast<double>(k.accumulation) * cell_area >= settings.stream_threshold_m2;
            if (on_stream && (!stream || nearer(k, *stream))) {
                stream = k;
            }
        }
    }
    // cell_of found the point's cell with data, so `own` and `largest` are set.
    SnappedPoint best;
    switch (settings.rule) {
    case SnapRule::largest_flow:
        best = snapped_to(*largest);
        break;
    case SnapRule::nearest_stream:
        best = snapped_to(stream ? *stream : *own);
        best.no_stream_within_radius = !stream;
        break;
    case SnapRule::none:
        best = snapped_to(*own);
        break;
    }
    best.accumulation_m2 = static_cast<double>(best.accumulation) * cell_area;
    best.given_accumulation = own->accumulation;
    best.given_accumulation_m2 = static_cast<double>(own->accumulation) * cell_area;
    best.min_accumulation = min_a;
    best.max_accumulation = max_a;
    best.min_accumulation_m2 = static_cast<double>(min_a) * cell_area;
    best.max_accumulation_m2 = static_cast<double>(max_a) * cell_area;
    return best;
}

std::string compass_direction(double dx_m, double dy_m) {
    if (dx_m == 0.0 && dy_m == 0.0) {
        return {};
    }
    static constexpr std::array<const char *, 8> names = {
        "north", "north-east", "east", "south-east", "south", "south-west", "west", "north-west"};
    // Bearing clockwise from north, in eighths of a turn.
    const double eighths = std::atan2(dx_m, dy_m) / (std::numbers::pi / 4.0);
    const auto k = static_cast<long long>(std::lround(eighths));
    return names[static_cast<std::size_t>(((k % 8) + 8) % 8)];
}

} // namespace catchpeak::terrain
