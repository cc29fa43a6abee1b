// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/app/culverts.hpp"
#include "catchpeak/app/point_hydrology.hpp"
#include "catchpeak/io/gpkg.hpp"
#include "catchpeak/project/project.hpp"
#include "catchpeak/report/results.hpp"

#include <ostream>
#include <string>
#include <vector>

/// The design points of a DEM project: delineation, land weighting, hydrology, maps.
namespace catchpeak::app {

struct DemPoints {
    std::vector<report::DesignPointResult> points;
    /// The layers of catchments.gpkg (as `delineate` writes them).
    std::vector<io::OutLayer> layers;
    std::vector<report::Reference> references; ///< terrain and land sources the lines cite
    CulvertSites culvert_sites; ///< breach line ends (only with a culvert table and breach lines)
};

/// Delineates the catchment of every design point of a project with [inputs] dem, weights
/// land cover and soils over each total catchment (and each local part of a nested point),
/// computes the hydrology, and fills the map of every point. `progress` may be null.
/// Throws InputError for bad input (a point outside the DEM, a class missing from a table, ...).
[[nodiscard]] DemPoints compute_dem_points(const project::Project &project,
                                           const HydrologyTables &tables, std::ostream *progress);

/// The checks of a DEM project that need the files but no computation: the DEM opens and has
/// a projected CRS, the design points open, have the id field and lie inside the DEM, the
/// land-cover and soils layers open with their fields. Adds every problem to `problems`.
void check_dem_inputs(const project::Project &project, project::Problems &problems);

} // namespace catchpeak::app
