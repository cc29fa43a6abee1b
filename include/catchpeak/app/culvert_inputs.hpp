// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/hydraulics/channel.hpp"
#include "catchpeak/hydraulics/culvert.hpp"
#include "catchpeak/hydraulics/inlets.hpp"
#include "catchpeak/hydraulics/overtopping.hpp"
#include "catchpeak/hydraulics/section.hpp"
#include "catchpeak/project/project.hpp"

#include <filesystem>
#include <optional>
#include <string>
#include <vector>

/// The culvert table of a project ([inputs] culvert_table): one row per culvert, the unit in
/// each column name like the catchment table. SI inside.
namespace catchpeak::app {

struct CulvertSpec {
    std::string id;       ///< the design point whose flow the culvert carries
    std::size_t line = 0; ///< line in the table, for messages
    hydraulics::Shape shape = hydraulics::Shape::circular;
    int barrels = 1;
    std::optional<hydraulics::Section> size; ///< unset: sized from the list of standard sizes
    std::string inlet;                       ///< key of the inlet table
    hydraulics::InletRow inlet_row;          ///< its coefficients
    double manning_n = 0.0;
    double length_m = 0.0;
    std::optional<double> invert_in_m; ///< unset (with invert_out_m): read from the DEM
    std::optional<double> invert_out_m;
    hydraulics::HeadwaterLimit limit;
    std::optional<double> tailwater_m;             ///< depth over the outlet invert
    std::optional<hydraulics::Trapezoid> channel;  ///< the outlet channel, for its normal depth
    std::optional<hydraulics::RoadCrest> road;     ///< road overtopping
    std::optional<double> design_return_period_yr; ///< unset: [design] culvert_return_period_yr
};

/// Reads the culvert table. Columns (the unit in the name):
/// - `id` (a design point of `known_ids`; not checked when `known_ids` is empty), `shape`
/// (circular, box), `barrels` (default 1);
/// - size, optional: `diameter_mm|diameter_in` (circular) or `span_m|span_ft` with
///   `rise_m|rise_ft` (box);
/// - `inlet` (a key of `inlets` of the culvert's shape), `manning_n`, `length_m|length_ft`;
/// - `invert_in_m|invert_in_ft` and `invert_out_m|invert_out_ft`: both or neither (neither:
///   from the DEM, allowed only when `inverts_from_dem`);
/// - `headwater_max_m|headwater_max_ft` (an elevation) and/or `hw_d_max`;
/// - optional `tailwater_m|tailwater_ft`, or the outlet channel: `channel_bottom_m|
///   channel_bottom_ft`, `channel_side_slope` (H:V), `channel_n`, `channel_slope` (m/m);
/// - optional road: `crest_m|crest_ft`, `crest_length_m|crest_length_ft`, and
///   `weir_coefficient_si` (m^0.5/s) or `weir_coefficient_us` (ft^0.5/s);
/// - optional `design_return_period_yr`.
/// Every problem of the table goes to `problems` with the file, line and column (all at once);
/// the rows without a problem are returned.
[[nodiscard]] std::vector<CulvertSpec> read_culvert_table(const std::filesystem::path &path,
                                                          const hydraulics::InletTable &inlets,
                                                          const std::vector<std::string> &known_ids,
                                                          bool inverts_from_dem,
                                                          project::Problems &problems);

} // namespace catchpeak::app
