// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/app/inputs.hpp"
#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/methods.hpp"
#include "catchpeak/hydro/tables.hpp"
#include "catchpeak/project/project.hpp"
#include "catchpeak/rain/design_storm.hpp"
#include "catchpeak/rain/idf.hpp"
#include "catchpeak/report/results.hpp"

#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

/// The hydrology of one design point: time of concentration and design peaks for every return
/// period, from plain SI figures of its catchment.
namespace catchpeak::app {

/// One land part of a catchment, for the area-weighted runoff alternative of the SCS methods.
struct LandPart {
    std::string name; ///< e.g. the land-cover class and soil group, for the sheet
    double area_m2 = 0.0;
    double cn = 0.0;
};

/// The figures of one catchment, SI.
struct PointInputs {
    double area_m2 = 0.0;
    double longest_flow_path_m = 0.0;
    double slope = 0.0;               ///< m/m along the longest flow path
    std::optional<double> mean_slope; ///< m/m, mean land slope of the catchment, if known
    std::optional<double> c;          ///< runoff coefficient
    std::optional<double> cn;         ///< curve number (composite)
    std::vector<LandPart> land_parts; ///< empty: no area-weighted runoff alternative
    /// Lines of a land weighting shown after the restated A, L and S in place of the C and CN
    /// notes (a catchment table with land parts); empty: C and CN restated as given.
    CalcLines land_lines;
    std::optional<double> tc_min; ///< a tc given in the catchment input
    std::string source;           ///< source text for the input notes
    /// Elevations along the longest flow path, (distance from its top in m, elevation in m),
    /// one per cell from the top to the outlet, when the catchment comes from a DEM: the
    /// segmental tc methods then take each segment's own slope. Empty: every segment takes
    /// `slope`.
    std::vector<std::pair<double, double>> profile;
    std::string profile_source; ///< source text for elevations read off the profile
    /// Whether the lines begin by restating A, L, S, C and CN. Off where earlier lines of the
    /// same design point already give them (the terrain and land lines of a DEM project).
    bool restate_inputs = true;
};

/// What a tc or peak method needs from a design point's inputs and from the configuration
/// folder. Each method registers it once (point_hydrology.cpp); the project checks, the loading
/// of the tables and the computation read it.
struct MethodNeeds {
    bool c = false;                 ///< a runoff coefficient
    bool cn = false;                ///< a curve number (for a peak: the SCS runoff of the storm)
    bool frequency_factors = false; ///< the Rational Method's frequency factor table
    bool tr55_tables = false;       ///< the TR-55 peak coefficients and pond factors
    bool unit_hydrograph = false;   ///< the dimensionless unit hydrograph
    /// A design storm hyetograph: the NRCS 24-hour storm table, unless the project's storm is
    /// the alternating block from its IDF.
    bool design_storm = false;
};

[[nodiscard]] const MethodNeeds &needs_of(TcMethod m);
[[nodiscard]] const MethodNeeds &needs_of(PeakMethod m);
/// What the peak methods the project uses (its own and its points') need together.
[[nodiscard]] MethodNeeds needs_of(const project::Project &project);

/// The file of the Rational Method's frequency factors in the configuration folder.
inline constexpr std::string_view frequency_factor_file = "rational_frequency_factors.csv";

/// The method tables a run has loaded. Pointers may be null when no chosen method needs them.
struct HydrologyTables {
    const rain::Idf *idf = nullptr;                                      ///< Rational Method
    const hydro::FrequencyFactorTable *frequency_factors = nullptr;      ///< Rational Method
    const hydro::PeakCoefficientTable *peak_coefficients = nullptr;      ///< TR-55 graphical
    const hydro::PondFactorTable *pond_factors = nullptr;                ///< TR-55 graphical
    const hydro::DimensionlessUnitHydrograph *unit_hydrograph = nullptr; ///< SCS UH
    const rain::StormDistribution *storm = nullptr; ///< the 24-hour storm (NRCS or the project's)
    const AnnualMaximumSeries *ams = nullptr;       ///< [rainfall] annual_maximum_series
};

/// Loads the tables the project's methods need from the configuration folder `config`
/// (config_dir()) and the project's IDF. Tables no chosen method needs stay empty.
struct LoadedTables {
    std::optional<rain::Idf> idf;
    hydro::FrequencyFactorTable frequency_factors;
    hydro::PeakCoefficientTable peak_coefficients;
    hydro::PondFactorTable pond_factors;
    hydro::DimensionlessUnitHydrograph unit_hydrograph;
    std::optional<rain::StormDistribution> storm;
    std::optional<AnnualMaximumSeries> ams;
    /// Each file read, (role, path relative to the config folder or as given), for the stamp.
    std::vector<std::pair<std::string, std::filesystem::path>> config_files;
    /// Pointers into this object; valid while it lives and is not moved.
    [[nodiscard]] HydrologyTables view() const;
};
[[nodiscard]] LoadedTables load_hydrology_tables(const project::Project &project,
                                                 const std::filesystem::path &config);

/// The project's own 24-hour storm distribution ([rainfall] storm_table), named by its path as
/// given; throws InputError naming the file and line of a bad table or of one that does not end
/// at 24 h.
[[nodiscard]] rain::StormDistribution read_project_storm_table(const project::InputPath &file);

/// Adds a problem when the project's alternating-block storm needs durations the IDF does not
/// cover: blocks from storm_time_step_min to storm_duration_min (a table's durations, or a
/// formula's fitted range; a formula without one is taken to hold everywhere). The IDF is not
/// extrapolated. Nothing for the NRCS 24-hour storm.
void check_storm_idf(const project::Project &project, const rain::Idf &idf,
                     project::Problems &problems);

/// The caution note of a run (printed once, on the cover) when unit-hydrograph peaks carry the
/// line "Peak averaged over a table interval": why the storm table averages their peak, which
/// each such line refers to by the note's title. Empty when no peak carries it.
[[nodiscard]] std::optional<std::string>
storm_averaging_caution(const HydrologyTables &tables,
                        const std::vector<report::DesignPointResult> &points);

/// Adds the published sources the design point's methods used to `refs`, each once (by key).
void add_method_references(const project::Project &project, const report::DesignPointResult &dp,
                           std::vector<report::Reference> &refs);

/// Computes tc and the design peaks of one design point with the project's methods (and the
/// point's overrides in [[methods.point]]). Appends the calculation lines to dp.lines, numbers
/// them with dp.id, and sets dp.tc_min, dp.tc_method and dp.peaks (each with the id of the line
/// that gives its Q). Throws InputError when an input a chosen method needs is missing.
void compute_point_hydrology(const project::Project &project, const PointInputs &in,
                             const HydrologyTables &tables, report::DesignPointResult &dp);

} // namespace catchpeak::app
