// SPDX-License-Identifier: MIT
#include "catchpeak/hydro/rational.hpp"

#include "checks.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

namespace catchpeak::hydro {

using units::System;

WithLines<double> frequency_factor(const FrequencyFactorTable &table, double return_period_yr) {
    detail::require_positive("return period", return_period_yr, "years");
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
    std::string how;
    if (row->return_period_yr == return_period_yr) {
        how = fmt::format("row {} years", sig(row->return_period_yr));
    } else if (row->return_period_yr > return_period_yr) {
        how = fmt::format("{} years not listed; row of the next longer return period, {} years",
                          sig(return_period_yr), sig(row->return_period_yr));
    } else {
        how = fmt::format("{} years beyond the table; its last row, {} years",
                          sig(return_period_yr), sig(row->return_period_yr));
    }
    out.lines.calc("Frequency factor", "Cf from table", "Cf: " + how, row->cf, "",
                   table.origin.cite());
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
    detail::require_positive("Rational Method: rainfall intensity i", intensity_mm_per_h, "mm/h");
    detail::require_positive("Rational Method: catchment area A", area_m2, "m2");
    WithLines<double> out{};
    const char *src = "Rational Method";
    double c_eff = c * cf;
    out.lines.calc("Runoff coefficient with frequency factor", "Cf C",
                   fmt::format("Cf C = {} x {}", sig(cf), sig(c)), c_eff, "",
                   "Rational Method frequency factor (many US manuals; from memory)");
    if (c_eff > 1.0) {
        c_eff = 1.0;
        out.lines.calc("Cf C capped at 1.0", "Cf C = min(Cf C, 1.0)",
                       fmt::format("Cf C = min({}, 1.0)", sig(c * cf)), c_eff, "",
                       "Rational Method: C Cf <= 1.0 (many US manuals; from memory)");
    }
    if (system == System::us_customary) {
        const double i_in_h = units::mm_per_h_to_in_per_h(intensity_mm_per_h);
        const double a_ac = units::m2_to_acre(area_m2);
        const double q_ac_in_h = c_eff * i_in_h * a_ac;
        out.lines.calc("Peak flow, Rational Method", "Q = Cf C i A (i in/h, A ac)",
                       fmt::format("Q = {} x {} x {}", sig(c_eff), sig(i_in_h), sig(a_ac)),
                       q_ac_in_h, "ac-in/h", src);
        const double q_cfs = 1.008 * q_ac_in_h;
        out.lines.calc("Peak flow in ft3/s", "Q = 1.008 x Q[ac-in/h] (1 ac-in/h = 1.008 ft3/s)",
                       fmt::format("Q = 1.008 x {}", sig(q_ac_in_h)), q_cfs, "ft3/s",
                       "1 acre-in/h = 43560/12/3600 = 1.008 ft3/s");
        out.value = units::cfs_to_m3s(q_cfs);
    } else {
        const double a_ha = units::m2_to_ha(area_m2);
        const double q = c_eff * intensity_mm_per_h * a_ha / 360.0;
        out.lines.calc(
            "Peak flow, Rational Method", "Q = Cf C i A / 360 (i mm/h, A ha)",
            fmt::format("Q = {} x {} x {} / 360", sig(c_eff), sig(intensity_mm_per_h), sig(a_ha)),
            q, "m3/s", "Rational Method, SI form (1 mm/h on 1 ha = 1/360 m3/s)");
        out.value = q;
    }
    const double limit_m2 = settings.max_area_m2.value_or(
        system == System::us_customary ? units::acre_to_m2(200.0) : units::ha_to_m2(80.0));
    if (area_m2 > limit_m2) {
        out.lines.warn(
            "Rational Method: catchment area over the limit",
            system == System::us_customary
                ? fmt::format("catchment area {} ac exceeds {} ac; the Rational Method is meant "
                              "for small catchments, use a hydrograph method",
                              sig(units::m2_to_acre(area_m2)), sig(units::m2_to_acre(limit_m2)))
                : fmt::format("catchment area {} ha exceeds {} ha; the Rational Method is meant "
                              "for small catchments, use a hydrograph method",
                              sig(units::m2_to_ha(area_m2)), sig(units::m2_to_ha(limit_m2))),
            "project setting (common practice, no source; local codes vary)");
    }
    return out;
}

} // namespace catchpeak::hydro
