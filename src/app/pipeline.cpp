// SPDX-License-Identifier: MIT
#include "catchpeak/app/pipeline.hpp"

#include "catchpeak/app/culverts.hpp"
#include "catchpeak/app/dem_project.hpp"
#include "catchpeak/app/land_inputs.hpp"
#include "catchpeak/app/point_hydrology.hpp"
#include "catchpeak/app/sha256.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/files.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/core/version.hpp"
#include "catchpeak/hydro/rational.hpp"
#include "catchpeak/hydro/tc.hpp"
#include "catchpeak/io/culvert_tables.hpp"
#include "catchpeak/io/hydro_tables.hpp"
#include "catchpeak/io/idf_csv.hpp"
#include "catchpeak/report/outputs.hpp"
#include "catchpeak/report/sheet.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <ctime>
#include <fstream>
#include <ostream>
#include <tuple>
#include <utility>

namespace catchpeak::app {

using project::InputPath;
using project::load_project;
using project::Methods;
using project::parse_project;
using project::Problems;
using project::Project;
using project::project_template;

namespace fs = std::filesystem;

namespace {

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
    if (p.uses_table() && p.inputs.land_cover) {
        problems.add(
            input_message(fmt::format("{}:{}: [inputs] land_cover", pf, p.inputs.land_cover->line),
                          "weighting C and CN over land cover is not in this build yet",
                          "'c' and 'cn' columns in the catchment table"));
    }
}

} // namespace

report::RunResults compute_from_table(const Project &p, const std::vector<TableCatchment> &rows,
                                      const HydrologyTables &tables,
                                      const LandPartsById &land_parts) {
    report::RunResults r;
    r.project = p.info;
    r.caution_notes = report::default_caution_notes();
    const std::optional<land::LandTables> land_tables =
        land_parts.empty() ? std::nullopt : std::optional(project_land_tables(p));

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

        PointInputs in;
        in.area_m2 = c.area_m2;
        in.longest_flow_path_m = c.longest_flow_path_m;
        in.slope = c.slope;
        in.c = c.c;
        in.cn = c.cn;
        in.tc_min = c.tc_min;
        if (const auto parts = land_parts.find(c.id); parts != land_parts.end()) {
            auto weighted = weight_table_catchment(p, c, parts->second, *land_tables);
            dp.land = std::move(weighted.weighting);
            in.land_lines = std::move(weighted.lines);
            if (std::isfinite(dp.land.c_weighted)) {
                in.c = dp.land.c_weighted;
            }
            if (std::isfinite(dp.land.cn_weighted)) {
                in.cn = dp.land.cn_weighted;
            }
            in.land_parts = land_parts_of(dp.land);
        }
        in.source =
            fmt::format("project input ({}, line {})",
                        p.inputs.catchment_table ? p.inputs.catchment_table->given : "", c.line);
        compute_point_hydrology(p, in, tables, dp);
        add_method_references(p, dp, r.references);
        r.points.push_back(std::move(dp));
    }
    return r;
}

namespace {

/// The stamp: what was run, on what. Paths as written in the project file.
void stamp_inputs(const Project &p, const LoadedTables &tables, const LandPartsById &land_parts,
                  report::RunResults &r) {
    r.stamp.tool_version = std::string(version());
    r.stamp.git_commit = std::string(git_commit());
    r.stamp.inputs.push_back({"project file", p.file.filename().string(), sha256_file(p.file)});
    auto add = [&](const std::string &role, const std::optional<InputPath> &ip) {
        if (ip) {
            r.stamp.inputs.push_back({role, ip->given, sha256_file(ip->resolved)});
        }
    };
    add("catchment table", p.inputs.catchment_table);
    add("catchment land table", p.inputs.catchment_land_table);
    add("DEM", p.inputs.dem);
    add("design points", p.inputs.design_points);
    add("land cover", p.inputs.land_cover);
    add("soils", p.inputs.soils);
    add("land cover codes", p.inputs.land_cover_codes);
    add("soil group codes", p.inputs.soil_group_codes);
    // A raster's category names and attribute table may live beside it (GDAL's .aux.xml).
    for (const auto &[role, ip] : {std::pair{"land cover names", p.inputs.land_cover},
                                   std::pair{"soils names", p.inputs.soils}}) {
        if (ip && fs::exists(ip->resolved.string() + ".aux.xml")) {
            add(role, InputPath{ip->given + ".aux.xml", ip->resolved.string() + ".aux.xml", 0});
        }
    }
    add("breach lines", p.inputs.breach_lines);
    add("culvert table", p.inputs.culvert_table);
    if (p.inputs.culvert_table) {
        std::vector<std::pair<std::string, std::string>> shipped{
            {"culvert inlet table", io::culvert_inlets_file}};
        if (p.design.culvert_sizes) {
            add("culvert sizes", p.design.culvert_sizes);
        } else {
            shipped.emplace_back("culvert sizes", io::culvert_sizes_file(
                                                      p.info.units == units::System::us_customary));
        }
        for (const auto &[role, rel] : shipped) {
            r.stamp.inputs.push_back({role, (fs::path("config") / rel).generic_string(),
                                      sha256_file(config_dir() / rel)});
        }
    }
    // The land tables: the project's own, else the shipped ones, when land is weighted.
    if (!p.uses_table() || !land_parts.empty()) {
        for (const auto &[role, own, shipped] :
             {std::tuple{"C table", p.inputs.c_table, "runoff_coefficients.csv"},
              std::tuple{"CN table", p.inputs.cn_table, "curve_numbers.csv"},
              std::tuple{"impervious share table", p.inputs.impervious_table,
                         "impervious_shares.csv"}}) {
            if (own) {
                add(role, own);
            } else {
                const fs::path rel = fs::path("land") / shipped;
                r.stamp.inputs.push_back({role, (fs::path("config") / rel).generic_string(),
                                          sha256_file(config_dir() / rel)});
            }
        }
    } else {
        add("C table", p.inputs.c_table);
        add("CN table", p.inputs.cn_table);
        add("impervious share table", p.inputs.impervious_table);
    }
    add("IDF", p.rainfall.idf);
    if (needs_of(p).design_storm && !p.rainfall.alternating_block()) {
        add("design storm", p.rainfall.storm_table);
    }
    add("annual maximum series", p.rainfall.annual_maximum_series);
    for (const auto &[role, rel] : tables.config_files) {
        r.stamp.inputs.push_back(
            {role, (fs::path("config") / rel).generic_string(), sha256_file(config_dir() / rel)});
    }
}

} // namespace

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
    Problems land_problems;
    const LandPartsById land_parts = read_land_parts(p, rows, land_problems);
    land_problems.throw_if_any();
    const LoadedTables tables = load_hydrology_tables(p, config_dir());
    report::RunResults r;
    CulvertSites culvert_sites; // a DEM project's breach line ends, for culvert inverts
    if (p.uses_table()) {
        if (!quiet) {
            progress << fmt::format("catchpeak: computing {} design points x {} return periods\n",
                                    rows.size(), p.rainfall.return_periods_yr.size());
        }
        r = compute_from_table(p, rows, tables.view(), land_parts);
    } else {
        r = compute_from_table(p, {}, tables.view()); // project info, references, notes
        DemPoints dem = compute_dem_points(p, tables.view(), quiet ? nullptr : &progress);
        r.points = std::move(dem.points);
        for (const auto &dp : r.points) {
            add_method_references(p, dp, r.references);
        }
        r.references.insert(r.references.end(), dem.references.begin(), dem.references.end());
        if (gpkg_layers != nullptr) {
            *gpkg_layers = std::move(dem.layers);
        }
        culvert_sites = std::move(dem.culvert_sites);
    }

    if (auto note = storm_averaging_caution(tables.view(), r.points)) {
        r.caution_notes.push_back(std::move(*note));
    }
    design_culverts(p, r, culvert_sites);

    stamp_inputs(p, tables, land_parts, r);
    return r;
}

namespace {

/// Removes the temporary files that a run killed while writing (kill -9, power lost) left in
/// the output folder, and says so on `err`. A failing run leaves none of its own: each is
/// removed when its write fails.
void remove_stale_outputs(const fs::path &dir, std::ostream &err) {
    for (const auto &f : remove_stale_temporaries(dir, report::output_file_names())) {
        err << fmt::format("catchpeak: removed {}, a temporary file left by an interrupted run\n",
                           f.string());
    }
}

} // namespace

fs::path run_project(const fs::path &project_file, const RunOptions &options, std::ostream &out,
                     std::ostream &err) {
    const Project p = load_project(project_file);
    const fs::path dir = options.out_dir ? *options.out_dir : p.output_dir;
    remove_stale_outputs(dir, err);
    std::vector<io::OutLayer> layers;
    report::RunResults r = compute_project(p, err, options.quiet, &layers);
    r.stamp.run_time_utc = options.run_time_utc.empty() ? utc_now() : options.run_time_utc;
    r.stamp.project_file_from_output = fs::absolute(p.file)
                                           .lexically_normal()
                                           .lexically_relative(fs::absolute(dir).lexically_normal())
                                           .generic_string();
    if (!options.quiet) {
        err << "catchpeak: writing results and the calculation sheet\n";
    }
    PendingFiles gpkg;
    if (!layers.empty()) {
        std::error_code ec;
        fs::create_directories(dir, ec);
        const fs::path temp = gpkg.add(dir / report::catchments_file_name);
        io::write_gpkg(temp, layers);
        // The temporary holds the final bytes: it is only renamed, with the other outputs.
        r.stamp.outputs.push_back({std::string(report::catchments_file_name), sha256_file(temp)});
    }
    (void)report::write_outputs(
        r, dir, [](const fs::path &f) { return sha256_file(f); }, std::move(gpkg));
    if (!options.quiet) {
        out << summary_table(r);
        out << fmt::format("outputs: {}\n", fs::absolute(dir).lexically_normal().string());
    }
    return dir;
}

void check_project_file(const fs::path &project_file, std::ostream &out) {
    Problems problems;
    const std::string text = read_text_file(project_file);
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
    write_text_file_atomic(file, project_template());
    return file;
}

} // namespace catchpeak::app
