// SPDX-License-Identifier: MIT
#include "catchpeak/rain/idf.hpp"

#include "sheet_units.hpp"

#include "catchpeak/core/error.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <utility>

namespace catchpeak::rain {

namespace {

/// Two durations or return periods closer than this (relative) are taken as equal.
constexpr double same_rel = 1e-9;

bool same(double a, double b) { return std::abs(a - b) <= same_rel * std::max(std::abs(a), 1.0); }

bool positive_finite(double v) { return std::isfinite(v) && v > 0.0; }

std::string list_numbers(const std::vector<double> &v) {
    std::vector<std::string> parts;
    parts.reserve(v.size());
    for (double x : v) {
        parts.push_back(sig(x));
    }
    return fmt::format("{}", fmt::join(parts, ", "));
}

std::string where_table(const IdfTable &t) { return fmt::format("IDF table '{}'", t.name); }
std::string where_formula(const IdfFormula &f) { return fmt::format("IDF formula '{}'", f.name); }

void check_return_periods(const std::vector<double> &rp, const std::string &where) {
    if (rp.empty()) {
        throw_input_error(where, "no return periods", "at least one return period (yr)");
    }
    for (std::size_t r = 0; r < rp.size(); ++r) {
        if (!positive_finite(rp[r])) {
            throw_input_error(where, fmt::format("return period {} yr is not positive", sig(rp[r])),
                              "return periods > 0 yr");
        }
        if (r > 0 && !(rp[r] > rp[r - 1])) {
            throw_input_error(where,
                              fmt::format("return periods not strictly increasing ({} yr after "
                                          "{} yr)",
                                          sig(rp[r]), sig(rp[r - 1])),
                              "each return period once, in increasing order");
        }
    }
}

void validate(const IdfTable &t) {
    const auto where = where_table(t);
    if (t.durations_min.empty()) {
        throw_input_error(where, "no durations", "at least one duration (min)");
    }
    for (std::size_t d = 0; d < t.durations_min.size(); ++d) {
        if (!positive_finite(t.durations_min[d])) {
            throw_input_error(
                where, fmt::format("duration {} min is not positive", sig(t.durations_min[d])),
                "durations > 0 min");
        }
        if (d > 0 && !(t.durations_min[d] > t.durations_min[d - 1])) {
            throw_input_error(where,
                              fmt::format("durations not strictly increasing ({} min after {} min)",
                                          sig(t.durations_min[d]), sig(t.durations_min[d - 1])),
                              "each duration once, in increasing order");
        }
    }
    check_return_periods(t.return_periods_yr, where);
    if (t.intensity_mm_per_h.size() != t.return_periods_yr.size()) {
        throw_input_error(where,
                          fmt::format("{} intensity columns for {} return periods",
                                      t.intensity_mm_per_h.size(), t.return_periods_yr.size()),
                          "one intensity column per return period");
    }
    for (std::size_t r = 0; r < t.return_periods_yr.size(); ++r) {
        const auto &col = t.intensity_mm_per_h[r];
        const double rp = t.return_periods_yr[r];
        if (col.size() != t.durations_min.size()) {
            throw_input_error(where,
                              fmt::format("{} intensities for the {} yr return period but {} "
                                          "durations",
                                          col.size(), sig(rp), t.durations_min.size()),
                              "one intensity per duration and return period");
        }
        for (std::size_t d = 0; d < col.size(); ++d) {
            const double dur = t.durations_min[d];
            if (!positive_finite(col[d])) {
                throw_input_error(where,
                                  fmt::format("intensity {} mm/h at {} min, {} yr is not positive",
                                              sig(col[d]), sig(dur), sig(rp)),
                                  "intensities > 0");
            }
            if (d > 0 && !(col[d] < col[d - 1])) {
                throw_input_error(
                    where,
                    fmt::format("intensity does not decrease with duration for {} yr: {} mm/h at "
                                "{} min, {} mm/h at {} min",
                                sig(rp), sig(col[d - 1]), sig(t.durations_min[d - 1]), sig(col[d]),
                                sig(dur)),
                    "intensities that decrease strictly as the duration grows");
            }
            if (r > 0 && !(col[d] > t.intensity_mm_per_h[r - 1][d])) {
                throw_input_error(
                    where,
                    fmt::format("intensity does not increase with return period at {} min: {} "
                                "mm/h for {} yr, {} mm/h for {} yr",
                                sig(dur), sig(t.intensity_mm_per_h[r - 1][d]),
                                sig(t.return_periods_yr[r - 1]), sig(col[d]), sig(rp)),
                    "intensities that increase strictly with the return period");
            }
        }
    }
}

double formula_value(const IdfFormulaConstants &k, double t_min) {
    return k.a / std::pow(t_min + k.b_min, k.c);
}

void validate(const IdfFormula &f) {
    const auto where = where_formula(f);
    std::vector<double> rp;
    for (const auto &k : f.constants) {
        rp.push_back(k.return_period_yr);
    }
    check_return_periods(rp, where);
    for (const auto &k : f.constants) {
        const auto at = fmt::format("constants for {} yr", sig(k.return_period_yr));
        if (!positive_finite(k.a)) {
            throw_input_error(where, fmt::format("{}: a = {} is not positive", at, sig(k.a)),
                              "a > 0");
        }
        if (!std::isfinite(k.b_min) || k.b_min < 0.0) {
            throw_input_error(where, fmt::format("{}: b = {} min is negative", at, sig(k.b_min)),
                              "b >= 0 min");
        }
        if (!positive_finite(k.c)) {
            throw_input_error(where, fmt::format("{}: c = {} is not positive", at, sig(k.c)),
                              "c > 0");
        }
    }
    if (!std::isfinite(f.min_duration_min) || !std::isfinite(f.max_duration_min) ||
        f.min_duration_min < 0.0 || f.max_duration_min < f.min_duration_min) {
        throw_input_error(where,
                          fmt::format("fitted duration range {} to {} min is not a range",
                                      sig(f.min_duration_min), sig(f.max_duration_min)),
                          "0 <= minimum <= maximum (both 0 when unknown)");
    }
    // With a, c > 0 and b >= 0 the intensity always decreases with duration. Whether it grows
    // with the return period depends on the constants: check it over the fitted range (or over
    // 5 min to 24 h when the range is unknown), at durations spaced evenly in log t.
    const bool have_range = f.max_duration_min > 0.0;
    const double lo = have_range ? std::max(f.min_duration_min, 1e-3) : 5.0;
    const double hi = have_range ? f.max_duration_min : 1440.0;
    constexpr int samples = 25;
    for (int s = 0; s < samples; ++s) {
        const double t =
            lo * std::pow(hi / lo, static_cast<double>(s) / static_cast<double>(samples - 1));
        for (std::size_t r = 1; r < f.constants.size(); ++r) {
            const double prev = formula_value(f.constants[r - 1], t);
            const double cur = formula_value(f.constants[r], t);
            if (!(cur > prev)) {
                throw_input_error(
                    where,
                    fmt::format("intensity does not increase with return period at {} min: {} {} "
                                "for {} yr, {} {} for {} yr",
                                sig(t), sig(prev), to_string(f.unit),
                                sig(f.constants[r - 1].return_period_yr), sig(cur),
                                to_string(f.unit), sig(f.constants[r].return_period_yr)),
                    "constants that give a higher intensity for a longer return period at every "
                    "duration");
            }
        }
    }
}

[[noreturn]] void missing_return_period(const std::string &where, double rp,
                                        const std::vector<double> &have) {
    throw_input_error(where, fmt::format("no intensities for the {} yr return period", sig(rp)),
                      fmt::format("one of the return periods it has: {} yr", list_numbers(have)));
}

std::size_t find_rp(const std::vector<double> &have, double rp, const std::string &where) {
    for (std::size_t r = 0; r < have.size(); ++r) {
        if (same(have[r], rp)) {
            return r;
        }
    }
    missing_return_period(where, rp, have);
}

// The lines of an intensity: t the duration, T the return period, i the intensity.
constexpr Formula table_value{"idf.table_value",
                              "Rainfall intensity, {t} {t:u}, {T} {T:u}",
                              "i = i(t, T) from the table",
                              "i = {i} (table value at t = {t_table} {t_table:u}, T = {T} {T:u})",
                              Ref::project_input,
                              ": IDF table {idf}"};
constexpr Formula table_interpolated{
    "idf.table_interpolated",
    "Rainfall intensity, {t} {t:u}, {T} {T:u}",
    "i = i1 (t/t1)^(ln(i2/i1) / ln(t2/t1))",
    "i = {i1} x ({t}/{t1})^(ln({i2}/{i1}) / ln({t2}/{t1}))",
    Ref::none,
    "log-log interpolation between {t1} and {t2} {t2:u}; project input: IDF table {idf}"};
constexpr Formula outside_fitted{"idf.outside_fitted_durations",
                                 "IDF formula outside its fitted durations",
                                 "",
                                 "duration {t} {t:u} lies outside {t_min} to {t_max} {t_max:u}, "
                                 "the durations the constants of '{idf}' were fitted for; the "
                                 "intensity is an extrapolation",
                                 Ref::project_input,
                                 ": IDF formula {idf}"};
constexpr Formula formula_value_line{
    "idf.formula",       "Rainfall intensity, {t} {t:u}, {T} {T:u}",
    "i = a / (t + b)^c", "i = {a} / ({t} + {b})^{c}",
    Ref::project_input,  ": IDF formula {idf}"};
constexpr Formula in_h_to_mm_h{"idf.to_mm_per_h",
                               "Rainfall intensity in {i:u}",
                               "i[{i:u}] = 25.4 i[{i_in:u}]",
                               "i = 25.4 x {i_in}",
                               Ref::none,
                               "1 in = 25.4 mm (exact)"};
constexpr Formula mm_h_to_in_h{"idf.to_in_per_h",
                               "Rainfall intensity in {i:u}",
                               "i[{i:u}] = i[{i_mm:u}] / 25.4",
                               "i = {i_mm} / 25.4",
                               Ref::none,
                               "1 in = 25.4 mm (exact)"};
constexpr Formula depth_line{"idf.depth", "Rainfall depth, {t} {t:u}, {T} {T:u}",
                             "P = i t",   "P = {i} x {t} / 60",
                             Ref::none,   "depth from the intensity over the duration"};

Unit unit_of(IntensityUnit u) noexcept {
    return u == IntensityUnit::in_per_h ? Unit::in_per_h : Unit::mm_per_h;
}

Quantity duration_qty(double t_min) { return qty("t", t_min, Unit::min); }

WithLines<double> table_intensity(const IdfTable &t, double dur, double rp, units::System s) {
    const auto where = where_table(t);
    const std::size_t r = find_rp(t.return_periods_yr, rp, where);
    const auto &col = t.intensity_mm_per_h[r];
    const auto &ds = t.durations_min;
    WithLines<double> out{0.0, {}};
    for (std::size_t d = 0; d < ds.size(); ++d) {
        if (same(ds[d], dur)) {
            out.value = col[d];
            out.lines.calc(table_value,
                           {duration_qty(dur), detail::return_period_qty(rp),
                            qty("t_table", ds[d], Unit::min), word("idf", t.name)},
                           detail::intensity_qty("i", col[d], s));
            return out;
        }
    }
    if (dur < ds.front() || dur > ds.back()) {
        throw_input_error(where,
                          fmt::format("duration {} min lies outside the table's durations ({} to "
                                      "{} min); the table is not extrapolated",
                                      sig(dur), sig(ds.front()), sig(ds.back())),
                          fmt::format("durations from {} to {} min, or a table that covers {} min",
                                      sig(ds.front()), sig(ds.back()), sig(dur)));
    }
    const auto hi_it = std::upper_bound(ds.begin(), ds.end(), dur);
    const auto hi = static_cast<std::size_t>(hi_it - ds.begin());
    const std::size_t lo = hi - 1;
    const double t1 = ds[lo];
    const double t2 = ds[hi];
    // Interpolate in the sheet's unit so that the line reproduces exactly; the log-log form is
    // the same in any unit, the SI value is converted back.
    const double i1 = detail::mm_h_to_sheet(col[lo], s);
    const double i2 = detail::mm_h_to_sheet(col[hi], s);
    const double n = std::log(i2 / i1) / std::log(t2 / t1);
    const double i = i1 * std::pow(dur / t1, n);
    out.value = detail::us_sheet(s) ? units::in_per_h_to_mm_per_h(i) : i;
    const Unit iu = detail::intensity_unit(s);
    out.lines.calc(table_interpolated,
                   {duration_qty(dur), detail::return_period_qty(rp), qty("t1", t1, Unit::min),
                    qty("t2", t2, Unit::min), qty("i1", i1, iu), qty("i2", i2, iu),
                    word("idf", t.name)},
                   qty("i", i, iu));
    return out;
}

WithLines<double> formula_intensity(const IdfFormula &f, double dur, double rp, units::System s) {
    const auto where = where_formula(f);
    std::vector<double> have;
    for (const auto &k : f.constants) {
        have.push_back(k.return_period_yr);
    }
    const auto &k = f.constants[find_rp(have, rp, where)];
    WithLines<double> out{0.0, {}};
    if (f.max_duration_min > 0.0 && (dur < f.min_duration_min || dur > f.max_duration_min)) {
        out.lines.warn(outside_fitted,
                       {duration_qty(dur), qty("t_min", f.min_duration_min, Unit::min),
                        qty("t_max", f.max_duration_min, Unit::min), word("idf", f.name)});
    }
    const double native = formula_value(k, dur);
    out.lines.calc(formula_value_line,
                   {duration_qty(dur), detail::return_period_qty(rp), qty("a", k.a),
                    qty("b", k.b_min, Unit::min), qty("c", k.c), word("idf", f.name)},
                   qty("i", native, unit_of(f.unit)));
    const bool native_si = f.unit == IntensityUnit::mm_per_h;
    out.value = native_si ? native : units::in_per_h_to_mm_per_h(native);
    const bool sheet_si = s == units::System::si;
    if (native_si != sheet_si) {
        if (sheet_si) {
            out.lines.calc(in_h_to_mm_h, {qty("i_in", native, Unit::in_per_h)},
                           qty("i", out.value, Unit::mm_per_h));
        } else {
            out.lines.calc(mm_h_to_in_h, {qty("i_mm", native, Unit::mm_per_h)},
                           qty("i", units::mm_per_h_to_in_per_h(native), Unit::in_per_h));
        }
    }
    return out;
}

} // namespace

std::string_view to_string(IntensityUnit u) noexcept { return symbol(unit_of(u)); }

Idf::Idf(IdfTable table) : data_(std::move(table)) { validate(std::get<IdfTable>(data_)); }

Idf::Idf(IdfFormula formula) : data_(std::move(formula)) { validate(std::get<IdfFormula>(data_)); }

const std::string &Idf::name() const noexcept {
    return std::visit([](const auto &d) -> const std::string & { return d.name; }, data_);
}

std::vector<double> Idf::return_periods_yr() const {
    if (const auto *t = std::get_if<IdfTable>(&data_)) {
        return t->return_periods_yr;
    }
    std::vector<double> rp;
    for (const auto &k : std::get<IdfFormula>(data_).constants) {
        rp.push_back(k.return_period_yr);
    }
    return rp;
}

std::optional<std::pair<double, double>> Idf::duration_range_min() const {
    if (const auto *t = std::get_if<IdfTable>(&data_)) {
        return std::pair{t->durations_min.front(), t->durations_min.back()};
    }
    const auto &f = std::get<IdfFormula>(data_);
    if (f.max_duration_min > 0.0) {
        return std::pair{f.min_duration_min, f.max_duration_min};
    }
    return std::nullopt;
}

WithLines<double> Idf::intensity(double duration_min, double return_period_yr,
                                 units::System sheet_units) const {
    if (!positive_finite(duration_min)) {
        throw_input_error(fmt::format("IDF '{}'", name()),
                          fmt::format("duration {} min is not positive", sig(duration_min)),
                          "durations > 0 min");
    }
    if (const auto *t = std::get_if<IdfTable>(&data_)) {
        return table_intensity(*t, duration_min, return_period_yr, sheet_units);
    }
    return formula_intensity(std::get<IdfFormula>(data_), duration_min, return_period_yr,
                             sheet_units);
}

WithLines<double> Idf::depth(double duration_min, double return_period_yr,
                             units::System sheet_units) const {
    auto out = intensity(duration_min, return_period_yr, sheet_units);
    const double i_mm_per_h = out.value;
    out.value = i_mm_per_h * units::min_to_h(duration_min);
    out.lines.calc(depth_line,
                   {duration_qty(duration_min), detail::return_period_qty(return_period_yr),
                    detail::intensity_qty("i", i_mm_per_h, sheet_units)},
                   detail::depth_qty("P", out.value, sheet_units));
    return out;
}

double Idf::intensity_mm_per_h(double duration_min, double return_period_yr) const {
    return intensity(duration_min, return_period_yr, units::System::si).value;
}

} // namespace catchpeak::rain
