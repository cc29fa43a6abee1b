// SPDX-License-Identifier: MIT
// Outlet control headwater, FHWA HDS-5 (2012) ch. 3: full-flow losses, the tailwater or
// (dc + D)/2, HWo = H + ho - L So.
#include "catchpeak/hydraulics/culvert.hpp"

#include "flow_lines.hpp"
#include "sheet.hpp"

#include <algorithm>
#include <cmath>

namespace catchpeak::hydraulics {

using detail::Sheet;

namespace {

// clang-format off
constexpr Formula velocity_full{"culvert.velocity_full", "Barrel velocity, full", "V = Q/(N A)",
                                "V = {Q}/({N} x {A})", Ref::hds5_2012, " ch. 3, outlet control"};
// HDS-5 (2012) ch. 3 prints the full-flow loss with Ku = 19.63 SI, 29 US and R^1.33 (the
// constants and the exponent from memory, not checked against the printed page).
constexpr Formula head_loss{"culvert.outlet_head_loss", "Head loss, full flow",
                            "H = (1 + ke + Ku n^2 L/R^1.33) V^2/(2 g)",
                            "H = (1 + {ke} + {Ku} x {n}^2 x {L}/{R}^1.33) x {V}^2/(2 x {g})",
                            Ref::hds5_2012, " ch. 3, outlet control (Ku = 19.63 SI, 29 US)"};
constexpr Formula outlet_datum{"culvert.outlet_datum", "Outlet control datum",
                               "ho = max(TW, (dc + D)/2)", "ho = max({TW}, ({dc} + {D})/2)",
                               Ref::hds5_2012, " ch. 3, outlet control"};
constexpr Formula hw_outlet{"culvert.hw_outlet", "Headwater, outlet control", "HWo = H + ho - L So",
                            "HWo = {H} + {ho} - {L} x {So}", Ref::hds5_2012,
                            " ch. 3, outlet control"};
// HDS-5 (2012) ch. 3: the approximate datum (dc + D)/2 holds while the barrel flows full over
// part of its length; below about HW = 0.75 D a backwater computation is needed (the 0.75 D
// from memory, not checked).
constexpr Formula partly_full{"culvert.partly_full", "Outlet control, barrel partly full", "",
                              "HWo = {HWo} {HWo:u} is below 0.75 D = {lim} {lim:u}: the barrel "
                              "flows partly full over its length and the full-flow method only "
                              "approximates the headwater; a backwater computation is exact",
                              Ref::hds5_2012, " ch. 3, outlet control"};
// clang-format on

} // namespace

WithLines<OutletControl> outlet_control(const Culvert &c, double q_m3_s, double tailwater_m,
                                        units::System system) {
    detail::require_positive("outlet control: flow Q", q_m3_s);
    detail::require_non_negative("outlet control: tailwater depth", tailwater_m);
    detail::require_positive("culvert: Manning n", c.manning_n);
    detail::require_positive("culvert: length L", c.length_m);
    const Sheet u{system};
    const Section v = detail::in_sheet(c.section, u);
    WithLines<OutletControl> out{};
    OutletControl &r = out.value;
    const double q = u.flow(q_m3_s);
    const FlowArea f = full_flow_area(v);
    const double n_barrels = static_cast<double>(c.barrels);
    const double vel = q / (n_barrels * f.area);
    out.lines.calc(velocity_full,
                   {u.sheet_flow("Q", q), qty("N", n_barrels, Unit::none, Shown::integer()),
                    u.sheet_area("A", f.area)},
                   u.sheet_vel("V", vel));
    const double ku = u.us() ? 29.0 : 19.63;
    const double len = u.len(c.length_m);
    const double rad = f.hydraulic_radius();
    const double h =
        (1.0 + c.inlet.ke + ku * c.manning_n * c.manning_n * len / std::pow(rad, 1.33)) * vel *
        vel / (2.0 * u.g());
    out.lines.calc(head_loss,
                   {qty("ke", c.inlet.ke), qty("Ku", ku, Unit::none, Shown::exact()),
                    qty("n", c.manning_n), u.sheet_len("L", len), u.sheet_len("R", rad),
                    u.sheet_vel("V", vel), u.q_g()},
                   u.sheet_len("H", h));
    const WithLines<double> dc = critical_depth_m(c.section, q_m3_s / n_barrels, system);
    out.lines.append(dc.lines);
    const double dc_sheet = u.len(dc.value);
    const double tw = u.len(tailwater_m);
    const double ho = std::max(tw, (dc_sheet + v.rise_m) / 2.0);
    out.lines.calc(outlet_datum,
                   {u.sheet_len("TW", tw), u.sheet_len("dc", dc_sheet), u.sheet_len("D", v.rise_m)},
                   u.sheet_len("ho", ho));
    const double hw = h + ho - len * c.slope_m_per_m;
    out.lines.calc(hw_outlet,
                   {u.sheet_len("H", h), u.sheet_len("ho", ho), u.sheet_len("L", len),
                    u.q_slope("So", c.slope_m_per_m)},
                   u.sheet_len("HWo", hw));
    r.partly_full = hw < 0.75 * v.rise_m;
    if (r.partly_full) {
        out.lines.warn(partly_full, {u.sheet_len("HWo", hw), u.sheet_len("lim", 0.75 * v.rise_m)});
    }
    r.velocity_full_m_s = u.vel_si(vel);
    r.head_loss_m = u.len_si(h);
    r.critical_depth_m = dc.value;
    r.ho_m = u.len_si(ho);
    r.hw_m = u.len_si(hw);
    return out;
}

} // namespace catchpeak::hydraulics
