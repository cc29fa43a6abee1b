// SPDX-License-Identifier: MIT
#include "catchpeak/app/pipeline.hpp"

#include "catchpeak/app/dem_project.hpp"
#include "catchpeak/app/sha256.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/core/version.hpp"
#include "catchpeak/hydro/rational.hpp"
#include "catchpeak/hydro/tc.hpp"
#include "catchpeak/io/atomic_file.hpp"
#include "catchpeak/io/csv.hpp"
#include "catchpeak/io/hydro_tables.hpp"
#include "catchpeak/io/idf_csv.hpp"
#include "catchpeak/report/outputs.hpp"

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

report::RunResults compute_from_table(const Project &p, const std::vector<TableCatchment> &rows,
                                      const rain::Idf *idf,
                                      const hydro::FrequencyFactorTable &frequency_factors) {
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
        } else {
            auto k = hydro::kirpich_tc_min(c.longest_flow_path_m, c.slope, c.area_m2, p.info.units);
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
            if (!rational || idf == nullptr || !c.c) {
                continue;
            }
            auto i = idf->intensity(tc, rp, p.info.units);
            lines.append(i.lines);
            auto cf = hydro::frequency_factor(frequency_factors, rp);
            lines.append(cf.lines);
            auto q = hydro::rational_peak_m3_s(*c.c, cf.value, i.value, c.area_m2, p.info.units,
                                               rational_settings);
            // The line that gives Q: the last calculation line of the Rational Method's lines.
            std::size_t q_line = lines.size();
            for (std::size_t k = 0; k < q.lines.size(); ++k) {
                if (q.lines.lines()[k].kind == LineKind::calculation) {
                    q_line = lines.size() + k;
                }
            }
            q_line_index.push_back(q_line);
            lines.append(q.lines);
            report::Peak pk;
            pk.return_period_yr = rp;
            pk.method = "rational";
            pk.q_m3_s = q.value;
            pk.intermediates = {{"c", *c.c},
                                {"cf", cf.value},
                                {"intensity_mm_per_h", i.value},
                                {"duration_min", tc}};
            dp.peaks.push_back(std::move(pk));
        }
        number_lines(lines, dp.id);
        for (std::size_t k = 0; k < dp.peaks.size(); ++k) {
            if (q_line_index[k] < lines.size()) {
                dp.peaks[k].line_id = lines.lines()[q_line_index[k]].id;
            }
        }
        r.points.push_back(std::move(dp));
    }
    return r;
}

report::RunResults compute_project(const Project &p, std::ostream &progress, bool quiet,
                                   std::vector<io::OutLayer> *gpkg_layers) {
    Problems problems;
    check_project(p, problems);
    not_yet_available(p, problems);
    problems.throw_if_any();

    std::vector<TableCatchment> rows;
    if (p.uses_table()) {
        if (!quiet) {
            progress << "catchpeak: reading " << p.inputs.catchment_table->given << '\n';
        }
        rows = read_catchment_table(p.inputs.catchment_table->resolved);
    }
    std::optional<rain::Idf> idf;
    if (p.rainfall.idf) {
        idf = io::read_idf_csv(p.rainfall.idf->resolved);
    }
    hydro::FrequencyFactorTable cf_table;
    if (p.uses_method("rational")) {
        cf_table = io::read_frequency_factor_table(config_dir() / "rational_frequency_factors.csv");
    }
    report::RunResults r;
    if (p.uses_table()) {
        if (!quiet) {
            progress << fmt::format("catchpeak: computing {} design points x {} return periods\n",
                                    rows.size(), p.rainfall.return_periods_yr.size());
        }
        r = compute_from_table(p, rows, idf ? &*idf : nullptr, cf_table);
    } else {
        r = compute_from_table(p, {}, nullptr, cf_table); // project info, references, notes
        DemPoints dem =
            compute_dem_points(p, idf ? &*idf : nullptr, cf_table, quiet ? nullptr : &progress);
        r.points = std::move(dem.points);
        r.references.insert(r.references.end(), dem.references.begin(), dem.references.end());
        if (gpkg_layers != nullptr) {
            *gpkg_layers = std::move(dem.layers);
        }
    }

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
    if (p.uses_method("rational")) {
        const auto cf = config_dir() / "rational_frequency_factors.csv";
        r.stamp.inputs.push_back(
            {"frequency factor table", "config/rational_frequency_factors.csv", sha256_file(cf)});
    }
    return r;
}

fs::path run_project(const fs::path &project_file, const RunOptions &options, std::ostream &out,
                     std::ostream &err) {
    const Project p = load_project(project_file);
    std::vector<io::OutLayer> layers;
    report::RunResults r = compute_project(p, err, options.quiet, &layers);
    r.stamp.run_time_utc = options.run_time_utc.empty() ? utc_now() : options.run_time_utc;
    const fs::path dir = options.out_dir ? *options.out_dir : p.output_dir;
    if (!options.quiet) {
        err << "catchpeak: writing results and the calculation sheet\n";
    }
    std::optional<io::PendingFile> gpkg;
    if (!layers.empty()) {
        std::error_code ec;
        fs::create_directories(dir, ec);
        gpkg.emplace(dir / "catchments.gpkg");
        io::write_gpkg(gpkg->temp_path(), layers);
    }
    (void)report::write_outputs(r, dir);
    if (gpkg) {
        gpkg->commit();
    }
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
    if (problems.empty() && !p.uses_table()) {
        check_dem_inputs(p, problems);
    }
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
