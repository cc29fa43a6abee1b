// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/methods.hpp"
#include "catchpeak/core/snap_rule.hpp"
#include "catchpeak/core/units.hpp"

#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <utility>
#include <vector>

/// The results of a run, as `app` hands them to `report`. Plain values, SI throughout (units in
/// the member names); `report` converts to the sheet's unit system when it renders.
namespace catchpeak::report {

/// Page size of the calculation sheet.
enum class PageSize { letter, a4 };

/// The texts of [project] page_size (and of results.json).
inline constexpr OptionTable<PageSize, 2> page_size_options{{
    {"letter", PageSize::letter},
    {"a4", PageSize::a4},
}};

/// Project information from the project file's [project] table.
struct ProjectInfo {
    std::string name;
    std::string number;
    std::string client;
    std::string location; ///< in words
    std::string prepared_by;
    std::string checked_by;
    std::string revision;
    units::System units = units::System::si;
    std::optional<PageSize> page_size; ///< unset: by the unit system (page_size_for)
};

/// One input file and its SHA-256, for the stamp and for recheck.
struct InputRecord {
    std::string role; ///< "project file", "DEM", "design points", "land cover", "IDF", ...
    std::string path; ///< as given in the project file (relative to it), never rewritten
    std::string sha256;
};

/// One file a run wrote into its output folder and the SHA-256 of the bytes written.
struct OutputRecord {
    std::string path; ///< relative to the output folder, e.g. "results.json"
    std::string sha256;
};

/// The stamp: what was run, on what, when. Goes in the run record and on the sheet, never in
/// results.json (which must be byte-identical between runs).
struct Stamp {
    std::string tool_version;
    std::string git_commit;
    std::string run_time_utc; ///< ISO 8601, e.g. "2026-12-02T10:15:00Z"
    std::vector<InputRecord> inputs;
    /// Every output of the run but run-record.json itself; empty in a record of an older run.
    std::vector<OutputRecord> outputs;
    /// Where the project file lay, relative to the output folder (e.g.
    /// "../../demo-data/demo-project.toml"), so that recheck finds it; "" when not recorded.
    std::string project_file_from_output;
};

/// A ring or a line in CRS coordinates (metres).
using Path = std::vector<std::pair<double, double>>;
/// A polygon: outer ring first, then holes.
using Polygon = std::vector<Path>;

/// What the map of one design point shows. Everything in the DEM's CRS (metres).
struct MapData {
    std::vector<Polygon> catchment;       ///< total catchment outline
    std::vector<Polygon> local_catchment; ///< own part, when nested points lie upstream
    Path longest_flow_path;
    std::vector<Path> streams;
    std::pair<double, double> given_xy{0.0, 0.0};
    std::pair<double, double> snapped_xy{0.0, 0.0};
    /// Hillshade of the DEM around the catchment, 0-255, row-major, north up.
    std::size_t hillshade_width = 0;
    std::size_t hillshade_height = 0;
    std::vector<std::uint8_t> hillshade;
    double hillshade_min_x = 0.0, hillshade_min_y = 0.0; ///< lower-left corner
    double hillshade_max_x = 0.0, hillshade_max_y = 0.0; ///< upper-right corner
    /// The linear unit of the DEM file's own CRS, in which the map's grid coordinates are
    /// labelled (so they match the engineer's survey), and metres per that unit.
    std::string crs_unit = "metre";
    double crs_unit_m = 1.0;
};

/// Figures of a catchment, from the DEM or from a catchment table.
struct CatchmentFigures {
    double area_m2 = 0.0;
    double local_area_m2 = 0.0; ///< equals area_m2 unless design points lie upstream
    double longest_flow_path_m = 0.0;
    double elevation_top_m = 0.0;
    double elevation_outlet_m = 0.0;
    double slope_flow_path = 0.0;             ///< H/L along the longest flow path, m/m
    double slope_10_85 = 0.0;                 ///< m/m
    double mean_slope = 0.0;                  ///< mean catchment slope (Horn 1981), m/m
    std::vector<std::string> upstream_points; ///< ids of design points nested inside
};

/// One (land-cover class, hydrologic soil group) part of a catchment.
struct LandPart {
    std::string land_class;
    std::string soil_group;
    double area_m2 = 0.0;
    double c = 0.0;
    double cn = 0.0;
    double impervious_share = 0.0; ///< 0..1
};

struct LandWeighting {
    std::vector<LandPart> parts;
    double c_weighted = 0.0;
    double cn_weighted = 0.0;
    double impervious_share = 0.0;
    std::string c_table;  ///< which table the C values came from
    std::string cn_table; ///< which table the CN values came from
    /// How the SCS runoff weighted the parts ([methods] cn_weighting: "composite" or "runoff");
    /// empty when the runoff did not come from parts.
    std::string cn_weighting;
};

/// A hydrograph: flow at equal time steps from the start of the storm.
struct Hydrograph {
    double step_s = 0.0;
    std::vector<double> q_m3_s;
    std::vector<double> rain_mm;   ///< incremental rainfall per step (for the hyetograph plot)
    std::vector<double> excess_mm; ///< incremental rainfall excess per step
};

/// The peak flow of one method for one return period.
struct Peak {
    double return_period_yr = 0.0;
    PeakMethod method = PeakMethod::rational;
    double q_m3_s = 0.0;
    /// Id of the calculation line that gives q (e.g. "DP3-L18"), for summary.csv and the
    /// summary page; empty when the runner did not record it.
    std::string line_id;
    /// The method's intermediates, SI with the unit in the key: "intensity_mm_per_h",
    /// "runoff_depth_mm", "rainfall_depth_mm", "time_to_peak_min", "volume_m3", "c_cf", ...
    std::map<std::string, double> intermediates;
    std::optional<Hydrograph> hydrograph;
};

/// A culvert at a design point checked for one flow (SI; HDS-5 (2012) terms).
struct CulvertCase {
    double return_period_yr = 0.0;
    bool design = false; ///< the flow the culvert is sized or checked for
    double flow_m3_s = 0.0;
    double culvert_flow_m3_s = 0.0;     ///< through the barrels
    double overtopping_flow_m3_s = 0.0; ///< over the road
    double tailwater_m = 0.0;
    double inlet_control_headwater_m = 0.0; ///< over the inlet invert
    double outlet_control_headwater_m = 0.0;
    double headwater_m = 0.0; ///< the larger, over the inlet invert
    double headwater_elevation_m = 0.0;
    double allowed_headwater_m = 0.0; ///< over the inlet invert
    std::string control;              ///< "inlet" or "outlet"
    double outlet_velocity_m_per_s = 0.0;
    bool passes = false;
    /// Id of the line that gives the controlling headwater (e.g. "DP3-L52"), and of the line of
    /// the peak whose flow the culvert carries; empty when the runner did not record them.
    std::string headwater_line_id;
    std::string flow_line_id;
};

/// One point of a culvert's performance curve.
struct CulvertCurvePoint {
    double flow_m3_s = 0.0;
    double headwater_elevation_m = 0.0;
    double inlet_control_headwater_m = 0.0;
    double outlet_control_headwater_m = 0.0;
    double overtopping_flow_m3_s = 0.0;
};

/// The culvert at a design point: its size (chosen or given) and every flow checked.
struct CulvertResult {
    std::string shape; ///< "circular" or "box"
    int barrels = 1;
    double span_m = 0.0; ///< the diameter of a circular pipe
    double rise_m = 0.0;
    bool sized = false;     ///< chosen from the list of standard sizes (else given)
    bool size_found = true; ///< false when no listed size passes (the largest is checked)
    std::string inlet;      ///< the key of the inlet table
    double inlet_invert_m = 0.0;
    double outlet_invert_m = 0.0;
    double length_m = 0.0;
    std::optional<double> crest_elevation_m; ///< the road crest, when given
    std::vector<CulvertCase> cases;
    std::vector<CulvertCurvePoint> curve;
};

/// How a design point of a DEM was snapped (terrain::snap_point), SI. The areas are flow
/// accumulations (cells draining through a cell x the cell area).
struct SnapFigures {
    SnapRule rule = SnapRule::nearest_stream;
    double radius_m = 0.0;
    double stream_threshold_m2 = 0.0; ///< nearest_stream: stream cells drain at least this
    double given_cell_area_m2 = 0.0;  ///< the catchment of the cell under the given point
    double snapped_area_m2 = 0.0;     ///< the catchment of the snapped cell
    double min_area_within_radius_m2 = 0.0;
    double max_area_within_radius_m2 = 0.0;
    bool no_stream_within_radius = false; ///< nearest_stream found none: not moved
    std::string direction;                ///< of the move ("north-east"), "" when not moved
    double area_factor = 0.0;             ///< [settings] snap_area_factor
};

/// Everything about one design point.
struct DesignPointResult {
    std::string id;
    std::pair<double, double> given_xy{0.0, 0.0};
    std::pair<double, double> snapped_xy{0.0, 0.0};
    double snap_distance_m = 0.0;
    std::optional<SnapFigures> snap; ///< a design point of a DEM; unset for a table catchment
    bool from_table = false;         ///< catchment from a catchment table, not from the DEM
    CatchmentFigures catchment;
    LandWeighting land;
    double tc_min = 0.0;
    std::optional<TcMethod> tc_method; ///< unset until the tc is computed
    std::vector<Peak> peaks;
    /// The numbered calculation lines of this design point (ids "<id>-L<n>"), warnings
    /// included, in the order they appear on the sheet.
    CalcLines lines;
    std::optional<MapData> map;
    std::optional<CulvertResult> culvert; ///< when the culvert table has a row for this point
};

/// A published source the run used, for the references page.
struct Reference {
    std::string key;      ///< short form used in source lines, e.g. "TR-55 (1986)"
    std::string citation; ///< full citation
};

struct RunResults {
    ProjectInfo project;
    Stamp stamp;
    std::vector<DesignPointResult> points;
    std::vector<Reference> references;
    std::vector<std::string> caution_notes; ///< printed on the cover and in README
};

} // namespace catchpeak::report
