// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/project/project.hpp"
#include "catchpeak/report/results.hpp"
#include "catchpeak/terrain/breach_ends.hpp"

#include <map>
#include <string>
#include <vector>

/// The culverts of a project ([inputs] culvert_table), designed from the peak flows of their
/// design points (FHWA HDS-5 (2012); hydraulics/crossing.hpp).
namespace catchpeak::app {

/// Where the culverts of a DEM project without inverts in the table read them: the breach line
/// nearest to each design point (as given) and the DEM at its ends.
struct CulvertSites {
    std::map<std::string, terrain::BreachEnds> ends; ///< by design point id
    /// A line farther than this from its design point is not taken as its culvert
    /// ([settings] snap_radius_m plus one cell diagonal).
    double reach_m = 0.0;
};

/// Checks the culvert table, its inlet keys and its size list; every problem goes to
/// `problems`. `ids`: the design points known before the run (a catchment table's), or empty
/// when they are known only after delineation (then the ids are checked by the run).
void check_culverts(const project::Project &p, const std::vector<std::string> &ids,
                    project::Problems &problems);

/// Designs every culvert of the table for the flows of its design point: each return period's
/// flow is the largest of the point's peaks for it; the design return period is the row's, else
/// [design] culvert_return_period_yr. Sets each point's `culvert` and appends the lines to its
/// own, numbered after them. A row without inverts takes them from `sites` (a DEM project with
/// breach lines), with lines that say so. Throws InputError listing every problem of the table
/// (and a culvert whose inverts cannot be read from the DEM).
void design_culverts(const project::Project &p, report::RunResults &r,
                     const CulvertSites &sites = {});

} // namespace catchpeak::app
