// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/app/catchment_land.hpp"
#include "catchpeak/app/inputs.hpp"
#include "catchpeak/app/point_hydrology.hpp"
#include "catchpeak/hydro/tables.hpp"
#include "catchpeak/io/gpkg.hpp"
#include "catchpeak/project/project.hpp"
#include "catchpeak/rain/idf.hpp"
#include "catchpeak/report/results.hpp"

#include <filesystem>
#include <iosfwd>
#include <optional>
#include <string>
#include <vector>

/// The whole job: project file in, results out.
namespace catchpeak::app {

/// Options of `catchpeak run`.
struct RunOptions {
    std::optional<std::filesystem::path> out_dir; ///< overrides [output] folder
    bool quiet = false;                           ///< no progress, no summary table
    std::string run_time_utc;                     ///< empty: now
};

/// Computes every design point and return period of a project whose catchments come from a
/// catchment table. `tables` holds the method tables the chosen methods need
/// (load_hydrology_tables). A catchment with land parts (`land_parts`, checked with
/// check_land_parts) takes its C, CN and impervious share from their weighting with the
/// project's land tables; the others take `c` and `cn` from the table.
[[nodiscard]] report::RunResults compute_from_table(const project::Project &project,
                                                    const std::vector<TableCatchment> &catchments,
                                                    const HydrologyTables &tables,
                                                    const LandPartsById &land_parts = {});

/// Computes a whole project: checks it, reads its inputs, computes every design point.
/// Throws InputError listing every problem found by the check.
/// For a DEM project, `gpkg_layers` (when not null) receives the layers of catchments.gpkg.
[[nodiscard]] report::RunResults compute_project(const project::Project &project,
                                                 std::ostream &progress, bool quiet,
                                                 std::vector<io::OutLayer> *gpkg_layers = nullptr);

/// The table printed at the end of a run, in the sheet's units.
[[nodiscard]] std::string summary_table(const report::RunResults &results);

/// `catchpeak run`: loads, checks and computes a project, writes results.json, summary.csv,
/// run-record.json and the calculation sheet into the output folder (report::write_outputs:
/// each under a temporary name, renamed when complete) and prints the summary table on `out`.
/// Returns the output folder.
std::filesystem::path run_project(const std::filesystem::path &project_file,
                                  const RunOptions &options, std::ostream &out, std::ostream &err);

/// `catchpeak check`: every problem of a project at once; throws InputError listing them.
/// Prints a short confirmation on `out` when there is none.
void check_project_file(const std::filesystem::path &project_file, std::ostream &out);

/// `catchpeak init DIR`: writes the commented project template as DIR/project.toml. Refuses to
/// overwrite an existing file (InputError). Returns the path written.
std::filesystem::path init_project(const std::filesystem::path &dir);

} // namespace catchpeak::app
