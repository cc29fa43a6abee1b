// SPDX-License-Identifier: MIT
#include "catchpeak/hydro/curve_number.hpp"

#include "checks.hpp"
#include "sheet.hpp"

#include <cmath>

namespace catchpeak::hydro {

using units::System;

namespace {

// clang-format off
constexpr std::string_view hawkins_where =
    ", Ia = 0.05 S (conversion formula from memory, not checked against the source)";

constexpr Formula retention_us{"cn.retention_us", "Potential maximum retention",
    "S = 1000/CN - 10", "S = 1000/{CN} - 10", Ref::tr55_1986, " eq. 2-4"};
constexpr Formula retention_si{"cn.retention_si", "Potential maximum retention",
    "S = 25400/CN - 254", "S = 25400/{CN} - 254", Ref::tr55_1986,
    " eq. 2-4, SI form (computed with 1 in = 25.4 mm)"};
constexpr Formula retention_hawkins_us{"cn.retention_hawkins_us", "Retention for Ia = 0.05 S",
    "S0.05 = 1.33 S0.20^1.15 (in)", "S0.05 = 1.33 x {S0.20}^1.15", Ref::hawkins_2002,
    hawkins_where};
constexpr Formula retention_hawkins_si{"cn.retention_hawkins_si", "Retention for Ia = 0.05 S",
    "S0.05 = 1.33 x 25.4^-0.15 S0.20^1.15 (mm)", "S0.05 = 1.33 x 25.4^-0.15 x {S0.20}^1.15",
    Ref::hawkins_2002,
    ", Ia = 0.05 S (conversion formula from memory, not checked against the source); SI form "
    "computed with 1 in = 25.4 mm"};
constexpr Formula cn_hawkins_us{"cn.cn_hawkins_us", "Curve number for Ia = 0.05 S",
    "CN0.05 = 1000 / (10 + S0.05)", "CN0.05 = 1000 / (10 + {S0.05})", Ref::tr55_1986,
    " eq. 2-4"};
constexpr Formula cn_hawkins_si{"cn.cn_hawkins_si", "Curve number for Ia = 0.05 S",
    "CN0.05 = 25400 / (254 + S0.05)", "CN0.05 = 25400 / (254 + {S0.05})", Ref::tr55_1986,
    " eq. 2-4, SI form"};
constexpr Formula initial_abstraction{"cn.initial_abstraction", "Initial abstraction",
    "Ia = 0.2 S", "Ia = 0.2 x {S}", Ref::tr55_1986, " eq. 2-2"};
constexpr Formula initial_abstraction_hawkins{"cn.initial_abstraction_hawkins",
    "Initial abstraction", "Ia = 0.05 S", "Ia = 0.05 x {S}", Ref::hawkins_2002, hawkins_where};
constexpr Formula runoff_none{"cn.runoff_none", "Runoff depth", "Q = 0 for P <= Ia",
    "P = {P} {P:u} <= Ia = {Ia} {Ia:u}", Ref::tr55_1986, " eq. 2-1"};
constexpr Formula runoff{"cn.runoff", "Runoff depth", "Q = (P - Ia)^2 / ((P - Ia) + S)",
    "Q = ({P} - {Ia})^2 / (({P} - {Ia}) + {S})", Ref::tr55_1986, " eq. 2-1"};
constexpr Formula composite{"cn.composite", "Composite curve number (area-weighted)",
    "CN = sum(CN A) / sum(A) (A {A:u})", "CN = ({[{CN} x {A}| + ]}) / ({[{A}| + ]})",
    Ref::tr55_1986, " ch. 2, Ex. 2-1"};
constexpr Formula runoff_weighted{"cn.runoff_weighted",
    "Runoff depth, area-weighted over the parts (each part by TR-55 eq. 2-1)",
    "Q = sum(Q A) / sum(A)", "Q = ({[{Q} x {A}| + ]}) / ({[{A}| + ]})", Ref::tr55_1986,
    " ch. 2 (weighting runoff of the parts)"};
constexpr Formula composite_differs{"cn.composite_differs",
    "Composite CN and weighted runoff differ", "",
    "runoff of the composite CN differs from the area-weighted runoff of the parts by {d} % "
    "(more than {max} %); the composite CN misrepresents parts with very different CN, prefer "
    "the weighted runoff ([methods] cn_weighting = \"runoff\")",
    Ref::project_setting, " (common practice, no source)"};
constexpr Formula part_note{"cn.part", "Land part {k} of {n}", "",
    "{part}: CN = {CN}, A = {A} {A:u}", Ref::none, "the land parts of the catchment above"};
constexpr Formula amc_i{"cn.amc_i", "Curve number, dry antecedent moisture (AMC I)",
    "CN(I) = 4.2 CN / (10 - 0.058 CN)", "CN(I) = 4.2 x {CN} / (10 - 0.058 x {CN})", Ref::none,
    "Chow, Maidment and Mays (1988) eq. 5.5.4 (from memory, not checked)"};
constexpr Formula amc_iii{"cn.amc_iii", "Curve number, wet antecedent moisture (AMC III)",
    "CN(III) = 23 CN / (10 + 0.13 CN)", "CN(III) = 23 x {CN} / (10 + 0.13 x {CN})", Ref::none,
    "Chow, Maidment and Mays (1988) eq. 5.5.5 (from memory, not checked)"};
// clang-format on

/// The curve-number runoff evaluated in the published form of one unit system: every depth in
/// in (US customary) or mm (SI).
struct CnEvaluation {
    double p = 0.0;       ///< rainfall P
    double s20 = 0.0;     ///< S of the CN given (Ia = 0.2 S)
    double s = 0.0;       ///< S for the Ia ratio used
    double ia = 0.0;      ///< initial abstraction
    double q = 0.0;       ///< runoff depth
    double cn_used = 0.0; ///< CN the S belongs to
};

/// TR-55 eq. 2-1 to 2-4 (and the Ia = 0.05 S conversion) for rainfall `rainfall_mm`.
CnEvaluation evaluate_cn(double rainfall_mm, double cn, System system, IaRatio ratio) {
    detail::require_cn(cn);
    detail::require_non_negative("CN runoff: rainfall P", rainfall_mm, Unit::mm);
    const bool us = detail::is_us(system);
    CnEvaluation e;
    e.p = detail::sheet_depth(rainfall_mm, system);
    e.s20 = us ? cn_retention_in(cn) : 25400.0 / cn - 254.0;
    e.s = e.s20;
    e.cn_used = cn;
    double lambda = 0.2;
    if (ratio == IaRatio::r005) {
        lambda = 0.05;
        if (us) {
            e.s = 1.33 * std::pow(e.s20, 1.15);
            e.cn_used = 1000.0 / (10.0 + e.s);
        } else {
            e.s = 1.33 * std::pow(25.4, -0.15) * std::pow(e.s20, 1.15);
            e.cn_used = 25400.0 / (254.0 + e.s);
        }
    }
    e.ia = lambda * e.s;
    e.q = e.p <= e.ia ? 0.0 : (e.p - e.ia) * (e.p - e.ia) / (e.p - e.ia + e.s);
    return e;
}

/// The lines of an evaluation, in the order of the computation; without the runoff line when
/// `with_runoff` is false.
void add_cn_lines(CalcLines &lines, const CnEvaluation &e, double cn, System system, IaRatio ratio,
                  bool with_runoff = true) {
    const bool us = detail::is_us(system);
    const Unit u = detail::depth_unit(system);
    lines.calc(us ? retention_us : retention_si, {qty("CN", cn)}, qty("S", e.s20, u));
    const bool hawkins = ratio == IaRatio::r005;
    if (hawkins) {
        lines.calc(us ? retention_hawkins_us : retention_hawkins_si, {qty("S0.20", e.s20, u)},
                   qty("S0.05", e.s, u));
        lines.calc(us ? cn_hawkins_us : cn_hawkins_si, {qty("S0.05", e.s, u)},
                   qty("CN0.05", e.cn_used));
    }
    lines.calc(hawkins ? initial_abstraction_hawkins : initial_abstraction, {qty("S", e.s, u)},
               qty("Ia", e.ia, u));
    if (!with_runoff) {
        return;
    }
    if (e.p <= e.ia) {
        lines.calc(runoff_none, {qty("P", e.p, u), qty("Ia", e.ia, u)}, qty("Q", 0.0, u));
    } else {
        lines.calc(runoff, {qty("P", e.p, u), qty("Ia", e.ia, u), qty("S", e.s, u)},
                   qty("Q", e.q, u));
    }
}

/// sum(x A) / sum(A) over the parts, `x` of each part given by `value_of(part)` as {value for
/// the sum, value shown}; one row {X, A} per part (A in the sheet's unit).
template <typename ValueOf>
double area_weighted(const std::vector<CnPart> &parts, System system, const char *symbol, Unit unit,
                     ValueOf value_of, std::vector<std::vector<Quantity>> &rows) {
    double sum_a = 0.0;
    double sum_xa = 0.0;
    for (const auto &p : parts) {
        const auto [x, shown] = value_of(p);
        sum_a += p.area_m2;
        sum_xa += x * p.area_m2;
        rows.push_back({qty(symbol, shown, unit), qty("A", detail::sheet_area(p.area_m2, system),
                                                      detail::area_unit(system))});
    }
    return sum_xa / sum_a;
}

} // namespace

double cn_retention_in(double cn) {
    detail::require_cn(cn);
    return 1000.0 / cn - 10.0;
}

double cn_runoff_depth_mm(double rainfall_mm, double cn, IaRatio ratio) {
    return evaluate_cn(rainfall_mm, cn, System::si, ratio).q;
}

namespace {

WithLines<CnRunoff> cn_evaluation(double rainfall_mm, double cn, System system, IaRatio ratio,
                                  bool with_runoff) {
    const CnEvaluation e = evaluate_cn(rainfall_mm, cn, system, ratio);
    const bool us = detail::is_us(system);
    WithLines<CnRunoff> out{};
    add_cn_lines(out.lines, e, cn, system, ratio, with_runoff);
    out.value.runoff_mm = us ? units::in_to_mm(e.q) : e.q;
    out.value.s_mm = us ? units::in_to_mm(e.s) : e.s;
    out.value.ia_mm = us ? units::in_to_mm(e.ia) : e.ia;
    out.value.cn_used = e.cn_used;
    return out;
}

} // namespace

WithLines<CnRunoff> cn_runoff(double rainfall_mm, double cn, System system, IaRatio ratio) {
    return cn_evaluation(rainfall_mm, cn, system, ratio, true);
}

WithLines<CnRunoff> cn_initial_abstraction(double rainfall_mm, double cn, System system,
                                           IaRatio ratio) {
    return cn_evaluation(rainfall_mm, cn, system, ratio, false);
}

WithLines<double> composite_cn(const std::vector<CnPart> &parts, System system) {
    if (parts.empty()) {
        throw_input_error("composite curve number", "no parts given", "at least one part");
    }
    double sum_a = 0.0;
    for (const auto &p : parts) {
        detail::require_positive("composite curve number: part area", p.area_m2, Unit::m2);
        detail::require_cn(p.cn);
        sum_a += p.area_m2;
    }
    WithLines<double> out{};
    std::vector<std::vector<Quantity>> rows;
    out.value = area_weighted(
        parts, system, "CN", Unit::none,
        [](const CnPart &p) {
            return std::pair{p.cn, p.cn};
        },
        rows);
    out.lines
        .calc(composite, {qty("A", detail::sheet_area(sum_a, system), detail::area_unit(system))},
              qty("CN", out.value))
        .rows = std::move(rows);
    return out;
}

WithLines<CompositeRunoff> composite_runoff(const std::vector<CnPart> &parts, double rainfall_mm,
                                            System system, IaRatio ratio,
                                            double warn_relative_difference) {
    detail::require_non_negative("composite runoff: warning threshold", warn_relative_difference);
    WithLines<CompositeRunoff> out{};
    auto cn = composite_cn(parts, system);
    out.lines.append(cn.lines);
    out.value.composite_cn = cn.value;
    auto q = cn_runoff(rainfall_mm, cn.value, system, ratio);
    out.lines.append(q.lines);
    out.value.runoff_composite_mm = q.value.runoff_mm;
    std::vector<std::vector<Quantity>> rows;
    out.value.runoff_weighted_mm = area_weighted(
        parts, system, "Q", detail::depth_unit(system),
        [&](const CnPart &p) {
            const double qi_mm = cn_runoff_depth_mm(rainfall_mm, p.cn, ratio);
            return std::pair{qi_mm, detail::sheet_depth(qi_mm, system)};
        },
        rows);
    const double w = out.value.runoff_weighted_mm;
    out.lines
        .calc(runoff_weighted, {},
              qty("Q", detail::sheet_depth(w, system), detail::depth_unit(system)))
        .rows = std::move(rows);
    out.value.relative_difference = w > 0.0 ? std::abs(w - out.value.runoff_composite_mm) / w : 0.0;
    if (out.value.relative_difference > warn_relative_difference) {
        out.lines.warn(composite_differs,
                       {qty("d", 100.0 * out.value.relative_difference, Unit::percent),
                        qty("max", 100.0 * warn_relative_difference, Unit::percent)});
    }
    return out;
}

WithLines<double> weighted_runoff(const std::vector<CnPart> &parts, double rainfall_mm,
                                  System system, IaRatio ratio) {
    (void)composite_cn(parts, system); // the same checks of the parts
    WithLines<double> out{};
    std::vector<double> q_mm;
    q_mm.reserve(parts.size());
    const auto n = qty("n", static_cast<double>(parts.size()), Unit::none, Shown::integer());
    for (std::size_t k = 0; k < parts.size(); ++k) {
        const auto &p = parts[k];
        out.lines.note(
            part_note,
            {qty("k", static_cast<double>(k + 1), Unit::none, Shown::integer()), n,
             word("part", p.name.empty() ? "part" : p.name), qty("CN", p.cn),
             qty("A", detail::sheet_area(p.area_m2, system), detail::area_unit(system))});
        auto q = cn_runoff(rainfall_mm, p.cn, system, ratio);
        out.lines.append(q.lines);
        q_mm.push_back(q.value.runoff_mm);
    }
    std::vector<std::vector<Quantity>> rows;
    std::size_t i = 0;
    out.value = area_weighted(
        parts, system, "Q", detail::depth_unit(system),
        [&](const CnPart &) {
            const double qi_mm = q_mm[i++];
            return std::pair{qi_mm, detail::sheet_depth(qi_mm, system)};
        },
        rows);
    out.lines
        .calc(runoff_weighted, {},
              qty("Q", detail::sheet_depth(out.value, system), detail::depth_unit(system)))
        .rows = std::move(rows);
    return out;
}

WithLines<double> cn_amc_i(double cn) {
    detail::require_cn(cn);
    WithLines<double> out{};
    out.value = 4.2 * cn / (10.0 - 0.058 * cn);
    out.lines.calc(amc_i, {qty("CN", cn)}, qty("CN(I)", out.value));
    return out;
}

WithLines<double> cn_amc_iii(double cn) {
    detail::require_cn(cn);
    WithLines<double> out{};
    out.value = 23.0 * cn / (10.0 + 0.13 * cn);
    out.lines.calc(amc_iii, {qty("CN", cn)}, qty("CN(III)", out.value));
    return out;
}

} // namespace catchpeak::hydro
