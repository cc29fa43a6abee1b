// SPDX-License-Identifier: MIT
#include "catchpeak/rain/design_storm.hpp"

#include "sheet_units.hpp"

#include "catchpeak/core/error.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <functional>
#include <vector>

namespace catchpeak::rain {

namespace {

/// Block depth lines on the sheet: every block of a storm of at most `max_block_lines` blocks,
/// else the first `few_block_lines` (the largest, for an IDF whose increments decrease).
constexpr std::size_t max_block_lines = 12;
constexpr std::size_t few_block_lines = 6;

std::string where_storm(const StormDistribution &d) {
    return d.project_file.empty()
               ? fmt::format("storm distribution '{}'", d.name)
               : fmt::format("{}: storm distribution '{}'", d.project_file, d.name);
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

namespace {

// A storm from a dimensionless distribution. The source is the table's: "{source}; status:
// {status}".
constexpr std::string_view table_source = "{source}; status: {status}";
constexpr Formula distribution_note{"storm.distribution",
                                    "Design storm distribution",
                                    "",
                                    "{storm}, {D} {D:u}, cumulative fractions interpolated "
                                    "linearly between the table's {points} points",
                                    Ref::none,
                                    table_source};
constexpr Formula distribution_note_project{"storm.distribution_project",
                                            "Design storm distribution",
                                            "",
                                            "{storm}, the project's table {file} ([rainfall] "
                                            "storm_table), {D} {D:u}, cumulative fractions "
                                            "interpolated linearly between the table's {points} "
                                            "points",
                                            Ref::none,
                                            table_source};
constexpr Formula not_checked{"storm.not_checked",
                              "Storm distribution not checked",
                              "",
                              "the table of '{storm}' has status '{status}': it has not been "
                              "checked against a published source; check it before relying on "
                              "the result",
                              Ref::none,
                              table_source};
constexpr Formula storm_depth{"storm.depth",   "Storm depth",      "",
                              "P = {P} {P:u}", Ref::project_input, ""};
constexpr Formula time_step{"storm.time_step",  "Time step", "", "dt = {dt} {dt:u}, {n} steps",
                            Ref::project_input, ""};
constexpr Formula largest_step{"storm.largest_step",
                               "Largest step depth",
                               "dP = P (F(t2) - F(t1))",
                               "dP = {P} x ({F2} - {F1}), t1 = {t1} {t1:u}, t2 = {t2} {t2:u}",
                               Ref::none,
                               table_source};
constexpr Formula storm_peak{"storm.peak_intensity",
                             "Peak intensity of the design storm",
                             "i = dP / dt",
                             "i = {dP} / ({dt} / 60)",
                             Ref::none,
                             table_source};
/// The largest step of a storm: its index and the cumulative fractions at its ends.
struct LargestStep {
    std::size_t index = 0;
    double f0 = 0.0;
    double f1 = 0.0;
};

/// Index of the largest step; the first of equal steps (within round-off).
std::size_t largest_step_index(const std::vector<double> &depth) {
    std::size_t peak = 0;
    for (std::size_t k = 1; k < depth.size(); ++k) {
        if (depth[k] > depth[peak] * (1.0 + 1e-9)) {
            peak = k;
        }
    }
    return peak;
}

LargestStep fill_steps(const StormDistribution &d, double depth_mm, double step_min,
                       std::vector<double> &depth) {
    const std::size_t n = depth.size();
    std::vector<double> f(n + 1, 0.0); // cumulative fraction at the end of each step
    for (std::size_t k = 0; k < n; ++k) {
        const double t1_h = units::min_to_h(static_cast<double>(k + 1) * step_min);
        f[k + 1] = k + 1 == n ? 1.0 : cumulative_fraction_at(d, t1_h);
        depth[k] = depth_mm * (f[k + 1] - f[k]);
    }
    const std::size_t peak = largest_step_index(depth);
    return {peak, f[peak], f[peak + 1]};
}

} // namespace

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
    const auto source = word("source", d.source);
    const auto status = word("status", d.status);
    const auto storm = word("storm", d.name);
    std::vector<Quantity> about{storm, qty("D", d.duration_h(), Unit::h),
                                detail::count_qty("points", d.hours.size()), source, status};
    if (d.project_file.empty()) {
        lines.note(distribution_note, std::move(about));
    } else {
        about.push_back(word("file", d.project_file));
        lines.note(distribution_note_project, std::move(about));
    }
    if (!is_checked(d)) {
        lines.warn(not_checked, {storm, source, status});
    }
    const auto p = detail::depth_qty("P", depth_mm, sheet_units);
    lines.note(storm_depth, {}, p);
    const auto dt = qty("dt", step_min, Unit::min);
    lines.note(time_step, {detail::count_qty("n", n)}, dt);
    out.value.step_s = units::min_to_s(step_min);
    out.value.depth_mm.resize(n);
    const auto peak = fill_steps(d, depth_mm, step_min, out.value.depth_mm);
    const double peak_start_h = units::min_to_h(static_cast<double>(peak.index) * step_min);
    const double peak_end_h = units::min_to_h(static_cast<double>(peak.index + 1) * step_min);
    const double peak_mm = out.value.depth_mm[peak.index];
    const auto dp = detail::depth_qty("dP", peak_mm, sheet_units);
    lines.calc(largest_step,
               {p, qty("F2", peak.f1), qty("F1", peak.f0), qty("t1", peak_start_h, Unit::h),
                qty("t2", peak_end_h, Unit::h), source, status},
               dp);
    lines.calc(storm_peak, {dp, dt, source, status},
               detail::intensity_qty("i", peak_mm / units::min_to_h(step_min), sheet_units));
    return out;
}

std::optional<TableInterval> peak_table_interval(const StormDistribution &d, const Hyetograph &h) {
    if (h.depth_mm.empty() || !(h.step_s > 0.0)) {
        return std::nullopt;
    }
    const std::size_t peak = largest_step_index(h.depth_mm);
    // Whole steps times the step in s, then to h: exact for steps of whole seconds.
    const double start_h = static_cast<double>(peak) * h.step_s / units::s_per_h;
    const double end_h = static_cast<double>(peak + 1) * h.step_s / units::s_per_h;
    const double step_h = h.step_s / units::s_per_h;
    const auto hi = static_cast<std::size_t>(
        std::upper_bound(d.hours.begin(), d.hours.end(), start_h * (1.0 + 1e-12)) -
        d.hours.begin());
    if (hi == 0 || hi >= d.hours.size()) {
        return std::nullopt;
    }
    const TableInterval interval{d.hours[hi - 1], d.hours[hi]};
    const bool inside = end_h <= interval.end_h * (1.0 + 1e-12);
    const bool longer = interval.end_h - interval.start_h > step_h * (1.0 + 1e-9);
    return inside && longer ? std::optional(interval) : std::nullopt;
}

namespace {

// The alternating block method, Chow, Maidment & Mays (1988), sec. 14.4.
constexpr std::string_view chow_ab = ", Applied Hydrology, sec. 14.4 (alternating block method)";
constexpr std::string_view block_symbols = "dD_k = i(k dt) k dt - i((k-1) dt) (k-1) dt";
constexpr Formula block_storm_note{"storm.alternating_block",
                                   "Design storm",
                                   "",
                                   "alternating block, {T} {T:u}, duration Td = {Td} {Td:u} in "
                                   "{n} blocks of dt = {dt} {dt:u}: block depths from the IDF, "
                                   "the largest in the middle of the storm (block {centre} of "
                                   "{n}, {c0} to {c1} {c1:u}), the others in descending order "
                                   "alternately right and left of it",
                                   Ref::chow_1988,
                                   chow_ab};
constexpr std::string_view block_label = "Block depth {k} of {n}, placed {t1} to {t2} {t2:u}";
constexpr Formula first_block{"storm.block_first",     block_label,    "dD_1 = i(dt) dt",
                              "dD_1 = {i} x {t} / 60", Ref::chow_1988, chow_ab};
constexpr Formula later_block{"storm.block",  block_label,
                              block_symbols,  "dD_{k} = {i} x {t} / 60 - {i_prev} x {t_prev} / 60",
                              Ref::chow_1988, chow_ab};
constexpr Formula other_blocks{"storm.other_blocks",
                               "Other blocks",
                               "",
                               "blocks {first} to {n} likewise, dD_k = i(k dt) k dt - i((k-1) "
                               "dt) (k-1) dt, the smallest {dD_min} {dD_min:u}; all are drawn "
                               "on the hyetograph",
                               Ref::chow_1988,
                               chow_ab};
constexpr Formula block_total{"storm.block_total",   "Storm depth",  "D = i(Td) Td",
                              "D = {i} x {Td} / 60", Ref::chow_1988, chow_ab};
constexpr Formula blocks_reordered{"storm.blocks_reordered",
                                   "Blocks reordered",
                                   "",
                                   "the depth increments of the IDF do not decrease steadily "
                                   "with duration; they are sorted, largest first ({dD_max} "
                                   "{dD_max:u}), before being placed",
                                   Ref::chow_1988,
                                   chow_ab};
constexpr Formula block_peak{"storm.block_peak_intensity",
                             "Peak intensity of the design storm",
                             "i = dD_max / dt",
                             "i = {dD} / ({dt} / 60)",
                             Ref::chow_1988,
                             chow_ab};

/// An alternating-block storm of `n` blocks of `step_min` over `duration_min` from `idf`.
struct BlockStorm {
    const Idf &idf;
    double duration_min;
    double step_min;
    double return_period_yr;
    std::size_t n;

    /// Duration of the first k blocks (exactly the storm duration for k = n).
    [[nodiscard]] double duration_of(std::size_t k) const {
        return k == n ? duration_min : static_cast<double>(k) * step_min;
    }
};

/// Cumulative depths D_k = i(k dt) k dt for k = 0..n, mm; throws when one falls.
std::vector<double> cumulative_depths(const BlockStorm &b, const std::string &where) {
    std::vector<double> cumulative(b.n + 1, 0.0);
    for (std::size_t k = 1; k <= b.n; ++k) {
        const double t_min = b.duration_of(k);
        cumulative[k] =
            b.idf.intensity_mm_per_h(t_min, b.return_period_yr) * units::min_to_h(t_min);
        if (cumulative[k] < cumulative[k - 1]) {
            throw_input_error(where,
                              fmt::format("the IDF depth falls from {} mm at {} min to {} mm at "
                                          "{} min, so a block would be negative",
                                          sig(cumulative[k - 1]), sig(b.duration_of(k - 1)),
                                          sig(cumulative[k]), sig(t_min)),
                              "an IDF whose depth i t grows with the duration");
        }
    }
    return cumulative;
}

/// Where each depth increment goes: increments ranked by size (0: the largest; ties keep the
/// order of duration), the largest at the centre, then right, left, right, ...
struct BlockOrder {
    std::vector<std::size_t> by_size;  ///< increment index by rank
    std::vector<std::size_t> position; ///< block position of increment k
    std::size_t centre = 0;
    bool already_descending = true;
};

BlockOrder block_order(const std::vector<double> &increments) {
    const std::size_t n = increments.size();
    BlockOrder o;
    o.by_size.resize(n);
    for (std::size_t k = 0; k < n; ++k) {
        o.by_size[k] = k;
    }
    std::stable_sort(o.by_size.begin(), o.by_size.end(),
                     [&](std::size_t a, std::size_t b) { return increments[a] > increments[b]; });
    o.already_descending = std::is_sorted(increments.begin(), increments.end(), std::greater<>());
    o.centre = (n - 1) / 2;
    std::vector<std::size_t> position_of_rank{o.centre};
    position_of_rank.reserve(n);
    std::size_t right = o.centre + 1;
    std::size_t left = o.centre; // the next left position is left - 1
    bool go_right = true;
    for (std::size_t r = 1; r < n; ++r) {
        position_of_rank.push_back(((go_right && right < n) || left == 0) ? right++ : --left);
        go_right = !go_right;
    }
    o.position.resize(n);
    for (std::size_t r = 0; r < n; ++r) {
        o.position[o.by_size[r]] = position_of_rank[r];
    }
    return o;
}

/// The intensity lines of i(k dt) of a block storm, each added once.
class BlockIntensities {
  public:
    BlockIntensities(const BlockStorm &b, units::System s, CalcLines &lines)
        : storm_(b), sheet_(s), lines_(lines), mm_per_h_(b.n + 1, 0.0), shown_(b.n + 1, false) {}

    /// i(k dt) as a quantity in the sheet's unit; adds its lines the first time.
    Quantity at(std::size_t k, std::string symbol) {
        if (!shown_[k]) {
            auto i = storm_.idf.intensity(storm_.duration_of(k), storm_.return_period_yr, sheet_);
            lines_.append(i.lines);
            mm_per_h_[k] = i.value;
            shown_[k] = true;
        }
        return detail::intensity_qty(std::move(symbol), mm_per_h_[k], sheet_);
    }

  private:
    const BlockStorm &storm_;
    units::System sheet_;
    CalcLines &lines_;
    std::vector<double> mm_per_h_;
    std::vector<bool> shown_;
};

/// The lines of the block depths: every block when there are few, else the first ones (the
/// largest for the usual IDF) and a note for the rest.
void block_depth_lines(const BlockStorm &b, const std::vector<double> &increments,
                       const BlockOrder &o, BlockIntensities &intensity, units::System s,
                       CalcLines &lines) {
    const std::size_t shown = b.n <= max_block_lines ? b.n : few_block_lines;
    for (std::size_t k = 1; k <= shown; ++k) {
        const double t1 = static_cast<double>(o.position[k - 1]) * b.step_min;
        std::vector<Quantity> inputs{
            detail::count_qty("k", k), detail::count_qty("n", b.n),
            qty("t1", t1, Unit::min),  qty("t2", t1 + b.step_min, Unit::min),
            intensity.at(k, "i"),      qty("t", b.duration_of(k), Unit::min)};
        const auto block = detail::depth_qty("dD", increments[k - 1], s);
        if (k == 1) {
            lines.calc(first_block, std::move(inputs), block);
            continue;
        }
        inputs.push_back(intensity.at(k - 1, "i_prev"));
        inputs.push_back(qty("t_prev", b.duration_of(k - 1), Unit::min));
        lines.calc(later_block, std::move(inputs), block);
    }
    if (shown < b.n) {
        lines.note(other_blocks,
                   {detail::count_qty("first", shown + 1), detail::count_qty("n", b.n),
                    detail::depth_qty("dD_min", increments[o.by_size.back()], s)});
    }
}

} // namespace

WithLines<Hyetograph> alternating_block_hyetograph(const Idf &idf, double duration_min,
                                                   double step_min, double return_period_yr,
                                                   units::System sheet_units) {
    const auto where = fmt::format("alternating-block storm from IDF '{}'", idf.name());
    if (!std::isfinite(duration_min) || !(duration_min > 0.0)) {
        throw_input_error(where,
                          fmt::format("storm duration {} min is not positive", sig(duration_min)),
                          "a duration > 0 min");
    }
    const BlockStorm b{idf, duration_min, step_min, return_period_yr,
                       whole_steps(duration_min, step_min, where, "storm duration")};
    const auto cumulative = cumulative_depths(b, where);
    std::vector<double> increments(b.n);
    for (std::size_t k = 0; k < b.n; ++k) {
        increments[k] = cumulative[k + 1] - cumulative[k];
    }
    const auto order = block_order(increments);
    WithLines<Hyetograph> out{{}, {}};
    out.value.step_s = units::min_to_s(step_min);
    out.value.depth_mm.assign(b.n, 0.0);
    for (std::size_t k = 0; k < b.n; ++k) {
        out.value.depth_mm[order.position[k]] = increments[k];
    }

    auto &lines = out.lines;
    const auto dt = qty("dt", step_min, Unit::min);
    lines.note(block_storm_note,
               {detail::return_period_qty(return_period_yr), qty("Td", duration_min, Unit::min),
                detail::count_qty("n", b.n), dt, detail::count_qty("centre", order.centre + 1),
                qty("c0", static_cast<double>(order.centre) * step_min, Unit::min),
                qty("c1", static_cast<double>(order.centre + 1) * step_min, Unit::min)});
    BlockIntensities intensity(b, sheet_units, lines);
    block_depth_lines(b, increments, order, intensity, sheet_units, lines);
    lines.calc(block_total, {intensity.at(b.n, "i"), qty("Td", duration_min, Unit::min)},
               detail::depth_qty("D", cumulative[b.n], sheet_units));
    if (!order.already_descending) {
        lines.note(blocks_reordered,
                   {detail::depth_qty("dD_max", increments[order.by_size.front()], sheet_units)});
    }
    const double peak_mm = increments[order.by_size.front()];
    lines.calc(block_peak, {detail::depth_qty("dD", peak_mm, sheet_units), dt},
               detail::intensity_qty("i", peak_mm / units::min_to_h(step_min), sheet_units));
    return out;
}

} // namespace catchpeak::rain
