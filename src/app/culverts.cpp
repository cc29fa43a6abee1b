// SPDX-License-Identifier: MIT
#include "catchpeak/app/culverts.hpp"

#include "catchpeak/app/culvert_inputs.hpp"
#include "catchpeak/app/inputs.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/hydraulics/crossing.hpp"
#include "catchpeak/io/culvert_tables.hpp"
#include "catchpeak/report/sheet_units.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <map>

namespace catchpeak::app {

using project::Problems;
using project::Project;

namespace {

// clang-format off
constexpr Formula culvert_note{"culvert.design", "Culvert", "",
                               "{shape}, {N} barrel(s), inlet {inlet} ({desc}), L = {L} {L:u}, inverts "
                               "{ELi} {ELi:u} (inlet) and {ELo} {ELo:u} (outlet), n = {n}; {size}",
                               Ref::project_input, " (the culvert table)"};
constexpr Formula barrel_slope{"culvert.slope", "Barrel slope", "So = (ELi - ELo)/L",
                               "So = ({ELi} - {ELo})/{L}", Ref::none, "geometry of the barrel"};
constexpr Formula dem_inverts{"culvert.dem_inverts", "Inverts from the DEM", "",
                              "ELi = {ELi} {ELi:u} at ({xi}, {yi}) and ELo = {ELo} {ELo:u} at "
                              "({xo}, {yo}): the DEM in the cells under the ends of breach "
                              "line {line}, {d} {d:u} from the design point as given; the "
                              "higher end is the inlet", Ref::none,
                              "the DEM as given (before conditioning); the culvert table gives "
                              "no inverts"};
constexpr Formula line_length_differs{"culvert.line_length", "Breach line and barrel lengths differ",
                                      "",
                                      "the breach line is {Ll} {Ll:u} long, the barrel L = {L} "
                                      "{L:u}: the inverts read at the line's ends may not be the "
                                      "barrel's; give invert_in and invert_out in the culvert "
                                      "table", Ref::none,
                                      "a difference over 25 % of L (common practice, no source)"};
constexpr Formula case_note{"culvert.case", "Culvert, flow checked", "",
                            "T = {T} {T:u}{design}: Q = {Q} {Q:u}, the largest of this design "
                            "point's peaks for T ({method})", Ref::none,
                            "the largest peak governs (conservative choice)"};
// clang-format on

struct Loaded {
    hydraulics::InletTable inlets;
    std::vector<hydraulics::Section> sizes;
};

Loaded load_tables(const Project &p) {
    Loaded t;
    t.inlets = io::read_culvert_inlet_table(config_dir() / io::culvert_inlets_file);
    const bool us = p.info.units == units::System::us_customary;
    t.sizes =
        io::read_culvert_sizes(p.design.culvert_sizes ? p.design.culvert_sizes->resolved
                                                      : config_dir() / io::culvert_sizes_file(us));
    return t;
}

std::vector<CulvertSpec> read_specs(const Project &p, const Loaded &t,
                                    const std::vector<std::string> &ids, Problems &problems) {
    auto specs =
        read_culvert_table(p.inputs.culvert_table->resolved, t.inlets, ids,
                           p.inputs.dem.has_value() && p.inputs.breach_lines.has_value(), problems);
    const std::string where = p.inputs.culvert_table->resolved.string();
    for (const auto &s : specs) {
        const auto rp = s.design_return_period_yr ? s.design_return_period_yr
                                                  : p.design.culvert_return_period_yr;
        const auto &rps = p.rainfall.return_periods_yr;
        if (!rp) {
            problems.add(input_message(
                fmt::format("{}:{}", where, s.line),
                fmt::format("culvert '{}' has no design return period", s.id),
                "a column design_return_period_yr, or [design] culvert_return_period_yr"));
        } else if (std::find(rps.begin(), rps.end(), *rp) == rps.end()) {
            problems.add(input_message(
                fmt::format("{}:{}: column 'design_return_period_yr'", where, s.line),
                fmt::format("{} years is not one of the return periods computed", *rp),
                "one of [rainfall] return_periods_yr"));
        }
    }
    return specs;
}

/// The largest peak of the point for each return period, and the method that gives it.
std::map<double, const report::Peak *> largest_peaks(const report::DesignPointResult &dp) {
    std::map<double, const report::Peak *> out;
    for (const auto &pk : dp.peaks) {
        auto &slot = out[pk.return_period_yr];
        if (slot == nullptr || pk.q_m3_s > slot->q_m3_s) {
            slot = &pk;
        }
    }
    return out;
}

report::CulvertCase case_result(const hydraulics::CaseResult &c) {
    report::CulvertCase out;
    out.return_period_yr = c.flow.return_period_yr;
    out.design = c.flow.design;
    out.flow_m3_s = c.flow.q_m3_s;
    out.culvert_flow_m3_s = c.split.culvert_flow_m3_s;
    out.overtopping_flow_m3_s = c.split.road_flow_m3_s;
    out.tailwater_m = c.tailwater_m;
    const auto &r = c.split.culvert;
    out.inlet_control_headwater_m = r.inlet.hw_m;
    out.outlet_control_headwater_m = r.outlet.hw_m;
    out.headwater_m = r.hw_m;
    out.headwater_elevation_m = c.split.headwater_elevation_m;
    out.allowed_headwater_m = r.allowed_hw_m;
    out.control = std::string(hydraulics::to_string(r.control));
    out.outlet_velocity_m_per_s = r.outlet_velocity_m_s;
    out.passes = c.passes;
    return out;
}

/// The id of the last line with `key` among the first `end` lines (the controlling headwater
/// of a case is the last such line of its lines: with a road, the barrels at their share).
std::string last_id_before(const CalcLines &lines, std::size_t end, std::string_view key) {
    for (std::size_t i = end; i-- > 0;) {
        if (lines.lines()[i].key == key) {
            return lines.lines()[i].id;
        }
    }
    return {};
}

hydraulics::Crossing crossing_of(const Project &p, const CulvertSpec &s) {
    hydraulics::Crossing x;
    x.culvert.section = s.size.value_or(hydraulics::Section{});
    x.culvert.barrels = s.barrels;
    x.culvert.length_m = s.length_m;
    x.culvert.slope_m_per_m = (*s.invert_in_m - *s.invert_out_m) / s.length_m;
    x.culvert.manning_n = s.manning_n;
    x.culvert.inlet = s.inlet_row;
    x.size = s.size;
    x.site.inlet_invert_m = *s.invert_in_m;
    x.site.limit = s.limit;
    x.tailwater_m = s.tailwater_m;
    x.channel = s.channel;
    x.road = s.road;
    x.outlet_velocity_max_m_s = p.design.outlet_velocity_max_m_per_s;
    return x;
}

std::string size_words(const hydraulics::Section &s, units::System sys) {
    const bool us = sys == units::System::us_customary;
    const auto len = [&](double m) {
        return us ? fmt::format("{:g} in", std::round(units::m_to_ft(m) * 12.0 * 10.0) / 10.0)
                  : fmt::format("{:g} mm", std::round(m * 1000.0));
    };
    return s.shape == hydraulics::Shape::circular
               ? fmt::format("diameter {}", len(s.rise_m))
               : fmt::format("span {} x rise {}", len(s.span_m), len(s.rise_m));
}

/// Lengths and elevations of a culvert's lines in the sheet's units (elevations to 0.01 ft or
/// 0.001 m, as levels are surveyed).
struct LineLengths {
    bool us = false;
    Unit unit = Unit::m;
    explicit LineLengths(units::System sys)
        : us(sys == units::System::us_customary), unit(us ? Unit::ft : Unit::m) {}
    [[nodiscard]] double of(double m) const { return us ? units::m_to_ft(m) : m; }
    [[nodiscard]] Quantity length(const char *sym, double m, Shown shown = {}) const {
        return qty(sym, of(m), unit, shown);
    }
    [[nodiscard]] Quantity elevation(const char *sym, double m) const {
        return qty(sym, of(m), unit, Shown::fixed(us ? 2 : 3));
    }
};

/// The lines that say where the inverts read from the DEM come from.
void dem_invert_lines(const terrain::BreachEnds &e, const CulvertSpec &s, units::System sys,
                      CalcLines &lines) {
    const LineLengths u(sys);
    const auto coord = [](const char *sym, double v) {
        return word(sym, fmt::format("{:.1f}", v));
    };
    lines.note(dem_inverts,
               {u.elevation("ELi", *s.invert_in_m), coord("xi", e.inlet.xy.first),
                coord("yi", e.inlet.xy.second), u.elevation("ELo", *s.invert_out_m),
                coord("xo", e.outlet.xy.first), coord("yo", e.outlet.xy.second),
                word("line", e.line_id), u.length("d", e.distance_m, Shown::fixed(1))});
    if (std::abs(e.length_m - s.length_m) > 0.25 * s.length_m) {
        lines.warn(line_length_differs, {u.length("Ll", e.length_m), u.length("L", s.length_m)});
    }
}

void design_one(const Project &p, const CulvertSpec &s,
                const std::vector<hydraulics::Section> &sizes, const terrain::BreachEnds *ends,
                report::DesignPointResult &dp) {
    const units::System sys = p.info.units;
    const double design_rp =
        s.design_return_period_yr.value_or(p.design.culvert_return_period_yr.value_or(0.0));
    const auto peaks = largest_peaks(dp);
    std::vector<hydraulics::FlowCase> flows;
    for (const auto &[rp, pk] : peaks) {
        flows.push_back({rp, pk->q_m3_s, rp == design_rp});
    }
    const hydraulics::Crossing x = crossing_of(p, s);
    const auto d = hydraulics::design_crossing(x, flows, sizes, sys);
    CalcLines lines;
    if (ends != nullptr) {
        dem_invert_lines(*ends, s, sys, lines);
    }
    const LineLengths u(sys);
    const bool us = u.us;
    lines.note(culvert_note,
               {word("shape", s.shape == hydraulics::Shape::box ? "box" : "circular"),
                qty("N", s.barrels, Unit::none, Shown::integer()), word("inlet", s.inlet),
                word("desc", s.inlet_row.source), u.length("L", s.length_m),
                u.elevation("ELi", *s.invert_in_m), u.elevation("ELo", *s.invert_out_m),
                qty("n", s.manning_n),
                word("size", s.size ? "size given: " + size_words(*s.size, sys)
                                    : fmt::format("size chosen for the {:g}-year flow from the "
                                                  "list of standard sizes",
                                                  design_rp))});
    lines.calc(barrel_slope,
               {u.elevation("ELi", *s.invert_in_m), u.elevation("ELo", *s.invert_out_m),
                u.length("L", s.length_m)},
               qty("So", x.culvert.slope_m_per_m, us ? Unit::ft_per_ft : Unit::m_per_m));
    lines.append(d.sizing_lines);
    report::CulvertResult out;
    std::vector<std::size_t> case_ends; // one past each case's last line
    for (const auto &c : d.cases) {
        const auto *pk = peaks.at(c.flow.return_period_yr);
        lines.note(case_note, {qty("T", c.flow.return_period_yr, Unit::yr, Shown::exact()),
                               word("design", c.flow.design ? " (design flow)" : ""),
                               qty("Q", us ? units::m3s_to_cfs(c.flow.q_m3_s) : c.flow.q_m3_s,
                                   us ? Unit::ft3_per_s : Unit::m3_per_s),
                               word("method", report::method_title(pk->method))});
        lines.append(c.lines);
        case_ends.push_back(lines.size());
        out.cases.push_back(case_result(c));
        out.cases.back().flow_line_id = pk->line_id;
    }
    out.shape = d.size.shape == hydraulics::Shape::box ? "box" : "circular";
    out.barrels = s.barrels;
    out.span_m = d.size.span_m;
    out.rise_m = d.size.rise_m;
    out.sized = d.sized;
    out.size_found = !d.sized || (d.sizing && d.sizing->chosen.has_value());
    out.inlet = s.inlet;
    out.inlet_invert_m = *s.invert_in_m;
    out.outlet_invert_m = *s.invert_out_m;
    out.length_m = s.length_m;
    if (s.road) {
        out.crest_elevation_m = s.road->crest_elevation_m;
    }
    for (const auto &pt : d.curve) {
        out.curve.push_back(
            {pt.flow_m3_s, pt.headwater_elevation_m, pt.hw_inlet_m, pt.hw_outlet_m, pt.road_m3_s});
    }
    number_lines(lines, dp.id, dp.lines.size() + 1);
    for (std::size_t i = 0; i < out.cases.size(); ++i) {
        out.cases[i].headwater_line_id = last_id_before(lines, case_ends[i], hydraulics::keys::hw);
    }
    dp.lines.append(lines);
    dp.culvert = std::move(out);
}

/// The inverts of a row that leaves them out, from the breach line at its design point; a
/// problem when there is none within reach, or an end is off the DEM's data.
const terrain::BreachEnds *take_dem_inverts(const Project &p, const CulvertSites &sites,
                                            CulvertSpec &s, Problems &problems) {
    const std::string where =
        fmt::format("{}:{}", p.inputs.culvert_table->resolved.string(), s.line);
    const auto it = sites.ends.find(s.id);
    const std::string fix = "invert_in_m|invert_in_ft and invert_out_m|invert_out_ft in the "
                            "culvert table, or a breach line drawn along the culvert";
    if (it == sites.ends.end()) {
        problems.add(
            input_message(where,
                          fmt::format("culvert '{}' gives no inverts, and there is no breach line "
                                      "([inputs] breach_lines) to read them from",
                                      s.id),
                          fix));
        return nullptr;
    }
    const terrain::BreachEnds &e = it->second;
    if (e.distance_m > sites.reach_m) {
        problems.add(input_message(
            where,
            fmt::format("culvert '{}' gives no inverts, and the nearest breach line ({}, [inputs] "
                        "breach_lines) is "
                        "{:.1f} m from design point '{}', farther than {:.1f} m ([settings] "
                        "snap_radius_m plus one cell diagonal)",
                        s.id, e.line_id, e.distance_m, s.id, sites.reach_m),
            fix));
        return nullptr;
    }
    if (!e.inlet.elevation_m || !e.outlet.elevation_m) {
        problems.add(input_message(
            where,
            fmt::format("culvert '{}' gives no inverts, and an end of its breach line ({}) lies "
                        "on a DEM cell without data or off the DEM",
                        s.id, e.line_id),
            fix));
        return nullptr;
    }
    s.invert_in_m = e.inlet.elevation_m;
    s.invert_out_m = e.outlet.elevation_m;
    const auto above = [&](std::optional<double> el, const char *what, const char *col) {
        if (el && *el <= *s.invert_in_m) {
            problems.add(input_message(
                fmt::format("{}: column '{}'", where, col),
                fmt::format("{} {:.3f} m of culvert '{}' is not above the inlet invert {:.3f} m "
                            "read from the DEM at the end of {}",
                            what, *el, s.id, *s.invert_in_m, e.line_id),
                "an elevation above the inlet invert, or the inverts in the culvert table"));
        }
    };
    above(s.limit.elevation_m, "the allowed headwater", "headwater_max");
    if (s.road) {
        above(s.road->crest_elevation_m, "the road crest", "crest");
    }
    return &e;
}

} // namespace

void check_culverts(const Project &p, const std::vector<std::string> &ids, Problems &problems) {
    if (!p.inputs.culvert_table) {
        return;
    }
    try {
        const Loaded t = load_tables(p);
        (void)read_specs(p, t, ids, problems);
    } catch (const InputError &e) {
        problems.add(e.what());
    }
}

void design_culverts(const Project &p, report::RunResults &r, const CulvertSites &sites) {
    if (!p.inputs.culvert_table) {
        return;
    }
    const Loaded t = load_tables(p);
    std::vector<std::string> ids;
    for (const auto &dp : r.points) {
        ids.push_back(dp.id);
    }
    Problems problems;
    auto specs = read_specs(p, t, ids, problems);
    std::vector<const terrain::BreachEnds *> ends(specs.size(), nullptr);
    for (std::size_t k = 0; k < specs.size(); ++k) {
        if (!specs[k].invert_in_m) {
            ends[k] = take_dem_inverts(p, sites, specs[k], problems);
        }
    }
    problems.throw_if_any();
    if (!specs.empty()) {
        r.caution_notes.emplace_back(
            "Culverts are sized here by their hydraulics alone (HDS-5 inlet and outlet control, "
            "flow over the road). Debris, sediment, fish and wildlife passage, structural "
            "cover and the reviewing agency's headwater and freeboard criteria are outside the "
            "calculation and must be checked by the engineer.");
    }
    for (std::size_t k = 0; k < specs.size(); ++k) {
        const auto &s = specs[k];
        auto it = std::find_if(r.points.begin(), r.points.end(),
                               [&](const auto &dp) { return dp.id == s.id; });
        design_one(p, s, t.sizes, ends[k], *it);
    }
}

} // namespace catchpeak::app
