// SPDX-License-Identifier: MIT
#include "catchpeak/hydro/unit_hydrograph.hpp"

#include "checks.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

namespace catchpeak::hydro {

using units::System;

namespace {

constexpr const char *neh16 = "NRCS NEH 630 ch. 16 (2007)";

void check_hyetograph(const rain::Hyetograph &h, const std::string &what) {
    detail::require_positive(what + ": time step", h.step_s, "s");
    if (h.depth_mm.empty()) {
        throw_input_error(what, "no time steps", "at least one step");
    }
    for (double d : h.depth_mm) {
        detail::require_non_negative(what + ": depth of a step", d, "mm");
    }
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
    check_hyetograph(excess, "excess hyetograph");
    detail::require_positive("unit hydrograph: catchment area", area_m2, "m2");
    detail::require_positive("unit hydrograph: time of concentration tc", tc_min, "min");
    detail::require_positive("unit hydrograph: step as a fraction of tc",
                             settings.step_fraction_of_tc, "");
    if (table.t_over_tp.size() < 2 || table.t_over_tp.size() != table.q_over_qp.size()) {
        throw_input_error("dimensionless unit hydrograph " + table.origin.file,
                          "fewer than 2 ordinates or columns of unequal length",
                          "at least 2 (t/tp, q/qp) pairs");
    }
    const bool us = system == System::us_customary;
    const std::string table_src = table.origin.cite();
    WithLines<Hydrograph> out{};

    // Duration D: aggregate or split the hyetograph's steps so that D <= fraction x tc.
    const double tc_s = units::min_to_s(tc_min);
    const double d_max_s = settings.step_fraction_of_tc * tc_s;
    const double step_in_s = excess.step_s;
    std::vector<double> e_mm;
    double d_s = 0.0;
    const double step_in_h = step_in_s / units::s_per_h;
    if (step_in_s <= d_max_s) {
        const auto k = static_cast<std::size_t>(std::floor(d_max_s / step_in_s));
        d_s = static_cast<double>(k) * step_in_s;
        e_mm.assign((excess.steps() + k - 1) / k, 0.0);
        for (std::size_t i = 0; i < excess.steps(); ++i) {
            e_mm[i / k] += excess.depth_mm[i];
        }
        out.lines.calc(
            "Unit hydrograph duration (hyetograph steps aggregated)",
            fmt::format("D = k dt, k = floor({} tc / dt)", sig(settings.step_fraction_of_tc)),
            fmt::format("D = {} x {} h", k, sig(step_in_h)), d_s / units::s_per_h, "h",
            std::string(neh16) + ": D about 0.133 tc (from memory)");
    } else {
        const auto m = static_cast<std::size_t>(std::ceil(step_in_s / d_max_s));
        d_s = step_in_s / static_cast<double>(m);
        e_mm.reserve(excess.steps() * m);
        for (double d : excess.depth_mm) {
            for (std::size_t j = 0; j < m; ++j) {
                e_mm.push_back(d / static_cast<double>(m));
            }
        }
        out.lines.calc(
            "Unit hydrograph duration (hyetograph steps split evenly)",
            fmt::format("D = dt / m, m = ceil(dt / ({} tc))", sig(settings.step_fraction_of_tc)),
            fmt::format("D = {} h / {}", sig(step_in_h), m), d_s / units::s_per_h, "h",
            std::string(neh16) +
                ": D about 0.133 tc (from memory); excess spread evenly over each step");
    }
    const double d_h = d_s / units::s_per_h;
    const double tc_h = units::min_to_h(tc_min);
    const double tp_h = d_h / 2.0 + 0.6 * tc_h;
    out.lines.calc("Time to peak of the unit hydrograph", "tp = D/2 + 0.6 tc",
                   fmt::format("tp = {}/2 + 0.6 x {}", sig(d_h), sig(tc_h)), tp_h, "h",
                   std::string(neh16) + ": tp = D/2 + L, lag L = 0.6 tc");
    if (d_h > 0.25 * tp_h * (1.0 + 1e-12)) {
        out.lines.warn("Unit hydrograph duration too long",
                       fmt::format("D = {} h exceeds 0.25 tp = {} h; the peak may be "
                                   "underestimated, use a finer hyetograph",
                                   sig(d_h), sig(0.25 * tp_h)),
                       std::string(neh16) + ": D <= 0.25 tp (from memory)");
    }

    // Unit peak per unit runoff, in the sheet's published form.
    double qpu = 0.0; // ft3/s per in (US) or m3/s per mm (SI)
    if (us) {
        const double a_mi2 = units::m2_to_mi2(area_m2);
        qpu = 484.0 * a_mi2 / tp_h;
        out.lines.calc("Unit hydrograph peak per inch of runoff", "qp = 484 A Q / tp (Q = 1 in)",
                       fmt::format("qp = 484 x {} x 1 / {}", sig(a_mi2), sig(tp_h)), qpu,
                       "ft3/s per in", std::string(neh16) + ", peak rate factor 484");
    } else {
        const double a_km2 = units::m2_to_km2(area_m2);
        qpu = 0.208 * a_km2 / tp_h;
        out.lines.calc(
            "Unit hydrograph peak per mm of runoff", "qp = 0.208 A Q / tp (Q = 1 mm)",
            fmt::format("qp = 0.208 x {} x 1 / {}", sig(a_km2), sig(tp_h)), qpu, "m3/s per mm",
            std::string(neh16) + ", SI form 2.08 A Q / tp with Q in cm, i.e. 0.208 with Q "
                                 "in mm");
    }

    // Unit hydrograph ordinates at steps of D, and the discrete convolution.
    const double t_end = table.t_over_tp.back();
    std::vector<double> u;
    for (std::size_t j = 0;; ++j) {
        const double x = static_cast<double>(j) * d_h / tp_h;
        if (x >= t_end) {
            break;
        }
        u.push_back(qpu * table.ratio_at(x));
    }
    const double per_mm = us ? 1.0 / units::mm_per_in : 1.0; // excess in the sheet's unit
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
    Hydrograph h;
    h.step_s = d_s;
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
    h.time_to_peak_s = static_cast<double>(i_peak) * d_s;
    double sum_q = 0.0;
    for (double q : h.flow_m3_s) {
        sum_q += q;
    }
    h.volume_m3 = sum_q * d_s;
    for (double e : e_mm) {
        h.runoff_mm += e;
    }

    const std::string conv =
        fmt::format("convolution of {} steps of excess with {} unit hydrograph ordinates at "
                    "D = {} h",
                    e_mm.size(), u.size(), sig(d_h));
    const std::string q_total =
        us ? sig(units::mm_to_in(h.runoff_mm)) + " in" : sig(h.runoff_mm) + " mm";
    out.lines.calc("Runoff depth (sum of excess)", "Q = sum of excess", "Q = " + q_total,
                   us ? units::mm_to_in(h.runoff_mm) : h.runoff_mm, us ? "in" : "mm",
                   "TR-55 (1986) eq. 2-1 on the cumulative rainfall");
    out.lines
        .calc("Peak flow, SCS unit hydrograph", "qp = max over t of sum_k Qk U(t - k D)", conv,
              sheet_peak, us ? "ft3/s" : "m3/s", table_src)
        .key = keys::uh_peak;
    out.lines.calc("Time to peak of the hydrograph", "t at the largest ordinate",
                   fmt::format("t = {} x {} h", i_peak, sig(d_h)),
                   h.time_to_peak_s / units::s_per_h, "h", "computed from the hydrograph");
    if (us) {
        const double v_ft3 = h.volume_m3 / (units::m_per_ft * units::m_per_ft * units::m_per_ft);
        out.lines.calc(
            "Hydrograph volume", "V = sum(q) D / 43560",
            fmt::format("V = {} ft3/s x {} s / 43560", sig(units::m3s_to_cfs(sum_q)), sig(d_s)),
            v_ft3 / 43560.0, "ac-ft", "computed from the hydrograph");
    } else {
        out.lines.calc("Hydrograph volume", "V = sum(q) D",
                       fmt::format("V = {} m3/s x {} s", sig(sum_q), sig(d_s)), h.volume_m3, "m3",
                       "computed from the hydrograph");
    }
    out.value = std::move(h);
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
    lines.note("Rainfall excess",
               fmt::format("excess per step = runoff of the cumulative rainfall (CN {}) minus that "
                           "of the step before; {} steps of {} min, rainfall {}",
                           sig(cn), rainfall.steps(), sig(rainfall.step_s / 60.0),
                           system == System::us_customary
                               ? sig(units::mm_to_in(rainfall.total_mm())) + " in"
                               : sig(rainfall.total_mm()) + " mm"),
               "TR-55 (1986) eq. 2-1 on the mass curve");
    lines.append(out.lines);
    out.lines = std::move(lines);
    return out;
}

} // namespace catchpeak::hydro
