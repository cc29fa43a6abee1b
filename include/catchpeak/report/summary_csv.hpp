// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/report/results.hpp"

#include <filesystem>
#include <string>
#include <string_view>

/// summary.csv: one row per design point, return period and method, in the sheet's unit system
/// (the column names carry the units), numbers as on the sheet (4 significant figures).
///
/// Columns (SI sheet; a US customary sheet has area_acre and q_cfs):
///   design_point, return_period_yr, method, area_ha, tc_min, q_m3_s, peak_line_id,
///   warning_count
/// warning_count is the number of warning lines of the design point.
namespace catchpeak::report {

inline constexpr std::string_view summary_file_name = "summary.csv";

/// The text of summary.csv (header line first, LF line ends, fields quoted when needed).
[[nodiscard]] std::string summary_csv(const RunResults &results);

/// Writes summary.csv into `dir` (to a temporary name, renamed when complete).
void write_summary_csv(const RunResults &results, const std::filesystem::path &dir);

} // namespace catchpeak::report
