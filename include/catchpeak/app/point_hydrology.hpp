// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/app/project.hpp"
#include "catchpeak/hydro/tables.hpp"
#include "catchpeak/rain/idf.hpp"
#include "catchpeak/report/results.hpp"

#include <optional>
#include <string>
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
    std::optional<double> tc_min;     ///< a tc given in the catchment input
    std::string source;               ///< source text for the input notes
};

/// The method tables a run has loaded. Pointers may be null when no chosen method needs them.
struct HydrologyTables {
    const rain::Idf *idf = nullptr;
    const hydro::FrequencyFactorTable *frequency_factors = nullptr;
};

/// Computes tc and the design peaks of one design point with the project's methods (and the
/// point's overrides in [[methods.point]]). Appends the calculation lines to dp.lines, numbers
/// them with dp.id, and sets dp.tc_min, dp.tc_method and dp.peaks (each with the id of the line
/// that gives its Q). Throws InputError when an input a chosen method needs is missing.
void compute_point_hydrology(const Project &project, const PointInputs &in,
                             const HydrologyTables &tables, report::DesignPointResult &dp);

} // namespace catchpeak::app
