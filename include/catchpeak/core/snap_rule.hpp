// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/option_table.hpp"

/// How a design point is moved onto the flow network ([settings] snap, `delineate --snap`). Its
/// texts are in the table below and nowhere else; terrain, the project parser, results.json
/// and the sheet all read it.
namespace catchpeak {

enum class SnapRule {
    /// The stream cell (accumulation area >= the stream threshold) nearest to the given point
    /// within the radius, ties to the larger accumulation; none within it: the cell under the
    /// point, with a warning.
    nearest_stream,
    largest_flow, ///< the cell of largest accumulation within the radius
    none,         ///< the cell under the point
};

inline constexpr OptionTable<SnapRule, 3> snap_rule_options{{
    {"nearest_stream", SnapRule::nearest_stream},
    {"largest_flow", SnapRule::largest_flow},
    {"none", SnapRule::none},
}};

} // namespace catchpeak
