// SPDX-License-Identifier: MIT
#include "catchpeak/hydro/tr55_peak.hpp"

#include "checks.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

namespace catchpeak::hydro {

using units::System;

namespace {

constexpr const char *tr55_ch4 = "TR-55 (1986) ch. 4";

double lerp(double a, double b, double w) { return a + w * (b - a); }

/// A number for the numbers column, in parentheses when negative ("(-0.6151)").
std::string num(double v, int digits = 4) {
    return v < 0.0 ? "(" + sig(v, digits) + ")" : sig(v, digits);
}

} // namespace

WithLines<Tr55Peak> tr55_peak(const PeakCoefficientTable &coefficients,
                              const PondFactorTable &pond_factors, StormType storm_type,
                              double area_m2, double tc_min, double rainfall_mm, double ia_mm,
                              double runoff_mm, double pond_percent, System system) {
    detail::require_positive("TR-55 peak: catchment area", area_m2, "m2");
    detail::require_positive("TR-55 peak: time of concentration tc", tc_min, "min");
    detail::require_positive("TR-55 peak: 24-hour rainfall P", rainfall_mm, "mm");
    detail::require_non_negative("TR-55 peak: initial abstraction Ia", ia_mm, "mm");
    detail::require_non_negative("TR-55 peak: runoff depth Q", runoff_mm, "mm");
    if (!limits::percent.contains(pond_percent)) {
        throw_input_error("TR-55 peak: ponds and swamps share",
                          "value " + full(pond_percent) + " % is out of range", "0-100 %");
    }
    std::vector<PeakCoefficientTable::Row> rows;
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
    if (pond_factors.rows.empty()) {
        throw_input_error("TR-55 pond factors " + pond_factors.origin.file, "the table has no rows",
                          "at least one row");
    }

    WithLines<Tr55Peak> out{};
    const std::string coef_src = coefficients.origin.cite();
    const bool us = system == System::us_customary;
    const double p = us ? units::mm_to_in(rainfall_mm) : rainfall_mm;
    const double ia = us ? units::mm_to_in(ia_mm) : ia_mm;
    double ratio = ia / p;
    out.lines.calc("Ratio Ia/P", "Ia/P", fmt::format("Ia/P = {} / {}", sig(ia), sig(p)), ratio, "",
                   tr55_ch4);
    const double lo = rows.front().ia_over_p;
    const double hi = rows.back().ia_over_p;
    if (ratio < lo || ratio > hi) {
        const double clamped = std::clamp(ratio, lo, hi);
        out.lines.warn("Ia/P outside the table",
                       fmt::format("Ia/P = {} is outside {}-{}; the nearest limit {} is used",
                                   sig(ratio), sig(lo), sig(hi), sig(clamped)),
                       "TR-55 (1986) ch. 4: use the limiting value of Ia/P");
        ratio = clamped;
    }
    out.value.ia_over_p = ratio;

    // Coefficients interpolated linearly between the rows around Ia/P.
    std::size_t j = 0;
    while (j + 1 < rows.size() && rows[j + 1].ia_over_p < ratio) {
        ++j;
    }
    const auto &ra = rows[j];
    const auto &rb = j + 1 < rows.size() ? rows[j + 1] : rows[j];
    const double w =
        rb.ia_over_p > ra.ia_over_p ? (ratio - ra.ia_over_p) / (rb.ia_over_p - ra.ia_over_p) : 0.0;
    const double c0 = lerp(ra.c0, rb.c0, w);
    const double c1 = lerp(ra.c1, rb.c1, w);
    const double c2 = lerp(ra.c2, rb.c2, w);
    const std::string type = "storm type " + to_string(storm_type);
    const auto coef_line = [&](const char *name, double a, double b, double v) {
        out.lines.calc(fmt::format("Coefficient {}, {}, Ia/P = {}", name, type, sig(ratio)),
                       fmt::format("{} = {}a + (Ia/P - Ia/Pa) / (Ia/Pb - Ia/Pa) x ({}b - {}a)",
                                   name, name, name, name),
                       fmt::format("{} = {} + ({} - {}) / ({} - {}) x ({} - {})", name, num(a, 6),
                                   sig(ratio), sig(ra.ia_over_p), sig(rb.ia_over_p),
                                   sig(ra.ia_over_p), num(b, 6), num(a, 6)),
                       v, "", coef_src);
    };
    coef_line("C0", ra.c0, rb.c0, c0);
    coef_line("C1", ra.c1, rb.c1, c1);
    coef_line("C2", ra.c2, rb.c2, c2);

    double tc_h = units::min_to_h(tc_min);
    if (tc_h < 0.1 || tc_h > 10.0) {
        const double clamped = std::clamp(tc_h, 0.1, 10.0);
        out.lines.warn("tc outside the method's range",
                       fmt::format("tc = {} h is outside 0.1-10 h; {} h is used for qu", sig(tc_h),
                                   sig(clamped)),
                       "TR-55 (1986) ch. 4 limitations");
        tc_h = clamped;
    }
    const double lt = std::log10(tc_h);
    const double log_qu = c0 + c1 * lt + c2 * lt * lt;
    out.lines.calc("Unit peak discharge (log)", "log10(qu) = C0 + C1 log10(tc) + C2 (log10 tc)^2",
                   fmt::format("log10(qu) = {} + {} x log10({}) + {} x (log10 {})^2", num(c0, 6),
                               num(c1, 6), sig(tc_h), num(c2, 6), sig(tc_h)),
                   log_qu, "", "TR-55 (1986) App. F (from memory)");
    const double qu = std::pow(10.0, log_qu);
    out.lines.calc("Unit peak discharge", "qu = 10^log10(qu)",
                   fmt::format("qu = 10^{}", sig(log_qu, 6)), qu, "ft3/s/mi2/in",
                   "TR-55 (1986) ch. 4, Exhibit 4");
    out.value.unit_peak_csm_per_in = qu;

    // Pond and swamp factor, linear between the table's rows.
    const auto &pf = pond_factors.rows;
    double fp = pf.back().fp;
    std::string fp_how;
    if (pond_percent <= pf.front().pond_percent) {
        fp = pf.front().fp;
        fp_how = fmt::format("Fp at {} %", sig(pf.front().pond_percent));
    } else if (pond_percent >= pf.back().pond_percent) {
        fp_how = fmt::format("Fp at {} % (last row)", sig(pf.back().pond_percent));
        if (pond_percent > pf.back().pond_percent) {
            out.lines.warn("Ponds and swamps beyond the table",
                           fmt::format("ponds and swamps {} % exceed the table's {} %; route the "
                                       "flow through the storage instead",
                                       sig(pond_percent), sig(pf.back().pond_percent)),
                           "TR-55 (1986) ch. 4 limitations (from memory)");
        }
    } else {
        std::size_t k = 0;
        while (pf[k + 1].pond_percent < pond_percent) {
            ++k;
        }
        const double wf =
            (pond_percent - pf[k].pond_percent) / (pf[k + 1].pond_percent - pf[k].pond_percent);
        fp = lerp(pf[k].fp, pf[k + 1].fp, wf);
        fp_how =
            fmt::format("Fp = {} + ({} - {}) / ({} - {}) x ({} - {})", sig(pf[k].fp),
                        sig(pond_percent), sig(pf[k].pond_percent), sig(pf[k + 1].pond_percent),
                        sig(pf[k].pond_percent), sig(pf[k + 1].fp), sig(pf[k].fp));
    }
    out.lines.calc("Pond and swamp adjustment factor",
                   fmt::format("Fp for {} % ponds and swamps", sig(pond_percent)), fp_how, fp, "",
                   pond_factors.origin.cite());
    out.value.fp = fp;

    double am_mi2 = units::m2_to_mi2(area_m2);
    double q_in = units::mm_to_in(runoff_mm);
    if (!us) {
        out.lines.note("TR-55 peak units",
                       "method published only in US customary units (qu in ft3/s per mi2 per "
                       "inch); SI inputs converted (exact factors, NIST SP 811)",
                       tr55_ch4);
        out.lines.calc("Drainage area in mi2", "Am = A[km2] / 2.590",
                       fmt::format("Am = {} / 2.590", sig(units::m2_to_km2(area_m2))), am_mi2,
                       "mi2", "1 mi2 = 2.589988 km2 (exact conversion, NIST SP 811)");
        out.lines.calc("Runoff depth in inches", "Q = Q[mm] / 25.4",
                       fmt::format("Q = {} / 25.4", sig(runoff_mm)), q_in, "in",
                       "exact conversion (NIST SP 811)");
    }
    const double qp_cfs = qu * am_mi2 * q_in * fp;
    out.lines.calc("Peak discharge, TR-55 graphical method", "qp = qu Am Q Fp",
                   fmt::format("qp = {} x {} x {} x {}", sig(qu), sig(am_mi2), sig(q_in), sig(fp)),
                   qp_cfs, "ft3/s", "TR-55 (1986) eq. 4-1");
    out.value.peak_m3_s = units::cfs_to_m3s(qp_cfs);
    if (!us) {
        out.lines.calc("Peak discharge in m3/s", "qp = 0.02832 qp[ft3/s]",
                       fmt::format("qp = 0.02832 x {}", sig(qp_cfs)), out.value.peak_m3_s, "m3/s",
                       "1 ft3/s = 0.028316846592 m3/s (exact conversion, NIST SP 811)");
    }
    return out;
}

} // namespace catchpeak::hydro
