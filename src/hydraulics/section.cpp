// SPDX-License-Identifier: MIT
#include "catchpeak/hydraulics/section.hpp"

#include "flow_lines.hpp"
#include "roots.hpp"
#include "sheet.hpp"

#include <boost/math/tools/minima.hpp>

#include <cmath>
#include <numbers>

namespace catchpeak::hydraulics {

using detail::in_sheet;
using detail::Sheet;

namespace {

constexpr double pi = std::numbers::pi;

// clang-format off
constexpr Formula area_circle{"culvert.area_full", "Barrel area, full", "A = pi D^2/4",
                              "A = pi x {D}^2/4", Ref::none, "geometry of the section"};
constexpr Formula area_box{"culvert.area_full", "Barrel area, full", "A = B D",
                           "A = {B} x {D}", Ref::none, "geometry of the section"};
constexpr Formula perimeter_circle{"culvert.perimeter_full", "Wetted perimeter, full",
                                   "P = pi D", "P = pi x {D}", Ref::none,
                                   "geometry of the section"};
constexpr Formula perimeter_box{"culvert.perimeter_full", "Wetted perimeter, full",
                                "P = 2 (B + D)", "P = 2 x ({B} + {D})", Ref::none,
                                "geometry of the section"};
constexpr Formula radius_full{"culvert.radius_full", "Hydraulic radius, full", "R = A/P",
                              "R = {A}/{P}", Ref::none, "geometry of the section"};
constexpr Formula critical_circle{
    "culvert.critical_depth", "Critical depth",
    "dc: Q^2 T = g A^3, A and T of the circle at depth dc (TOMS 748)",
    "Q = {Q}, D = {D}, g = {g}; solved to a relative {tol}", Ref::chow_1959,
    " ch. 4, critical-flow criterion"};
constexpr Formula critical_box{"culvert.critical_depth", "Critical depth",
                               "dc = (Q^2/(g B^2))^(1/3) (Q^2 T = g A^3, TOMS 748)",
                               "dc = ({Q}^2/({g} x {B}^2))^(1/3)", Ref::chow_1959,
                               " ch. 4, critical-flow criterion"};
constexpr Formula critical_capped{"culvert.critical_depth_capped", "Critical depth at most the rise",
                                  "dc = min(dc, D)", "dc = min({dc0}, {D})", Ref::hds5_2012,
                                  " ch. 3, outlet control (dc <= D)"};
constexpr Formula capacity{"culvert.full_capacity", "Full-flow capacity, Manning",
                           "Qfull = (Kn/n) A R^(2/3) S^(1/2)",
                           "Qfull = ({Kn}/{n}) x {A} x {R}^(2/3) x {S}^0.5", Ref::chow_1959,
                           " ch. 5, Manning formula"};
constexpr Formula normal_barrel{"culvert.barrel_normal_depth", "Normal depth in the barrel",
                                "yn: Q = (Kn/n) A R^(2/3) S^(1/2) at depth yn (TOMS 748)",
                                "Q = {Q}, n = {n}, S = {S}, Kn = {Kn}; solved to a relative {tol}",
                                Ref::chow_1959, " ch. 5, Manning formula"};
constexpr Formula barrel_full{"culvert.barrel_normal_depth", "Normal depth in the barrel",
                              "yn = D when Q exceeds the part-full maximum",
                              "Q = {Q} {Q:u} > Qmax = {Qmax} {Qmax:u}: yn = {D}",
                              Ref::chow_1959, " ch. 5, Manning formula"};
constexpr Formula barrel_flat{"culvert.barrel_normal_depth", "Normal depth in the barrel",
                              "yn = D on a flat or adverse slope (no normal depth)",
                              "S = {S}: yn = {D}", Ref::chow_1959, " ch. 5, Manning formula"};
// clang-format on

Quantity tolerance() { return qty("tol", detail::root_tolerance, Unit::none, Shown::sig(2)); }

double manning_conveyance(const FlowArea &f) {
    return f.area * std::pow(f.hydraulic_radius(), 2.0 / 3.0);
}

} // namespace

FlowArea full_flow_area(const Section &s) noexcept {
    if (s.shape == Shape::circular) {
        const double d = s.span_m;
        return {pi * d * d / 4.0, pi * d, 0.0};
    }
    return {s.span_m * s.rise_m, 2.0 * (s.span_m + s.rise_m), 0.0};
}

FlowArea flow_area_at(const Section &s, double depth) noexcept {
    if (s.shape == Shape::circular) {
        const double d = s.span_m;
        const double theta = 2.0 * std::acos(1.0 - 2.0 * depth / d);
        return {d * d / 8.0 * (theta - std::sin(theta)), d * theta / 2.0,
                d * std::sin(theta / 2.0)};
    }
    return {s.span_m * depth, s.span_m + 2.0 * depth, s.span_m};
}

WithLines<FlowArea> full_flow(const Section &s, units::System system) {
    detail::require_positive("culvert section: span or diameter", s.span_m);
    detail::require_positive("culvert section: rise", s.rise_m);
    const Sheet u{system};
    const Section v = in_sheet(s, u);
    WithLines<FlowArea> out{};
    const FlowArea f = full_flow_area(v);
    if (s.shape == Shape::circular) {
        out.lines.calc(area_circle, {u.sheet_len("D", v.span_m)}, u.sheet_area("A", f.area));
        out.lines.calc(perimeter_circle, {u.sheet_len("D", v.span_m)},
                       u.sheet_len("P", f.wetted_perimeter));
    } else {
        out.lines.calc(area_box, {u.sheet_len("B", v.span_m), u.sheet_len("D", v.rise_m)},
                       u.sheet_area("A", f.area));
        out.lines.calc(perimeter_box, {u.sheet_len("B", v.span_m), u.sheet_len("D", v.rise_m)},
                       u.sheet_len("P", f.wetted_perimeter));
    }
    out.lines.calc(radius_full, {u.sheet_area("A", f.area), u.sheet_len("P", f.wetted_perimeter)},
                   u.sheet_len("R", f.hydraulic_radius()));
    out.value = full_flow_area(s);
    return out;
}

WithLines<double> critical_depth_m(const Section &s, double q_m3_s, units::System system) {
    detail::require_positive("critical depth: flow Q", q_m3_s);
    detail::require_positive("culvert section: span or diameter", s.span_m);
    detail::require_positive("culvert section: rise", s.rise_m);
    const Sheet u{system};
    const Section v = in_sheet(s, u);
    const double q = u.flow(q_m3_s);
    const double g = u.g();
    // Q^2 T / (g A^3) - 1 falls with depth; the circle's top width vanishes at the crown, so the
    // bracket stops just below it and a deeper critical depth is taken as the rise.
    const auto froude = [&](double y) {
        const FlowArea f = flow_area_at(v, y);
        return q * q * f.top_width / (g * f.area * f.area * f.area) - 1.0;
    };
    const double top = v.shape == Shape::circular
                           ? v.rise_m * (1.0 - 1e-9)
                           : 2.0 * std::cbrt(q * q / (g * v.span_m * v.span_m)) + v.rise_m;
    double dc = top;
    const bool beyond = froude(top) >= 0.0;
    if (!beyond) {
        dc = detail::solve_bracketed(froude, v.rise_m * 1e-9, top, "critical depth");
    }
    WithLines<double> out{};
    if (v.shape == Shape::circular) {
        out.lines.calc(critical_circle,
                       {u.sheet_flow("Q", q), u.sheet_len("D", v.rise_m), u.q_g(), tolerance()},
                       u.sheet_len("dc", dc));
    } else {
        out.lines.calc(critical_box, {u.sheet_flow("Q", q), u.sheet_len("B", v.span_m), u.q_g()},
                       u.sheet_len("dc", dc));
    }
    if (beyond || dc > v.rise_m) {
        auto &l =
            out.lines.calc(critical_capped, {u.sheet_len("dc0", dc), u.sheet_len("D", v.rise_m)},
                           u.sheet_len("dc", v.rise_m));
        l.flags.capped = true;
        dc = v.rise_m;
    }
    out.value = u.len_si(dc);
    return out;
}

WithLines<double> full_flow_capacity_m3_s(const Section &s, double manning_n, double slope_m_per_m,
                                          units::System system) {
    detail::require_positive("Manning roughness n", manning_n);
    detail::require_positive("barrel slope S", slope_m_per_m);
    const Sheet u{system};
    WithLines<double> out{};
    const auto geometry = full_flow(s, system);
    out.lines.append(geometry.lines);
    const FlowArea f = full_flow_area(in_sheet(s, u));
    const double q = u.kn() / manning_n * f.area * std::pow(f.hydraulic_radius(), 2.0 / 3.0) *
                     std::sqrt(slope_m_per_m);
    out.lines.calc(capacity,
                   {u.q_kn(), qty("n", manning_n), u.sheet_area("A", f.area),
                    u.sheet_len("R", f.hydraulic_radius()), u.q_slope("S", slope_m_per_m)},
                   u.sheet_flow("Qfull", q));
    out.value = u.flow_si(q);
    return out;
}

WithLines<double> barrel_normal_depth_m(const Section &s, double q_m3_s, double manning_n,
                                        double slope_m_per_m, units::System system) {
    detail::require_positive("normal depth: flow Q", q_m3_s);
    detail::require_positive("Manning roughness n", manning_n);
    const Sheet u{system};
    const Section v = in_sheet(s, u);
    const double q = u.flow(q_m3_s);
    WithLines<double> out{};
    out.value = s.rise_m;
    if (!(slope_m_per_m > 0.0)) {
        out.lines.calc(barrel_flat, {u.q_slope("S", slope_m_per_m), u.sheet_len("D", v.rise_m)},
                       u.sheet_len("yn", v.rise_m));
        return out;
    }
    const double k = u.kn() / manning_n * std::sqrt(slope_m_per_m);
    const auto discharge = [&](double y) { return k * manning_conveyance(flow_area_at(v, y)); };
    // The circle carries most a little below its crown (about 0.94 D); find that depth.
    double y_max = v.rise_m;
    if (v.shape == Shape::circular) {
        const auto neg = [&](double y) { return -discharge(y); };
        y_max = boost::math::tools::brent_find_minima(neg, 0.5 * v.rise_m, v.rise_m,
                                                      detail::root_tolerance_bits / 2)
                    .first;
    }
    const double q_max = discharge(y_max);
    if (q >= q_max) {
        auto &l = out.lines.calc(
            barrel_full,
            {u.sheet_flow("Q", q), u.sheet_flow("Qmax", q_max), u.sheet_len("D", v.rise_m)},
            u.sheet_len("yn", v.rise_m));
        l.flags.capped = true;
        return out;
    }
    const double yn = detail::solve_bracketed([&](double y) { return discharge(y) - q; },
                                              v.rise_m * 1e-9, y_max, "barrel normal depth");
    out.lines.calc(normal_barrel,
                   {u.sheet_flow("Q", q), qty("n", manning_n), u.q_slope("S", slope_m_per_m),
                    u.q_kn(), tolerance()},
                   u.sheet_len("yn", yn));
    out.value = u.len_si(yn);
    return out;
}

} // namespace catchpeak::hydraulics
