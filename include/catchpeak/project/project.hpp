// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/methods.hpp"
#include "catchpeak/core/snap_rule.hpp"
#include "catchpeak/core/spelling.hpp"
#include "catchpeak/hydro/tables.hpp"
#include "catchpeak/hydro/tc.hpp"
#include "catchpeak/project/options.hpp"
#include "catchpeak/report/results.hpp"

#include <filesystem>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

/// The project file (TOML): what a run computes, from which inputs, with which methods and
/// settings. config/project-template.toml documents every key.
namespace catchpeak::project {

/// One input file: the path as written in the project file, and resolved against the project
/// file's folder.
struct InputPath {
    std::string given;              ///< as written, for messages and the run record
    std::filesystem::path resolved; ///< relative paths are relative to the project file
    std::size_t line = 0;           ///< line of the key in the project file, for messages
};

/// [inputs]: either a DEM with design points, or a catchment table.
struct Inputs {
    std::optional<InputPath> dem;
    std::optional<InputPath> design_points;
    std::string design_points_layer; ///< empty: the first layer
    /// The CRS of the design points' coordinates when the file does not declare it right (a
    /// GeoJSON file in a projected CRS without a "crs" member): "EPSG:32617", WKT or PROJ;
    /// empty: the file's own.
    std::string design_points_crs;
    std::size_t design_points_crs_line = 0; ///< line of the key, 0 when not given
    std::string id_field = "id";
    std::optional<InputPath> catchment_table;
    /// Land parts of the catchments of the catchment table (CSV: id, class, soil_group and the
    /// area with its unit in the column name); C and CN are weighted from them.
    std::optional<InputPath> catchment_land_table;
    std::optional<InputPath> land_cover;
    std::string class_field = "class";
    std::optional<InputPath> soils;
    std::string soil_group_field = "hsg";
    /// Code tables (CSV: code,class and code,soil_group) for land cover and soils given as
    /// rasters of codes; empty: the raster's own category names or attribute table.
    std::optional<InputPath> land_cover_codes;
    std::optional<InputPath> soil_group_codes;
    std::optional<InputPath> breach_lines;
    std::optional<InputPath> c_table;          ///< empty: the table shipped in config/
    std::optional<InputPath> cn_table;         ///< empty: the table shipped in config/
    std::optional<InputPath> impervious_table; ///< empty: the table shipped in config/
    /// Culverts to design (CSV, one row per culvert at a design point; app/culvert_inputs.hpp).
    std::optional<InputPath> culvert_table;
};

/// [rainfall]
struct Rainfall {
    std::optional<InputPath> idf;
    std::vector<double> return_periods_yr;
    std::optional<hydro::StormType> storm_type; ///< unset when not given
    /// The project's own 24-hour storm distribution (CSV, io/storm_table.hpp) in place of the
    /// shipped NRCS one of storm_type; never both.
    std::optional<InputPath> storm_table;
    /// 24-hour design depth per return period, mm (given in mm or in inches in the file).
    std::map<double, double> depth_24h_mm;
    std::string depth_24h_key;      ///< "depths_24h_mm" or "depths_24h_in" as written; "" if none
    std::size_t depth_24h_line = 0; ///< line of that key in the project file, for messages
    /// Annual maximum 24-hour depths (CSV: year, depth_24h_mm or depth_24h_in); when given,
    /// the 24-hour design depth of every return period is fitted to it.
    std::optional<InputPath> annual_maximum_series;
    AmsDistribution ams_distribution = AmsDistribution::gumbel;
    std::size_t ams_distribution_line = 0; ///< line of the key, 0 when not given
    /// Design storm of the SCS unit hydrograph (the alternating block in blocks of [settings]
    /// storm_time_step_min); unset when the key names no known storm (reported already).
    std::optional<DesignStorm> design_storm = DesignStorm::nrcs_24h;
    std::size_t design_storm_line = 0;   ///< line of the key, 0 when not given
    double storm_duration_min = 0.0;     ///< alternating_block only; 0 when not given
    std::size_t storm_duration_line = 0; ///< line of the key, 0 when not given

    /// The storm type; throws InputError naming `file` when none is given (the project's
    /// checks refuse that already when a method needs it).
    [[nodiscard]] hydro::StormType required_storm_type(const std::string &file) const;

    [[nodiscard]] bool alternating_block() const noexcept {
        return design_storm == DesignStorm::alternating_block;
    }
};

/// Choices of the engineer for the TR-55 segmental tc ([methods.tr55_segmental], and per point
/// in [[methods.point]]). The longest flow path is split: the first sheet_flow_max_length_m is
/// sheet flow, the next shallow_length_m shallow concentrated flow, the rest channel flow.
/// Defaults: sheet n 0.24, dense grasses (TR-55 Table 3-1); channel n 0.05 and the channel
/// section a = 27 ft2, pw = 28.2 ft of TR-55 Example 3-1.
struct SegmentalParameters {
    double sheet_manning_n = 0.24;
    hydro::ShallowSurface shallow_surface = hydro::ShallowSurface::unpaved;
    /// Length of shallow concentrated flow after the sheet flow, m; unset: the whole rest of
    /// the flow path (a warning line says so).
    std::optional<double> shallow_length_m;
    double channel_manning_n = 0.05;
    double channel_flow_area_m2 = 27.0 * 0.3048 * 0.3048; ///< 27 ft2
    double channel_wetted_perimeter_m = 28.2 * 0.3048;    ///< 28.2 ft
};

/// Choices for the Kerby-Kirpich tc ([methods.kerby_kirpich], and per point): Kerby overland
/// flow over the first sheet_flow_max_length_m of the flow path, Kirpich for the rest.
/// Default retardance N 0.40, average grass (Kerby's table as given in the TxDOT Hydraulic
/// Design Manual ch. 4).
struct KerbyParameters {
    double retardance_n = 0.40;
};

/// Per design point choices in [[methods.point]].
struct PointOverride {
    std::string id;
    std::size_t line = 0;
    std::optional<TcMethod> tc_method;
    std::optional<std::vector<PeakMethod>> peak_methods;
    std::optional<double> tc_min;             ///< a tc given by the engineer instead of computed
    std::optional<double> pond_swamp_percent; ///< overrides [settings] pond_swamp_percent
    SegmentalParameters tr55_segmental;       ///< the project's, with this point's keys over them
    KerbyParameters kerby_kirpich;            ///< the project's, with this point's keys over them
    /// The catchment area the engineer expects (from a map, a previous study), m2; the run
    /// refuses a delineated area outside [settings] expected_area_tolerance_percent of it.
    std::optional<double> expected_area_m2;
    std::string expected_area_key; ///< "expected_area_ha" or "expected_area_ac" as written
};

/// [methods]
struct Methods {
    TcMethod tc_method = TcMethod::kirpich;
    std::vector<PeakMethod> peak_methods{PeakMethod::rational};
    /// The SCS runoff of a catchment with land parts: of the composite CN (default) or the
    /// area-weighted runoff of the parts.
    CnWeighting cn_weighting = CnWeighting::composite;
    SegmentalParameters tr55_segmental;
    KerbyParameters kerby_kirpich;
    std::vector<PointOverride> points;
};

/// [settings]. SI, unit in every name.
struct Settings {
    double snap_radius_m = 10.0;
    std::size_t snap_radius_line = 0; ///< line of the key, 0 when not given
    /// How a design point moves onto the flow network (core/snap_rule.hpp). Default
    /// nearest_stream: it keeps the point on the channel it was drawn beside.
    SnapRule snap = SnapRule::nearest_stream;
    /// nearest_stream: cells draining at least this area are streams (our choice: 1 ha, so
    /// that a flow line down a valley side is none but the swales and gutter lines of most
    /// culverts and inlets are; a point without one keeps its cell, with a warning).
    double snap_stream_threshold_m2 = 1.0e4;
    /// Warn when the snapped catchment is more than this many times the catchment of the cell
    /// under the given point, or when the largest and smallest catchment within the snap
    /// radius differ by more (our choice, no source).
    double snap_area_factor = 4.0;
    /// A design point's delineated area outside this share of its expected area (a key of
    /// [[methods.point]] or a field of the design points) is refused; a project choice.
    double expected_area_tolerance_percent = 25.0;
    double minimum_tc_min = 5.0;
    double rational_area_limit_ha = 80.0;   ///< common practice, no source (REFERENCES.md 4)
    double sheet_flow_max_length_m = 30.48; ///< 100 ft, NEH 630 ch. 15 (REFERENCES.md 9)
    double initial_abstraction_ratio = 0.2; ///< Ia/S: 0.2 (TR-55) or 0.05 (Hawkins 2002)
    DualSoilGroup dual_soil_group = DualSoilGroup::undrained;
    UncoveredLand uncovered_land = RefuseUncovered{};
    /// Land parts (class on soil group) of a catchment smaller than this are added to its
    /// largest part, with a line that says so: slivers of the overlay, not land uses (our
    /// choice: 10 m2, about 108 ft2, an absolute area so that no real patch is lost).
    double min_land_part_m2 = 10.0;
    /// Share of the catchment in ponds and swamps, %, for the TR-55 graphical method's Fp;
    /// unset: 0 % (Fp = 1), said in a note.
    std::optional<double> pond_swamp_percent;
    std::size_t pond_swamp_line = 0;
    /// Time step of the design storm hyetograph, min: > 0, at most 60, and the storm in whole
    /// steps (1440 min for the NRCS 24-hour storm, storm_duration_min for the alternating block).
    double storm_time_step_min = 6.0;
    std::size_t storm_time_step_line = 0;
};

/// [design]: the choices that turn peak flows into structure sizes. SI, unit in every name.
struct Design {
    /// The return period a culvert is sized for when its row gives none; one of
    /// [rainfall] return_periods_yr.
    std::optional<double> culvert_return_period_yr;
    std::size_t culvert_return_period_line = 0;
    /// The list of standard culvert sizes; unset: config/culvert_sizes_si.csv or _us.csv.
    std::optional<InputPath> culvert_sizes;
    /// Outlet velocity above which a warning asks for outlet protection (common practice,
    /// no source: 4.5 m/s, about 15 ft/s).
    double outlet_velocity_max_m_per_s = 4.5;
};

struct Project {
    std::filesystem::path file; ///< the project file
    std::filesystem::path dir;  ///< its folder; relative paths are relative to it
    report::ProjectInfo info;
    Inputs inputs;
    Rainfall rainfall;
    Methods methods;
    Settings settings;
    Design design;
    std::filesystem::path output_dir; ///< resolved against the project file's folder

    [[nodiscard]] bool uses_table() const noexcept { return inputs.catchment_table.has_value(); }
    /// True when the project's peak methods or a point's include `method`.
    [[nodiscard]] bool uses_method(PeakMethod method) const;
    /// True when the project's tc method or a point's is `method`.
    [[nodiscard]] bool uses_tc_method(TcMethod method) const;
};

/// A list of problems found in the inputs, each "<file>:<line>: <what>; accepted: <...>".
/// Commands collect every problem first and report them all at once.
class Problems {
  public:
    void add(std::string message) { list_.push_back(std::move(message)); }
    [[nodiscard]] bool empty() const noexcept { return list_.empty(); }
    [[nodiscard]] std::size_t size() const noexcept { return list_.size(); }
    [[nodiscard]] const std::vector<std::string> &list() const noexcept { return list_; }
    /// Throws InputError listing every problem (one per line) when there is any.
    void throw_if_any() const;

  private:
    std::vector<std::string> list_;
};

/// Parses project file text. `file` names it in messages and gives the folder relative paths
/// are resolved against. Problems (syntax, unknown keys, wrong types, missing or out-of-range
/// values) are added to `problems`; the returned project holds what could be read.
[[nodiscard]] Project parse_project(std::string_view text, const std::filesystem::path &file,
                                    Problems &problems);

/// The commented project template (config/project-template.toml, built into the program).
[[nodiscard]] std::string_view project_template();

/// Reads and parses a project file; throws InputError listing every problem.
[[nodiscard]] Project load_project(const std::filesystem::path &file);

// "Did you mean" suggestions (core/spelling.hpp), as the project's readers use them.
using catchpeak::closest_match;
using catchpeak::edit_distance;

} // namespace catchpeak::project
