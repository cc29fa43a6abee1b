// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/option_table.hpp"
#include "catchpeak/hydro/tc.hpp"

#include <string>
#include <string_view>
#include <variant>

/// The choices of the project file that only the project model names: each an enum with its
/// one table of texts. The methods' tables are in core/methods.hpp (results.json and the sheet
/// name them too), the storm types' in hydro/tables.hpp, the unit systems' in core/units.hpp.
namespace catchpeak::project {

/// [rainfall] design_storm: the storm of the SCS unit hydrograph.
enum class DesignStorm {
    nrcs_24h, ///< a 24-hour distribution (storm_type's, or storm_table) with the 24-hour depth
    alternating_block, ///< from the IDF, lasting storm_duration_min
};

inline constexpr OptionTable<DesignStorm, 2> design_storm_options{{
    {"nrcs_24h", DesignStorm::nrcs_24h},
    {"alternating_block", DesignStorm::alternating_block},
}};

/// [methods] cn_weighting: how the SCS runoff of a catchment made of land parts with their own
/// curve numbers is weighted (TR-55 ch. 2 and NRCS NEH 630 ch. 10 discuss both).
enum class CnWeighting {
    composite, ///< the area-weighted (composite) CN, then the runoff of it (TR-55 Ex. 2-1)
    runoff,    ///< the runoff depth of each part from its own CN, weighted by area
};

inline constexpr OptionTable<CnWeighting, 2> cn_weighting_options{{
    {"composite", CnWeighting::composite},
    {"runoff", CnWeighting::runoff},
}};

/// [rainfall] ams_distribution: the distribution fitted to an annual maximum series.
enum class AmsDistribution {
    gumbel, ///< by moments
    gev,    ///< by L-moments
};

inline constexpr OptionTable<AmsDistribution, 2> ams_distribution_options{{
    {"gumbel", AmsDistribution::gumbel},
    {"gev", AmsDistribution::gev},
}};

/// [settings] dual_soil_group: how A/D, B/D and C/D resolve.
enum class DualSoilGroup {
    drained,   ///< the first letter
    undrained, ///< D
};

inline constexpr OptionTable<DualSoilGroup, 2> dual_soil_group_options{{
    {"drained", DualSoilGroup::drained},
    {"undrained", DualSoilGroup::undrained},
}};

/// shallow_surface of the TR-55 segmental tc method.
inline constexpr OptionTable<hydro::ShallowSurface, 2> shallow_surface_options{{
    {"unpaved", hydro::ShallowSurface::unpaved},
    {"paved", hydro::ShallowSurface::paved},
}};

/// [settings] uncovered_land: what a part of a catchment that the land-cover layer leaves
/// uncovered becomes.
struct RefuseUncovered {
    friend bool operator==(const RefuseUncovered &, const RefuseUncovered &) = default;
};
/// The text of the refusal; any other text names a land-cover class.
inline constexpr std::string_view refuse_uncovered_key = "refuse";
/// Taken as this land-cover class (with a warning line).
struct UncoveredAsClass {
    std::string land_class;
    friend bool operator==(const UncoveredAsClass &, const UncoveredAsClass &) = default;
};
using UncoveredLand = std::variant<RefuseUncovered, UncoveredAsClass>;

/// "refuse" or a class name, as the project file writes it.
[[nodiscard]] UncoveredLand parse_uncovered_land(std::string_view text);
[[nodiscard]] std::string uncovered_land_key(const UncoveredLand &u);

} // namespace catchpeak::project
