// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/hydro/curve_number.hpp"
#include "catchpeak/hydro/tables.hpp"
#include "catchpeak/rain/hyetograph.hpp"

#include <vector>

/// SCS unit hydrograph (NEH 630 ch. 16) convolved with a rainfall excess hyetograph.
namespace catchpeak::hydro {

namespace keys {
/// The line of the hydrograph's peak flow.
inline constexpr std::string_view uh_peak = "uh.peak";
} // namespace keys

struct UnitHydrographSettings {
    /// Unit hydrograph duration D as a fraction of tc: D is the largest step not above
    /// fraction x tc obtained by aggregating (or evenly splitting) the hyetograph's steps.
    /// NEH 630 ch. 16 suggests D about 0.133 tc and D <= 0.25 tp (memory); smaller values give
    /// a finer hydrograph.
    double step_fraction_of_tc = 0.133;
};

struct Hydrograph {
    double step_s = 0.0;           ///< D: flow_m3_s[k] is the flow at time k D
    std::vector<double> flow_m3_s; ///< from time 0 (start of the hyetograph)
    double peak_m3_s = 0.0;        ///< largest ordinate
    double time_to_peak_s = 0.0;   ///< time of the largest ordinate
    double volume_m3 = 0.0;        ///< sum of ordinates x D
    double tp_h = 0.0;             ///< time to peak of the unit hydrograph
    double runoff_mm = 0.0;        ///< total excess depth
};

/// Rainfall excess per step from the cumulative CN runoff of the cumulative rainfall (TR-55
/// eq. 2-3 applied to the mass curve). Same steps as the rainfall.
[[nodiscard]] rain::Hyetograph excess_hyetograph(const rain::Hyetograph &rainfall, double cn,
                                                 IaRatio ratio = IaRatio::r020);

/// Hydrograph from a rainfall EXCESS hyetograph: tp = D/2 + 0.6 tc; the unit hydrograph
/// qp = 484 A Q / tp (US; ft3/s, A mi2, Q in, tp h) or 0.208 A Q / tp (SI; m3/s, A km2,
/// Q mm); ordinates from the dimensionless table; discrete convolution at step D. The
/// hyetograph is aggregated (or split evenly) to the step D.
[[nodiscard]] WithLines<Hydrograph>
unit_hydrograph_from_excess(const DimensionlessUnitHydrograph &table,
                            const rain::Hyetograph &excess, double area_m2, double tc_min,
                            units::System system, const UnitHydrographSettings &settings = {});

/// The same from RAINFALL: the excess comes from excess_hyetograph() with `cn`.
[[nodiscard]] WithLines<Hydrograph> unit_hydrograph_from_rainfall(
    const DimensionlessUnitHydrograph &table, const rain::Hyetograph &rainfall, double cn,
    double area_m2, double tc_min, units::System system,
    const UnitHydrographSettings &settings = {}, IaRatio ratio = IaRatio::r020);

/// The area-weighted excess of a catchment's parts: each part's excess_hyetograph() by its own
/// CN, weighted by area step by step (its sum is the area-weighted runoff of the parts).
[[nodiscard]] rain::Hyetograph weighted_excess_hyetograph(const rain::Hyetograph &rainfall,
                                                          const std::vector<CnPart> &parts,
                                                          IaRatio ratio = IaRatio::r020);

/// The same from RAINFALL and the catchment's PARTS: the excess is weighted_excess_hyetograph(),
/// said in a note line.
[[nodiscard]] WithLines<Hydrograph> unit_hydrograph_from_parts(
    const DimensionlessUnitHydrograph &table, const rain::Hyetograph &rainfall,
    const std::vector<CnPart> &parts, double area_m2, double tc_min, units::System system,
    const UnitHydrographSettings &settings = {}, IaRatio ratio = IaRatio::r020);

} // namespace catchpeak::hydro
