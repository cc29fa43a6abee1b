// SPDX-License-Identifier: MIT
#include "catchpeak/hydraulics/gutter.hpp"

#include "roots.hpp"
#include "sheet.hpp"

#include <cmath>

namespace catchpeak::hydraulics {

using detail::Sheet;

namespace {

// clang-format off
constexpr Formula flow_uniform{
    "gutter.flow_uniform", "Gutter flow at the spread, uniform cross slope",
    "Q = (Ku/n) Sx^1.67 SL^0.5 T^2.67",
    "Q = ({Ku}/{n}) x {Sx}^1.67 x {SL}^0.5 x {T}^2.67", Ref::hec22_2009, " eq. 4-2"};
constexpr Formula spread_uniform{
    "gutter.spread_uniform", "Spread, uniform cross slope",
    "T = (Q n/(Ku Sx^1.67 SL^0.5))^(1/2.67)",
    "T = ({Q} x {n}/({Ku} x {Sx}^1.67 x {SL}^0.5))^(1/2.67)", Ref::hec22_2009,
    " eq. 4-2 solved for T"};
constexpr Formula depth_uniform{"gutter.depth", "Depth at the curb", "d = T Sx",
                                "d = {T} x {Sx}", Ref::hec22_2009, " ch. 4, d = T Sx"};
constexpr Formula depth_composite{"gutter.depth", "Depth at the curb", "d = T Sx + a",
                                  "d = {T} x {Sx} + {a}", Ref::hec22_2009,
                                  " ch. 4, composite gutter sections"};
constexpr Formula gutter_slope{"gutter.gutter_slope", "Cross slope of the gutter section",
                               "Sw = Sx + a/W", "Sw = {Sx} + {a}/{W}", Ref::hec22_2009,
                               " ch. 4, composite gutter sections"};
constexpr Formula frontal_ratio{
    "gutter.frontal_ratio", "Ratio of frontal flow (width W) to gutter flow",
    "Eo = 1/(1 + (Sw/Sx)/((1 + (Sw/Sx)/(T/W - 1))^2.67 - 1))",
    "Eo = 1/(1 + ({Sw}/{Sx})/((1 + ({Sw}/{Sx})/({T}/{W} - 1))^2.67 - 1))", Ref::hec22_2009,
    " eq. 4-4"};
constexpr Formula side_spread{"gutter.side_spread", "Spread beyond the gutter section",
                              "Ts = T - W", "Ts = {T} - {W}", Ref::hec22_2009,
                              " ch. 4, composite gutter sections"};
constexpr Formula side_flow{
    "gutter.side_flow", "Flow beyond the gutter section", "Qs = (Ku/n) Sx^1.67 SL^0.5 Ts^2.67",
    "Qs = ({Ku}/{n}) x {Sx}^1.67 x {SL}^0.5 x {Ts}^2.67", Ref::hec22_2009, " eq. 4-2"};
constexpr Formula flow_composite{"gutter.flow_composite",
                                 "Gutter flow at the spread, composite gutter", "Q = Qs/(1 - Eo)",
                                 "Q = {Qs}/(1 - {Eo})", Ref::hec22_2009,
                                 " ch. 4, composite gutter sections"};
constexpr Formula flow_within{
    "gutter.flow_within_gutter", "Gutter flow, spread within the gutter section",
    "Q = (Ku/n) Sw^1.67 SL^0.5 T^2.67 (T <= W)",
    "Q = ({Ku}/{n}) x {Sw}^1.67 x {SL}^0.5 x {T}^2.67", Ref::hec22_2009, " eq. 4-2"};
constexpr Formula spread_within{
    "gutter.spread_within_gutter", "Spread within the gutter section",
    "T = (Q n/(Ku Sw^1.67 SL^0.5))^(1/2.67) (T <= W)",
    "T = ({Q} x {n}/({Ku} x {Sw}^1.67 x {SL}^0.5))^(1/2.67)", Ref::hec22_2009,
    " eq. 4-2 solved for T"};
constexpr Formula spread_composite{
    "gutter.spread_composite", "Spread, composite gutter",
    "T: Q = Qs/(1 - Eo) at spread T (eq. 4-2 over Ts = T - W, eq. 4-4; TOMS 748)",
    "Q = {Q}, n = {n}, Sx = {Sx}, Sw = {Sw}, W = {W}, SL = {SL}, Ku = {Ku}; solved to a "
    "relative {tol}",
    Ref::hec22_2009, " eq. 4-2, 4-4"};
// clang-format on

/// HEC-22 (2009) eq. 4-2: Ku = 0.376 SI, 0.56 US.
double ku_gutter(const Sheet &u) noexcept { return u.us() ? 0.56 : 0.376; }

/// The gutter in sheet units, its inputs checked.
struct SheetGutter {
    double sx, sl, n, w, a, sw, ku;
};

SheetGutter checked(const Gutter &g, const Sheet &u) {
    detail::require_positive("gutter: cross slope Sx", g.cross_slope_m_per_m);
    detail::require_positive("gutter: longitudinal slope SL", g.longitudinal_slope_m_per_m);
    detail::require_positive("gutter: Manning n", g.manning_n);
    detail::require_non_negative("gutter: gutter width W", g.gutter_width_m);
    detail::require_non_negative("gutter: gutter depression a", g.depression_m);
    if (g.depression_m > 0.0 && g.gutter_width_m == 0.0) {
        throw_input_error("gutter", "a gutter depression a is given without a gutter width W",
                          "W > 0 with a > 0, or both 0 for a uniform cross slope");
    }
    return {g.cross_slope_m_per_m,
            g.longitudinal_slope_m_per_m,
            g.manning_n,
            g.composite() ? u.len(g.gutter_width_m) : 0.0,
            g.composite() ? u.len(g.depression_m) : 0.0,
            g.gutter_slope_m_per_m(),
            ku_gutter(u)};
}

/// Eq. 4-2 for a triangle of cross slope `s` and spread `t` (sheet units).
double triangle_flow(const SheetGutter &g, double s, double t) noexcept {
    return g.ku / g.n * std::pow(s, 1.67) * std::sqrt(g.sl) * std::pow(t, 2.67);
}

Quantity q_ku(double ku) { return qty("Ku", ku, Unit::none, Shown::exact()); }

/// The composite gutter's flow at T > W, as the sum of the flow in W and beyond it: the same
/// as Qs/(1 - Eo) (eq. 4-4 is their ratio), and finite as T approaches W.
double composite_flow(const SheetGutter &g, double t) noexcept {
    const double ts = t - g.w;
    const double frontal = triangle_flow(g, g.sw, (ts * g.sx + g.w * g.sw) / g.sw) -
                           triangle_flow(g, g.sw, ts * g.sx / g.sw);
    return frontal + triangle_flow(g, g.sx, ts);
}

void gutter_slope_line(CalcLines &lines, const SheetGutter &g, const Sheet &u) {
    lines.calc(gutter_slope, {u.q_slope("Sx", g.sx), u.sheet_len("a", g.a), u.sheet_len("W", g.w)},
               u.q_slope("Sw", g.sw));
}

/// The lines of a composite gutter's flow at spread t > W (sheet units); returns Q and Eo.
std::pair<double, double> composite_lines(CalcLines &lines, const SheetGutter &g, double t,
                                          const Sheet &u) {
    const double eo = composite_frontal_ratio(g.sw / g.sx, t / g.w);
    lines.calc(
        frontal_ratio,
        {u.q_slope("Sw", g.sw), u.q_slope("Sx", g.sx), u.sheet_len("T", t), u.sheet_len("W", g.w)},
        qty("Eo", eo));
    const double ts = t - g.w;
    lines.calc(side_spread, {u.sheet_len("T", t), u.sheet_len("W", g.w)}, u.sheet_len("Ts", ts));
    const double qs = triangle_flow(g, g.sx, ts);
    lines.calc(side_flow,
               {q_ku(g.ku), qty("n", g.n), u.q_slope("Sx", g.sx), u.q_slope("SL", g.sl),
                u.sheet_len("Ts", ts)},
               u.sheet_flow("Qs", qs));
    const double q = qs / (1.0 - eo);
    lines.calc(flow_composite, {u.sheet_flow("Qs", qs), qty("Eo", eo)}, u.sheet_flow("Q", q));
    return {q, eo};
}

void depth_line(CalcLines &lines, const SheetGutter &g, double t, GutterFlow &out, const Sheet &u) {
    const double d = t * g.sx + g.a;
    if (g.a > 0.0) {
        lines.calc(depth_composite,
                   {u.sheet_len("T", t), u.q_slope("Sx", g.sx), u.sheet_len("a", g.a)},
                   u.sheet_len("d", d));
    } else {
        lines.calc(depth_uniform, {u.sheet_len("T", t), u.q_slope("Sx", g.sx)},
                   u.sheet_len("d", d));
    }
    out.spread_m = u.len_si(t);
    out.depth_m = u.len_si(d);
}

} // namespace

double composite_frontal_ratio(double sw_over_sx, double t_over_w) noexcept {
    const double r = sw_over_sx;
    return 1.0 / (1.0 + r / (std::pow(1.0 + r / (t_over_w - 1.0), 2.67) - 1.0));
}

WithLines<GutterFlow> gutter_flow_at_spread(const Gutter &gutter, double spread_m,
                                            units::System system) {
    const Sheet u{system};
    const SheetGutter g = checked(gutter, u);
    detail::require_positive("gutter: spread T", spread_m);
    const double t = u.len(spread_m);
    WithLines<GutterFlow> out{};
    if (g.a == 0.0) {
        const double q = triangle_flow(g, g.sx, t);
        out.lines.calc(flow_uniform,
                       {q_ku(g.ku), qty("n", g.n), u.q_slope("Sx", g.sx), u.q_slope("SL", g.sl),
                        u.sheet_len("T", t)},
                       u.sheet_flow("Q", q));
        out.value.flow_m3_s = u.flow_si(q);
    } else {
        gutter_slope_line(out.lines, g, u);
        if (t <= g.w) {
            const double q = triangle_flow(g, g.sw, t);
            out.lines.calc(flow_within,
                           {q_ku(g.ku), qty("n", g.n), u.q_slope("Sw", g.sw), u.q_slope("SL", g.sl),
                            u.sheet_len("T", t)},
                           u.sheet_flow("Q", q));
            out.value.flow_m3_s = u.flow_si(q);
            out.value.frontal_ratio = 1.0;
        } else {
            const auto [q, eo] = composite_lines(out.lines, g, t, u);
            out.value.flow_m3_s = u.flow_si(q);
            out.value.frontal_ratio = eo;
        }
    }
    depth_line(out.lines, g, t, out.value, u);
    return out;
}

WithLines<GutterFlow> gutter_spread(const Gutter &gutter, double q_m3_s, units::System system) {
    const Sheet u{system};
    const SheetGutter g = checked(gutter, u);
    detail::require_positive("gutter: flow Q", q_m3_s);
    const double q = u.flow(q_m3_s);
    WithLines<GutterFlow> out{};
    out.value.flow_m3_s = q_m3_s;
    const auto closed_form = [&](const Formula &f, const char *slope, double s) {
        const double t =
            std::pow(q * g.n / (g.ku * std::pow(s, 1.67) * std::sqrt(g.sl)), 1.0 / 2.67);
        out.lines.calc(f,
                       {u.sheet_flow("Q", q), qty("n", g.n), q_ku(g.ku), u.q_slope(slope, s),
                        u.q_slope("SL", g.sl)},
                       u.sheet_len("T", t));
        return t;
    };
    if (g.a == 0.0) {
        depth_line(out.lines, g, closed_form(spread_uniform, "Sx", g.sx), out.value, u);
        return out;
    }
    gutter_slope_line(out.lines, g, u);
    if (q <= triangle_flow(g, g.sw, g.w)) {
        out.value.frontal_ratio = 1.0;
        depth_line(out.lines, g, closed_form(spread_within, "Sw", g.sw), out.value, u);
        return out;
    }
    const auto residual = [&](double t) { return composite_flow(g, t) - q; };
    double hi = 2.0 * g.w;
    while (residual(hi) < 0.0) {
        hi *= 2.0;
    }
    const double t = detail::solve_bracketed(residual, g.w, hi, "composite gutter spread");
    out.lines.calc(spread_composite,
                   {u.sheet_flow("Q", q), qty("n", g.n), u.q_slope("Sx", g.sx),
                    u.q_slope("Sw", g.sw), u.sheet_len("W", g.w), u.q_slope("SL", g.sl), q_ku(g.ku),
                    qty("tol", detail::root_tolerance, Unit::none, Shown::sig(2))},
                   u.sheet_len("T", t));
    out.value.frontal_ratio = composite_lines(out.lines, g, t, u).second;
    depth_line(out.lines, g, t, out.value, u);
    return out;
}

} // namespace catchpeak::hydraulics
