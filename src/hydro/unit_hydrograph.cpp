// SPDX-License-Identifier: MIT
#include "catchpeak/hydro/unit_hydrograph.hpp"

#include "checks.hpp"
#include "sheet.hpp"

#include <algorithm>
#include <cmath>

namespace catchpeak::hydro {

using units::System;

namespace {

// clang-format off
constexpr Formula duration_aggregated{"uh.duration_aggregated",
    "Unit hydrograph duration (hyetograph steps aggregated)", "D = k dt, k = floor({f} tc / dt)",
    "D = {k} x {dt} {dt:u}", Ref::none, "NRCS NEH 630 ch. 16 (2007): D about 0.133 tc (from memory)"};
constexpr Formula duration_split{"uh.duration_split",
    "Unit hydrograph duration (hyetograph steps split evenly)",
    "D = dt / m, m = ceil(dt / ({f} tc))", "D = {dt} {dt:u} / {m}", Ref::none,
    "NRCS NEH 630 ch. 16 (2007): D about 0.133 tc (from memory); excess spread evenly over each "
    "step"};
constexpr Formula unit_time_to_peak{"uh.unit_time_to_peak", "Time to peak of the unit hydrograph",
    "tp = D/2 + 0.6 tc", "tp = {D}/2 + 0.6 x {tc}", Ref::none,
    "NRCS NEH 630 ch. 16 (2007): tp = D/2 + L, lag L = 0.6 tc"};
constexpr Formula duration_too_long{"uh.duration_too_long", "Unit hydrograph duration too long", "",
    "D = {D} {D:u} exceeds 0.25 tp = {tp/4} {tp/4:u}; the peak may be underestimated, use a finer "
    "hyetograph", Ref::none, "NRCS NEH 630 ch. 16 (2007): D <= 0.25 tp (from memory)"};
constexpr Formula unit_peak_us{"uh.unit_peak_us", "Unit hydrograph peak per inch of runoff",
    "qp = 484 A Q / tp (Q = 1 in)", "qp = 484 x {A} x 1 / {tp}", Ref::none,
    "NRCS NEH 630 ch. 16 (2007), peak rate factor 484"};
constexpr Formula unit_peak_si{"uh.unit_peak_si", "Unit hydrograph peak per mm of runoff",
    "qp = 0.208 A Q / tp (Q = 1 mm)", "qp = 0.208 x {A} x 1 / {tp}", Ref::none,
    "NRCS NEH 630 ch. 16 (2007), SI form 2.08 A Q / tp with Q in cm, i.e. 0.208 with Q in mm "
    "(the published rounding, used as printed; 484 converted exactly is 0.20833)"};
constexpr Formula runoff_sum{"uh.runoff", "Runoff depth (sum of excess)", "Q = sum of excess",
    "Q = {Q} {Q:u}", Ref::tr55_1986, " eq. 2-1 on the cumulative rainfall"};
constexpr Formula peak{keys::uh_peak, "Peak flow, SCS unit hydrograph",
    "qp = max over t of sum_k Qk U(t - k D)",
    "convolution of {n} steps of excess with {m} unit hydrograph ordinates at D = {D} {D:u}",
    Ref::none, "{table}"};
constexpr Formula time_to_peak{"uh.time_to_peak", "Time to peak of the hydrograph",
    "t at the largest ordinate", "t = {i} x {D} {D:u}", Ref::none, "computed from the hydrograph"};
constexpr Formula volume_us{"uh.volume_us", "Hydrograph volume", "V = sum(q) D / 43560",
    "V = {sum(q)} {sum(q):u} x {D} {D:u} / 43560", Ref::none, "computed from the hydrograph"};
constexpr Formula volume_si{"uh.volume_si", "Hydrograph volume", "V = sum(q) D",
    "V = {sum(q)} {sum(q):u} x {D} {D:u}", Ref::none, "computed from the hydrograph"};
constexpr Formula rainfall_excess{"uh.rainfall_excess", "Rainfall excess", "",
    "excess per step = runoff of the cumulative rainfall (CN {CN}) minus that of the step before; "
    "{n} steps of {dt} {dt:u}, rainfall {P} {P:u}", Ref::tr55_1986, " eq. 2-1 on the mass curve"};
constexpr Formula rainfall_excess_parts{"uh.rainfall_excess_parts",
    "Rainfall excess, area-weighted over the land parts",
    "e = sum(e_i A_i) / sum(A_i)",
    "excess per step = area-weighted excess of the {parts} land parts, each the runoff of the "
    "cumulative rainfall by its own CN minus that of the step before; {n} steps of {dt} {dt:u}, "
    "rainfall {P} {P:u}", Ref::tr55_1986, " eq. 2-1 on the mass curve, for each part"};
// clang-format on

Quantity count(std::string symbol, std::size_t n) {
    return qty(std::move(symbol), static_cast<double>(n), Unit::none, Shown::integer());
}

void check_hyetograph(const rain::Hyetograph &h, const std::string &what) {
    detail::require_positive(what + ": time step", h.step_s, Unit::s);
    if (h.depth_mm.empty()) {
        throw_input_error(what, "no time steps", "at least one step");
    }
    for (double d : h.depth_mm) {
        detail::require_non_negative(what + ": depth of a step", d, Unit::mm);
    }
}

void check_inputs(const DimensionlessUnitHydrograph &table, const rain::Hyetograph &excess,
                  double area_m2, double tc_min, const UnitHydrographSettings &settings) {
    check_hyetograph(excess, "excess hyetograph");
    detail::require_positive("unit hydrograph: catchment area", area_m2, Unit::m2);
    detail::require_positive("unit hydrograph: time of concentration tc", tc_min, Unit::min);
    detail::require_positive("unit hydrograph: step as a fraction of tc",
                             settings.step_fraction_of_tc);
    if (table.t_over_tp.size() < 2 || table.t_over_tp.size() != table.q_over_qp.size()) {
        throw_input_error("dimensionless unit hydrograph " + table.origin.file,
                          "fewer than 2 ordinates or columns of unequal length",
                          "at least 2 (t/tp, q/qp) pairs");
    }
}

/// The excess at the unit hydrograph's duration D.
struct ExcessAtD {
    double d_s = 0.0;         ///< D
    std::vector<double> e_mm; ///< excess per step of D
};

/// Aggregates or splits the hyetograph's steps so that D <= fraction x tc.
ExcessAtD excess_at_duration(CalcLines &lines, const rain::Hyetograph &excess, double tc_min,
                             double fraction) {
    const double d_max_s = fraction * units::min_to_s(tc_min);
    const double step_in_s = excess.step_s;
    const double step_in_h = step_in_s / units::s_per_h;
    ExcessAtD out;
    const Quantity f = qty("f", fraction);
    const Quantity dt = qty("dt", step_in_h, Unit::h);
    if (step_in_s <= d_max_s) {
        const auto k = static_cast<std::size_t>(std::floor(d_max_s / step_in_s));
        out.d_s = static_cast<double>(k) * step_in_s;
        out.e_mm.assign((excess.steps() + k - 1) / k, 0.0);
        for (std::size_t i = 0; i < excess.steps(); ++i) {
            out.e_mm[i / k] += excess.depth_mm[i];
        }
        lines.calc(duration_aggregated, {f, count("k", k), dt},
                   qty("D", out.d_s / units::s_per_h, Unit::h));
    } else {
        const auto m = static_cast<std::size_t>(std::ceil(step_in_s / d_max_s));
        out.d_s = step_in_s / static_cast<double>(m);
        out.e_mm.reserve(excess.steps() * m);
        for (double d : excess.depth_mm) {
            for (std::size_t j = 0; j < m; ++j) {
                out.e_mm.push_back(d / static_cast<double>(m));
            }
        }
        lines.calc(duration_split, {f, dt, count("m", m)},
                   qty("D", out.d_s / units::s_per_h, Unit::h));
    }
    return out;
}

/// tp = D/2 + 0.6 tc, with a warning when D > 0.25 tp.
double unit_hydrograph_tp_h(CalcLines &lines, double d_h, double tc_min) {
    const double tc_h = units::min_to_h(tc_min);
    const double tp_h = d_h / 2.0 + 0.6 * tc_h;
    lines.calc(unit_time_to_peak, {qty("D", d_h, Unit::h), qty("tc", tc_h, Unit::h)},
               qty("tp", tp_h, Unit::h));
    if (d_h > 0.25 * tp_h * (1.0 + 1e-12)) {
        lines.warn(duration_too_long, {qty("D", d_h, Unit::h), qty("tp/4", 0.25 * tp_h, Unit::h)});
    }
    return tp_h;
}

/// The unit peak per unit runoff in the sheet's published form: ft3/s per in (US) or m3/s
/// per mm (SI).
double unit_peak_per_runoff(CalcLines &lines, double area_m2, double tp_h, System system) {
    const Quantity tp = qty("tp", tp_h, Unit::h);
    if (detail::is_us(system)) {
        const double a_mi2 = units::m2_to_mi2(area_m2);
        const double qpu = 484.0 * a_mi2 / tp_h;
        lines.calc(unit_peak_us, {qty("A", a_mi2, Unit::mi2), tp},
                   qty("qp", qpu, Unit::ft3_per_s_per_in));
        return qpu;
    }
    const double a_km2 = units::m2_to_km2(area_m2);
    const double qpu = 0.208 * a_km2 / tp_h;
    lines.calc(unit_peak_si, {qty("A", a_km2, Unit::km2), tp},
               qty("qp", qpu, Unit::m3_per_s_per_mm));
    return qpu;
}

/// Unit hydrograph ordinates at steps of D (until the table's end).
std::vector<double> unit_ordinates(const DimensionlessUnitHydrograph &table, double qpu, double d_h,
                                   double tp_h) {
    const double t_end = table.t_over_tp.back();
    std::vector<double> u;
    for (std::size_t j = 0;; ++j) {
        const double x = static_cast<double>(j) * d_h / tp_h;
        if (x >= t_end) {
            break;
        }
        u.push_back(qpu * table.ratio_at(x));
    }
    return u;
}

/// The discrete convolution of the excess (in the sheet's unit) with the ordinates.
std::vector<double> convolve(const std::vector<double> &e_mm, const std::vector<double> &u,
                             System system) {
    const double per_mm = detail::is_us(system) ? 1.0 / units::mm_per_in : 1.0;
    std::vector<double> flow(e_mm.size() + u.size(), 0.0);
    for (std::size_t k = 0; k < e_mm.size(); ++k) {
        const double e = e_mm[k] * per_mm;
        if (e == 0.0) {
            continue;
        }
        for (std::size_t j = 0; j < u.size(); ++j) {
            flow[k + j] += e * u[j];
        }
    }
    return flow;
}

/// The hydrograph of the flows in the sheet's unit, with the lines of its peak, time to peak,
/// runoff and volume.
Hydrograph hydrograph_of(CalcLines &lines, const std::vector<double> &flow, const ExcessAtD &x,
                         std::size_t ordinates, double tp_h, const std::string &table,
                         System system) {
    const bool us = detail::is_us(system);
    Hydrograph h;
    h.step_s = x.d_s;
    h.tp_h = tp_h;
    h.flow_m3_s.reserve(flow.size());
    double sheet_peak = 0.0;
    std::size_t i_peak = 0;
    for (std::size_t i = 0; i < flow.size(); ++i) {
        h.flow_m3_s.push_back(us ? units::cfs_to_m3s(flow[i]) : flow[i]);
        if (flow[i] > sheet_peak) {
            sheet_peak = flow[i];
            i_peak = i;
        }
    }
    h.peak_m3_s = us ? units::cfs_to_m3s(sheet_peak) : sheet_peak;
    h.time_to_peak_s = static_cast<double>(i_peak) * x.d_s;
    double sum_q = 0.0;
    for (double q : h.flow_m3_s) {
        sum_q += q;
    }
    h.volume_m3 = sum_q * x.d_s;
    for (double e : x.e_mm) {
        h.runoff_mm += e;
    }
    const double d_h = x.d_s / units::s_per_h;
    const Quantity d = qty("D", d_h, Unit::h);
    const Unit qu = detail::flow_unit(system);
    lines.calc(runoff_sum, {},
               qty("Q", detail::sheet_depth(h.runoff_mm, system), detail::depth_unit(system)));
    lines.calc(peak, {count("n", x.e_mm.size()), count("m", ordinates), d, word("table", table)},
               qty("qp", sheet_peak, qu));
    lines.calc(time_to_peak, {count("i", i_peak), d},
               qty("t", h.time_to_peak_s / units::s_per_h, Unit::h));
    const Quantity ds = qty("D", x.d_s, Unit::s);
    if (us) {
        const double v_ft3 = h.volume_m3 / (units::m_per_ft * units::m_per_ft * units::m_per_ft);
        lines.calc(volume_us, {qty("sum(q)", units::m3s_to_cfs(sum_q), qu), ds},
                   qty("V", v_ft3 / 43560.0, Unit::ac_ft));
    } else {
        lines.calc(volume_si, {qty("sum(q)", sum_q, qu), ds}, qty("V", h.volume_m3, Unit::m3));
    }
    return h;
}

} // namespace

rain::Hyetograph excess_hyetograph(const rain::Hyetograph &rainfall, double cn, IaRatio ratio) {
    check_hyetograph(rainfall, "rainfall hyetograph");
    detail::require_cn(cn);
    rain::Hyetograph excess;
    excess.step_s = rainfall.step_s;
    excess.depth_mm.reserve(rainfall.steps());
    double cum_p = 0.0;
    double cum_q = 0.0;
    for (double d : rainfall.depth_mm) {
        cum_p += d;
        const double q = cn_runoff_depth_mm(cum_p, cn, ratio);
        excess.depth_mm.push_back(std::max(0.0, q - cum_q));
        cum_q = std::max(cum_q, q);
    }
    return excess;
}

WithLines<Hydrograph> unit_hydrograph_from_excess(const DimensionlessUnitHydrograph &table,
                                                  const rain::Hyetograph &excess, double area_m2,
                                                  double tc_min, System system,
                                                  const UnitHydrographSettings &settings) {
    check_inputs(table, excess, area_m2, tc_min, settings);
    WithLines<Hydrograph> out{};
    const ExcessAtD x = excess_at_duration(out.lines, excess, tc_min, settings.step_fraction_of_tc);
    const double d_h = x.d_s / units::s_per_h;
    const double tp_h = unit_hydrograph_tp_h(out.lines, d_h, tc_min);
    const double qpu = unit_peak_per_runoff(out.lines, area_m2, tp_h, system);
    const std::vector<double> u = unit_ordinates(table, qpu, d_h, tp_h);
    const std::vector<double> flow = convolve(x.e_mm, u, system);
    out.value = hydrograph_of(out.lines, flow, x, u.size(), tp_h, table.origin.cite(), system);
    return out;
}

WithLines<Hydrograph> unit_hydrograph_from_rainfall(const DimensionlessUnitHydrograph &table,
                                                    const rain::Hyetograph &rainfall, double cn,
                                                    double area_m2, double tc_min, System system,
                                                    const UnitHydrographSettings &settings,
                                                    IaRatio ratio) {
    const rain::Hyetograph excess = excess_hyetograph(rainfall, cn, ratio);
    auto out = unit_hydrograph_from_excess(table, excess, area_m2, tc_min, system, settings);
    CalcLines lines;
    lines.note(
        rainfall_excess,
        {qty("CN", cn), count("n", rainfall.steps()), qty("dt", rainfall.step_s / 60.0, Unit::min),
         qty("P", detail::sheet_depth(rainfall.total_mm(), system), detail::depth_unit(system))});
    lines.append(out.lines);
    out.lines = std::move(lines);
    return out;
}

rain::Hyetograph weighted_excess_hyetograph(const rain::Hyetograph &rainfall,
                                            const std::vector<CnPart> &parts, IaRatio ratio) {
    check_hyetograph(rainfall, "rainfall hyetograph");
    if (parts.empty()) {
        throw_input_error("weighted rainfall excess", "no parts given", "at least one part");
    }
    rain::Hyetograph out;
    out.step_s = rainfall.step_s;
    out.depth_mm.assign(rainfall.steps(), 0.0);
    double sum_a = 0.0;
    for (const auto &p : parts) {
        detail::require_positive("weighted rainfall excess: part area", p.area_m2, Unit::m2);
        sum_a += p.area_m2;
    }
    for (const auto &p : parts) {
        const rain::Hyetograph e = excess_hyetograph(rainfall, p.cn, ratio);
        for (std::size_t k = 0; k < e.steps(); ++k) {
            out.depth_mm[k] += e.depth_mm[k] * p.area_m2 / sum_a;
        }
    }
    return out;
}

WithLines<Hydrograph> unit_hydrograph_from_parts(const DimensionlessUnitHydrograph &table,
                                                 const rain::Hyetograph &rainfall,
                                                 const std::vector<CnPart> &parts, double area_m2,
                                                 double tc_min, System system,
                                                 const UnitHydrographSettings &settings,
                                                 IaRatio ratio) {
    const rain::Hyetograph excess = weighted_excess_hyetograph(rainfall, parts, ratio);
    auto out = unit_hydrograph_from_excess(table, excess, area_m2, tc_min, system, settings);
    CalcLines lines;
    lines.note(rainfall_excess_parts, {count("parts", parts.size()), count("n", rainfall.steps()),
                                       qty("dt", rainfall.step_s / 60.0, Unit::min),
                                       qty("P", detail::sheet_depth(rainfall.total_mm(), system),
                                           detail::depth_unit(system))});
    lines.append(out.lines);
    out.lines = std::move(lines);
    return out;
}

} // namespace catchpeak::hydro
