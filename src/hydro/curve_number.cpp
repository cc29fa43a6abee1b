// SPDX-License-Identifier: MIT
#include "catchpeak/hydro/curve_number.hpp"

#include "checks.hpp"

#include <fmt/format.h>

#include <cmath>

namespace catchpeak::hydro {

using units::System;

namespace {

constexpr const char *hawkins_source =
    "Hawkins et al. (2002), Ia = 0.05 S (conversion formula from memory, not checked against "
    "the source)";

/// Runoff depth from P, S, Ia in any one length unit (TR-55 eq. 2-1).
double runoff_depth(double p, double s, double ia) {
    if (p <= ia) {
        return 0.0;
    }
    return (p - ia) * (p - ia) / (p - ia + s);
}

} // namespace

double cn_runoff_depth_mm(double rainfall_mm, double cn, IaRatio ratio) {
    detail::require_cn(cn);
    detail::require_non_negative("CN runoff: rainfall P", rainfall_mm, "mm");
    double s_mm = 25400.0 / cn - 254.0;
    double lambda = 0.2;
    if (ratio == IaRatio::r005) {
        s_mm = 1.33 * std::pow(25.4, -0.15) * std::pow(s_mm, 1.15);
        lambda = 0.05;
    }
    return runoff_depth(rainfall_mm, s_mm, lambda * s_mm);
}

WithLines<CnRunoff> cn_runoff(double rainfall_mm, double cn, System system, IaRatio ratio) {
    detail::require_cn(cn);
    detail::require_non_negative("CN runoff: rainfall P", rainfall_mm, "mm");
    WithLines<CnRunoff> out{};
    const bool us = system == System::us_customary;
    const std::string u = us ? "in" : "mm";
    const double p = us ? units::mm_to_in(rainfall_mm) : rainfall_mm;
    double s = 0.0;
    if (us) {
        s = 1000.0 / cn - 10.0;
        out.lines.calc("Potential maximum retention", "S = 1000/CN - 10",
                       fmt::format("S = 1000/{} - 10", sig(cn)), s, u, "TR-55 (1986) eq. 2-4");
    } else {
        s = 25400.0 / cn - 254.0;
        out.lines.calc("Potential maximum retention", "S = 25400/CN - 254",
                       fmt::format("S = 25400/{} - 254", sig(cn)), s, u,
                       "TR-55 (1986) eq. 2-4, SI form (computed with 1 in = 25.4 mm)");
    }
    double lambda = 0.2;
    double cn_used = cn;
    if (ratio == IaRatio::r005) {
        const double s20 = s;
        lambda = 0.05;
        if (us) {
            s = 1.33 * std::pow(s20, 1.15);
            out.lines.calc("Retention for Ia = 0.05 S", "S0.05 = 1.33 S0.20^1.15 (in)",
                           fmt::format("S0.05 = 1.33 x {}^1.15", sig(s20)), s, u, hawkins_source);
            cn_used = 1000.0 / (10.0 + s);
            out.lines.calc("Curve number for Ia = 0.05 S", "CN0.05 = 1000 / (10 + S0.05)",
                           fmt::format("CN0.05 = 1000 / (10 + {})", sig(s)), cn_used, "",
                           "TR-55 (1986) eq. 2-4");
        } else {
            s = 1.33 * std::pow(25.4, -0.15) * std::pow(s20, 1.15);
            out.lines.calc("Retention for Ia = 0.05 S", "S0.05 = 1.33 x 25.4^-0.15 S0.20^1.15 (mm)",
                           fmt::format("S0.05 = 1.33 x 25.4^-0.15 x {}^1.15", sig(s20)), s, u,
                           std::string(hawkins_source) + "; SI form computed with 1 in = 25.4 mm");
            cn_used = 25400.0 / (254.0 + s);
            out.lines.calc("Curve number for Ia = 0.05 S", "CN0.05 = 25400 / (254 + S0.05)",
                           fmt::format("CN0.05 = 25400 / (254 + {})", sig(s)), cn_used, "",
                           "TR-55 (1986) eq. 2-4, SI form");
        }
    }
    const double ia = lambda * s;
    out.lines.calc("Initial abstraction", lambda == 0.2 ? "Ia = 0.2 S" : "Ia = 0.05 S",
                   fmt::format("Ia = {} x {}", lambda == 0.2 ? "0.2" : "0.05", sig(s)), ia, u,
                   lambda == 0.2 ? "TR-55 (1986) eq. 2-2" : hawkins_source);
    const double q = runoff_depth(p, s, ia);
    if (p <= ia) {
        out.lines.calc("Runoff depth", "Q = 0 for P <= Ia",
                       fmt::format("P = {} {} <= Ia = {} {}", sig(p), u, sig(ia), u), 0.0, u,
                       "TR-55 (1986) eq. 2-1");
    } else {
        out.lines.calc("Runoff depth", "Q = (P - Ia)^2 / ((P - Ia) + S)",
                       fmt::format("Q = ({} - {})^2 / (({} - {}) + {})", sig(p), sig(ia), sig(p),
                                   sig(ia), sig(s)),
                       q, u, "TR-55 (1986) eq. 2-1");
    }
    out.value.runoff_mm = us ? units::in_to_mm(q) : q;
    out.value.s_mm = us ? units::in_to_mm(s) : s;
    out.value.ia_mm = us ? units::in_to_mm(ia) : ia;
    out.value.cn_used = cn_used;
    return out;
}

WithLines<double> composite_cn(const std::vector<CnPart> &parts, System system) {
    if (parts.empty()) {
        throw_input_error("composite curve number", "no parts given", "at least one part");
    }
    const bool us = system == System::us_customary;
    double sum_a = 0.0;
    double sum_cn_a = 0.0;
    std::string num;
    std::string den;
    for (const auto &p : parts) {
        detail::require_positive("composite curve number: part area", p.area_m2, "m2");
        detail::require_cn(p.cn);
        sum_a += p.area_m2;
        sum_cn_a += p.cn * p.area_m2;
        const double a = us ? units::m2_to_acre(p.area_m2) : units::m2_to_ha(p.area_m2);
        num += (num.empty() ? "" : " + ") + sig(p.cn) + " x " + sig(a);
        den += (den.empty() ? "" : " + ") + sig(a);
    }
    WithLines<double> out{};
    out.value = sum_cn_a / sum_a;
    out.lines.calc("Composite curve number (area-weighted)",
                   us ? "CN = sum(CN A) / sum(A) (A ac)" : "CN = sum(CN A) / sum(A) (A ha)",
                   "CN = (" + num + ") / (" + den + ")", out.value, "",
                   "TR-55 (1986) ch. 2, Ex. 2-1");
    return out;
}

WithLines<CompositeRunoff> composite_runoff(const std::vector<CnPart> &parts, double rainfall_mm,
                                            System system, IaRatio ratio,
                                            double warn_relative_difference) {
    detail::require_non_negative("composite runoff: warning threshold", warn_relative_difference,
                                 "");
    WithLines<CompositeRunoff> out{};
    auto cn = composite_cn(parts, system);
    out.lines.append(cn.lines);
    out.value.composite_cn = cn.value;
    auto q = cn_runoff(rainfall_mm, cn.value, system, ratio);
    out.lines.append(q.lines);
    out.value.runoff_composite_mm = q.value.runoff_mm;
    const bool us = system == System::us_customary;
    double sum_a = 0.0;
    double sum_qa = 0.0;
    std::string num;
    std::string den;
    for (const auto &p : parts) {
        const double qi_mm = cn_runoff_depth_mm(rainfall_mm, p.cn, ratio);
        sum_a += p.area_m2;
        sum_qa += qi_mm * p.area_m2;
        const double a = us ? units::m2_to_acre(p.area_m2) : units::m2_to_ha(p.area_m2);
        const double qi = us ? units::mm_to_in(qi_mm) : qi_mm;
        num += (num.empty() ? "" : " + ") + sig(qi) + " x " + sig(a);
        den += (den.empty() ? "" : " + ") + sig(a);
    }
    out.value.runoff_weighted_mm = sum_qa / sum_a;
    const std::string u = us ? "in" : "mm";
    out.lines.calc("Runoff depth, area-weighted over the parts (each part by TR-55 eq. 2-1)",
                   "Q = sum(Q A) / sum(A)", "Q = (" + num + ") / (" + den + ")",
                   us ? units::mm_to_in(out.value.runoff_weighted_mm)
                      : out.value.runoff_weighted_mm,
                   u, "TR-55 (1986) ch. 2 (weighting runoff of the parts)");
    const double w = out.value.runoff_weighted_mm;
    out.value.relative_difference = w > 0.0 ? std::abs(w - out.value.runoff_composite_mm) / w : 0.0;
    if (out.value.relative_difference > warn_relative_difference) {
        out.lines.warn(
            "Composite CN and weighted runoff differ",
            fmt::format("runoff of the composite CN differs from the area-weighted runoff of the "
                        "parts by {} % (more than {} %); the composite CN misrepresents "
                        "parts with very different CN, prefer the weighted runoff",
                        sig(100.0 * out.value.relative_difference),
                        sig(100.0 * warn_relative_difference)),
            "project setting (common practice, no source)");
    }
    return out;
}

WithLines<double> cn_amc_i(double cn) {
    detail::require_cn(cn);
    WithLines<double> out{};
    out.value = 4.2 * cn / (10.0 - 0.058 * cn);
    out.lines.calc("Curve number, dry antecedent moisture (AMC I)",
                   "CN(I) = 4.2 CN / (10 - 0.058 CN)",
                   fmt::format("CN(I) = 4.2 x {} / (10 - 0.058 x {})", sig(cn), sig(cn)), out.value,
                   "", "Chow, Maidment and Mays (1988) eq. 5.5.4 (from memory, not checked)");
    return out;
}

WithLines<double> cn_amc_iii(double cn) {
    detail::require_cn(cn);
    WithLines<double> out{};
    out.value = 23.0 * cn / (10.0 + 0.13 * cn);
    out.lines.calc("Curve number, wet antecedent moisture (AMC III)",
                   "CN(III) = 23 CN / (10 + 0.13 CN)",
                   fmt::format("CN(III) = 23 x {} / (10 + 0.13 x {})", sig(cn), sig(cn)), out.value,
                   "", "Chow, Maidment and Mays (1988) eq. 5.5.5 (from memory, not checked)");
    return out;
}

} // namespace catchpeak::hydro
