// SPDX-License-Identifier: MIT
#include "catchpeak/app/pipeline.hpp"

#include "catchpeak/app/sha256.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/core/version.hpp"
#include "catchpeak/io/csv.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <ctime>
#include <fstream>
#include <ostream>
#include <utility>

namespace catchpeak::app {

namespace fs = std::filesystem;

namespace {

constexpr const char *kirpich_source = "Kirpich (1940); TxDOT Hydraulic Design Manual eq. 4-15";
constexpr const char *rational_source_us = "Rational Method, Q = C i A; 1 acre-in/h = 1.008 ft3/s";
constexpr const char *rational_source_si =
    "Rational Method, Q = C i A; SI form with i in mm/h, A in ha (computed: 1/360)";
constexpr const char *idf_source_suffix = "log-log interpolation between durations";

bool is_us(const Project &p) { return p.info.units == units::System::us_customary; }

const PointOverride *override_for(const Project &p, const std::string &id) {
    for (const auto &o : p.methods.points) {
        if (o.id == id) {
            return &o;
        }
    }
    return nullptr;
}

std::string utc_now() {
    const std::time_t t = std::chrono::system_clock::to_time_t(std::chrono::system_clock::now());
    std::tm tm{};
    gmtime_r(&t, &tm);
    return fmt::format("{:04}-{:02}-{:02}T{:02}:{:02}:{:02}Z", tm.tm_year + 1900, tm.tm_mon + 1,
                       tm.tm_mday, tm.tm_hour, tm.tm_min, tm.tm_sec);
}

/// Methods and inputs this build cannot compute yet, each a problem naming the key.
void not_yet_available(const Project &p, Problems &problems) {
    const std::string pf = p.file.string();
    if (!p.uses_table()) {
        problems.add(input_message(
            fmt::format("{}:{}: [inputs] dem", pf, p.inputs.dem ? p.inputs.dem->line : 0),
            "catchments from a DEM cannot be delineated by this build yet",
            "a catchment table ('catchment_table')"));
    }
    for (const std::string m : {"tr55_graphical", "scs_unit_hydrograph"}) {
        if (p.uses_method(m)) {
            problems.add(input_message(pf + ": [methods] peak",
                                       fmt::format("peak method '{}' is not in this build yet", m),
                                       "\"rational\""));
        }
    }
    auto tc_ok = [](const std::string &m) { return m == "kirpich" || m == "given"; };
    if (!tc_ok(p.methods.tc_method)) {
        problems.add(input_message(
            pf + ": [methods] tc",
            fmt::format("tc method '{}' is not in this build yet", p.methods.tc_method),
            "\"kirpich\", or \"given\" per design point"));
    }
    for (const auto &o : p.methods.points) {
        if (o.tc_method && !tc_ok(*o.tc_method)) {
            problems.add(
                input_message(fmt::format("{}:{}: [[methods.point]] tc", pf, o.line),
                              fmt::format("tc method '{}' is not in this build yet", *o.tc_method),
                              "\"kirpich\" or \"given\""));
        }
    }
    if (p.uses_table() && p.inputs.land_cover) {
        problems.add(
            input_message(fmt::format("{}:{}: [inputs] land_cover", pf, p.inputs.land_cover->line),
                          "weighting C and CN over land cover is not in this build yet",
                          "'c' and 'cn' columns in the catchment table"));
    }
}

} // namespace

double idf_intensity_mm_per_h(const IdfTable &idf, double return_period_yr, double duration_min) {
    const auto it = idf.intensity_mm_per_h.find(return_period_yr);
    if (it == idf.intensity_mm_per_h.end()) {
        throw_input_error(idf.source,
                          fmt::format("no column for the {}-year return period", return_period_yr),
                          "a column '<T>yr_mm_per_h' for every return period of the project");
    }
    const auto &d = idf.durations_min;
    const auto &i = it->second;
    if (duration_min < d.front() || duration_min > d.back()) {
        throw_input_error(
            idf.source,
            fmt::format("duration {} min is outside the table ({} to {} min); the table is not "
                        "extrapolated",
                        sig(duration_min), d.front(), d.back()),
            "a table covering every tc of the project");
    }
    std::size_t k = 1;
    while (k < d.size() - 1 && d[k] < duration_min) {
        ++k;
    }
    const double exponent = std::log(i[k] / i[k - 1]) / std::log(d[k] / d[k - 1]);
    return i[k - 1] * std::pow(duration_min / d[k - 1], exponent);
}

report::RunResults compute_from_table(const Project &p, const std::vector<TableCatchment> &rows,
                                      const IdfTable *idf) {
    report::RunResults r;
    r.project = p.info;
    const bool us = is_us(p);
    r.references = {
        {"Kirpich (1940)",
         "Kirpich, Z.P. (1940). Time of concentration of small agricultural watersheds. Civil "
         "Engineering 10(6), 362."},
        {"TxDOT Hydraulic Design Manual", "Texas Department of Transportation, Hydraulic Design "
                                          "Manual, chapter 4 Hydrology."},
    };
    r.caution_notes = {"Every result must be reviewed by a licensed professional engineer before "
                       "it is used for design; the local drainage code governs."};

    for (const auto &c : rows) {
        report::DesignPointResult dp;
        dp.id = c.id;
        dp.from_table = true;
        // A table catchment has no snapping; its coordinates are shown when the table has them.
        dp.given_xy = dp.snapped_xy = {std::nan(""), std::nan("")};
        dp.snap_distance_m = std::nan("");
        if (c.x && c.y) {
            dp.given_xy = dp.snapped_xy = {*c.x, *c.y};
            dp.snap_distance_m = 0.0;
        }
        dp.catchment.area_m2 = c.area_m2;
        dp.catchment.local_area_m2 = c.area_m2;
        dp.catchment.longest_flow_path_m = c.longest_flow_path_m;
        dp.catchment.elevation_outlet_m = std::nan("");
        dp.catchment.elevation_top_m = std::nan("");
        dp.catchment.slope_flow_path = c.slope;
        dp.catchment.slope_10_85 = std::nan("");
        dp.catchment.mean_slope = std::nan("");
        dp.land.c_weighted = c.c.value_or(std::nan(""));
        dp.land.cn_weighted = c.cn.value_or(std::nan(""));
        dp.land.impervious_share = std::nan("");
        dp.land.c_table = c.c ? "catchment table" : "";
        dp.land.cn_table = c.cn ? "catchment table" : "";

        const std::string table_src =
            fmt::format("project input ({}, line {})",
                        p.inputs.catchment_table ? p.inputs.catchment_table->given : "", c.line);
        auto &lines = dp.lines;
        const double area_ha = units::m2_to_ha(c.area_m2);
        const double area_ac = units::m2_to_acre(c.area_m2);
        const double length_ft = units::m_to_ft(c.longest_flow_path_m);
        if (us) {
            lines.note("Catchment area", fmt::format("A = {} ac", sig(area_ac)), table_src, area_ac,
                       "ac");
            lines.note("Longest flow path length", fmt::format("L = {} ft", sig(length_ft)),
                       table_src, length_ft, "ft");
        } else {
            lines.note("Catchment area", fmt::format("A = {} ha", sig(area_ha)), table_src, area_ha,
                       "ha");
            lines.note("Longest flow path length",
                       fmt::format("L = {} m", sig(c.longest_flow_path_m)), table_src,
                       c.longest_flow_path_m, "m");
        }
        lines.note("Slope of the longest flow path", fmt::format("S = {} m/m", sig(c.slope)),
                   table_src, c.slope, us ? "ft/ft" : "m/m");
        if (c.c) {
            lines.note("Runoff coefficient", fmt::format("C = {}", sig(*c.c)), table_src, *c.c);
        }
        if (c.cn) {
            lines.note("Curve number", fmt::format("CN = {}", sig(*c.cn)), table_src, *c.cn);
        }

        // Time of concentration.
        const PointOverride *o = override_for(p, c.id);
        std::string tc_method =
            (o != nullptr && o->tc_method) ? *o->tc_method : p.methods.tc_method;
        double tc = 0.0;
        if (o != nullptr && o->tc_min && (!o->tc_method || *o->tc_method == "given")) {
            tc_method = "given";
            tc = *o->tc_min;
            lines.note(
                "Time of concentration, given", fmt::format("tc = {} min", sig(tc)),
                fmt::format("project input ({}, line {})", p.file.filename().string(), o->line), tc,
                "min");
        } else if (c.tc_min && (o == nullptr || !o->tc_method)) {
            tc_method = "given";
            tc = *c.tc_min;
            lines.note("Time of concentration, given", fmt::format("tc = {} min", sig(tc)),
                       table_src, tc, "min");
        } else if (us) {
            tc = 0.0078 * std::pow(length_ft, 0.77) * std::pow(c.slope, -0.385);
            lines.calc(
                "Time of concentration, Kirpich (US form)", "tc = 0.0078 L^0.77 S^-0.385",
                fmt::format("tc = 0.0078 x {}^0.77 x {}^-0.385", sig(length_ft), sig(c.slope)), tc,
                "min", kirpich_source);
        } else {
            tc = 0.0195 * std::pow(c.longest_flow_path_m, 0.77) * std::pow(c.slope, -0.385);
            lines.calc("Time of concentration, Kirpich (SI form)", "tc = 0.0195 L^0.77 S^-0.385",
                       fmt::format("tc = 0.0195 x {}^0.77 x {}^-0.385", sig(c.longest_flow_path_m),
                                   sig(c.slope)),
                       tc, "min", kirpich_source);
        }
        if (tc < p.settings.minimum_tc_min) {
            lines.calc("Time of concentration, not below the minimum", "tc = max(tc, tc_min)",
                       fmt::format("tc = max({}, {})", sig(tc), sig(p.settings.minimum_tc_min)),
                       p.settings.minimum_tc_min, "min",
                       "project setting minimum_tc_min (common practice, no source)");
            tc = p.settings.minimum_tc_min;
        }
        dp.tc_min = tc;
        dp.tc_method = tc_method;

        const auto &peaks =
            (o != nullptr && o->peak_methods) ? *o->peak_methods : p.methods.peak_methods;
        const bool rational = std::find(peaks.begin(), peaks.end(), "rational") != peaks.end();
        if (rational && area_ha > p.settings.rational_area_limit_ha) {
            lines.warn("Rational Method area limit",
                       fmt::format("catchment area {} ha exceeds the limit of {} ha set for the "
                                   "Rational Method; use an SCS method or split the catchment",
                                   sig(area_ha), sig(p.settings.rational_area_limit_ha)),
                       "project setting rational_area_limit_ha (common practice, no source)");
        }
        for (double rp : p.rainfall.return_periods_yr) {
            if (!rational || idf == nullptr || !c.c) {
                continue;
            }
            const double i_mm = idf_intensity_mm_per_h(*idf, rp, tc);
            const double i_show = us ? units::mm_per_h_to_in_per_h(i_mm) : i_mm;
            lines.calc(fmt::format("Rainfall intensity, {}-year, duration tc", rp),
                       "i = IDF(T, tc)", fmt::format("i = IDF({} yr, {} min)", rp, sig(tc)), i_show,
                       us ? "in/h" : "mm/h",
                       fmt::format("project IDF table {} ({})",
                                   p.rainfall.idf ? p.rainfall.idf->given : "", idf_source_suffix));
            report::Peak pk;
            pk.return_period_yr = rp;
            pk.method = "rational";
            double q_m3_s = 0.0;
            if (us) {
                const double q_cfs = 1.008 * *c.c * i_show * area_ac;
                lines.calc(
                    fmt::format("Peak flow, Rational Method, {}-year", rp), "Q = 1.008 C i A",
                    fmt::format("Q = 1.008 x {} x {} x {}", sig(*c.c), sig(i_show), sig(area_ac)),
                    q_cfs, "ft3/s", rational_source_us);
                q_m3_s = units::cfs_to_m3s(q_cfs);
            } else {
                q_m3_s = *c.c * i_mm * area_ha / 360.0;
                lines.calc(
                    fmt::format("Peak flow, Rational Method, {}-year", rp), "Q = C i A / 360",
                    fmt::format("Q = {} x {} x {} / 360", sig(*c.c), sig(i_mm), sig(area_ha)),
                    q_m3_s, "m3/s", rational_source_si);
            }
            pk.q_m3_s = q_m3_s;
            pk.intermediates = {{"c", *c.c},
                                {"intensity_mm_per_h", i_mm},
                                {"duration_min", tc},
                                {"area_m2", c.area_m2}};
            dp.peaks.push_back(std::move(pk));
        }
        if (rational && p.rainfall.return_periods_yr.size() > 0 &&
            *std::max_element(p.rainfall.return_periods_yr.begin(),
                              p.rainfall.return_periods_yr.end()) > 10.0) {
            lines.warn("Rational Method frequency factor",
                       "no frequency factor Cf is applied to C for return periods above 10 "
                       "years; check what the local drainage code requires",
                       "common practice, no source");
        }
        number_lines(lines, dp.id);
        r.points.push_back(std::move(dp));
    }
    return r;
}

report::RunResults compute_project(const Project &p, std::ostream &progress, bool quiet) {
    Problems problems;
    check_project(p, problems);
    not_yet_available(p, problems);
    problems.throw_if_any();

    if (!quiet) {
        progress << "catchpeak: reading " << p.inputs.catchment_table->given << '\n';
    }
    const auto rows = read_catchment_table(p.inputs.catchment_table->resolved);
    std::optional<IdfTable> idf;
    if (p.rainfall.idf) {
        idf = read_idf_table(p.rainfall.idf->resolved);
    }
    if (!quiet) {
        progress << fmt::format("catchpeak: computing {} design points x {} return periods\n",
                                rows.size(), p.rainfall.return_periods_yr.size());
    }
    report::RunResults r = compute_from_table(p, rows, idf ? &*idf : nullptr);

    // The stamp: what was run, on what. Paths as written in the project file.
    r.stamp.tool_version = std::string(version());
    r.stamp.git_commit = std::string(git_commit());
    r.stamp.inputs.push_back({"project file", p.file.filename().string(), sha256_file(p.file)});
    auto add = [&](const std::string &role, const std::optional<InputPath> &ip) {
        if (ip) {
            r.stamp.inputs.push_back({role, ip->given, sha256_file(ip->resolved)});
        }
    };
    add("catchment table", p.inputs.catchment_table);
    add("DEM", p.inputs.dem);
    add("design points", p.inputs.design_points);
    add("land cover", p.inputs.land_cover);
    add("soils", p.inputs.soils);
    add("breach lines", p.inputs.breach_lines);
    add("C table", p.inputs.c_table);
    add("CN table", p.inputs.cn_table);
    add("IDF", p.rainfall.idf);
    add("annual maximum series", p.rainfall.annual_maximum_series);
    return r;
}

namespace {

/// Writes every output under a temporary name, then renames them all; on failure removes the
/// temporary files and leaves any earlier outputs as they were.
void write_outputs(const fs::path &dir,
                   const std::vector<std::pair<std::string, std::string>> &files) {
    std::error_code ec;
    fs::create_directories(dir, ec);
    if (ec) {
        throw_input_error(dir.string(), "the output folder cannot be created: " + ec.message(),
                          "a folder you may write to ('--out' or [output] folder)");
    }
    std::vector<fs::path> written;
    try {
        for (const auto &[name, text] : files) {
            const fs::path tmp = dir / ("." + name + ".partial");
            std::ofstream out(tmp, std::ios::binary | std::ios::trunc);
            written.push_back(tmp);
            out << text;
            out.close();
            if (!out) {
                throw_input_error(tmp.string(), "cannot be written",
                                  "a folder you may write to, with free space");
            }
        }
        for (std::size_t k = 0; k < files.size(); ++k) {
            fs::rename(written[k], dir / files[k].first);
        }
    } catch (...) {
        for (const auto &w : written) {
            fs::remove(w, ec);
        }
        throw;
    }
}

} // namespace

fs::path run_project(const fs::path &project_file, const RunOptions &options, std::ostream &out,
                     std::ostream &err) {
    const Project p = load_project(project_file);
    report::RunResults r = compute_project(p, err, options.quiet);
    r.stamp.run_time_utc = options.run_time_utc.empty() ? utc_now() : options.run_time_utc;
    const fs::path dir = options.out_dir ? *options.out_dir : p.output_dir;
    write_outputs(dir, {{"results.json", results_json(r)},
                        {"summary.csv", summary_csv(r)},
                        {"run-record.json", run_record_json(r)}});
    if (!options.quiet) {
        out << summary_table(r);
        out << fmt::format("outputs: {}\n", fs::absolute(dir).lexically_normal().string());
    }
    return dir;
}

void check_project_file(const fs::path &project_file, std::ostream &out) {
    Problems problems;
    const std::string text = io::read_text_file(project_file);
    const Project p = parse_project(text, project_file, problems);
    check_project(p, problems);
    not_yet_available(p, problems);
    problems.throw_if_any();
    out << fmt::format("{}: no problems found\n", project_file.string());
}

fs::path init_project(const fs::path &dir) {
    const fs::path file = dir / "project.toml";
    std::error_code ec;
    if (fs::exists(file, ec)) {
        throw_input_error(file.string(), "the file exists already and is not overwritten",
                          "a folder without a project.toml");
    }
    fs::create_directories(dir, ec);
    if (ec) {
        throw_input_error(dir.string(), "the folder cannot be created: " + ec.message(),
                          "a folder you may write to");
    }
    const fs::path tmp = dir / ".project.toml.partial";
    {
        std::ofstream o(tmp, std::ios::binary | std::ios::trunc);
        o << project_template();
        if (!o) {
            throw_input_error(tmp.string(), "cannot be written", "a folder you may write to");
        }
    }
    fs::rename(tmp, file);
    return file;
}

} // namespace catchpeak::app
