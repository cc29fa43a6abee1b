// SPDX-License-Identifier: MIT
// results.json, summary.csv, the run record and the printed summary table.
#include "catchpeak/app/pipeline.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>
#include <set>

namespace catchpeak::app {

namespace {

using Json = nlohmann::ordered_json;

/// A number, or null when it is not known (NaN).
Json num(double v) { return std::isfinite(v) ? Json(v) : Json(nullptr); }

Json xy(const std::pair<double, double> &p) { return Json::array({num(p.first), num(p.second)}); }

Json lines_json(const CalcLines &lines) {
    Json a = Json::array();
    for (const auto &l : lines.lines()) {
        a.push_back({{"id", l.id},
                     {"kind", std::string(to_string(l.kind))},
                     {"label", l.label},
                     {"symbols", l.symbols},
                     {"numbers", l.numbers},
                     {"value", num(l.value)},
                     {"unit", l.unit},
                     {"source", l.source}});
    }
    return a;
}

/// CSV cell: quoted when it holds a comma, a quote or a line break.
std::string cell(const std::string &s) {
    if (s.find_first_of(",\"\n") == std::string::npos) {
        return s;
    }
    std::string q = "\"";
    for (char ch : s) {
        q += ch == '"' ? std::string("\"\"") : std::string(1, ch);
    }
    return q + "\"";
}

std::string csv_num(double v) { return std::isfinite(v) ? full(v) : std::string{}; }

} // namespace

std::string results_json(const report::RunResults &r) {
    Json j;
    j["format"] = "catchpeak results";
    j["format_version"] = 1;
    j["project"] = {{"name", r.project.name},
                    {"number", r.project.number},
                    {"client", r.project.client},
                    {"location", r.project.location},
                    {"prepared_by", r.project.prepared_by},
                    {"checked_by", r.project.checked_by},
                    {"revision", r.project.revision},
                    {"units", r.project.units == units::System::si ? "SI" : "US"}};
    Json points = Json::array();
    for (const auto &dp : r.points) {
        Json p;
        p["id"] = dp.id;
        p["from_table"] = dp.from_table;
        p["given_xy_m"] = xy(dp.given_xy);
        p["snapped_xy_m"] = xy(dp.snapped_xy);
        p["snap_distance_m"] = num(dp.snap_distance_m);
        const auto &c = dp.catchment;
        p["catchment"] = {{"area_m2", num(c.area_m2)},
                          {"local_area_m2", num(c.local_area_m2)},
                          {"longest_flow_path_m", num(c.longest_flow_path_m)},
                          {"elevation_top_m", num(c.elevation_top_m)},
                          {"elevation_outlet_m", num(c.elevation_outlet_m)},
                          {"slope_flow_path_m_per_m", num(c.slope_flow_path)},
                          {"slope_10_85_m_per_m", num(c.slope_10_85)},
                          {"mean_slope_m_per_m", num(c.mean_slope)},
                          {"upstream_points", c.upstream_points}};
        Json parts = Json::array();
        for (const auto &lp : dp.land.parts) {
            parts.push_back({{"land_class", lp.land_class},
                             {"soil_group", lp.soil_group},
                             {"area_m2", num(lp.area_m2)},
                             {"c", num(lp.c)},
                             {"cn", num(lp.cn)},
                             {"impervious_share", num(lp.impervious_share)}});
        }
        p["land"] = {{"c_weighted", num(dp.land.c_weighted)},
                     {"cn_weighted", num(dp.land.cn_weighted)},
                     {"impervious_share", num(dp.land.impervious_share)},
                     {"c_table", dp.land.c_table},
                     {"cn_table", dp.land.cn_table},
                     {"parts", parts}};
        p["tc_min"] = num(dp.tc_min);
        p["tc_method"] = dp.tc_method;
        Json peaks = Json::array();
        for (const auto &pk : dp.peaks) {
            Json e = {{"return_period_yr", num(pk.return_period_yr)},
                      {"method", pk.method},
                      {"q_m3_s", num(pk.q_m3_s)}};
            for (const auto &[k, v] : pk.intermediates) {
                e[k] = num(v);
            }
            if (pk.hydrograph) {
                e["hydrograph"] = {{"step_s", num(pk.hydrograph->step_s)},
                                   {"q_m3_s", pk.hydrograph->q_m3_s}};
            }
            peaks.push_back(std::move(e));
        }
        p["peaks"] = std::move(peaks);
        p["warnings"] = dp.lines.warning_count();
        p["lines"] = lines_json(dp.lines);
        points.push_back(std::move(p));
    }
    j["design_points"] = std::move(points);
    return j.dump(2) + "\n";
}

std::string summary_csv(const report::RunResults &r) {
    std::string s = "design_point,area_m2,tc_min,return_period_yr,method,q_m3_s,warnings\n";
    for (const auto &dp : r.points) {
        for (const auto &pk : dp.peaks) {
            s += fmt::format("{},{},{},{},{},{},{}\n", cell(dp.id), csv_num(dp.catchment.area_m2),
                             csv_num(dp.tc_min), csv_num(pk.return_period_yr), pk.method,
                             csv_num(pk.q_m3_s), dp.lines.warning_count());
        }
    }
    return s;
}

std::string run_record_json(const report::RunResults &r) {
    Json inputs = Json::array();
    for (const auto &i : r.stamp.inputs) {
        inputs.push_back({{"role", i.role}, {"path", i.path}, {"sha256", i.sha256}});
    }
    Json j = {{"format", "catchpeak run record"},
              {"tool_version", r.stamp.tool_version},
              {"git_commit", r.stamp.git_commit},
              {"run_time_utc", r.stamp.run_time_utc},
              {"inputs", inputs}};
    return j.dump(2) + "\n";
}

std::string summary_table(const report::RunResults &r) {
    const bool us = r.project.units == units::System::us_customary;
    std::set<double> rps;
    for (const auto &dp : r.points) {
        for (const auto &pk : dp.peaks) {
            rps.insert(pk.return_period_yr);
        }
    }
    std::string s =
        fmt::format("{:<12} {:>10} {:>8}", "point", us ? "area ac" : "area ha", "tc min");
    for (double rp : rps) {
        s += fmt::format(" {:>12}", fmt::format("Q{} {}", rp, us ? "ft3/s" : "m3/s"));
    }
    s += "  warnings\n";
    for (const auto &dp : r.points) {
        const double a =
            us ? units::m2_to_acre(dp.catchment.area_m2) : units::m2_to_ha(dp.catchment.area_m2);
        s += fmt::format("{:<12} {:>10} {:>8}", dp.id, sig(a), sig(dp.tc_min));
        for (double rp : rps) {
            std::string q = "-";
            for (const auto &pk : dp.peaks) {
                if (pk.return_period_yr == rp && pk.method == "rational") {
                    q = sig(us ? units::m3s_to_cfs(pk.q_m3_s) : pk.q_m3_s);
                }
            }
            s += fmt::format(" {:>12}", q);
        }
        s += fmt::format("  {}\n", dp.lines.warning_count());
    }
    return s;
}

} // namespace catchpeak::app
