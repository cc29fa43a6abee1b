// SPDX-License-Identifier: MIT
#include "catchpeak/hydro/tc.hpp"

#include "catchpeak/hydro/curve_number.hpp"

#include "checks.hpp"
#include "sheet.hpp"

#include <cmath>

namespace catchpeak::hydro {

namespace {

using units::System;

// clang-format off
constexpr std::string_view us_only =
    "method published only in US customary units; SI inputs converted (exact factors, NIST SP "
    "811)";
constexpr std::string_view conversion = "exact conversion (NIST SP 811)";
constexpr std::string_view lag_where = "NRCS NEH 630 ch. 15 (2010), lag equation";
constexpr std::string_view kirpich_range_where =
    " data: about 1-112 ac, slopes about 3-10 % (from memory, not checked against the source)";
constexpr std::string_view lag_range_where =
    "NRCS NEH 630 ch. 15 (2010): data behind the lag equation 1.3 ac to 9.2 mi2";
constexpr std::string_view sheet_too_long =
    "sheet flow length {L} {L:u} exceeds {Lmax} {Lmax:u}; beyond it flow concentrates, treat the "
    "rest as shallow concentrated flow";

constexpr Formula kirpich_us{"tc.kirpich_us", "Time of concentration, Kirpich",
    "tc = 0.0078 L^0.77 S^-0.385 (L ft)", "tc = 0.0078 x {L}^0.77 x {S}^-0.385",
    Ref::kirpich_1940, "; TxDOT Hydraulic Design Manual eq. 4-15"};
constexpr Formula kirpich_si{"tc.kirpich_si", "Time of concentration, Kirpich",
    "tc = 0.0195 L^0.77 S^-0.385 (L m)", "tc = 0.0195 x {L}^0.77 x {S}^-0.385",
    Ref::kirpich_1940, "; TxDOT Hydraulic Design Manual eq. 4-15"};
constexpr Formula kirpich_area_us{"tc.kirpich_area", "Kirpich: catchment area outside the data",
    "", "catchment area {A} {A:u} is outside Kirpich's data (about 1-112 ac); tc may be "
    "unreliable, compare with another method", Ref::kirpich_1940, kirpich_range_where};
constexpr Formula kirpich_area_si{"tc.kirpich_area", "Kirpich: catchment area outside the data",
    "", "catchment area {A} {A:u} is outside Kirpich's data (about 0.4047-45.32 ha); tc may be "
    "unreliable, compare with another method", Ref::kirpich_1940, kirpich_range_where};
constexpr Formula kirpich_slope{"tc.kirpich_slope", "Kirpich: slope outside the data", "",
    "slope {S} {S:u} is outside Kirpich's data (about 3-10 %); tc may be unreliable, compare "
    "with another method", Ref::kirpich_1940, kirpich_range_where};
constexpr Formula lag_units{"tc.lag_units", "NRCS lag method units", "", us_only, Ref::none,
    lag_where};
constexpr Formula lag_length_ft{"tc.lag_length_ft", "Hydraulic flow length in ft",
    "l = l[m] / 0.3048", "l = {l[m]} / 0.3048", Ref::none, conversion};
constexpr Formula lag_retention{"tc.lag_retention", "Potential maximum retention",
    "S = 1000/CN - 10 (in)", "S = 1000/{CN} - 10", Ref::tr55_1986, " eq. 2-4"};
constexpr Formula lag{"tc.lag", "Lag, NRCS lag equation",
    "L = l^0.8 (S + 1)^0.7 / (1900 Y^0.5) (l ft, Y %)",
    "L = {l}^0.8 x ({S} + 1)^0.7 / (1900 x {Y}^0.5)", Ref::none, lag_where};
constexpr Formula lag_tc{"tc.lag_tc", "Time of concentration from lag", "tc = L / 0.6",
    "tc = {L} / 0.6", Ref::none, lag_where};
constexpr Formula lag_tc_min{"tc.lag_tc_min", "Time of concentration in minutes",
    "tc[min] = 60 tc[h]", "tc = 60 x {tc}", Ref::none, "definition"};
constexpr Formula lag_area_us{"tc.lag_area", "NRCS lag: catchment area outside the data", "",
    "catchment area {A} {A:u} is outside the data behind the lag equation (1.3 ac to 9.2 mi2); "
    "tc may be unreliable", Ref::none, lag_range_where};
constexpr Formula lag_area_si{"tc.lag_area", "NRCS lag: catchment area outside the data", "",
    "catchment area {A} {A:u} is outside the data behind the lag equation (0.5261 ha to 23.83 "
    "km2); tc may be unreliable", Ref::none, lag_range_where};
constexpr Formula sheet_units{"tc.sheet_units", "Sheet flow units", "", us_only,
    Ref::tr55_1986, " ch. 3"};
constexpr Formula sheet_length_ft{"tc.sheet_length_ft", "Sheet flow length in ft",
    "L = L[m] / 0.3048", "L = {L[m]} / 0.3048", Ref::none, conversion};
constexpr Formula sheet_p2_in{"tc.sheet_p2_in", "2-year 24-hour rainfall in inches",
    "P2 = P2[mm] / 25.4", "P2 = {P2[mm]} / 25.4", Ref::none, conversion};
constexpr Formula sheet_flow{"tc.sheet_flow", "Travel time, sheet flow",
    "Tt = 0.007 (n L)^0.8 / (P2^0.5 s^0.4) (L ft, P2 in)",
    "Tt = 0.007 x ({n} x {L})^0.8 / ({P2}^0.5 x {s}^0.4)", Ref::tr55_1986, " eq. 3-3"};
constexpr Formula sheet_over_300ft{"tc.sheet_over_limit", "Sheet flow length over the limit", "",
    sheet_too_long, Ref::tr55_1986, " ch. 3: L <= 300 ft"};
constexpr Formula sheet_over_100ft{"tc.sheet_over_limit", "Sheet flow length over the limit", "",
    sheet_too_long, Ref::none, "NRCS NEH 630 ch. 15 (2010): L typically <= 100 ft"};
constexpr Formula shallow_velocity_us{"tc.shallow_velocity_us",
    "Velocity, shallow concentrated flow ({surface})", "V = {k} s^0.5", "V = {k} x {s}^0.5",
    Ref::tr55_1986, " App. F, {surface} (from memory, not checked)"};
constexpr Formula shallow_velocity_si{"tc.shallow_velocity_si",
    "Velocity, shallow concentrated flow ({surface})", "V = {k} x 0.3048 s^0.5",
    "V = {k} x 0.3048 x {s}^0.5", Ref::tr55_1986,
    " App. F, {surface} (from memory, not checked); SI form computed with 1 ft = 0.3048 m"};
constexpr Formula shallow_travel_time{"tc.shallow_travel_time",
    "Travel time, shallow concentrated flow", "Tt = L / (3600 V)",
    "Tt = {L} {L:u} / (3600 x {V} {V:u})", Ref::tr55_1986, " eq. 3-1"};
constexpr Formula hydraulic_radius{"tc.hydraulic_radius", "Hydraulic radius", "r = a / pw",
    "r = {a} {a:u} / {pw} {pw:u}", Ref::tr55_1986, " ch. 3"};
constexpr Formula manning_us{"tc.manning_us", "Velocity, channel flow (Manning)",
    "V = 1.49 r^(2/3) s^(1/2) / n", "V = 1.49 x {r}^(2/3) x {s}^(1/2) / {n}", Ref::none,
    "Manning's equation; TR-55 (1986) eq. 3-4"};
constexpr Formula manning_si{"tc.manning_si", "Velocity, channel flow (Manning)",
    "V = r^(2/3) s^(1/2) / n", "V = {r}^(2/3) x {s}^(1/2) / {n}", Ref::none,
    "Manning's equation; TR-55 (1986) eq. 3-4"};
constexpr Formula channel_travel_time{"tc.channel_travel_time", "Travel time, channel flow",
    "Tt = L / (3600 V)", "Tt = {L} {L:u} / (3600 x {V} {V:u})", Ref::tr55_1986, " eq. 3-1"};
constexpr Formula kerby_us{"tc.kerby_us", "Overland flow time, Kerby",
    "tov = 0.828 (L N / S^0.5)^0.467 (L ft)", "tov = 0.8280 x ({L} x {N} / {S}^0.5)^0.467",
    Ref::kerby_1959, ", as given in the TxDOT Hydraulic Design Manual ch. 4"};
constexpr Formula kerby_si{"tc.kerby_si", "Overland flow time, Kerby",
    "tov = 1.44 (L N / S^0.5)^0.467 (L m)", "tov = 1.440 x ({L} x {N} / {S}^0.5)^0.467",
    Ref::kerby_1959, ", SI form (constant 1.44 from memory, not checked against the source)"};
constexpr Formula kerby_too_long{"tc.kerby_over_limit",
    "Kerby: overland flow length over the limit", "",
    "overland flow length {L} {L:u} exceeds about {Lmax} {Lmax:u}", Ref::none,
    "Kerby method limit about 1200 ft (from memory, not checked against the source)"};
constexpr Formula tc_sum{"tc.sum", "Time of concentration, sum of travel times",
    "tc = sum of Tt", "tc = {[{Tt}| + ]}", Ref::tr55_1986, " ch. 3"};
constexpr Formula tc_minimum{"tc.minimum", "Time of concentration, minimum applied",
    "tc = max(tc, tc,min)", "tc = max({tc}, {tc,min})", Ref::project_setting,
    ": minimum tc (common practice, no source)"};
constexpr Formula tc_minimum_governs{"tc.minimum_governs", "Minimum tc governs", "",
    "computed tc {tc} {tc:u} is below the minimum {tc,min} {tc,min:u}; the minimum is used",
    Ref::project_setting, ""};
// clang-format on

/// Adds the line converting a length in m to ft, for methods published only in US units.
/// `symbol` names the length in ft, `symbol`[m] the length in m.
double length_to_ft_line(CalcLines &lines, const Formula &f, const std::string &symbol,
                         double length_m) {
    const double ft = units::m_to_ft(length_m);
    lines.calc(f, {qty(symbol + "[m]", length_m, Unit::m)}, qty(symbol, ft, Unit::ft));
    return ft;
}

/// Warns (with `us` or `si`, the same message in the sheet's units) when the catchment area is
/// outside the data of a method.
void warn_area_outside(CalcLines &lines, const Formula &us, const Formula &si, double area_m2,
                       System system) {
    lines.warn(detail::is_us(system) ? us : si,
               {qty("A", detail::sheet_area(area_m2, system), detail::area_unit(system))});
}

/// Tt = L / (3600 V) in h, L and V in the sheet's units.
double travel_time_line(CalcLines &lines, const Formula &f, double l, double v, System system) {
    const double tt_h = l / (3600.0 * v);
    const Unit vu = detail::is_us(system) ? Unit::ft_per_s : Unit::m_per_s;
    lines.calc(f, {qty("L", l, detail::length_unit(system)), qty("V", v, vu)},
               qty("Tt", tt_h, Unit::h));
    return tt_h;
}

} // namespace

WithLines<double> kirpich_tc_min(double length_m, double slope_m_per_m, double area_m2,
                                 System system) {
    detail::require_positive("Kirpich: longest flow path length L", length_m, Unit::m);
    detail::require_positive("Kirpich: slope S", slope_m_per_m, Unit::m_per_m);
    detail::require_positive("Kirpich: catchment area", area_m2, Unit::m2);
    WithLines<double> out{};
    const bool us = detail::is_us(system);
    const double l = us ? units::m_to_ft(length_m) : length_m;
    const double tc_min =
        (us ? 0.0078 : 0.0195) * std::pow(l, 0.77) * std::pow(slope_m_per_m, -0.385);
    out.lines.calc(us ? kirpich_us : kirpich_si,
                   {qty("L", l, detail::length_unit(system)),
                    qty("S", slope_m_per_m, us ? Unit::ft_per_ft : Unit::m_per_m)},
                   qty("tc", tc_min, Unit::min));
    const double area_ac = units::m2_to_acre(area_m2);
    if (area_ac < 1.0 || area_ac > 112.0) {
        warn_area_outside(out.lines, kirpich_area_us, kirpich_area_si, area_m2, system);
    }
    const double slope_pct = 100.0 * slope_m_per_m;
    if (slope_pct < 3.0 || slope_pct > 10.0) {
        out.lines.warn(kirpich_slope, {qty("S", slope_pct, Unit::percent)});
    }
    out.value = tc_min;
    return out;
}

WithLines<double> nrcs_lag_tc_min(double flow_length_m, double cn, double slope_percent,
                                  double area_m2, System system) {
    detail::require_positive("NRCS lag: hydraulic flow length l", flow_length_m, Unit::m);
    detail::require_cn(cn);
    detail::require_positive("NRCS lag: average catchment slope Y", slope_percent, Unit::percent);
    detail::require_positive("NRCS lag: catchment area", area_m2, Unit::m2);
    if (cn >= 100.0) {
        throw_input_error("NRCS lag: curve number CN", "value 100 gives S = 0 and no lag",
                          full(limits::curve_number.min) + " <= CN < " +
                              full(limits::curve_number.max) + " (a surface that holds some rain)");
    }
    WithLines<double> out{};
    double l_ft = units::m_to_ft(flow_length_m);
    if (system == System::si) {
        out.lines.note(lag_units);
        l_ft = length_to_ft_line(out.lines, lag_length_ft, "l", flow_length_m);
    }
    const double s_in = cn_retention_in(cn);
    out.lines.calc(lag_retention, {qty("CN", cn)}, qty("S", s_in, Unit::in));
    const double lag_h =
        std::pow(l_ft, 0.8) * std::pow(s_in + 1.0, 0.7) / (1900.0 * std::sqrt(slope_percent));
    out.lines.calc(lag,
                   {qty("l", l_ft, Unit::ft), qty("S", s_in, Unit::in),
                    qty("Y", slope_percent, Unit::percent)},
                   qty("L", lag_h, Unit::h));
    const double tc_h = lag_h / 0.6;
    out.lines.calc(lag_tc, {qty("L", lag_h, Unit::h)}, qty("tc", tc_h, Unit::h));
    out.value = units::h_to_min(tc_h);
    out.lines.calc(lag_tc_min, {qty("tc", tc_h, Unit::h)}, qty("tc[min]", out.value, Unit::min));
    const double area_ac = units::m2_to_acre(area_m2);
    const double area_mi2 = units::m2_to_mi2(area_m2);
    if (area_ac < 1.3 || area_mi2 > 9.2) {
        warn_area_outside(out.lines, lag_area_us, lag_area_si, area_m2, system);
    }
    return out;
}

WithLines<double> sheet_flow_tt_min(double manning_n, double length_m, double p2_24h_mm,
                                    double slope_m_per_m, SheetFlowLimit limit, System system) {
    detail::require_positive("sheet flow: Manning roughness n", manning_n);
    detail::require_positive("sheet flow: length L", length_m, Unit::m);
    detail::require_positive("sheet flow: 2-year 24-hour rainfall P2", p2_24h_mm, Unit::mm);
    detail::require_positive("sheet flow: slope s", slope_m_per_m, Unit::m_per_m);
    WithLines<double> out{};
    double l_ft = units::m_to_ft(length_m);
    const double p2_in = units::mm_to_in(p2_24h_mm);
    if (system == System::si) {
        out.lines.note(sheet_units);
        l_ft = length_to_ft_line(out.lines, sheet_length_ft, "L", length_m);
        out.lines.calc(sheet_p2_in, {qty("P2[mm]", p2_24h_mm, Unit::mm)},
                       qty("P2", p2_in, Unit::in));
    }
    const double tt_h =
        0.007 * std::pow(manning_n * l_ft, 0.8) / (std::sqrt(p2_in) * std::pow(slope_m_per_m, 0.4));
    out.lines.calc(sheet_flow,
                   {qty("n", manning_n), qty("L", l_ft, Unit::ft), qty("P2", p2_in, Unit::in),
                    qty("s", slope_m_per_m, Unit::ft_per_ft)},
                   qty("Tt", tt_h, Unit::h));
    const bool tr55 = limit == SheetFlowLimit::tr55_300_ft;
    const double limit_ft = tr55 ? 300.0 : 100.0;
    if (l_ft > limit_ft) {
        const bool us = detail::is_us(system);
        const Unit lu = detail::length_unit(system);
        out.lines.warn(tr55 ? sheet_over_300ft : sheet_over_100ft,
                       {qty("L", us ? l_ft : length_m, lu),
                        qty("Lmax", us ? limit_ft : units::ft_to_m(limit_ft), lu)});
    }
    out.value = units::h_to_min(tt_h);
    return out;
}

WithLines<double> shallow_flow_tt_min(double length_m, double slope_m_per_m, ShallowSurface surface,
                                      System system) {
    detail::require_positive("shallow concentrated flow: length L", length_m, Unit::m);
    detail::require_positive("shallow concentrated flow: slope s", slope_m_per_m, Unit::m_per_m);
    WithLines<double> out{};
    const bool paved = surface == ShallowSurface::paved;
    const double k_us = paved ? 20.3282 : 16.1345;
    const bool us = detail::is_us(system);
    const double v =
        us ? k_us * std::sqrt(slope_m_per_m) : k_us * units::m_per_ft * std::sqrt(slope_m_per_m);
    out.lines.calc(us ? shallow_velocity_us : shallow_velocity_si,
                   {word("surface", paved ? "paved" : "unpaved"),
                    qty("k", k_us, Unit::none, Shown::sig(6)),
                    qty("s", slope_m_per_m, us ? Unit::ft_per_ft : Unit::m_per_m)},
                   qty("V", v, us ? Unit::ft_per_s : Unit::m_per_s));
    const double l = us ? units::m_to_ft(length_m) : length_m;
    out.value = units::h_to_min(travel_time_line(out.lines, shallow_travel_time, l, v, system));
    return out;
}

WithLines<double> channel_flow_tt_min(double manning_n, double flow_area_m2,
                                      double wetted_perimeter_m, double slope_m_per_m,
                                      double length_m, System system) {
    detail::require_positive("channel flow: Manning roughness n", manning_n);
    detail::require_positive("channel flow: flow area a", flow_area_m2, Unit::m2);
    detail::require_positive("channel flow: wetted perimeter pw", wetted_perimeter_m, Unit::m);
    detail::require_positive("channel flow: slope s", slope_m_per_m, Unit::m_per_m);
    detail::require_positive("channel flow: length L", length_m, Unit::m);
    WithLines<double> out{};
    const bool us = detail::is_us(system);
    const double a = us ? units::m2_to_ft2(flow_area_m2) : flow_area_m2;
    const double pw = us ? units::m_to_ft(wetted_perimeter_m) : wetted_perimeter_m;
    const double l = us ? units::m_to_ft(length_m) : length_m;
    const Unit lu = detail::length_unit(system);
    const double r = a / pw;
    out.lines.calc(hydraulic_radius, {qty("a", a, us ? Unit::ft2 : Unit::m2), qty("pw", pw, lu)},
                   qty("r", r, lu));
    const double k = us ? 1.49 : 1.0;
    const double v = k / manning_n * std::pow(r, 2.0 / 3.0) * std::sqrt(slope_m_per_m);
    out.lines.calc(us ? manning_us : manning_si,
                   {qty("r", r, lu), qty("s", slope_m_per_m, us ? Unit::ft_per_ft : Unit::m_per_m),
                    qty("n", manning_n)},
                   qty("V", v, us ? Unit::ft_per_s : Unit::m_per_s));
    out.value = units::h_to_min(travel_time_line(out.lines, channel_travel_time, l, v, system));
    return out;
}

WithLines<double> kerby_tov_min(double length_m, double retardance_n, double slope_m_per_m,
                                System system) {
    detail::require_positive("Kerby: overland flow length L", length_m, Unit::m);
    detail::require_positive("Kerby: retardance coefficient N", retardance_n);
    detail::require_positive("Kerby: slope S", slope_m_per_m, Unit::m_per_m);
    WithLines<double> out{};
    const bool us = detail::is_us(system);
    const double l = us ? units::m_to_ft(length_m) : length_m;
    const double k = us ? 0.828 : 1.44;
    const double tov = k * std::pow(l * retardance_n / std::sqrt(slope_m_per_m), 0.467);
    const Unit lu = detail::length_unit(system);
    out.lines.calc(us ? kerby_us : kerby_si,
                   {qty("L", l, lu), qty("N", retardance_n),
                    qty("S", slope_m_per_m, us ? Unit::ft_per_ft : Unit::m_per_m)},
                   qty("tov", tov, Unit::min));
    const double l_ft = units::m_to_ft(length_m);
    if (l_ft > 1200.0) {
        out.lines.warn(kerby_too_long, {qty("L", us ? l_ft : length_m, lu),
                                        qty("Lmax", us ? 1200.0 : units::ft_to_m(1200.0), lu)});
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
    const bool us = detail::is_us(system);
    const Unit tu = us ? Unit::h : Unit::min;
    double sum_min = 0.0;
    std::vector<std::vector<Quantity>> rows;
    for (double t : times_min) {
        detail::require_non_negative("time of concentration: travel time", t, Unit::min);
        sum_min += t;
        rows.push_back({qty("Tt", us ? units::min_to_h(t) : t, tu)});
    }
    out.lines.calc(tc_sum, {}, qty("tc", us ? units::min_to_h(sum_min) : sum_min, tu)).rows =
        std::move(rows);
    out.value = sum_min;
    return out;
}

WithLines<double> apply_minimum_tc(double tc_min, double minimum_tc_min) {
    detail::require_positive("time of concentration tc", tc_min, Unit::min);
    detail::require_non_negative("minimum time of concentration", minimum_tc_min, Unit::min);
    WithLines<double> out{};
    out.value = std::max(tc_min, minimum_tc_min);
    const std::vector<Quantity> inputs = {qty("tc", tc_min, Unit::min),
                                          qty("tc,min", minimum_tc_min, Unit::min)};
    out.lines.calc(tc_minimum, inputs, qty("tc", out.value, Unit::min));
    if (tc_min < minimum_tc_min) {
        out.lines.note(tc_minimum_governs, inputs).flags.minimum_governs = true;
    }
    return out;
}

} // namespace catchpeak::hydro
