// SPDX-License-Identifier: MIT
// Inlet control headwater, FHWA HDS-5 (2012) appendix A, eq. A.1 to A.3.
#include "catchpeak/hydraulics/culvert.hpp"

#include "flow_lines.hpp"
#include "sheet.hpp"

#include <cmath>

namespace catchpeak::hydraulics {

using detail::Sheet;

namespace {

// The unsubmerged equations hold for Ku Q/(A D^0.5) <= 3.5, the submerged one for >= 4.0
// (HDS-5 (2012) A.2; 1.93 and 2.21 in SI, the same numbers times Ku = 1.811).
constexpr double x_unsubmerged_max = 3.5;
constexpr double x_submerged_min = 4.0;

// clang-format off
constexpr Formula flow_per_barrel{"culvert.flow_per_barrel", "Flow per barrel", "Qb = Q/N",
                                  "Qb = {Q}/{N}", Ref::none, "N barrels share the flow equally"};
constexpr Formula inlet_parameter{"culvert.inlet_parameter", "Inlet control discharge parameter",
                                  "X = Ku Q/(A D^0.5)", "X = {Ku} x {Q}/({A} x {D}^0.5)",
                                  Ref::hds5_2012, " eq. A.1 to A.3 (Ku = 1.811 SI, 1.0 US)"};
constexpr Formula critical_area_circle{
    "culvert.critical_area", "Flow area at critical depth",
    "Ac = D^2/8 (t - sin t), t = 2 acos(1 - 2 dc/D)",
    "Ac = {D}^2/8 x (t - sin t), t = 2 acos(1 - 2 x {y}/{D})", Ref::none,
    "geometry of the section"};
constexpr Formula critical_area_box{"culvert.critical_area", "Flow area at critical depth",
                                    "Ac = B dc", "Ac = {B} x {y}", Ref::none,
                                    "geometry of the section"};
constexpr Formula critical_head{"culvert.critical_head", "Specific head at critical depth",
                                "Hc = dc + (Q/Ac)^2/(2 g)", "Hc = {dc} + ({Q}/{Ac})^2/(2 x {g})",
                                Ref::hds5_2012, " eq. A.1 (Hc = dc + Vc^2/2g)"};
constexpr Formula unsubmerged_form1{
    "culvert.inlet_unsubmerged", "Inlet control, unsubmerged (form 1)",
    "HWi/D = Hc/D + K (Ku Q/(A D^0.5))^M + Ks S",
    "HWi/D = {Hc}/{D} + {K} x {X}^{M} + ({Ks}) x {S}", Ref::hds5_2012, " eq. A.1; {row}"};
constexpr Formula unsubmerged_form2{"culvert.inlet_unsubmerged",
                                    "Inlet control, unsubmerged (form 2)",
                                    "HWi/D = K (Ku Q/(A D^0.5))^M", "HWi/D = {K} x {X}^{M}",
                                    Ref::hds5_2012, " eq. A.2; {row}"};
constexpr Formula submerged{"culvert.inlet_submerged", "Inlet control, submerged",
                            "HWi/D = c (Ku Q/(A D^0.5))^2 + Y + Ks S",
                            "HWi/D = {c} x {X}^2 + {Y} + ({Ks}) x {S}", Ref::hds5_2012,
                            " eq. A.3; {row}"};
constexpr Formula transition{
    "culvert.inlet_transition", "Inlet control, transition",
    "HWi/D = H1 + (X - 3.5)/(4.0 - 3.5) (H2 - H1), H1 = eq. A.1/A.2 at X = 3.5, H2 = eq. A.3 at "
    "X = 4.0",
    "HWi/D = {H1} + ({X} - 3.5)/(4.0 - 3.5) x ({H2} - {H1})", Ref::hds5_2012,
    " A.2 transition zone (a curve between the two; the straight line is common practice, no "
    "source)"};
constexpr Formula hw_inlet{"culvert.hw_inlet", "Headwater, inlet control", "HWi = (HWi/D) D",
                           "HWi = {r} x {D}", Ref::hds5_2012, " appendix A"};
// clang-format on

double ku(const Sheet &u) noexcept { return u.us() ? 1.0 : 1.811; }

/// Unsubmerged HWi/D at the barrel flow `q` (sheet units) whose parameter is `x`.
double unsubmerged_ratio(CalcLines &lines, const Culvert &c, const Section &v, double q, double x,
                         const Sheet &u) {
    const InletRow &r = c.inlet;
    const Quantity row = word("row", r.source);
    if (r.form == InletForm::form2) {
        const double ratio = r.k * std::pow(x, r.m);
        lines.calc(unsubmerged_form2, {qty("K", r.k), qty("X", x), qty("M", r.m), row},
                   qty("HWi/D", ratio));
        return ratio;
    }
    const WithLines<double> dc = critical_depth_m(
        Section{v.shape, u.len_si(v.span_m), u.len_si(v.rise_m)}, u.flow_si(q), u.system);
    lines.append(dc.lines);
    const double dc_sheet = u.len(dc.value);
    const double ac =
        detail::area_line(lines, {critical_area_circle, critical_area_box}, v, dc_sheet, "Ac", u);
    const double vc = q / ac;
    const double hc = dc_sheet + vc * vc / (2.0 * u.g());
    lines.calc(critical_head,
               {u.sheet_len("dc", dc_sheet), u.sheet_flow("Q", q), u.sheet_area("Ac", ac), u.q_g()},
               u.sheet_len("Hc", hc));
    const double ratio = hc / v.rise_m + r.k * std::pow(x, r.m) + r.ks * c.slope_m_per_m;
    lines.calc(unsubmerged_form1,
               {u.sheet_len("Hc", hc), u.sheet_len("D", v.rise_m), qty("K", r.k), qty("X", x),
                qty("M", r.m), qty("Ks", r.ks), u.q_slope("S", c.slope_m_per_m), row},
               qty("HWi/D", ratio));
    return ratio;
}

double submerged_ratio(CalcLines &lines, const Culvert &c, double x, const Sheet &u) {
    const InletRow &r = c.inlet;
    const double ratio = r.c * x * x + r.y + r.ks * c.slope_m_per_m;
    lines.calc(submerged,
               {qty("c", r.c), qty("X", x), qty("Y", r.y), qty("Ks", r.ks),
                u.q_slope("S", c.slope_m_per_m), word("row", r.source)},
               qty("HWi/D", ratio));
    return ratio;
}

} // namespace

WithLines<InletControl> inlet_control(const Culvert &c, double q_m3_s, units::System system) {
    detail::require_positive("inlet control: flow Q", q_m3_s);
    if (c.barrels < 1) {
        throw_input_error("culvert: number of barrels", std::to_string(c.barrels), "1 or more");
    }
    const Sheet u{system};
    const Section v = detail::in_sheet(c.section, u);
    WithLines<InletControl> out{};
    const WithLines<FlowArea> full = full_flow(c.section, system);
    out.lines.append(full.lines);
    double q = u.flow(q_m3_s);
    if (c.barrels > 1) {
        const double qb = q / c.barrels;
        out.lines.calc(flow_per_barrel,
                       {u.sheet_flow("Q", q), qty("N", c.barrels, Unit::none, Shown::integer())},
                       u.sheet_flow("Qb", qb));
        q = qb;
    }
    const double a = full_flow_area(v).area;
    const double root_d = std::sqrt(v.rise_m);
    const double x = ku(u) * q / (a * root_d);
    out.lines.calc(inlet_parameter,
                   {qty("Ku", ku(u), Unit::none, Shown::exact()), u.sheet_flow("Q", q),
                    u.sheet_area("A", a), u.sheet_len("D", v.rise_m)},
                   qty("X", x));
    InletControl &r = out.value;
    r.x = x;
    if (x <= x_unsubmerged_max) {
        r.regime = InletRegime::unsubmerged;
        r.hw_over_d = unsubmerged_ratio(out.lines, c, v, q, x, u);
    } else if (x >= x_submerged_min) {
        r.regime = InletRegime::submerged;
        r.hw_over_d = submerged_ratio(out.lines, c, x, u);
    } else {
        r.regime = InletRegime::transition;
        const double q1 = x_unsubmerged_max * a * root_d / ku(u);
        const double h1 = unsubmerged_ratio(out.lines, c, v, q1, x_unsubmerged_max, u);
        const double h2 = submerged_ratio(out.lines, c, x_submerged_min, u);
        r.hw_over_d =
            h1 + (x - x_unsubmerged_max) / (x_submerged_min - x_unsubmerged_max) * (h2 - h1);
        out.lines.calc(transition, {qty("H1", h1), qty("H2", h2), qty("X", x)},
                       qty("HWi/D", r.hw_over_d));
    }
    const double hw = r.hw_over_d * v.rise_m;
    out.lines.calc(hw_inlet, {qty("r", r.hw_over_d), u.sheet_len("D", v.rise_m)},
                   u.sheet_len("HWi", hw));
    r.hw_m = u.len_si(hw);
    return out;
}

} // namespace catchpeak::hydraulics
