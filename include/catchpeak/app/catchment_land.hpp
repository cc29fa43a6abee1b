// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/app/inputs.hpp"
#include "catchpeak/land/tables.hpp"
#include "catchpeak/land/weighting.hpp"
#include "catchpeak/project/project.hpp"

#include <map>
#include <string>
#include <vector>

/// The land parts of a catchment table's catchments ([inputs] catchment_land_table): their
/// checks against the catchment table and the land tables, and their weighting.
namespace catchpeak::app {

/// The parts of a catchment must add up to the catchment table's area within this share of it
/// (common practice, no source: areas measured by hand on a plan are rounded).
inline constexpr double land_parts_area_tolerance_share = 0.005;

/// The land parts of the catchments, by catchment id, in file order.
using LandPartsById = std::map<std::string, std::vector<TableLandPart>>;

/// Checks the land parts against the catchment table and the land tables, and groups them by
/// catchment. A problem (each naming the file and line) for: a part whose id is not in the
/// catchment table; a catchment that gives `c` or `cn` and has land parts (both named; either
/// the values or the parts, not both); parts that do not add up to the catchment's area within
/// land_parts_area_tolerance_share (naming the id, both sums and both files and lines); a class
/// missing from a land table, or without a row of the C table for its soil group and the
/// catchment's slope.
[[nodiscard]] LandPartsById check_land_parts(const project::Project &project,
                                             const std::vector<TableCatchment> &catchments,
                                             const std::vector<TableLandPart> &parts,
                                             const land::LandTables &tables,
                                             project::Problems &problems);

/// Reads the project's land table ([inputs] catchment_land_table) with the project's land
/// tables and checks it (check_land_parts). Empty when the project has none. Every problem,
/// of reading or of the checks, is added to `problems`.
[[nodiscard]] LandPartsById read_land_parts(const project::Project &project,
                                            const std::vector<TableCatchment> &catchments,
                                            project::Problems &problems);

/// The land weighting of one catchment of the table from its parts (land::weight_parts: the
/// same parts, weighted values and lines as a DEM project's overlay gives). The slope of the
/// C table's slope bands is the slope of the longest flow path (a table has no mean slope; a
/// note says so). The lines give no area line: the catchment's own lines restate it.
[[nodiscard]] land::PartsWeighting weight_table_catchment(const project::Project &project,
                                                          const TableCatchment &catchment,
                                                          const std::vector<TableLandPart> &parts,
                                                          const land::LandTables &tables);

} // namespace catchpeak::app
