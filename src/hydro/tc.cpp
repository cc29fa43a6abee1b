// SPDX-License-Identifier: MIT
#include "catchpeak/hydro/tc.hpp"

#include "checks.hpp"

#include <fmt/format.h>

#include <cmath>

namespace catchpeak::hydro {

namespace {

using units::System;

constexpr const char *kirpich_source = "Kirpich (1940); TxDOT Hydraulic Design Manual eq. 4-15";
constexpr const char *kirpich_range_source =
    "Kirpich (1940) data: about 1-112 ac, slopes about 3-10 % (from memory, not checked "
    "against the source)";
constexpr const char *lag_source = "NRCS NEH 630 ch. 15 (2010), lag equation";
constexpr const char *lag_range_source =
    "NRCS NEH 630 ch. 15 (2010): data behind the lag equation 1.3 ac to 9.2 mi2";
constexpr const char *tr55_ch3 = "TR-55 (1986) ch. 3";
constexpr const char *us_only_note =
    "method published only in US customary units; SI inputs converted (exact factors, NIST SP "
    "811)";
constexpr const char *conversion_source = "exact conversion (NIST SP 811)";

/// Adds the line converting a length in m to ft, for methods published only in US units.
double length_to_ft_line(CalcLines &lines, const std::string &label, const std::string &symbol,
                         double length_m) {
    const double ft = units::m_to_ft(length_m);
    lines.calc(label + " in ft", symbol + " = " + symbol + "[m] / 0.3048",
               fmt::format("{} = {} / 0.3048", symbol, sig(length_m)), ft, "ft", conversion_source);
    return ft;
}

double h_to_min_line(CalcLines &lines, const std::string &label, const std::string &symbol,
                     double value_h) {
    const double v_min = units::h_to_min(value_h);
    lines.calc(label + " in minutes", symbol + "[min] = 60 " + symbol + "[h]",
               fmt::format("{} = 60 x {}", symbol, sig(value_h)), v_min, "min", "definition");
    return v_min;
}

} // namespace

WithLines<double> kirpich_tc_min(double length_m, double slope_m_per_m, double area_m2,
                                 System system) {
    detail::require_positive("Kirpich: longest flow path length L", length_m, "m");
    detail::require_positive("Kirpich: slope S", slope_m_per_m, "m/m");
    detail::require_positive("Kirpich: catchment area", area_m2, "m2");
    WithLines<double> out{};
    double tc_min = 0.0;
    if (system == System::us_customary) {
        const double l_ft = units::m_to_ft(length_m);
        tc_min = 0.0078 * std::pow(l_ft, 0.77) * std::pow(slope_m_per_m, -0.385);
        out.lines.calc(
            "Time of concentration, Kirpich", "tc = 0.0078 L^0.77 S^-0.385 (L ft)",
            fmt::format("tc = 0.0078 x {}^0.77 x {}^-0.385", sig(l_ft), sig(slope_m_per_m)), tc_min,
            "min", kirpich_source);
    } else {
        tc_min = 0.0195 * std::pow(length_m, 0.77) * std::pow(slope_m_per_m, -0.385);
        out.lines.calc(
            "Time of concentration, Kirpich", "tc = 0.0195 L^0.77 S^-0.385 (L m)",
            fmt::format("tc = 0.0195 x {}^0.77 x {}^-0.385", sig(length_m), sig(slope_m_per_m)),
            tc_min, "min", kirpich_source);
    }
    const double area_ac = units::m2_to_acre(area_m2);
    if (area_ac < 1.0 || area_ac > 112.0) {
        const std::string shown = system == System::us_customary
                                      ? fmt::format("{} ac", sig(area_ac))
                                      : fmt::format("{} ha", sig(units::m2_to_ha(area_m2)));
        const std::string range =
            system == System::us_customary ? "about 1-112 ac" : "about 0.4047-45.32 ha";
        out.lines.warn("Kirpich: catchment area outside the data",
                       fmt::format("catchment area {} is outside Kirpich's data ({}); tc may be "
                                   "unreliable, compare with another method",
                                   shown, range),
                       kirpich_range_source);
    }
    const double slope_pct = 100.0 * slope_m_per_m;
    if (slope_pct < 3.0 || slope_pct > 10.0) {
        out.lines.warn("Kirpich: slope outside the data",
                       fmt::format("slope {} % is outside Kirpich's data (about 3-10 %); tc may "
                                   "be unreliable, compare with another method",
                                   sig(slope_pct)),
                       kirpich_range_source);
    }
    out.value = tc_min;
    return out;
}

WithLines<double> nrcs_lag_tc_min(double flow_length_m, double cn, double slope_percent,
                                  double area_m2, System system) {
    detail::require_positive("NRCS lag: hydraulic flow length l", flow_length_m, "m");
    detail::require_cn(cn);
    detail::require_positive("NRCS lag: average catchment slope Y", slope_percent, "%");
    detail::require_positive("NRCS lag: catchment area", area_m2, "m2");
    if (cn >= 100.0) {
        throw_input_error("NRCS lag: curve number CN", "value 100 gives S = 0 and no lag",
                          "30 <= CN < 100");
    }
    WithLines<double> out{};
    double l_ft = units::m_to_ft(flow_length_m);
    if (system == System::si) {
        out.lines.note("NRCS lag method units", us_only_note, lag_source);
        l_ft = length_to_ft_line(out.lines, "Hydraulic flow length", "l", flow_length_m);
    }
    const double s_in = 1000.0 / cn - 10.0;
    out.lines.calc("Potential maximum retention", "S = 1000/CN - 10 (in)",
                   fmt::format("S = 1000/{} - 10", sig(cn)), s_in, "in", "TR-55 (1986) eq. 2-4");
    const double lag_h =
        std::pow(l_ft, 0.8) * std::pow(s_in + 1.0, 0.7) / (1900.0 * std::sqrt(slope_percent));
    out.lines.calc("Lag, NRCS lag equation", "L = l^0.8 (S + 1)^0.7 / (1900 Y^0.5) (l ft, Y %)",
                   fmt::format("L = {}^0.8 x ({} + 1)^0.7 / (1900 x {}^0.5)", sig(l_ft), sig(s_in),
                               sig(slope_percent)),
                   lag_h, "h", lag_source);
    const double tc_h = lag_h / 0.6;
    out.lines.calc("Time of concentration from lag", "tc = L / 0.6",
                   fmt::format("tc = {} / 0.6", sig(lag_h)), tc_h, "h", lag_source);
    out.value = h_to_min_line(out.lines, "Time of concentration", "tc", tc_h);
    const double area_ac = units::m2_to_acre(area_m2);
    const double area_mi2 = units::m2_to_mi2(area_m2);
    if (area_ac < 1.3 || area_mi2 > 9.2) {
        const std::string shown = system == System::us_customary
                                      ? fmt::format("{} ac", sig(area_ac))
                                      : fmt::format("{} ha", sig(units::m2_to_ha(area_m2)));
        const std::string range =
            system == System::us_customary ? "1.3 ac to 9.2 mi2" : "0.5261 ha to 23.83 km2";
        out.lines.warn("NRCS lag: catchment area outside the data",
                       fmt::format("catchment area {} is outside the data behind the lag "
                                   "equation ({}); tc may be unreliable",
                                   shown, range),
                       lag_range_source);
    }
    return out;
}

WithLines<double> sheet_flow_tt_min(double manning_n, double length_m, double p2_24h_mm,
                                    double slope_m_per_m, SheetFlowLimit limit, System system) {
    detail::require_positive("sheet flow: Manning roughness n", manning_n, "");
    detail::require_positive("sheet flow: length L", length_m, "m");
    detail::require_positive("sheet flow: 2-year 24-hour rainfall P2", p2_24h_mm, "mm");
    detail::require_positive("sheet flow: slope s", slope_m_per_m, "m/m");
    WithLines<double> out{};
    double l_ft = units::m_to_ft(length_m);
    double p2_in = units::mm_to_in(p2_24h_mm);
    if (system == System::si) {
        out.lines.note("Sheet flow units", us_only_note, tr55_ch3);
        l_ft = length_to_ft_line(out.lines, "Sheet flow length", "L", length_m);
        out.lines.calc("2-year 24-hour rainfall in inches", "P2 = P2[mm] / 25.4",
                       fmt::format("P2 = {} / 25.4", sig(p2_24h_mm)), p2_in, "in",
                       conversion_source);
    }
    const double tt_h =
        0.007 * std::pow(manning_n * l_ft, 0.8) / (std::sqrt(p2_in) * std::pow(slope_m_per_m, 0.4));
    out.lines.calc("Travel time, sheet flow", "Tt = 0.007 (n L)^0.8 / (P2^0.5 s^0.4) (L ft, P2 in)",
                   fmt::format("Tt = 0.007 x ({} x {})^0.8 / ({}^0.5 x {}^0.4)", sig(manning_n),
                               sig(l_ft), sig(p2_in), sig(slope_m_per_m)),
                   tt_h, "h", "TR-55 (1986) eq. 3-3");
    const bool tr55 = limit == SheetFlowLimit::tr55_300_ft;
    const double limit_ft = tr55 ? 300.0 : 100.0;
    if (l_ft > limit_ft) {
        const std::string shown =
            system == System::us_customary
                ? fmt::format("{} ft exceeds {} ft", sig(l_ft), sig(limit_ft))
                : fmt::format("{} m exceeds {} m", sig(length_m), sig(units::ft_to_m(limit_ft)));
        out.lines.warn("Sheet flow length over the limit",
                       "sheet flow length " + shown +
                           "; beyond it flow concentrates, treat the rest as shallow "
                           "concentrated flow",
                       tr55 ? "TR-55 (1986) ch. 3: L <= 300 ft"
                            : "NRCS NEH 630 ch. 15 (2010): L typically <= 100 ft");
    }
    out.value = units::h_to_min(tt_h);
    return out;
}

WithLines<double> shallow_flow_tt_min(double length_m, double slope_m_per_m, ShallowSurface surface,
                                      System system) {
    detail::require_positive("shallow concentrated flow: length L", length_m, "m");
    detail::require_positive("shallow concentrated flow: slope s", slope_m_per_m, "m/m");
    WithLines<double> out{};
    const bool paved = surface == ShallowSurface::paved;
    const double k_us = paved ? 20.3282 : 16.1345;
    const std::string what = paved ? "paved" : "unpaved";
    const std::string src = "TR-55 (1986) App. F, " + what + " (from memory, not checked)";
    double v = 0.0;
    double l = 0.0;
    std::string vu;
    std::string lu;
    if (system == System::us_customary) {
        v = k_us * std::sqrt(slope_m_per_m);
        l = units::m_to_ft(length_m);
        vu = "ft/s";
        lu = "ft";
        out.lines.calc("Velocity, shallow concentrated flow (" + what + ")",
                       fmt::format("V = {} s^0.5", sig(k_us, 6)),
                       fmt::format("V = {} x {}^0.5", sig(k_us, 6), sig(slope_m_per_m)), v, vu,
                       src);
    } else {
        const double k_si = k_us * units::m_per_ft;
        v = k_si * std::sqrt(slope_m_per_m);
        l = length_m;
        vu = "m/s";
        lu = "m";
        out.lines.calc("Velocity, shallow concentrated flow (" + what + ")",
                       fmt::format("V = {} x 0.3048 s^0.5", sig(k_us, 6)),
                       fmt::format("V = {} x 0.3048 x {}^0.5", sig(k_us, 6), sig(slope_m_per_m)), v,
                       vu, src + "; SI form computed with 1 ft = 0.3048 m");
    }
    const double tt_h = l / (3600.0 * v);
    out.lines.calc("Travel time, shallow concentrated flow", "Tt = L / (3600 V)",
                   fmt::format("Tt = {} {} / (3600 x {} {})", sig(l), lu, sig(v), vu), tt_h, "h",
                   "TR-55 (1986) eq. 3-1");
    out.value = units::h_to_min(tt_h);
    return out;
}

WithLines<double> channel_flow_tt_min(double manning_n, double flow_area_m2,
                                      double wetted_perimeter_m, double slope_m_per_m,
                                      double length_m, System system) {
    detail::require_positive("channel flow: Manning roughness n", manning_n, "");
    detail::require_positive("channel flow: flow area a", flow_area_m2, "m2");
    detail::require_positive("channel flow: wetted perimeter pw", wetted_perimeter_m, "m");
    detail::require_positive("channel flow: slope s", slope_m_per_m, "m/m");
    detail::require_positive("channel flow: length L", length_m, "m");
    WithLines<double> out{};
    const bool us = system == System::us_customary;
    const double a = us ? units::m2_to_ft2(flow_area_m2) : flow_area_m2;
    const double pw = us ? units::m_to_ft(wetted_perimeter_m) : wetted_perimeter_m;
    const double l = us ? units::m_to_ft(length_m) : length_m;
    const std::string lu = us ? "ft" : "m";
    const std::string vu = us ? "ft/s" : "m/s";
    const double r = a / pw;
    out.lines.calc("Hydraulic radius", "r = a / pw",
                   fmt::format("r = {} {}2 / {} {}", sig(a), lu, sig(pw), lu), r, lu,
                   "TR-55 (1986) ch. 3");
    const double k = us ? 1.49 : 1.0;
    const double v = k / manning_n * std::pow(r, 2.0 / 3.0) * std::sqrt(slope_m_per_m);
    out.lines.calc("Velocity, channel flow (Manning)",
                   us ? "V = 1.49 r^(2/3) s^(1/2) / n" : "V = r^(2/3) s^(1/2) / n",
                   us ? fmt::format("V = 1.49 x {}^(2/3) x {}^(1/2) / {}", sig(r),
                                    sig(slope_m_per_m), sig(manning_n))
                      : fmt::format("V = {}^(2/3) x {}^(1/2) / {}", sig(r), sig(slope_m_per_m),
                                    sig(manning_n)),
                   v, vu, "Manning's equation; TR-55 (1986) eq. 3-4");
    const double tt_h = l / (3600.0 * v);
    out.lines.calc("Travel time, channel flow", "Tt = L / (3600 V)",
                   fmt::format("Tt = {} {} / (3600 x {} {})", sig(l), lu, sig(v), vu), tt_h, "h",
                   "TR-55 (1986) eq. 3-1");
    out.value = units::h_to_min(tt_h);
    return out;
}

WithLines<double> kerby_tov_min(double length_m, double retardance_n, double slope_m_per_m,
                                System system) {
    detail::require_positive("Kerby: overland flow length L", length_m, "m");
    detail::require_positive("Kerby: retardance coefficient N", retardance_n, "");
    detail::require_positive("Kerby: slope S", slope_m_per_m, "m/m");
    WithLines<double> out{};
    const bool us = system == System::us_customary;
    const double l = us ? units::m_to_ft(length_m) : length_m;
    const double k = us ? 0.828 : 1.44;
    const double tov = k * std::pow(l * retardance_n / std::sqrt(slope_m_per_m), 0.467);
    out.lines.calc("Overland flow time, Kerby",
                   us ? "tov = 0.828 (L N / S^0.5)^0.467 (L ft)"
                      : "tov = 1.44 (L N / S^0.5)^0.467 (L m)",
                   fmt::format("tov = {} x ({} x {} / {}^0.5)^0.467", sig(k), sig(l),
                               sig(retardance_n), sig(slope_m_per_m)),
                   tov, "min",
                   us ? "Kerby (1959), as given in the TxDOT Hydraulic Design Manual ch. 4"
                      : "Kerby (1959), SI form (constant 1.44 from memory, not checked against "
                        "the source)");
    const double l_ft = units::m_to_ft(length_m);
    if (l_ft > 1200.0) {
        out.lines.warn(
            "Kerby: overland flow length over the limit",
            us ? fmt::format("overland flow length {} ft exceeds about 1200 ft", sig(l_ft))
               : fmt::format("overland flow length {} m exceeds about 365.8 m", sig(length_m)),
            "Kerby method limit about 1200 ft (from memory, not checked against the "
            "source)");
    }
    out.value = tov;
    return out;
}

WithLines<double> sum_travel_times_min(const std::vector<double> &times_min, System system) {
    if (times_min.empty()) {
        throw_input_error("time of concentration: travel times", "no segment given",
                          "at least one segment");
    }
    WithLines<double> out{};
    const bool us = system == System::us_customary;
    double sum_min = 0.0;
    std::string terms;
    for (double t : times_min) {
        detail::require_non_negative("time of concentration: travel time", t, "min");
        sum_min += t;
        terms += (terms.empty() ? "" : " + ") + sig(us ? units::min_to_h(t) : t);
    }
    out.lines.calc("Time of concentration, sum of travel times", "tc = sum of Tt", "tc = " + terms,
                   us ? units::min_to_h(sum_min) : sum_min, us ? "h" : "min", "TR-55 (1986) ch. 3");
    out.value = sum_min;
    return out;
}

WithLines<double> apply_minimum_tc(double tc_min, double minimum_tc_min) {
    detail::require_positive("time of concentration tc", tc_min, "min");
    detail::require_non_negative("minimum time of concentration", minimum_tc_min, "min");
    WithLines<double> out{};
    out.value = std::max(tc_min, minimum_tc_min);
    out.lines.calc("Time of concentration, minimum applied", "tc = max(tc, tc,min)",
                   fmt::format("tc = max({}, {})", sig(tc_min), sig(minimum_tc_min)), out.value,
                   "min", "project setting: minimum tc (common practice, no source)");
    if (tc_min < minimum_tc_min) {
        out.lines.note("Minimum tc governs",
                       fmt::format("computed tc {} min is below the minimum {} min; the minimum "
                                   "is used",
                                   sig(tc_min), sig(minimum_tc_min)),
                       "project setting");
    }
    return out;
}

} // namespace catchpeak::hydro
