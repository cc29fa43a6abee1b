// SPDX-License-Identifier: MIT
#include "catchpeak/hydro/tr55_peak.hpp"

#include "checks.hpp"
#include "sheet.hpp"

#include <algorithm>
#include <cmath>

namespace catchpeak::hydro {

using units::System;

namespace {

// A coefficient is printed in parentheses when negative ("(-0.6151)"), as TR-55 prints it.
// clang-format off
constexpr Formula ratio_line{"tr55.ia_over_p", "Ratio Ia/P", "Ia/P", "Ia/P = {Ia} / {P}",
    Ref::tr55_1986, " ch. 4"};
constexpr Formula ratio_outside{"tr55.ia_over_p_outside", "Ia/P outside the table", "",
    "Ia/P = {Ia/P} is outside {lo}-{hi}; the nearest limit {used} is used", Ref::tr55_1986,
    " ch. 4: use the limiting value of Ia/P"};
constexpr Formula coefficient{"tr55.coefficient", "Coefficient {name}, storm type {type}, Ia/P = {Ia/P}",
    "{name} = {name}a + (Ia/P - Ia/Pa) / (Ia/Pb - Ia/Pa) x ({name}b - {name}a)",
    "{name} = {a} + ({Ia/P} - {Ia/Pa}) / ({Ia/Pb} - {Ia/Pa}) x ({b} - {a})",
    Ref::none, "{table}"};
constexpr Formula tc_outside{"tr55.tc_outside", "tc outside the method's range", "",
    "tc = {tc} {tc:u} is outside 0.1-10 h; {used} {used:u} is used for qu", Ref::tr55_1986,
    " ch. 4 limitations"};
constexpr Formula log_unit_peak{"tr55.log_unit_peak", "Unit peak discharge (log)",
    "log10(qu) = C0 + C1 log10(tc) + C2 (log10 tc)^2",
    "log10(qu) = {C0} + {C1} x log10({tc}) + {C2} x (log10 {tc})^2",
    Ref::tr55_1986, " App. F (from memory)"};
constexpr Formula unit_peak{"tr55.unit_peak", "Unit peak discharge", "qu = 10^log10(qu)",
    "qu = 10^{log10(qu)}", Ref::tr55_1986, " ch. 4, Exhibit 4"};
constexpr Formula pond_first_row{"tr55.pond_factor", "Pond and swamp adjustment factor",
    "Fp for {pond} % ponds and swamps", "Fp at {row} %", Ref::none, "{table}"};
constexpr Formula pond_last_row{"tr55.pond_factor", "Pond and swamp adjustment factor",
    "Fp for {pond} % ponds and swamps", "Fp at {row} % (last row)", Ref::none, "{table}"};
constexpr Formula pond_between{"tr55.pond_factor", "Pond and swamp adjustment factor",
    "Fp for {pond} % ponds and swamps", "Fp = {Fpa} + ({pond} - {pa}) / ({pb} - {pa}) x ({Fpb} - {Fpa})",
    Ref::none, "{table}"};
constexpr Formula pond_beyond{"tr55.pond_beyond", "Ponds and swamps beyond the table", "",
    "ponds and swamps {pond} % exceed the table's {row} %; route the flow through the storage "
    "instead", Ref::tr55_1986, " ch. 4 limitations (from memory)"};
constexpr Formula si_units{"tr55.units", "TR-55 peak units", "",
    "method published only in US customary units (qu in ft3/s per mi2 per inch); SI inputs "
    "converted (exact factors, NIST SP 811)", Ref::tr55_1986, " ch. 4"};
constexpr Formula area_mi2{"tr55.area_mi2", "Drainage area in mi2", "Am = A[km2] / 2.590",
    "Am = {A[km2]} / 2.590", Ref::none, "1 mi2 = 2.589988 km2 (exact conversion, NIST SP 811)"};
constexpr Formula runoff_in{"tr55.runoff_in", "Runoff depth in inches", "Q = Q[mm] / 25.4",
    "Q = {Q[mm]} / 25.4", Ref::none, "exact conversion (NIST SP 811)"};
constexpr Formula peak{"tr55.peak", "Peak discharge, TR-55 graphical method", "qp = qu Am Q Fp",
    "qp = {qu} x {Am} x {Q} x {Fp}", Ref::tr55_1986, " eq. 4-1"};
constexpr Formula peak_m3_s{"tr55.peak_m3_s", "Peak discharge in m3/s", "qp = 0.02832 qp[ft3/s]",
    "qp = 0.02832 x {qp[ft3/s]}", Ref::none,
    "1 ft3/s = 0.028316846592 m3/s (exact conversion, NIST SP 811)"};
// clang-format on

using Rows = std::vector<PeakCoefficientTable::Row>;

double lerp(double a, double b, double w) { return a + w * (b - a); }

/// Coefficient `symbol` with 6 significant figures, in parentheses when negative.
void add_coefficient(std::vector<Quantity> &q, const std::string &symbol, double v) {
    q.push_back(qty(symbol, v, Unit::none, Shown::sig(6).parenthesised()));
}

void check_inputs(double area_m2, double tc_min, double rainfall_mm, double ia_mm, double runoff_mm,
                  double pond_percent) {
    detail::require_positive("TR-55 peak: catchment area", area_m2, Unit::m2);
    detail::require_positive("TR-55 peak: time of concentration tc", tc_min, Unit::min);
    detail::require_positive("TR-55 peak: 24-hour rainfall P", rainfall_mm, Unit::mm);
    detail::require_non_negative("TR-55 peak: initial abstraction Ia", ia_mm, Unit::mm);
    detail::require_non_negative("TR-55 peak: runoff depth Q", runoff_mm, Unit::mm);
    if (!limits::percent.contains(pond_percent)) {
        throw_input_error("TR-55 peak: ponds and swamps share",
                          "value " + full(pond_percent) + " % is out of range", "0-100 %");
    }
}

/// The coefficient rows of the storm type, ascending Ia/P.
Rows storm_rows(const PeakCoefficientTable &coefficients, StormType storm_type) {
    Rows rows;
    for (const auto &r : coefficients.rows) {
        if (r.storm_type == storm_type) {
            rows.push_back(r);
        }
    }
    if (rows.empty()) {
        throw_input_error("TR-55 peak coefficients " + coefficients.origin.file,
                          "no rows for storm type " + to_string(storm_type),
                          "rows for the storm type used");
    }
    std::sort(rows.begin(), rows.end(),
              [](const auto &a, const auto &b) { return a.ia_over_p < b.ia_over_p; });
    return rows;
}

/// Ia/P in the sheet's units, brought into the table's range (with a warning).
double ia_over_p(CalcLines &lines, const Rows &rows, double rainfall_mm, double ia_mm,
                 System system) {
    const Unit u = detail::depth_unit(system);
    const double p = detail::sheet_depth(rainfall_mm, system);
    const double ia = detail::sheet_depth(ia_mm, system);
    double ratio = ia / p;
    lines.calc(ratio_line, {qty("Ia", ia, u), qty("P", p, u)}, qty("Ia/P", ratio));
    const double lo = rows.front().ia_over_p;
    const double hi = rows.back().ia_over_p;
    if (ratio < lo || ratio > hi) {
        const double clamped = std::clamp(ratio, lo, hi);
        lines
            .warn(ratio_outside,
                  {qty("Ia/P", ratio), qty("lo", lo), qty("hi", hi), qty("used", clamped)})
            .flags.clamped = true;
        ratio = clamped;
    }
    return ratio;
}

struct Coefficients {
    double c0 = 0.0;
    double c1 = 0.0;
    double c2 = 0.0;
};

/// C0, C1, C2 interpolated linearly between the rows around Ia/P.
Coefficients interpolate_coefficients(CalcLines &lines, const Rows &rows, double ratio,
                                      StormType storm_type, const std::string &table) {
    std::size_t j = 0;
    while (j + 1 < rows.size() && rows[j + 1].ia_over_p < ratio) {
        ++j;
    }
    const auto &ra = rows[j];
    const auto &rb = j + 1 < rows.size() ? rows[j + 1] : rows[j];
    const double w =
        rb.ia_over_p > ra.ia_over_p ? (ratio - ra.ia_over_p) / (rb.ia_over_p - ra.ia_over_p) : 0.0;
    const auto line = [&](const char *name, double a, double b) {
        const double v = lerp(a, b, w);
        std::vector<Quantity> q = {word("name", name),         word("type", to_string(storm_type)),
                                   qty("Ia/P", ratio),         qty("Ia/Pa", ra.ia_over_p),
                                   qty("Ia/Pb", rb.ia_over_p), word("table", table)};
        add_coefficient(q, "a", a);
        add_coefficient(q, "b", b);
        lines.calc(coefficient, std::move(q), qty(name, v));
        return v;
    };
    Coefficients c;
    c.c0 = line("C0", ra.c0, rb.c0);
    c.c1 = line("C1", ra.c1, rb.c1);
    c.c2 = line("C2", ra.c2, rb.c2);
    return c;
}

/// qu in csm/in for tc (brought into 0.1-10 h, with a warning).
double unit_peak_csm_per_in(CalcLines &lines, const Coefficients &c, double tc_min) {
    double tc_h = units::min_to_h(tc_min);
    if (tc_h < 0.1 || tc_h > 10.0) {
        const double clamped = std::clamp(tc_h, 0.1, 10.0);
        lines.warn(tc_outside, {qty("tc", tc_h, Unit::h), qty("used", clamped, Unit::h)})
            .flags.clamped = true;
        tc_h = clamped;
    }
    const double lt = std::log10(tc_h);
    const double log_qu = c.c0 + c.c1 * lt + c.c2 * lt * lt;
    std::vector<Quantity> q = {qty("tc", tc_h, Unit::h)};
    add_coefficient(q, "C0", c.c0);
    add_coefficient(q, "C1", c.c1);
    add_coefficient(q, "C2", c.c2);
    lines.calc(log_unit_peak, std::move(q), qty("log10(qu)", log_qu));
    const double qu = std::pow(10.0, log_qu);
    lines.calc(unit_peak, {qty("log10(qu)", log_qu, Unit::none, Shown::sig(6))},
               qty("qu", qu, Unit::csm_per_in));
    return qu;
}

/// Fp, linear between the table's rows.
double pond_factor(CalcLines &lines, const PondFactorTable &table, double pond_percent) {
    const auto &pf = table.rows;
    std::vector<Quantity> q = {qty("pond", pond_percent, Unit::percent),
                               word("table", table.origin.cite())};
    double fp = pf.back().fp;
    const Formula *f = &pond_between;
    if (pond_percent <= pf.front().pond_percent) {
        fp = pf.front().fp;
        f = &pond_first_row;
        q.push_back(qty("row", pf.front().pond_percent, Unit::percent));
    } else if (pond_percent >= pf.back().pond_percent) {
        f = &pond_last_row;
        q.push_back(qty("row", pf.back().pond_percent, Unit::percent));
        if (pond_percent > pf.back().pond_percent) {
            lines.warn(pond_beyond, q);
        }
    } else {
        std::size_t k = 0;
        while (pf[k + 1].pond_percent < pond_percent) {
            ++k;
        }
        const double wf =
            (pond_percent - pf[k].pond_percent) / (pf[k + 1].pond_percent - pf[k].pond_percent);
        fp = lerp(pf[k].fp, pf[k + 1].fp, wf);
        q.insert(q.end(), {qty("pa", pf[k].pond_percent, Unit::percent),
                           qty("pb", pf[k + 1].pond_percent, Unit::percent), qty("Fpa", pf[k].fp),
                           qty("Fpb", pf[k + 1].fp)});
    }
    lines.calc(*f, std::move(q), qty("Fp", fp));
    return fp;
}

/// qp = qu Am Q Fp in ft3/s (with the conversions of an SI sheet); returns qp in m3/s.
double peak_discharge_m3_s(CalcLines &lines, double qu, double fp, double area_m2, double runoff_mm,
                           System system) {
    const double am_mi2 = units::m2_to_mi2(area_m2);
    const double q_in = units::mm_to_in(runoff_mm);
    const bool us = detail::is_us(system);
    if (!us) {
        lines.note(si_units);
        lines.calc(area_mi2, {qty("A[km2]", units::m2_to_km2(area_m2), Unit::km2)},
                   qty("Am", am_mi2, Unit::mi2));
        lines.calc(runoff_in, {qty("Q[mm]", runoff_mm, Unit::mm)}, qty("Q", q_in, Unit::in));
    }
    const double qp_cfs = qu * am_mi2 * q_in * fp;
    lines.calc(peak,
               {qty("qu", qu, Unit::csm_per_in), qty("Am", am_mi2, Unit::mi2),
                qty("Q", q_in, Unit::in), qty("Fp", fp)},
               qty("qp", qp_cfs, Unit::ft3_per_s));
    const double qp_m3_s = units::cfs_to_m3s(qp_cfs);
    if (!us) {
        lines.calc(peak_m3_s, {qty("qp[ft3/s]", qp_cfs, Unit::ft3_per_s)},
                   qty("qp", qp_m3_s, Unit::m3_per_s));
    }
    return qp_m3_s;
}

} // namespace

WithLines<Tr55Peak> tr55_peak(const PeakCoefficientTable &coefficients,
                              const PondFactorTable &pond_factors, StormType storm_type,
                              double area_m2, double tc_min, double rainfall_mm, double ia_mm,
                              double runoff_mm, double pond_percent, System system) {
    check_inputs(area_m2, tc_min, rainfall_mm, ia_mm, runoff_mm, pond_percent);
    const Rows rows = storm_rows(coefficients, storm_type);
    if (pond_factors.rows.empty()) {
        throw_input_error("TR-55 pond factors " + pond_factors.origin.file, "the table has no rows",
                          "at least one row");
    }
    WithLines<Tr55Peak> out{};
    out.value.ia_over_p = ia_over_p(out.lines, rows, rainfall_mm, ia_mm, system);
    const Coefficients c = interpolate_coefficients(out.lines, rows, out.value.ia_over_p,
                                                    storm_type, coefficients.origin.cite());
    out.value.unit_peak_csm_per_in = unit_peak_csm_per_in(out.lines, c, tc_min);
    out.value.fp = pond_factor(out.lines, pond_factors, pond_percent);
    out.value.peak_m3_s = peak_discharge_m3_s(out.lines, out.value.unit_peak_csm_per_in,
                                              out.value.fp, area_m2, runoff_mm, system);
    return out;
}

} // namespace catchpeak::hydro
