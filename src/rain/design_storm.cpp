// SPDX-License-Identifier: MIT
#include "catchpeak/rain/design_storm.hpp"

#include "catchpeak/core/error.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <functional>
#include <vector>

namespace catchpeak::rain {

namespace {

constexpr const char *chow_ab =
    "Chow, Maidment & Mays (1988), Applied Hydrology, sec. 14.4 (alternating block method)";

/// Block depth lines on the sheet: every block of a storm of at most `max_block_lines` blocks,
/// else the first `few_block_lines` (the largest, for an IDF whose increments decrease).
constexpr std::size_t max_block_lines = 12;
constexpr std::size_t few_block_lines = 6;

std::string where_storm(const StormDistribution &d) {
    return fmt::format("storm distribution '{}'", d.name);
}

/// Number of whole steps in `total`; throws when `step` does not divide it.
std::size_t whole_steps(double total_min, double step_min, const std::string &where,
                        const char *what) {
    if (!std::isfinite(step_min) || !(step_min > 0.0)) {
        throw_input_error(where, fmt::format("time step {} min is not positive", sig(step_min)),
                          "a time step > 0 min");
    }
    const double n = total_min / step_min;
    const double rounded = std::round(n);
    if (rounded < 1.0 || std::abs(n - rounded) > 1e-9 * std::max(rounded, 1.0)) {
        throw_input_error(where,
                          fmt::format("time step {} min does not divide the {} of {} min into "
                                      "whole steps",
                                      sig(step_min), what, sig(total_min)),
                          fmt::format("a time step that divides {} min, e.g. {} min",
                                      sig(total_min), sig(total_min / std::max(1.0, rounded))));
    }
    return static_cast<std::size_t>(rounded);
}

std::string depth_unit(units::System s) { return s == units::System::us_customary ? "in" : "mm"; }
double mm_to_sheet(double mm, units::System s) {
    return s == units::System::us_customary ? units::mm_to_in(mm) : mm;
}
double mm_h_to_sheet(double v, units::System s) {
    return s == units::System::us_customary ? units::mm_per_h_to_in_per_h(v) : v;
}

} // namespace

void validate(const StormDistribution &d) {
    const auto where = where_storm(d);
    if (d.hours.size() != d.cumulative_fraction.size()) {
        throw_input_error(where,
                          fmt::format("{} hours but {} cumulative fractions", d.hours.size(),
                                      d.cumulative_fraction.size()),
                          "one cumulative fraction per hour");
    }
    if (d.hours.size() < 2) {
        throw_input_error(where, fmt::format("{} points", d.hours.size()), "at least 2 points");
    }
    for (std::size_t i = 0; i < d.hours.size(); ++i) {
        const double h = d.hours[i];
        const double f = d.cumulative_fraction[i];
        if (!std::isfinite(h) || !std::isfinite(f)) {
            throw_input_error(where, fmt::format("point {} is not a finite number", i + 1),
                              "finite hours and fractions");
        }
        if (i == 0 && (h != 0.0 || f != 0.0)) {
            throw_input_error(
                where, fmt::format("the first point is ({} h, {}), not (0 h, 0)", sig(h), sig(f)),
                "a table that starts at 0 h with fraction 0");
        }
        if (i > 0 && !(h > d.hours[i - 1])) {
            throw_input_error(where,
                              fmt::format("hours not strictly increasing ({} h after {} h)", sig(h),
                                          sig(d.hours[i - 1])),
                              "each hour once, in increasing order");
        }
        if (i > 0 && f < d.cumulative_fraction[i - 1]) {
            throw_input_error(where,
                              fmt::format("cumulative fraction decreases from {} at {} h to {} "
                                          "at {} h",
                                          sig(d.cumulative_fraction[i - 1]), sig(d.hours[i - 1]),
                                          sig(f), sig(h)),
                              "cumulative fractions that never decrease");
        }
    }
    if (d.cumulative_fraction.back() != 1.0) {
        throw_input_error(where,
                          fmt::format("the last cumulative fraction is {}, not 1",
                                      sig(d.cumulative_fraction.back(), 6)),
                          "a table that ends with fraction 1");
    }
}

bool is_checked(const StormDistribution &d) { return d.status.rfind("checked", 0) == 0; }

double cumulative_fraction_at(const StormDistribution &d, double hour) {
    const auto &h = d.hours;
    const auto &f = d.cumulative_fraction;
    if (hour <= h.front()) {
        return f.front();
    }
    if (hour >= h.back()) {
        return f.back();
    }
    const auto hi =
        static_cast<std::size_t>(std::upper_bound(h.begin(), h.end(), hour) - h.begin());
    const std::size_t lo = hi - 1;
    return f[lo] + (f[hi] - f[lo]) * (hour - h[lo]) / (h[hi] - h[lo]);
}

WithLines<Hyetograph> storm_hyetograph(const StormDistribution &d, double depth_mm, double step_min,
                                       units::System sheet_units) {
    validate(d);
    const auto where = where_storm(d);
    if (!std::isfinite(depth_mm) || !(depth_mm > 0.0)) {
        throw_input_error(where, fmt::format("storm depth {} mm is not positive", sig(depth_mm)),
                          "a depth > 0 mm");
    }
    const double duration_min = units::h_to_min(d.duration_h());
    const std::size_t n = whole_steps(duration_min, step_min, where, "storm duration");
    WithLines<Hyetograph> out{{}, {}};
    auto &lines = out.lines;
    const auto source = fmt::format("{}; status: {}", d.source, d.status);
    lines.note("Design storm distribution",
               fmt::format("{}, {} h, cumulative fractions interpolated linearly between the "
                           "table's {} points",
                           d.name, sig(d.duration_h()), d.hours.size()),
               source);
    if (!is_checked(d)) {
        lines.warn("Storm distribution not checked",
                   fmt::format("the table of '{}' has status '{}': it has not been checked "
                               "against a published source; check it before relying on the "
                               "result",
                               d.name, d.status),
                   source);
    }
    const auto unit = depth_unit(sheet_units);
    const double p_sheet = mm_to_sheet(depth_mm, sheet_units);
    lines.note("Storm depth", fmt::format("P = {} {}", sig(p_sheet), unit), "project input",
               p_sheet, unit);
    lines.note("Time step", fmt::format("dt = {} min, {} steps", sig(step_min), n), "project input",
               step_min, "min");
    out.value.step_s = units::min_to_s(step_min);
    out.value.depth_mm.resize(n);
    double prev_f = 0.0;
    std::size_t peak = 0;
    double peak_f0 = 0.0;
    double peak_f1 = 0.0;
    for (std::size_t k = 0; k < n; ++k) {
        const double t1_h = units::min_to_h(static_cast<double>(k + 1) * step_min);
        const double f1 = k + 1 == n ? 1.0 : cumulative_fraction_at(d, t1_h);
        out.value.depth_mm[k] = depth_mm * (f1 - prev_f);
        // The first of equal steps (within round-off) is reported as the largest.
        if (k == 0 || out.value.depth_mm[k] > out.value.depth_mm[peak] * (1.0 + 1e-9)) {
            peak = k;
            peak_f0 = prev_f;
            peak_f1 = f1;
        }
        prev_f = f1;
    }
    const double peak_start_h = units::min_to_h(static_cast<double>(peak) * step_min);
    const double peak_end_h = units::min_to_h(static_cast<double>(peak + 1) * step_min);
    lines.calc("Largest step depth", "dP = P (F(t2) - F(t1))",
               fmt::format("dP = {} x ({} - {}), t1 = {} h, t2 = {} h", sig(p_sheet), sig(peak_f1),
                           sig(peak_f0), sig(peak_start_h), sig(peak_end_h)),
               mm_to_sheet(out.value.depth_mm[peak], sheet_units), unit, source);
    lines.calc("Peak intensity of the design storm", "i = dP / dt",
               fmt::format("i = {} / ({} / 60)",
                           sig(mm_to_sheet(out.value.depth_mm[peak], sheet_units)), sig(step_min)),
               mm_h_to_sheet(out.value.depth_mm[peak] / units::min_to_h(step_min), sheet_units),
               unit + "/h", source);
    // Linear interpolation spreads the rain of one table interval evenly over the steps inside
    // it: when the largest step lies inside an interval longer than a step, the peak intensity
    // is that interval's average, lower than a finer table would give.
    const auto hi = static_cast<std::size_t>(
        std::upper_bound(d.hours.begin(), d.hours.end(), peak_start_h * (1.0 + 1e-12)) -
        d.hours.begin());
    if (hi > 0 && hi < d.hours.size()) {
        const double h0 = d.hours[hi - 1];
        const double h1 = d.hours[hi];
        const double interval_min = units::h_to_min(h1 - h0);
        if (peak_end_h <= h1 * (1.0 + 1e-12) && interval_min > step_min * (1.0 + 1e-9)) {
            lines
                .warn("Peak averaged over a table interval",
                      fmt::format("the largest step lies between the table's points at {} h "
                                  "and {} h ({} min apart, {} min steps): the rain of that "
                                  "interval is spread evenly over its steps, so the peak "
                                  "intensity is the interval's average; a table with more "
                                  "points near the peak would give a higher peak",
                                  sig(h0), sig(h1), sig(interval_min), sig(step_min)),
                      "linear interpolation of the storm table (property of the method)")
                .flags.averaged = true;
        }
    }
    return out;
}

WithLines<Hyetograph> alternating_block_hyetograph(const Idf &idf, double duration_min,
                                                   double step_min, double return_period_yr,
                                                   units::System sheet_units) {
    const auto where = fmt::format("alternating-block storm from IDF '{}'", idf.name());
    if (!std::isfinite(duration_min) || !(duration_min > 0.0)) {
        throw_input_error(where,
                          fmt::format("storm duration {} min is not positive", sig(duration_min)),
                          "a duration > 0 min");
    }
    const std::size_t n = whole_steps(duration_min, step_min, where, "storm duration");
    auto duration_of = [&](std::size_t k) {
        return k == n ? duration_min : static_cast<double>(k) * step_min;
    };
    // Cumulative depths D_k = i(k dt) k dt, mm.
    std::vector<double> cumulative(n + 1, 0.0);
    for (std::size_t k = 1; k <= n; ++k) {
        const double t_min = duration_of(k);
        cumulative[k] = idf.intensity_mm_per_h(t_min, return_period_yr) * units::min_to_h(t_min);
        if (cumulative[k] < cumulative[k - 1]) {
            throw_input_error(where,
                              fmt::format("the IDF depth falls from {} mm at {} min to {} mm at "
                                          "{} min, so a block would be negative",
                                          sig(cumulative[k - 1]), sig(duration_of(k - 1)),
                                          sig(cumulative[k]), sig(t_min)),
                              "an IDF whose depth i t grows with the duration");
        }
    }
    // Increment k (by duration, from 0) and its rank by size (0: the largest; ties keep the
    // order of duration).
    std::vector<double> increments(n);
    for (std::size_t k = 0; k < n; ++k) {
        increments[k] = cumulative[k + 1] - cumulative[k];
    }
    std::vector<std::size_t> by_size(n);
    for (std::size_t k = 0; k < n; ++k) {
        by_size[k] = k;
    }
    std::stable_sort(by_size.begin(), by_size.end(),
                     [&](std::size_t a, std::size_t b) { return increments[a] > increments[b]; });
    const bool already_descending =
        std::is_sorted(increments.begin(), increments.end(), std::greater<>());
    // Block positions by rank: centre, then right, left, right, ...
    const std::size_t centre = (n - 1) / 2;
    std::vector<std::size_t> position_of_rank{centre};
    position_of_rank.reserve(n);
    std::size_t right = centre + 1;
    std::size_t left = centre; // the next left position is left - 1
    bool go_right = true;
    for (std::size_t r = 1; r < n; ++r) {
        position_of_rank.push_back(((go_right && right < n) || left == 0) ? right++ : --left);
        go_right = !go_right;
    }
    std::vector<std::size_t> position(n); // of increment k
    for (std::size_t r = 0; r < n; ++r) {
        position[by_size[r]] = position_of_rank[r];
    }
    WithLines<Hyetograph> out{{}, {}};
    out.value.step_s = units::min_to_s(step_min);
    out.value.depth_mm.assign(n, 0.0);
    for (std::size_t k = 0; k < n; ++k) {
        out.value.depth_mm[position[k]] = increments[k];
    }

    auto &lines = out.lines;
    const auto unit = depth_unit(sheet_units);
    lines.note("Design storm",
               fmt::format("alternating block, {} yr, duration Td = {} min in {} blocks of "
                           "dt = {} min: block depths from the IDF, the largest in the middle of "
                           "the storm (block {} of {}, {} to {} min), the others in descending "
                           "order alternately right and left of it",
                           sig(return_period_yr), sig(duration_min), n, sig(step_min), centre + 1,
                           n, sig(static_cast<double>(centre) * step_min),
                           sig(static_cast<double>(centre + 1) * step_min)),
               chow_ab);
    // The intensity lines of i(k dt), each shown once.
    std::vector<double> i_sheet(n + 1, 0.0);
    std::vector<bool> shown(n + 1, false);
    auto intensity_at = [&](std::size_t k) {
        if (!shown[k]) {
            auto i = idf.intensity(duration_of(k), return_period_yr, sheet_units);
            lines.append(i.lines);
            i_sheet[k] = i.value;
            shown[k] = true;
        }
        return mm_h_to_sheet(i_sheet[k], sheet_units);
    };
    // Every block when there are few; else the first ones (the largest for the usual IDF).
    const std::size_t block_lines = n <= max_block_lines ? n : few_block_lines;
    for (std::size_t k = 1; k <= block_lines; ++k) {
        const double t1 = static_cast<double>(position[k - 1]) * step_min;
        const std::string label = fmt::format("Block depth {} of {}, placed {} to {} min", k, n,
                                              sig(t1), sig(t1 + step_min));
        const double now = intensity_at(k);
        if (k == 1) {
            lines.calc(label, "dD_1 = i(dt) dt",
                       fmt::format("dD_1 = {} x {} / 60", sig(now), sig(duration_of(1))),
                       mm_to_sheet(increments[0], sheet_units), unit, chow_ab);
            continue;
        }
        const double before = intensity_at(k - 1);
        lines.calc(label, "dD_k = i(k dt) k dt - i((k-1) dt) (k-1) dt",
                   fmt::format("dD_{} = {} x {} / 60 - {} x {} / 60", k, sig(now),
                               sig(duration_of(k)), sig(before), sig(duration_of(k - 1))),
                   mm_to_sheet(increments[k - 1], sheet_units), unit, chow_ab);
    }
    if (block_lines < n) {
        lines.note("Other blocks",
                   fmt::format("blocks {} to {} likewise, dD_k = i(k dt) k dt - i((k-1) dt) "
                               "(k-1) dt, the smallest {} {}; all are drawn on the hyetograph",
                               block_lines + 1, n,
                               sig(mm_to_sheet(increments[by_size.back()], sheet_units)), unit),
                   chow_ab);
    }
    const double i_total = intensity_at(n);
    lines.calc("Storm depth", "D = i(Td) Td",
               fmt::format("D = {} x {} / 60", sig(i_total), sig(duration_min)),
               mm_to_sheet(cumulative[n], sheet_units), unit, chow_ab);
    if (!already_descending) {
        lines.note("Blocks reordered",
                   fmt::format("the depth increments of the IDF do not decrease steadily with "
                               "duration; they are sorted, largest first ({} {}), before being "
                               "placed",
                               sig(mm_to_sheet(increments[by_size.front()], sheet_units)), unit),
                   chow_ab);
    }
    const double peak_mm = increments[by_size.front()];
    lines.calc(
        "Peak intensity of the design storm", "i = dD_max / dt",
        fmt::format("i = {} / ({} / 60)", sig(mm_to_sheet(peak_mm, sheet_units)), sig(step_min)),
        mm_h_to_sheet(peak_mm / units::min_to_h(step_min), sheet_units), unit + "/h", chow_ab);
    return out;
}

} // namespace catchpeak::rain
