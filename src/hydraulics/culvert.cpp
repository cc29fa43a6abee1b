// SPDX-License-Identifier: MIT
// The controlling headwater, the check against the headwater limit, the outlet velocity and
// sizing from a list of standard sizes (FHWA HDS-5 (2012) ch. 3).
#include "catchpeak/hydraulics/culvert.hpp"

#include "flow_lines.hpp"
#include "sheet.hpp"

#include <algorithm>
#include <numeric>

namespace catchpeak::hydraulics {

using detail::Sheet;

namespace {

// clang-format off
constexpr Formula adverse{"culvert.adverse_slope", "Adverse barrel slope", "",
                          "So = {So} {So:u}: the barrel rises toward the outlet; outlet control "
                          "and standing water in the barrel are likely", Ref::hds5_2012,
                          " ch. 3"};
constexpr Formula controlling{"culvert.hw", "Headwater, controlling", "HW = max(HWi, HWo)",
                              "HW = max({HWi}, {HWo}): {control} control", Ref::hds5_2012,
                              " ch. 3, the larger headwater controls"};
constexpr Formula ratio{"culvert.hw_ratio", "Headwater to rise", "HW/D", "HW/D = {HW}/{D}",
                        Ref::hds5_2012, " ch. 3"};
constexpr Formula allowed_both{"culvert.hw_allowed", "Allowed headwater, the stricter limit",
                               "HWa = min(ELa - ELi, (HW/D)a D)",
                               "HWa = min({ELa} - {ELi}, {ra} x {D})", Ref::project_input, ""};
constexpr Formula allowed_elevation{"culvert.hw_allowed", "Allowed headwater", "HWa = ELa - ELi",
                                    "HWa = {ELa} - {ELi}", Ref::project_input, ""};
constexpr Formula allowed_ratio{"culvert.hw_allowed", "Allowed headwater", "HWa = (HW/D)a D",
                                "HWa = {ra} x {D}", Ref::project_input, ""};
constexpr Formula over_limit{"culvert.hw_over_limit", "Headwater over the limit", "",
                             "HW = {HW} {HW:u} exceeds the allowed {HWa} {HWa:u}",
                             Ref::project_input, ""};
// HDS-5 (2012) appendix C: the inlet control charts end near HW/D = 3 (from memory, not
// checked); beyond it the equations are extrapolated.
constexpr Formula beyond_charts{"culvert.beyond_charts", "Headwater beyond the design charts", "",
                                "HWi/D = {r} is beyond the range of the inlet control charts "
                                "(about HW/D = 3); the equations are extrapolated",
                                Ref::hds5_2012, " appendix C (range from memory, not checked)"};
constexpr Formula outlet_depth{"culvert.outlet_depth", "Depth at the outlet, outlet control",
                               "yo = min(max(dc, TW), D)", "yo = min(max({dc}, {TW}), {D})",
                               Ref::hds5_2012, " ch. 3, outlet velocity"};
constexpr Formula outlet_area_circle{"culvert.outlet_area", "Flow area at the outlet",
                                     "Ao = D^2/8 (t - sin t), t = 2 acos(1 - 2 yo/D)",
                                     "Ao = {D}^2/8 x (t - sin t), t = 2 acos(1 - 2 x {y}/{D})",
                                     Ref::none, "geometry of the section"};
constexpr Formula outlet_area_box{"culvert.outlet_area", "Flow area at the outlet", "Ao = B yo",
                                  "Ao = {B} x {y}", Ref::none, "geometry of the section"};
constexpr Formula outlet_velocity{"culvert.outlet_velocity", "Outlet velocity", "Vo = Q/(N Ao)",
                                  "Vo = {Q}/({N} x {Ao})", Ref::hds5_2012, " ch. 3, outlet velocity"};
constexpr Formula size_chosen{"culvert.size_chosen", "Size chosen", "",
                              "{[{s}| x ]} {D:u}: HW = {HW} {HW:u} <= {HWa} {HWa:u}, {control} "
                              "control; the smallest listed size that passes",
                              Ref::hds5_2012, " ch. 3"};
constexpr Formula size_smaller{"culvert.size_smaller_fails", "Next smaller size fails", "",
                               "{[{s}| x ]} {D:u}: HW = {HW} {HW:u} > {HWa} {HWa:u}, {control} "
                               "control", Ref::hds5_2012, " ch. 3"};
constexpr Formula none_passes{"culvert.no_size_passes", "No listed size passes", "",
                              "Q = {Q} {Q:u} is beyond every size listed: the largest, "
                              "{[{s}| x ]} {D:u}, gives HW = {HW} {HW:u} > {HWa} {HWa:u}",
                              Ref::hds5_2012, " ch. 3"};
// clang-format on

double allowed_line(CalcLines &lines, const Site &site, const Section &s, const Sheet &u) {
    const HeadwaterLimit &lim = site.limit;
    const double d = u.len(s.rise_m);
    if (lim.elevation_m && lim.hw_over_d) {
        const double a =
            std::min(u.len(*lim.elevation_m - site.inlet_invert_m), *lim.hw_over_d * d);
        lines.calc(allowed_both,
                   {u.q_elev("ELa", *lim.elevation_m), u.q_elev("ELi", site.inlet_invert_m),
                    qty("ra", *lim.hw_over_d), u.sheet_len("D", d)},
                   u.sheet_len("HWa", a));
        return u.len_si(a);
    }
    if (lim.elevation_m) {
        const double a = u.len(*lim.elevation_m - site.inlet_invert_m);
        lines.calc(allowed_elevation,
                   {u.q_elev("ELa", *lim.elevation_m), u.q_elev("ELi", site.inlet_invert_m)},
                   u.sheet_len("HWa", a));
        return u.len_si(a);
    }
    const double a = *lim.hw_over_d * d;
    lines.calc(allowed_ratio, {qty("ra", *lim.hw_over_d), u.sheet_len("D", d)},
               u.sheet_len("HWa", a));
    return u.len_si(a);
}

/// Outlet velocity: under inlet control at normal depth in the barrel, under outlet control at
/// dc, TW or D (HDS-5 (2012) ch. 3).
double outlet_velocity_line(CalcLines &lines, const Culvert &c, double q_m3_s, const Site &site,
                            const CulvertResult &r, const Sheet &u) {
    const Section v = detail::in_sheet(c.section, u);
    const double n_barrels = static_cast<double>(c.barrels);
    double y = 0.0;
    if (r.control == Control::inlet) {
        const auto yn = barrel_normal_depth_m(c.section, q_m3_s / n_barrels, c.manning_n,
                                              c.slope_m_per_m, u.system);
        lines.append(yn.lines);
        y = u.len(yn.value);
    } else {
        const double dc = u.len(r.outlet.critical_depth_m);
        const double tw = u.len(site.tailwater_depth_m);
        y = std::min(std::max(dc, tw), v.rise_m);
        lines.calc(outlet_depth,
                   {u.sheet_len("dc", dc), u.sheet_len("TW", tw), u.sheet_len("D", v.rise_m)},
                   u.sheet_len("yo", y));
    }
    const double a = detail::area_line(lines, {outlet_area_circle, outlet_area_box}, v, y, "Ao", u);
    const double q = u.flow(q_m3_s);
    const double vo = q / (n_barrels * a);
    lines.calc(outlet_velocity,
               {u.sheet_flow("Q", q), qty("N", n_barrels, Unit::none, Shown::integer()),
                u.sheet_area("Ao", a)},
               u.sheet_vel("Vo", vo));
    return u.vel_si(vo);
}

} // namespace

std::string_view to_string(Control c) noexcept { return c == Control::inlet ? "inlet" : "outlet"; }

WithLines<CulvertResult> analyse(const Culvert &c, double q_m3_s, const Site &site,
                                 units::System system) {
    if (!site.limit.elevation_m && !site.limit.hw_over_d) {
        throw_input_error("culvert: headwater limit", "neither an elevation nor HW/D is given",
                          "an allowed headwater elevation, an allowed HW/D, or both");
    }
    const Sheet u{system};
    WithLines<CulvertResult> out{};
    CulvertResult &r = out.value;
    if (c.slope_m_per_m < 0.0) {
        out.lines.warn(adverse, {u.q_slope("So", c.slope_m_per_m)});
    }
    auto inlet = inlet_control(c, q_m3_s, system);
    out.lines.append(inlet.lines);
    r.inlet = inlet.value;
    if (r.inlet.hw_over_d > 3.0) {
        out.lines.warn(beyond_charts, {qty("r", r.inlet.hw_over_d)});
    }
    auto outlet = outlet_control(c, q_m3_s, site.tailwater_depth_m, system);
    out.lines.append(outlet.lines);
    r.outlet = outlet.value;
    r.control = r.outlet.hw_m > r.inlet.hw_m ? Control::outlet : Control::inlet;
    r.hw_m = std::max(r.inlet.hw_m, r.outlet.hw_m);
    out.lines.calc(controlling,
                   {u.q_len("HWi", r.inlet.hw_m), u.q_len("HWo", r.outlet.hw_m),
                    word("control", std::string(to_string(r.control)))},
                   u.q_len("HW", r.hw_m));
    r.hw_over_d = r.hw_m / c.section.rise_m;
    out.lines.calc(ratio, {u.q_len("HW", r.hw_m), u.q_len("D", c.section.rise_m)},
                   qty("HW/D", r.hw_over_d));
    r.allowed_hw_m = allowed_line(out.lines, site, c.section, u);
    r.passes = r.hw_m <= r.allowed_hw_m;
    if (!r.passes) {
        out.lines.warn(over_limit, {u.q_len("HW", r.hw_m), u.q_len("HWa", r.allowed_hw_m)});
    }
    r.outlet_velocity_m_s = outlet_velocity_line(out.lines, c, q_m3_s, site, r, u);
    return out;
}

namespace {

/// The quantities naming a size and its result, for the sizing notes.
std::vector<Quantity> size_quantities(const Section &s, const CulvertResult &r, const Sheet &u) {
    return {u.q_len("D", s.rise_m), u.q_len("HW", r.hw_m), u.q_len("HWa", r.allowed_hw_m),
            word("control", std::string(to_string(r.control)))};
}

std::vector<std::vector<Quantity>> size_rows(const Section &s, const Sheet &u) {
    if (s.shape == Shape::circular) {
        return {{u.q_len("s", s.rise_m)}};
    }
    return {{u.q_len("s", s.span_m)}, {u.q_len("s", s.rise_m)}};
}

} // namespace

WithLines<Sizing> size_culvert(const Culvert &culvert, const std::vector<Section> &sizes,
                               double q_m3_s, const Site &site, units::System system) {
    if (sizes.empty()) {
        throw_input_error("culvert sizing", "the list of sizes is empty", "one size or more");
    }
    const Sheet u{system};
    std::vector<std::size_t> order(sizes.size());
    std::iota(order.begin(), order.end(), std::size_t{0});
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
        return full_flow_area(sizes[a]).area < full_flow_area(sizes[b]).area;
    });
    WithLines<Sizing> out{};
    Sizing &z = out.value;
    std::optional<WithLines<CulvertResult>> previous;
    for (const std::size_t i : order) {
        Culvert c = culvert;
        c.section = sizes[i];
        auto r = analyse(c, q_m3_s, site, system);
        if (r.value.passes) {
            z.chosen = i;
            z.chosen_result = r.value;
            out.lines.note(size_chosen, size_quantities(sizes[i], r.value, u)).rows =
                size_rows(sizes[i], u);
            out.lines.append(r.lines);
            break;
        }
        z.next_smaller = i;
        z.next_smaller_result = r.value;
        previous = std::move(r);
    }
    z.largest_tried = order.back();
    if (!z.chosen) {
        auto quantities = size_quantities(sizes[order.back()], *z.next_smaller_result, u);
        quantities.push_back(u.q_flow("Q", q_m3_s));
        out.lines.warn(none_passes, std::move(quantities)).rows = size_rows(sizes[order.back()], u);
        out.lines.append(previous->lines);
        z.next_smaller.reset();
        z.next_smaller_result.reset();
        return out;
    }
    if (previous) {
        out.lines
            .note(size_smaller, size_quantities(sizes[*z.next_smaller], *z.next_smaller_result, u))
            .rows = size_rows(sizes[*z.next_smaller], u);
        // Its failing is why it is not chosen (the note above), not a warning of the design.
        CalcLines smaller = std::move(previous->lines);
        for (auto &l : smaller.lines()) {
            if (l.kind == LineKind::warning) {
                l.kind = LineKind::note;
            }
        }
        out.lines.append(smaller);
    }
    return out;
}

} // namespace catchpeak::hydraulics
