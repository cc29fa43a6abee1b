// SPDX-License-Identifier: MIT
// Flow over the road at a culvert crossing and the split of the flow between barrels and road
// (FHWA HDS-5 (2012) ch. 2, roadway overtopping), and the crossing's performance curve.
#include "catchpeak/hydraulics/overtopping.hpp"

#include "roots.hpp"
#include "sheet.hpp"

#include <algorithm>
#include <cmath>

namespace catchpeak::hydraulics {

using detail::Sheet;

namespace {

// clang-format off
constexpr Formula alone_below{"culvert.road_clear", "Road crest not reached", "",
                              "ELhw = {ELi} + {HW} = {ELhw} {ELhw:u} <= crest {ELc} {ELc:u}: "
                              "no flow over the road", Ref::hds5_2012,
                              " ch. 2, roadway overtopping"};
constexpr Formula alone_above{"culvert.road_overtops", "Road overtops",
                              "",
                              "With the whole flow in the barrels, ELhw = {ELi} + {HW} = {ELhw} "
                              "{ELhw:u} > crest {ELc} {ELc:u}: the flow splits between the "
                              "barrels and the road", Ref::hds5_2012,
                              " ch. 2, roadway overtopping"};
constexpr Formula over_road{"culvert.road_flow", "Flow over the road", "Qr = Cd L HWr^1.5",
                            "Qr = {Cd} x {L} x ({ELhw} - {ELc})^1.5", Ref::hds5_2012,
                            " ch. 2, roadway overtopping (weir equation)"};
constexpr Formula split{"culvert.flow_split", "Flow through the barrels", "Qc = Q - Qr",
                        "Qc = {Q} - {Qr}, at the one headwater ELhw = {ELhw} {ELhw:u} of barrels "
                        "and road (solved by TOMS 748 to a relative {tol})", Ref::hds5_2012,
                        " ch. 2, roadway overtopping"};
// clang-format on

/// 0.3048^0.5, of the exact foot.
const double sqrt_m_per_ft = std::sqrt(units::m_per_ft);

/// Cd in the sheet's units (m^0.5/s or ft^0.5/s) and its unit.
Quantity weir_coefficient(double cd_si, const Sheet &u) {
    return u.us() ? qty("Cd", cd_si / sqrt_m_per_ft, Unit::ft_half_per_s)
                  : qty("Cd", cd_si, Unit::m_half_per_s);
}

/// The headwater elevation of the barrels alone carrying q (no lines kept).
double headwater_elevation(const Culvert &c, double q, const Site &site, units::System system) {
    return site.inlet_invert_m + analyse(c, q, site, system).value.hw_m;
}

void check_road(const RoadCrest &road, const Site &site) {
    detail::require_positive("road crest: length", road.length_m);
    detail::require_positive("road crest: weir coefficient", road.weir_coefficient_si);
    if (!std::isfinite(road.crest_elevation_m) || road.crest_elevation_m <= site.inlet_invert_m) {
        throw_input_error("road crest: elevation",
                          full(road.crest_elevation_m) + " is not above the inlet invert " +
                              full(site.inlet_invert_m),
                          "a crest above the culvert's inlet invert");
    }
}

/// Qc of the split: Qc + Qr(ELhw(Qc)) = Q, Qc in (0, Q]; the left side rises with Qc.
double culvert_share(const Culvert &c, double q, const Site &site, const RoadCrest &road,
                     units::System system) {
    const auto excess = [&](double qc) {
        return qc + road_flow_m3_s(road, headwater_elevation(c, qc, site, system)) - q;
    };
    // At a share so small that the barrels hold it below the crest, the road carries nothing.
    return detail::solve_bracketed(excess, q * 1e-9, q, "culvert and road flow split");
}

} // namespace

double weir_coefficient_si_from_us(double cd_us) noexcept { return cd_us * sqrt_m_per_ft; }

double default_weir_coefficient_si() noexcept { return weir_coefficient_si_from_us(3.0); }

double road_flow_m3_s(const RoadCrest &road, double headwater_elevation_m) {
    const double h = headwater_elevation_m - road.crest_elevation_m;
    return h > 0.0 ? road.weir_coefficient_si * road.length_m * std::pow(h, 1.5) : 0.0;
}

WithLines<FlowSplit> split_with_road(const Culvert &c, double q_m3_s, const Site &site,
                                     const RoadCrest &road, units::System system) {
    check_road(road, site);
    const Sheet u{system};
    WithLines<FlowSplit> out{};
    FlowSplit &s = out.value;
    auto alone = analyse(c, q_m3_s, site, system);
    const double el_alone = site.inlet_invert_m + alone.value.hw_m;
    const std::vector<Quantity> alone_q{u.q_elev("ELi", site.inlet_invert_m),
                                        u.q_len("HW", alone.value.hw_m),
                                        u.q_elev("ELc", road.crest_elevation_m)};
    if (el_alone <= road.crest_elevation_m) {
        out.lines.note(alone_below, alone_q).result = u.q_elev("ELhw", el_alone);
        s = {q_m3_s, 0.0, el_alone, 0.0, false, alone.value};
        out.lines.append(alone.lines);
        return out;
    }
    out.lines.warn(alone_above, alone_q).result = u.q_elev("ELhw", el_alone);
    const double qc = culvert_share(c, q_m3_s, site, road, system);
    auto shared = analyse(c, qc, site, system);
    const double el = site.inlet_invert_m + shared.value.hw_m;
    // The road's share from the printed headwater, so that Qc + Qr = Q holds on the sheet.
    const double qr = q_m3_s - qc;
    s = {qc, qr, el, std::max(0.0, el - road.crest_elevation_m), true, shared.value};
    out.lines.calc(over_road,
                   {weir_coefficient(road.weir_coefficient_si, u), u.q_len("L", road.length_m),
                    u.q_elev("ELhw", el), u.q_elev("ELc", road.crest_elevation_m)},
                   u.q_flow("Qr", road_flow_m3_s(road, el)));
    out.lines.calc(split,
                   {u.q_flow("Q", q_m3_s), u.q_flow("Qr", qr), u.q_elev("ELhw", el),
                    qty("tol", detail::root_tolerance)},
                   u.q_flow("Qc", qc));
    out.lines.append(shared.lines);
    return out;
}

std::vector<CurvePoint> performance_curve(const Culvert &c, const Site &site,
                                          const std::optional<RoadCrest> &road, double q_max_m3_s,
                                          int steps, units::System system) {
    detail::require_positive("performance curve: largest flow", q_max_m3_s);
    if (steps < 1) {
        throw_input_error("performance curve: steps", std::to_string(steps), "1 or more");
    }
    if (road) {
        check_road(*road, site);
    }
    // Stepping the barrels' share (not the total) needs no root finding per point: the total
    // at each step is Qc + Qr(ELhw(Qc)). The last share is the split of q_max itself.
    double qc_max = q_max_m3_s;
    if (road && headwater_elevation(c, q_max_m3_s, site, system) > road->crest_elevation_m) {
        qc_max = culvert_share(c, q_max_m3_s, site, *road, system);
    }
    std::vector<CurvePoint> curve;
    curve.reserve(static_cast<std::size_t>(steps) + 1);
    curve.push_back({0.0, 0.0, 0.0, 0.0, 0.0, site.inlet_invert_m});
    for (int k = 1; k <= steps; ++k) {
        const double qc = qc_max * static_cast<double>(k) / static_cast<double>(steps);
        const auto r = analyse(c, qc, site, system).value;
        CurvePoint p{};
        p.culvert_m3_s = qc;
        p.hw_inlet_m = r.inlet.hw_m;
        p.hw_outlet_m = r.outlet.hw_m;
        p.headwater_elevation_m = site.inlet_invert_m + r.hw_m;
        p.road_m3_s = road ? road_flow_m3_s(*road, p.headwater_elevation_m) : 0.0;
        p.flow_m3_s = qc + p.road_m3_s;
        curve.push_back(p);
    }
    return curve;
}

} // namespace catchpeak::hydraulics
