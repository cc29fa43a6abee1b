// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/app/point_hydrology.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/io/class_raster.hpp"
#include "catchpeak/io/feature.hpp"
#include "catchpeak/land/tables.hpp"
#include "catchpeak/project/project.hpp"
#include "catchpeak/report/results.hpp"

#include <cstdint>
#include <map>
#include <string>
#include <vector>

/// The land-cover and soils inputs of a DEM project, polygon layers or rasters of class codes,
/// as the land overlay takes them.
namespace catchpeak::app {

enum class LandInput { land_cover, soils };

/// How much of one land-cover class an input holds, for the checks of the classes.
struct ClassUse {
    std::string land_class;
    std::uint64_t count = 0; ///< features, cells or parts of the class
    double area_m2 = 0.0;    ///< their area; NaN when not known
    std::string where;       ///< where the class is first found: "land.gpkg: feature 12"
};

/// The classes of a land-cover input and how much of each it holds, in the order of `uses`
/// (as read_land_input or the land parts give them); `noun` counts them ("feature", "cell",
/// "part": the plural adds an s).
struct LandClasses {
    std::vector<ClassUse> uses;
    std::string noun;
};

/// Adds a problem for every class missing from every table of `tables` (the C, CN and impervious
/// share tables the land weighting reads): the class, how many of its features (cells, parts)
/// and their area, the table, the closest class of the table ("did you mean") and the key of
/// the project's own table.
void check_classes_in_tables(const LandClasses &classes, const land::LandTables &tables,
                             units::System units, project::Problems &problems);

/// The box around polygons given as ISO WKB (the catchments); all zero for none.
[[nodiscard]] io::Extent extent_of(const std::vector<std::vector<unsigned char>> &polygons);

/// A code table of the project (`land_cover_codes`, `soil_group_codes`): a CSV with columns
/// `code` (an integer) and `name_column` ("class" or "soil_group"). Throws InputError naming the
/// file and line for a code that is not an integer, a code listed twice or an empty name.
[[nodiscard]] std::map<std::int64_t, std::string> read_code_table(const project::InputPath &table,
                                                                  const std::string &name_column);

/// Reads the land-cover or soils input of a project, in the DEM's CRS `crs_wkt`.
///
/// - A vector layer is read whole; a layer without CRS is refused. A code table given for a
///   vector layer is refused (it would not be used).
/// - A raster of class codes is read over `window` (the catchments' extent; a margin is added),
///   reprojected by nearest neighbour when its CRS differs, its codes named by the project's
///   code table when there is one, else by the raster's attribute table or category names,
///   and (when `polygons`) turned into one polygon per patch of cells of a code, carrying the
///   name in the class field (or soil group field). The layer's source states the cell size
///   and where the names come from; its features' ids are the codes. Nodata cells are not
///   covered. Refused: a raster without CRS, a code in the window that the names do not
///   cover (naming the code, the raster and the table), a raster with neither a code table
///   nor names of its own, and (soils) a name that is not a hydrologic soil group.
/// - `facts`, when given, gets the extent of the layer (of the whole raster) in the DEM's CRS and
///   its reprojection, if it was reprojected.
/// - `classes`, when given, receives the classes found (land cover: the class field of every
///   feature, or the named codes in the window with their cells).
[[nodiscard]] io::VectorLayer read_land_input(const project::Project &project, LandInput which,
                                              const std::string &crs_wkt, const io::Extent &window,
                                              bool polygons = true, io::LayerFacts *facts = nullptr,
                                              LandClasses *classes = nullptr);

/// The land tables of a project: the shipped tables (config/land/), with the project's own
/// `c_table`, `cn_table` and `impervious_table` in their place when given.
[[nodiscard]] land::LandTables project_land_tables(const project::Project &project);

/// The parts of a land weighting as the area-weighted runoff alternative of the SCS methods
/// takes them ("<class>, soil group <group>", area, CN).
[[nodiscard]] std::vector<LandPart> land_parts_of(const report::LandWeighting &w);

} // namespace catchpeak::app
