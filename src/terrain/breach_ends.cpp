// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/breach_ends.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace catchpeak::terrain {

namespace {

using Point = std::pair<double, double>;

/// Distance from p to the segment a-b.
double segment_distance(const Point &p, const Point &a, const Point &b) {
    const double dx = b.first - a.first;
    const double dy = b.second - a.second;
    const double len2 = dx * dx + dy * dy;
    double t = 0.0;
    if (len2 > 0.0) {
        t = ((p.first - a.first) * dx + (p.second - a.second) * dy) / len2;
        t = std::clamp(t, 0.0, 1.0);
    }
    return std::hypot(p.first - (a.first + t * dx), p.second - (a.second + t * dy));
}

LineEnd end_at(const Grid<float> &dem, const Point &xy) {
    LineEnd e;
    e.xy = xy;
    const auto &t = dem.transform;
    const double c = std::floor((xy.first - t.origin_x) / t.pixel_width);
    const double r = std::floor((xy.second - t.origin_y) / t.pixel_height);
    if (c < 0.0 || r < 0.0 || c >= static_cast<double>(dem.width()) ||
        r >= static_cast<double>(dem.height())) {
        return e;
    }
    e.col = static_cast<std::size_t>(c);
    e.row = static_cast<std::size_t>(r);
    const std::size_t i = e.row * dem.width() + e.col;
    if (dem.is_valid(i)) {
        e.elevation_m = static_cast<double>(dem[i]);
    }
    return e;
}

} // namespace

std::optional<BreachEnds> nearest_breach_ends(const Grid<float> &dem,
                                              const std::vector<BreachLine> &lines, double x,
                                              double y) {
    std::optional<BreachEnds> best;
    double best_d = std::numeric_limits<double>::infinity();
    for (std::size_t k = 0; k < lines.size(); ++k) {
        const auto &v = lines[k].vertices_xy;
        for (std::size_t j = 1; j < v.size(); ++j) {
            const double d = segment_distance({x, y}, v[j - 1], v[j]);
            if (d < best_d) {
                best_d = d;
                best = BreachEnds{};
                best->line = k;
            }
        }
    }
    if (!best) {
        return best;
    }
    const auto &line = lines[best->line];
    const auto &v = line.vertices_xy;
    best->line_id = line.id;
    best->distance_m = best_d;
    for (std::size_t j = 1; j < v.size(); ++j) {
        best->length_m += std::hypot(v[j].first - v[j - 1].first, v[j].second - v[j - 1].second);
    }
    LineEnd first = end_at(dem, v.front());
    LineEnd last = end_at(dem, v.back());
    // The higher end is the inlet; the first vertex when equal or unknown.
    const bool reversed =
        first.elevation_m && last.elevation_m && *last.elevation_m > *first.elevation_m;
    best->inlet = reversed ? last : first;
    best->outlet = reversed ? first : last;
    return best;
}

} // namespace catchpeak::terrain
