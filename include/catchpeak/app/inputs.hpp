// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/land/tables.hpp"
#include "catchpeak/project/project.hpp"

#include <filesystem>
#include <map>
#include <optional>
#include <string>
#include <vector>

/// The catchment table of a project, the configuration folder, and the check of a whole project.
namespace catchpeak::app {

/// One catchment of a catchment table (a catchment drawn by hand, e.g. an urban inlet).
struct TableCatchment {
    std::string id;
    std::size_t line = 0; ///< line in the table, for messages
    double area_m2 = 0.0;
    double longest_flow_path_m = 0.0;
    double relief_m = 0.0; ///< elevation difference along the flow path
    double slope = 0.0;    ///< m/m along the flow path
    std::optional<double> c;
    std::optional<double> cn;
    std::optional<double> tc_min;
    std::optional<double> x;
    std::optional<double> y;
};

/// Reads a catchment table (CSV). Columns, with the unit in the name:
/// - `id`;
/// - the area: one of `area_m2`, `area_ha`, `area_km2`, `area_ac`, `area_ft2`, `area_mi2`;
/// - the longest flow path: `length_m` or `length_ft`;
/// - its relief (`relief_m`, `relief_ft`) or its slope (`slope_m_per_m`, `slope_percent`);
/// - optional: `c`, `cn`, `tc_min`, `x`, `y`.
/// Throws InputError naming the file, the line and the column.
[[nodiscard]] std::vector<TableCatchment> read_catchment_table(const std::filesystem::path &path);

/// The same from a CSV table already read (read_csv, or parse_csv of text in memory).
[[nodiscard]] std::vector<TableCatchment> catchment_table_from_csv(const CsvTable &table);

/// One row of a catchment land table: one part (land-cover class on a soil group) of one
/// catchment of the catchment table.
struct TableLandPart {
    std::string id; ///< the catchment's id in the catchment table
    std::size_t line = 0;
    std::string land_class;
    std::string soil_group_text; ///< as written (e.g. "B/D")
    land::SoilGroupReading soil; ///< resolved by the `drained` setting
    double area_m2 = 0.0;
    std::string area_column; ///< the area column of the file (area_ac, ...), for messages
    double area_given = 0.0; ///< the area in that column's unit
};

/// Reads a catchment land table (CSV): columns `id`, `class`, `soil_group` (A, B, C, D, A/D,
/// B/D, C/D; dual groups resolve to the first letter when `drained`, else D) and the area in
/// one of the area columns of the catchment table (`area_m2`, `area_ha`, ...). One row per
/// part of a catchment; a catchment may have several rows. Throws InputError naming the file,
/// the line and the column (an empty id or class, an unknown soil group, an area not > 0).
[[nodiscard]] std::vector<TableLandPart>
read_catchment_land_table(const std::filesystem::path &path, bool drained);

/// An annual maximum series of 24-hour rainfall depths: one value per year.
struct AnnualMaximumSeries {
    std::string source;           ///< the file name as given in the project file
    std::vector<int> years;       ///< as in the file
    std::vector<double> depth_mm; ///< the largest 24-hour depth of each year, mm
    std::string column;           ///< "depth_24h_mm" or "depth_24h_in"
};

/// Reads an annual maximum series (CSV) with the columns `year` (a whole number, each year
/// once) and `depth_24h_mm` or `depth_24h_in` (>= 0). At least rain::min_record_years values,
/// not all equal (the frequency analysis needs a spread). `given` names the file in messages.
/// Throws InputError naming the file, the line and the column.
[[nodiscard]] AnnualMaximumSeries read_annual_maximum_series(const std::filesystem::path &path,
                                                             const std::string &given);

/// The folder of the method tables (config/): $CATCHPEAK_CONFIG_DIR when set, else the
/// config/ folder of the source tree the program was built from.
[[nodiscard]] std::filesystem::path config_dir();

/// Checks everything that can be checked without computing: every file exists and is read,
/// the tables parse, every return period is in the IDF, every catchment has C for the Rational
/// Method and CN for the SCS methods, overrides name existing design points. Adds every
/// problem found to `problems`.
void check_project(const project::Project &project, project::Problems &problems);

} // namespace catchpeak::app
