// SPDX-License-Identifier: MIT
#include "catchpeak/hydraulics/channel.hpp"

#include "roots.hpp"
#include "sheet.hpp"

#include <cmath>

namespace catchpeak::hydraulics {

namespace {

constexpr Formula trapezoid_normal{
    "culvert.tailwater_normal_depth",
    "Tailwater, normal depth in the outlet channel",
    "yn: Q = (Kn/n) A R^(2/3) S^(1/2), A = (b + z y) y, P = b + 2 y (1 + z^2)^(1/2) (TOMS 748)",
    "Q = {Q}, b = {b}, z = {z}, n = {n}, S = {S}, Kn = {Kn}; solved to a relative {tol}",
    Ref::chow_1959,
    " ch. 5, Manning formula"};

} // namespace

WithLines<double> normal_depth_m(const Trapezoid &channel, double q_m3_s, units::System system) {
    detail::require_positive("outlet channel: flow Q", q_m3_s);
    detail::require_non_negative("outlet channel: bottom width b", channel.bottom_width_m);
    detail::require_non_negative("outlet channel: side slope z", channel.side_slope_h_per_v);
    detail::require_positive("outlet channel: Manning n", channel.manning_n);
    detail::require_positive("outlet channel: slope S", channel.slope_m_per_m);
    if (channel.bottom_width_m == 0.0 && channel.side_slope_h_per_v == 0.0) {
        throw_input_error("outlet channel", "bottom width and side slope are both 0",
                          "b > 0 or z > 0");
    }
    const detail::Sheet u{system};
    const double b = u.len(channel.bottom_width_m);
    const double z = channel.side_slope_h_per_v;
    const double q = u.flow(q_m3_s);
    const double k = u.kn() / channel.manning_n * std::sqrt(channel.slope_m_per_m);
    const auto discharge = [&](double y) {
        const double a = (b + z * y) * y;
        const double p = b + 2.0 * y * std::sqrt(1.0 + z * z);
        return k * a * std::pow(a / p, 2.0 / 3.0) - q;
    };
    // The discharge grows without bound with depth: widen the bracket until it holds the root.
    double hi = 1.0;
    while (discharge(hi) < 0.0) {
        hi *= 2.0;
    }
    const double yn = detail::solve_bracketed(discharge, hi * 1e-12, hi, "channel normal depth");
    WithLines<double> out{};
    out.lines.calc(trapezoid_normal,
                   {u.sheet_flow("Q", q), u.sheet_len("b", b), qty("z", z),
                    qty("n", channel.manning_n), u.q_slope("S", channel.slope_m_per_m), u.q_kn(),
                    qty("tol", detail::root_tolerance, Unit::none, Shown::sig(2))},
                   u.sheet_len("yn", yn));
    out.value = u.len_si(yn);
    return out;
}

} // namespace catchpeak::hydraulics
