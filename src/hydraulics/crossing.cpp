// SPDX-License-Identifier: MIT
// A crossing designed for its flows: size, every flow checked, the performance curve.
#include "catchpeak/hydraulics/crossing.hpp"

#include "sheet.hpp"

#include <algorithm>

namespace catchpeak::hydraulics {

using detail::Sheet;

namespace {

// clang-format off
constexpr Formula tw_given{"culvert.tailwater", "Tailwater depth", "TW, given",
                           "TW = {TW} (the culvert table)", Ref::project_input, ""};
constexpr Formula tw_channel{"culvert.tailwater", "Tailwater depth", "TW = yn of the outlet channel",
                             "TW = yn = {yn}", Ref::hds5_2012,
                             " ch. 3, tailwater from the downstream channel"};
constexpr Formula tw_none{"culvert.tailwater", "Tailwater depth", "",
                          "no tailwater or outlet channel given: TW = 0, so ho = (dc + D)/2 "
                          "governs the outlet control headwater", Ref::hds5_2012,
                          " ch. 3, outlet control"};
constexpr Formula velocity_over{"culvert.velocity_over_limit", "Outlet velocity over the limit", "",
                                "Vo = {Vo} {Vo:u} exceeds {Vmax} {Vmax:u}: outlet protection "
                                "(riprap, an energy dissipator) needs design",
                                Ref::project_input, " ([design] outlet_velocity_max_m_per_s)"};
// clang-format on

/// The tailwater depth at q with its lines.
double tailwater_line(CalcLines &lines, const Crossing &x, double q, const Sheet &u) {
    if (x.tailwater_m) {
        lines.calc(tw_given, {}, u.q_len("TW", *x.tailwater_m));
        return *x.tailwater_m;
    }
    if (x.channel) {
        auto yn = normal_depth_m(*x.channel, q, u.system);
        lines.append(yn.lines);
        lines.calc(tw_channel, {u.q_len("yn", yn.value)}, u.q_len("TW", yn.value));
        return yn.value;
    }
    lines.note(tw_none, {});
    return 0.0;
}

/// One flow at the crossing's size: tailwater, barrels (and road), the outlet velocity check.
CaseResult check_case(const Crossing &x, const Culvert &c, const FlowCase &f, const Sheet &u) {
    CaseResult r;
    r.flow = f;
    Site site = x.site;
    site.tailwater_depth_m = r.tailwater_m = tailwater_line(r.lines, x, f.q_m3_s, u);
    if (x.road) {
        auto s = split_with_road(c, f.q_m3_s, site, *x.road, u.system);
        r.lines.append(s.lines);
        r.split = s.value;
    } else {
        auto a = analyse(c, f.q_m3_s, site, u.system);
        r.lines.append(a.lines);
        r.split = {f.q_m3_s, 0.0, site.inlet_invert_m + a.value.hw_m, 0.0, false, a.value};
    }
    r.passes = r.split.culvert.passes;
    const double vo = r.split.culvert.outlet_velocity_m_s;
    if (vo > x.outlet_velocity_max_m_s) {
        r.lines.warn(velocity_over, {qty("Vo", u.vel(vo), u.u_vel()),
                                     qty("Vmax", u.vel(x.outlet_velocity_max_m_s), u.u_vel())});
    }
    return r;
}

/// The design flow: the case marked design, else the largest.
const FlowCase &design_flow(const std::vector<FlowCase> &flows) {
    const auto it =
        std::find_if(flows.begin(), flows.end(), [](const FlowCase &f) { return f.design; });
    if (it != flows.end()) {
        return *it;
    }
    return *std::max_element(flows.begin(), flows.end(),
                             [](const auto &a, const auto &b) { return a.q_m3_s < b.q_m3_s; });
}

} // namespace

CrossingDesign design_crossing(const Crossing &x, const std::vector<FlowCase> &flows,
                               const std::vector<Section> &sizes, units::System system,
                               int curve_steps) {
    if (flows.empty()) {
        throw_input_error("culvert", "no flows to check", "one return period or more");
    }
    const Sheet u{system};
    CrossingDesign d;
    Culvert c = x.culvert;
    if (x.size) {
        c.section = *x.size;
    } else {
        std::vector<Section> same_shape;
        std::copy_if(sizes.begin(), sizes.end(), std::back_inserter(same_shape),
                     [&](const Section &s) { return s.shape == c.inlet.shape; });
        if (same_shape.empty()) {
            throw_input_error("culvert sizing", "no standard size of the culvert's shape",
                              "a list of sizes with this shape");
        }
        const FlowCase &f = design_flow(flows);
        Site site = x.site;
        site.tailwater_depth_m = tailwater_line(d.sizing_lines, x, f.q_m3_s, u);
        auto z = size_culvert(c, same_shape, f.q_m3_s, site, system);
        d.sizing_lines.append(z.lines);
        c.section = same_shape[z.value.chosen ? *z.value.chosen : z.value.largest_tried];
        d.sizing = z.value;
        d.sized = true;
    }
    d.size = c.section;
    double q_max = 0.0;
    for (const FlowCase &f : flows) {
        d.cases.push_back(check_case(x, c, f, u));
        q_max = std::max(q_max, f.q_m3_s);
    }
    // The curve with the tailwater of the largest flow (the tailwater of a channel rises with
    // the flow; the given one is constant).
    Site site = x.site;
    site.tailwater_depth_m =
        std::max_element(d.cases.begin(), d.cases.end(), [](const auto &a, const auto &b) {
            return a.flow.q_m3_s < b.flow.q_m3_s;
        })->tailwater_m;
    d.curve = performance_curve(c, site, x.road, 1.5 * q_max, curve_steps, system);
    return d;
}

} // namespace catchpeak::hydraulics
