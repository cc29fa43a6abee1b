// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/project/project.hpp"
#include "catchpeak/report/results.hpp"

#include <string>
#include <vector>

/// The culverts of a project ([inputs] culvert_table), designed from the peak flows of their
/// design points (FHWA HDS-5 (2012); hydraulics/crossing.hpp).
namespace catchpeak::app {

/// Checks the culvert table, its inlet keys and its size list; every problem goes to
/// `problems`. `ids`: the design points known before the run (a catchment table's), or empty
/// when they are known only after delineation (then the ids are checked by the run).
void check_culverts(const project::Project &p, const std::vector<std::string> &ids,
                    project::Problems &problems);

/// Designs every culvert of the table for the flows of its design point: each return period's
/// flow is the largest of the point's peaks for it; the design return period is the row's, else
/// [design] culvert_return_period_yr. Sets each point's `culvert` and appends the lines to its
/// own, numbered after them. Throws InputError listing every problem of the table.
void design_culverts(const project::Project &p, report::RunResults &r);

} // namespace catchpeak::app
