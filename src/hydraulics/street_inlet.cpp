// SPDX-License-Identifier: MIT
#include "catchpeak/hydraulics/street_inlet.hpp"

#include "sheet.hpp"

#include <algorithm>
#include <cmath>

namespace catchpeak::hydraulics {

using detail::Sheet;

namespace {

// clang-format off
constexpr Formula depression_slope{"inlet.curb_depression_slope",
                                   "Cross slope of the depression, from the pavement's",
                                   "S'w = a/W", "S'w = {a}/{W}", Ref::hec22_2009, " eq. 4-24"};
constexpr Formula equivalent_slope{"inlet.curb_equivalent_slope", "Equivalent cross slope",
                                   "Se = Sx + S'w Eo", "Se = {Sx} + {S'w} x {Eo}",
                                   Ref::hec22_2009, " eq. 4-24"};
constexpr Formula length_total{
    "inlet.curb_length_total", "Curb opening length for total interception",
    "LT = Ku Q^0.42 SL^0.3 (1/(n Sx))^0.6",
    "LT = {Ku} x {Q}^0.42 x {SL}^0.3 x (1/({n} x {Sx}))^0.6", Ref::hec22_2009, " eq. 4-22"};
constexpr Formula length_total_depressed{
    "inlet.curb_length_total", "Curb opening length for total interception",
    "LT = Ku Q^0.42 SL^0.3 (1/(n Se))^0.6",
    "LT = {Ku} x {Q}^0.42 x {SL}^0.3 x (1/({n} x {Se}))^0.6", Ref::hec22_2009,
    " eq. 4-22 with Se for Sx"};
constexpr Formula efficiency_partial{"inlet.curb_efficiency", "Curb opening efficiency",
                                     "E = 1 - (1 - L/LT)^1.8", "E = 1 - (1 - {L}/{LT})^1.8",
                                     Ref::hec22_2009, " eq. 4-23"};
constexpr Formula efficiency_full{"inlet.curb_efficiency", "Curb opening efficiency",
                                  "E = 1 (L >= LT)", "L = {L} {L:u} >= LT = {LT} {LT:u}: E = 1",
                                  Ref::hec22_2009, " eq. 4-23"};
constexpr Formula intercepted{"inlet.intercepted", "Intercepted flow", "Qi = E Q",
                              "Qi = {E} x {Q}", Ref::hec22_2009, " ch. 4, interception"};
constexpr Formula bypass{"inlet.bypass", "Bypass flow, passed on down the gutter",
                         "Qb = Q - Qi", "Qb = {Q} - {Qi}", Ref::hec22_2009,
                         " ch. 4, interception"};
constexpr Formula lip_depth{"inlet.sag_lip_depth", "Depth at the lip of the curb opening",
                            "di = d + a", "di = {d} + {a}", Ref::hec22_2009,
                            " ch. 4, curb-opening inlets in sags"};
constexpr Formula curb_weir_depressed{
    "inlet.sag_curb_weir", "Curb opening in the sag, weir flow (depressed gutter)",
    "Qw = Cw (L + 1.8 W) d^1.5", "Qw = {Cw} x ({L} + 1.8 x {W}) x {d}^1.5", Ref::hec22_2009,
    " ch. 4, curb-opening inlets in sags"};
constexpr Formula curb_weir_plain{
    "inlet.sag_curb_weir", "Curb opening in the sag, weir flow", "Qw = Cw L d^1.5",
    "Qw = {Cw} x {L} x {d}^1.5", Ref::hec22_2009,
    " ch. 4, curb-opening inlets in sags (no depression, or L > 3.6 m (12 ft))"};
constexpr Formula orifice_head{"inlet.sag_orifice_head", "Head on the centre of the opening",
                               "do = di - h/2", "do = {di} - {h}/2", Ref::hec22_2009,
                               " ch. 4, curb-opening inlets in sags"};
constexpr Formula curb_orifice{
    "inlet.sag_curb_orifice", "Curb opening in the sag, orifice flow", "Qo = Co h L (2 g do)^0.5",
    "Qo = {Co} x {h} x {L} x (2 x {g} x {do})^0.5", Ref::hec22_2009,
    " ch. 4, curb-opening inlets in sags"};
constexpr Formula curb_is_weir{"inlet.sag_capacity", "Capacity in the sag", "Q = Qw (di <= h)",
                               "di = {di} {di:u} <= h = {h} {h:u}: Q = {Qw}", Ref::hec22_2009,
                               " ch. 4, curb-opening inlets in sags"};
constexpr Formula curb_is_orifice{"inlet.sag_capacity", "Capacity in the sag",
                                  "Q = Qo (di >= 1.4 h)",
                                  "di = {di} {di:u} >= 1.4 x {h} {h:u}: Q = {Qo}",
                                  Ref::hec22_2009, " ch. 4, curb-opening inlets in sags"};
constexpr Formula curb_is_transition{
    "inlet.sag_capacity", "Capacity in the sag", "Q = min(Qw, Qo) (h < di < 1.4 h)",
    "Q = min({Qw}, {Qo})", Ref::txdot_hdm,
    " ch. 10, curb inlets in sag configuration (the lesser in the transition)"};
constexpr Formula clogging_factor{"inlet.grate_open_share", "Open share of the grate",
                                  "k = 1 - C/100", "k = 1 - {C}/100", Ref::project_input, ""};
constexpr Formula grate_weir{"inlet.sag_grate_weir", "Grate in the sag, weir flow",
                             "Qw = Cw P k d^1.5", "Qw = {Cw} x {P} x {k} x {d}^1.5",
                             Ref::hec22_2009, " ch. 4, grate inlets in sags"};
constexpr Formula grate_orifice{"inlet.sag_grate_orifice", "Grate in the sag, orifice flow",
                                "Qo = Co A k (2 g d)^0.5",
                                "Qo = {Co} x {A} x {k} x (2 x {g} x {d})^0.5", Ref::hec22_2009,
                                " ch. 4, grate inlets in sags"};
constexpr Formula grate_capacity{"inlet.sag_capacity", "Capacity in the sag", "Q = min(Qw, Qo)",
                                 "Q = min({Qw}, {Qo})", Ref::txdot_hdm,
                                 " ch. 10, grate inlets in sag configurations"};
constexpr Formula grate_clean{
    "inlet.grate_no_clogging", "Grate without a clogging allowance",
    "",
    "clogging C = 0 %: the grate's capacity in the sag assumes clean openings; debris can halve "
    "it (a multiplier of about 0.5 on perimeter and area is recommended)",
    Ref::txdot_hdm, " ch. 10, grate inlets in sag configurations"};
// clang-format on

Quantity exact(std::string s, double v, Unit unit = Unit::none) {
    return qty(std::move(s), v, unit, Shown::exact());
}

/// Se = Sx + S'w Eo (eq. 4-24) for a composite gutter; Sx for a uniform one.
double equivalent_cross_slope(CalcLines &lines, const Gutter &g, double eo, const Sheet &u) {
    if (!g.composite()) {
        return g.cross_slope_m_per_m;
    }
    const double swp = g.depression_m / g.gutter_width_m;
    lines.calc(depression_slope, {u.q_len("a", g.depression_m), u.q_len("W", g.gutter_width_m)},
               u.q_slope("S'w", swp));
    const double se = g.cross_slope_m_per_m + swp * eo;
    lines.calc(equivalent_slope,
               {u.q_slope("Sx", g.cross_slope_m_per_m), u.q_slope("S'w", swp), qty("Eo", eo)},
               u.q_slope("Se", se));
    return se;
}

/// The efficiency line (eq. 4-23), L and LT in sheet units.
double efficiency_line(CalcLines &lines, double l, double lt, const Sheet &u) {
    if (l >= lt) {
        lines.calc(efficiency_full, {u.sheet_len("L", l), u.sheet_len("LT", lt)}, qty("E", 1.0));
        return 1.0;
    }
    const double e = 1.0 - std::pow(1.0 - l / lt, 1.8);
    lines.calc(efficiency_partial, {u.sheet_len("L", l), u.sheet_len("LT", lt)}, qty("E", e));
    return e;
}

} // namespace

WithLines<InletOnGrade> curb_on_grade(const Gutter &gutter, double length_m, double q_m3_s,
                                      units::System system) {
    detail::require_positive("curb opening on grade: length L", length_m);
    const Sheet u{system};
    WithLines<InletOnGrade> out{};
    const auto flow = gutter_spread(gutter, q_m3_s, system);
    out.lines.append(flow.lines);
    const double se = equivalent_cross_slope(out.lines, gutter, flow.value.frontal_ratio, u);
    const double q = u.flow(q_m3_s);
    const double ku = u.us() ? 0.6 : 0.817; // HEC-22 (2009) eq. 4-22
    const double n = gutter.manning_n;
    const double sl = gutter.longitudinal_slope_m_per_m;
    const double lt = ku * std::pow(q, 0.42) * std::pow(sl, 0.3) * std::pow(1.0 / (n * se), 0.6);
    const bool depressed = gutter.composite();
    out.lines.calc(depressed ? length_total_depressed : length_total,
                   {exact("Ku", ku), u.sheet_flow("Q", q), u.q_slope("SL", sl), qty("n", n),
                    u.q_slope(depressed ? "Se" : "Sx", se)},
                   u.sheet_len("LT", lt));
    const double e = efficiency_line(out.lines, u.len(length_m), lt, u);
    const double qi = e * q;
    out.lines.calc(intercepted, {qty("E", e), u.sheet_flow("Q", q)}, u.sheet_flow("Qi", qi));
    out.lines.calc(bypass, {u.sheet_flow("Q", q), u.sheet_flow("Qi", qi)},
                   u.sheet_flow("Qb", q - qi));
    out.value = {q_m3_s, flow.value.spread_m, u.len_si(lt), e, u.flow_si(qi), u.flow_si(q - qi)};
    return out;
}

WithLines<SagCapacity> curb_in_sag(const Gutter &gutter, const CurbInSag &inlet, double depth_m,
                                   units::System system) {
    detail::require_positive("curb opening in sag: length L", inlet.length_m);
    detail::require_positive("curb opening in sag: opening height h", inlet.opening_height_m);
    detail::require_positive("curb opening in sag: depth d", depth_m);
    const Sheet u{system};
    const double l = u.len(inlet.length_m);
    const double h = u.len(inlet.opening_height_m);
    const double d = u.len(depth_m);
    const double a = gutter.composite() ? u.len(gutter.depression_m) : 0.0;
    const double w = gutter.composite() ? u.len(gutter.gutter_width_m) : 0.0;
    WithLines<SagCapacity> out{};
    double di = d;
    if (a > 0.0) {
        di = d + a;
        out.lines.calc(lip_depth, {u.sheet_len("d", d), u.sheet_len("a", a)},
                       u.sheet_len("di", di));
    }
    auto &r = out.value;
    r.regime = di <= h         ? SagRegime::weir
               : di >= 1.4 * h ? SagRegime::orifice
                               : SagRegime::transition;
    const Unit cw_unit = u.us() ? Unit::ft_half_per_s : Unit::m_half_per_s;
    double qw = 0.0;
    double qo = 0.0;
    if (r.regime != SagRegime::orifice) {
        const bool depressed = a > 0.0 && l <= (u.us() ? 12.0 : 3.6);
        if (depressed) {
            const double cw = u.us() ? 2.3 : 1.25;
            qw = cw * (l + 1.8 * w) * std::pow(d, 1.5);
            out.lines.calc(curb_weir_depressed,
                           {exact("Cw", cw, cw_unit), u.sheet_len("L", l), u.sheet_len("W", w),
                            u.sheet_len("d", d)},
                           u.sheet_flow("Qw", qw));
        } else {
            const double cw = u.us() ? 3.0 : 1.60;
            qw = cw * l * std::pow(d, 1.5);
            out.lines.calc(curb_weir_plain,
                           {exact("Cw", cw, cw_unit), u.sheet_len("L", l), u.sheet_len("d", d)},
                           u.sheet_flow("Qw", qw));
        }
    }
    if (r.regime != SagRegime::weir) {
        const double head = di - h / 2.0;
        out.lines.calc(orifice_head, {u.sheet_len("di", di), u.sheet_len("h", h)},
                       u.sheet_len("do", head));
        qo = 0.67 * h * l * std::sqrt(2.0 * u.g() * head);
        out.lines.calc(curb_orifice,
                       {exact("Co", 0.67), u.sheet_len("h", h), u.sheet_len("L", l), u.q_g(),
                        u.sheet_len("do", head)},
                       u.sheet_flow("Qo", qo));
    }
    double q = 0.0;
    if (r.regime == SagRegime::weir) {
        q = qw;
        out.lines.calc(curb_is_weir,
                       {u.sheet_len("di", di), u.sheet_len("h", h), u.sheet_flow("Qw", qw)},
                       u.sheet_flow("Q", q));
    } else if (r.regime == SagRegime::orifice) {
        q = qo;
        out.lines.calc(curb_is_orifice,
                       {u.sheet_len("di", di), u.sheet_len("h", h), u.sheet_flow("Qo", qo)},
                       u.sheet_flow("Q", q));
    } else {
        q = std::min(qw, qo);
        out.lines.calc(curb_is_transition, {u.sheet_flow("Qw", qw), u.sheet_flow("Qo", qo)},
                       u.sheet_flow("Q", q));
    }
    r.capacity_m3_s = u.flow_si(q);
    r.weir_m3_s = u.flow_si(qw);
    r.orifice_m3_s = u.flow_si(qo);
    return out;
}

WithLines<SagCapacity> grate_in_sag(const GrateInSag &grate, double depth_m, units::System system) {
    detail::require_positive("grate in sag: perimeter P", grate.perimeter_m);
    detail::require_positive("grate in sag: clear opening area A", grate.clear_area_m2);
    detail::require_positive("grate in sag: depth d", depth_m);
    if (!std::isfinite(grate.clogging_percent) || grate.clogging_percent < 0.0 ||
        grate.clogging_percent >= 100.0) {
        throw_input_error("grate in sag: clogging C",
                          "value " + full(grate.clogging_percent) + " % is out of range",
                          "0 <= C < 100 (percent)");
    }
    const Sheet u{system};
    WithLines<SagCapacity> out{};
    if (grate.clogging_percent == 0.0) {
        out.lines.warn(grate_clean);
    }
    const double k = 1.0 - grate.clogging_percent / 100.0;
    out.lines.calc(clogging_factor, {qty("C", grate.clogging_percent, Unit::percent)}, qty("k", k));
    const double p = u.len(grate.perimeter_m);
    const double area = u.area(grate.clear_area_m2);
    const double d = u.len(depth_m);
    const double cw = u.us() ? 3.0 : 1.66;
    const double qw = cw * p * k * std::pow(d, 1.5);
    out.lines.calc(grate_weir,
                   {exact("Cw", cw, u.us() ? Unit::ft_half_per_s : Unit::m_half_per_s),
                    u.sheet_len("P", p), qty("k", k), u.sheet_len("d", d)},
                   u.sheet_flow("Qw", qw));
    const double qo = 0.67 * area * k * std::sqrt(2.0 * u.g() * d);
    out.lines.calc(
        grate_orifice,
        {exact("Co", 0.67), u.sheet_area("A", area), qty("k", k), u.q_g(), u.sheet_len("d", d)},
        u.sheet_flow("Qo", qo));
    const double q = std::min(qw, qo);
    out.lines.calc(grate_capacity, {u.sheet_flow("Qw", qw), u.sheet_flow("Qo", qo)},
                   u.sheet_flow("Q", q));
    out.value = {u.flow_si(q), u.flow_si(qw), u.flow_si(qo),
                 qw <= qo ? SagRegime::weir : SagRegime::orifice};
    return out;
}

} // namespace catchpeak::hydraulics
