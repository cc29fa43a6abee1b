// SPDX-License-Identifier: MIT
#include "catchpeak/app/point_hydrology.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/hydro/rational.hpp"
#include "catchpeak/hydro/tc.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <utility>

namespace catchpeak::app {

namespace {

const PointOverride *override_for(const Project &p, const std::string &id) {
    for (const auto &o : p.methods.points) {
        if (o.id == id) {
            return &o;
        }
    }
    return nullptr;
}

/// Index of the last calculation line of `part` once appended to `lines`.
std::size_t last_calculation_index(const CalcLines &lines, const CalcLines &part) {
    std::size_t at = lines.size();
    for (std::size_t k = 0; k < part.size(); ++k) {
        if (part.lines()[k].kind == LineKind::calculation) {
            at = lines.size() + k;
        }
    }
    return at;
}

} // namespace

void compute_point_hydrology(const Project &p, const PointInputs &in, const HydrologyTables &tables,
                             report::DesignPointResult &dp) {
    const bool us = p.info.units == units::System::us_customary;
    const std::string &src = in.source;
    auto &lines = dp.lines;
    const double area_ha = units::m2_to_ha(in.area_m2);
    const double area_ac = units::m2_to_acre(in.area_m2);
    const double length_ft = units::m_to_ft(in.longest_flow_path_m);
    if (us) {
        lines.note("Catchment area", fmt::format("A = {} ac", sig(area_ac)), src, area_ac, "ac");
        lines.note("Longest flow path length", fmt::format("L = {} ft", sig(length_ft)), src,
                   length_ft, "ft");
    } else {
        lines.note("Catchment area", fmt::format("A = {} ha", sig(area_ha)), src, area_ha, "ha");
        lines.note("Longest flow path length", fmt::format("L = {} m", sig(in.longest_flow_path_m)),
                   src, in.longest_flow_path_m, "m");
    }
    lines.note("Slope of the longest flow path", fmt::format("S = {} m/m", sig(in.slope)), src,
               in.slope, us ? "ft/ft" : "m/m");
    if (in.c) {
        lines.note("Runoff coefficient", fmt::format("C = {}", sig(*in.c)), src, *in.c);
    }
    if (in.cn) {
        lines.note("Curve number", fmt::format("CN = {}", sig(*in.cn)), src, *in.cn);
    }

    // Time of concentration.
    const PointOverride *o = override_for(p, dp.id);
    std::string tc_method = (o != nullptr && o->tc_method) ? *o->tc_method : p.methods.tc_method;
    double tc = 0.0;
    if (o != nullptr && o->tc_min && (!o->tc_method || *o->tc_method == "given")) {
        tc_method = "given";
        tc = *o->tc_min;
        lines.note("Time of concentration, given", fmt::format("tc = {} min", sig(tc)),
                   fmt::format("project input ({}, line {})", p.file.filename().string(), o->line),
                   tc, "min");
    } else if (in.tc_min && (o == nullptr || !o->tc_method)) {
        tc_method = "given";
        tc = *in.tc_min;
        lines.note("Time of concentration, given", fmt::format("tc = {} min", sig(tc)), src, tc,
                   "min");
    } else {
        auto k = hydro::kirpich_tc_min(in.longest_flow_path_m, in.slope, in.area_m2, p.info.units);
        lines.append(k.lines);
        tc = k.value;
    }
    {
        auto m = hydro::apply_minimum_tc(tc, p.settings.minimum_tc_min);
        lines.append(m.lines);
        tc = m.value;
    }
    dp.tc_min = tc;
    dp.tc_method = tc_method;

    const auto &peaks =
        (o != nullptr && o->peak_methods) ? *o->peak_methods : p.methods.peak_methods;
    const bool rational = std::find(peaks.begin(), peaks.end(), "rational") != peaks.end();
    std::vector<std::size_t> q_line_index; // per peak, filled with its line id below
    hydro::RationalSettings rational_settings;
    rational_settings.max_area_m2 = units::ha_to_m2(p.settings.rational_area_limit_ha);
    for (double rp : p.rainfall.return_periods_yr) {
        if (!rational || tables.idf == nullptr || tables.frequency_factors == nullptr || !in.c) {
            continue;
        }
        auto i = tables.idf->intensity(tc, rp, p.info.units);
        lines.append(i.lines);
        auto cf = hydro::frequency_factor(*tables.frequency_factors, rp);
        lines.append(cf.lines);
        auto q = hydro::rational_peak_m3_s(*in.c, cf.value, i.value, in.area_m2, p.info.units,
                                           rational_settings);
        // The line that gives Q: the last calculation line of the Rational Method's lines.
        q_line_index.push_back(last_calculation_index(lines, q.lines));
        lines.append(q.lines);
        report::Peak pk;
        pk.return_period_yr = rp;
        pk.method = "rational";
        pk.q_m3_s = q.value;
        pk.intermediates = {
            {"c", *in.c}, {"cf", cf.value}, {"intensity_mm_per_h", i.value}, {"duration_min", tc}};
        dp.peaks.push_back(std::move(pk));
    }
    number_lines(lines, dp.id);
    for (std::size_t k = 0; k < dp.peaks.size(); ++k) {
        if (q_line_index[k] < lines.size()) {
            dp.peaks[k].line_id = lines.lines()[q_line_index[k]].id;
        }
    }
}

} // namespace catchpeak::app
