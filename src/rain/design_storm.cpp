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
            lines.warn("Peak averaged over a table interval",
                       fmt::format("the largest step lies between the table's points at {} h "
                                   "and {} h ({} min apart, {} min steps): the rain of that "
                                   "interval is spread evenly over its steps, so the peak "
                                   "intensity is the interval's average; a table with more "
                                   "points near the peak would give a higher peak",
                                   sig(h0), sig(h1), sig(interval_min), sig(step_min)),
                       "linear interpolation of the storm table (property of the method)");
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
    WithLines<Hyetograph> out{{}, {}};
    auto &lines = out.lines;
    const auto unit = depth_unit(sheet_units);
    lines.note("Design storm",
               fmt::format("alternating block, {} yr, duration {} min in {} blocks of {} min; "
                           "largest block at block {} of {}",
                           sig(return_period_yr), sig(duration_min), n, sig(step_min),
                           (n - 1) / 2 + 1, n),
               chow_ab);
    // Cumulative depths D_k = i(k dt) k dt, mm.
    std::vector<double> cumulative(n + 1, 0.0);
    for (std::size_t k = 1; k <= n; ++k) {
        const double t_min = k == n ? duration_min : static_cast<double>(k) * step_min;
        const double i = idf.intensity_mm_per_h(t_min, return_period_yr);
        cumulative[k] = i * units::min_to_h(t_min);
        if (cumulative[k] < cumulative[k - 1]) {
            throw_input_error(where,
                              fmt::format("the IDF depth falls from {} mm at {} min to {} mm at "
                                          "{} min, so a block would be negative",
                                          sig(cumulative[k - 1]),
                                          sig(static_cast<double>(k - 1) * step_min),
                                          sig(cumulative[k]), sig(t_min)),
                              "an IDF whose depth i t grows with the duration");
        }
    }
    std::vector<double> increments(n);
    for (std::size_t k = 1; k <= n; ++k) {
        increments[k - 1] = cumulative[k] - cumulative[k - 1];
    }
    const bool already_descending =
        std::is_sorted(increments.begin(), increments.end(), std::greater<>());
    // Line for the first block: i(dt) dt, and for the whole storm: i(Td) Td.
    const auto first = idf.intensity(step_min, return_period_yr, sheet_units);
    lines.append(first.lines);
    lines.calc(already_descending ? "Largest block depth" : "First block depth", "dD_1 = i(dt) dt",
               fmt::format("dD_1 = {} x {} / 60", sig(mm_h_to_sheet(first.value, sheet_units)),
                           sig(step_min)),
               mm_to_sheet(cumulative[1], sheet_units), unit, chow_ab);
    if (n > 1) {
        const auto last = idf.intensity(duration_min, return_period_yr, sheet_units);
        lines.append(last.lines);
        lines.calc("Storm depth", "D = i(Td) Td",
                   fmt::format("D = {} x {} / 60", sig(mm_h_to_sheet(last.value, sheet_units)),
                               sig(duration_min)),
                   mm_to_sheet(cumulative[n], sheet_units), unit, chow_ab);
    }
    if (!already_descending) {
        std::stable_sort(increments.begin(), increments.end(), std::greater<>());
        lines.note("Blocks reordered",
                   fmt::format("the depth increments of the IDF do not decrease steadily with "
                               "duration; they are sorted, largest first ({} {}), before being "
                               "placed",
                               sig(mm_to_sheet(increments.front(), sheet_units)), unit),
                   chow_ab);
    }
    // Place the increments: centre, then right, left, right, ...
    out.value.step_s = units::min_to_s(step_min);
    out.value.depth_mm.assign(n, 0.0);
    const std::size_t centre = (n - 1) / 2;
    std::size_t right = centre + 1;
    std::size_t left = centre; // the next left position is left - 1
    out.value.depth_mm[centre] = increments[0];
    bool go_right = true;
    for (std::size_t k = 1; k < n; ++k) {
        if ((go_right && right < n) || left == 0) {
            out.value.depth_mm[right++] = increments[k];
        } else {
            out.value.depth_mm[--left] = increments[k];
        }
        go_right = !go_right;
    }
    return out;
}

} // namespace catchpeak::rain
