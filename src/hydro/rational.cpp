// SPDX-License-Identifier: MIT
#include "catchpeak/hydro/rational.hpp"

#include "checks.hpp"
#include "sheet.hpp"

#include <algorithm>
#include <cmath>

namespace catchpeak::hydro {

using units::System;

namespace {

/// 1 acre-inch per hour in ft3/s: 43560 ft2 x 1/12 ft per 3600 s (exact; the rounded 1.008 of
/// many manuals gives peaks 0.033 % low).
constexpr double ft3_per_s_per_ac_in_per_h = 43560.0 / 43200.0;

// clang-format off
constexpr Formula cf_row{"rational.frequency_factor", "Frequency factor", "Cf from table",
    "Cf: row {Trow} years", Ref::none, "{table}"};
constexpr Formula cf_next_row{"rational.frequency_factor", "Frequency factor", "Cf from table",
    "Cf: {T} years not listed; row of the next longer return period, {Trow} years", Ref::none,
    "{table}"};
constexpr Formula cf_last_row{"rational.frequency_factor", "Frequency factor", "Cf from table",
    "Cf: {T} years beyond the table; its last row, {Trow} years", Ref::none, "{table}"};
constexpr Formula cf_c{keys::rational_cf_c, "Runoff coefficient with frequency factor", "Cf C",
    "Cf C = {Cf} x {C}", Ref::none,
    "Rational Method frequency factor (many US manuals; from memory)"};
constexpr Formula cf_c_capped{keys::rational_cf_c_capped, "Cf C capped at 1.0",
    "Cf C = min(Cf C, 1.0)", "Cf C = min({CfC}, 1.0)", Ref::none,
    "Rational Method: C Cf <= 1.0 (many US manuals; from memory)"};
constexpr Formula peak_us{"rational.peak_us", "Peak flow, Rational Method",
    "Q = Cf C i A (i in/h, A ac)", "Q = {CfC} x {i} x {A}", Ref::none, "Rational Method"};
constexpr Formula peak_cfs{"rational.peak_cfs", "Peak flow in ft3/s",
    "Q = Q[ac-in/h] x 43560/43200 (1 ac-in/h = 1.00833 ft3/s)", "Q = {Q[ac-in/h]} x 43560/43200",
    Ref::none, "1 acre-in/h = 43560 ft3 / 12 / 3600 s = 1.00833 ft3/s (exact conversion)"};
constexpr Formula peak_si{"rational.peak_si", "Peak flow, Rational Method",
    "Q = Cf C i A / 360 (i mm/h, A ha)", "Q = {CfC} x {i} x {A} / 360", Ref::none,
    "Rational Method, SI form (1 mm/h on 1 ha = 1/360 m3/s)"};
constexpr Formula area_over_limit{"rational.area_over_limit",
    "Rational Method: catchment area over the limit", "",
    "catchment area {A} {A:u} exceeds {Amax} {Amax:u}; the Rational Method is meant for small "
    "catchments, use a hydrograph method",
    Ref::project_setting, " (common practice, no source; local codes vary)"};
// clang-format on

} // namespace

WithLines<double> frequency_factor(const FrequencyFactorTable &table, double return_period_yr) {
    detail::require_positive("return period", return_period_yr, Unit::yr);
    if (table.rows.empty()) {
        throw_input_error("frequency factor table " + table.origin.file, "the table has no rows",
                          "at least one row");
    }
    const FrequencyFactorTable::Row *row = &table.rows.back();
    for (const auto &r : table.rows) {
        if (r.return_period_yr >= return_period_yr) {
            row = &r;
            break;
        }
    }
    WithLines<double> out{};
    out.value = row->cf;
    const Formula &f = row->return_period_yr == return_period_yr  ? cf_row
                       : row->return_period_yr > return_period_yr ? cf_next_row
                                                                  : cf_last_row;
    out.lines.calc(f,
                   {qty("T", return_period_yr, Unit::yr),
                    qty("Trow", row->return_period_yr, Unit::yr),
                    word("table", table.origin.cite())},
                   qty("Cf", row->cf));
    return out;
}

WithLines<double> rational_peak_m3_s(double c, double cf, double intensity_mm_per_h, double area_m2,
                                     System system, const RationalSettings &settings) {
    if (!limits::runoff_coefficient.contains(c)) {
        throw_input_error("Rational Method: runoff coefficient C",
                          "value " + full(c) + " is out of range", "0 < C <= 1");
    }
    if (!limits::frequency_factor.contains(cf)) {
        throw_input_error("Rational Method: frequency factor Cf",
                          "value " + full(cf) + " is out of range", "1 <= Cf <= 2");
    }
    detail::require_positive("Rational Method: rainfall intensity i", intensity_mm_per_h,
                             Unit::mm_per_h);
    detail::require_positive("Rational Method: catchment area A", area_m2, Unit::m2);
    WithLines<double> out{};
    double c_eff = c * cf;
    out.lines.calc(cf_c, {qty("Cf", cf), qty("C", c)}, qty("CfC", c_eff));
    if (c_eff > 1.0) {
        c_eff = 1.0;
        out.lines.calc(cf_c_capped, {qty("CfC", c * cf)}, qty("CfC", c_eff)).flags.capped = true;
    }
    const bool us = detail::is_us(system);
    const double a = detail::sheet_area(area_m2, system);
    const Unit au = detail::area_unit(system);
    if (us) {
        const double i_in_h = units::mm_per_h_to_in_per_h(intensity_mm_per_h);
        const double q_ac_in_h = c_eff * i_in_h * a;
        out.lines.calc(peak_us,
                       {qty("CfC", c_eff), qty("i", i_in_h, Unit::in_per_h), qty("A", a, au)},
                       qty("Q", q_ac_in_h, Unit::ac_in_per_h));
        const double q_cfs = q_ac_in_h * ft3_per_s_per_ac_in_per_h;
        out.lines.calc(peak_cfs, {qty("Q[ac-in/h]", q_ac_in_h, Unit::ac_in_per_h)},
                       qty("Q", q_cfs, Unit::ft3_per_s));
        out.value = units::cfs_to_m3s(q_cfs);
    } else {
        const double q = c_eff * intensity_mm_per_h * a / 360.0;
        out.lines.calc(
            peak_si,
            {qty("CfC", c_eff), qty("i", intensity_mm_per_h, Unit::mm_per_h), qty("A", a, au)},
            qty("Q", q, Unit::m3_per_s));
        out.value = q;
    }
    const double limit_m2 =
        settings.max_area_m2.value_or(us ? units::acre_to_m2(200.0) : units::ha_to_m2(80.0));
    if (area_m2 > limit_m2) {
        out.lines.warn(area_over_limit,
                       {qty("A", a, au), qty("Amax", detail::sheet_area(limit_m2, system), au)});
    }
    return out;
}

} // namespace catchpeak::hydro
