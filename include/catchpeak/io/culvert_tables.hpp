// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/hydraulics/inlets.hpp"
#include "catchpeak/hydraulics/section.hpp"

#include <filesystem>
#include <string>
#include <vector>

/// Readers of the culvert tables in config/ (or a project's own): the inlet coefficients of
/// HDS-5 (2012) and the lists of standard sizes. Bad values throw InputError naming the file,
/// the line, the column, the value and what is accepted.
namespace catchpeak::io {

/// config/culvert_inlets.csv: columns key, shape (circular, box), form (1, 2), k, m, c, y, ks,
/// ke, source; "# source:" and "# status:" lines; K, M, c > 0, 0 <= ke <= 1.5, -1 <= Ks <= 1.
[[nodiscard]] hydraulics::InletTable read_culvert_inlet_table(const std::filesystem::path &path);

/// A list of standard sizes: a column shape (circular, box) and the span and rise in mm
/// (span_mm, rise_mm), m (span_m, rise_m), in (span_in, rise_in) or ft (span_ft, rise_ft);
/// both > 0, equal for a circular pipe; no size listed twice; "# source:" and "# status:".
[[nodiscard]] std::vector<hydraulics::Section>
read_culvert_sizes(const std::filesystem::path &path);

/// The shipped list of the unit system: config/culvert_sizes_si.csv or culvert_sizes_us.csv.
[[nodiscard]] std::string culvert_sizes_file(bool us_customary);

inline constexpr const char *culvert_inlets_file = "culvert_inlets.csv";

} // namespace catchpeak::io
