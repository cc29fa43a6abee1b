// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/csv.hpp"
#include "catchpeak/hydro/tables.hpp"
#include "catchpeak/rain/design_storm.hpp"

#include <filesystem>
#include <string_view>

/// Reading a design storm distribution (cumulative fraction against hour) from a CSV file.
///
/// Format:
///
///     # name: NRCS 24-hour Type II      (required)
///     # source: TP-149 (1973) Table 1   (required)
///     # status: checked (primary)       (required: how sure the values are)
///     hour,cumulative_fraction
///     0,0
///     ...
///     24,1
///
/// Hours strictly increasing from 0; fractions from 0 to 1, never decreasing. Every message
/// names the file, the line and the column.
namespace catchpeak::io {

[[nodiscard]] rain::StormDistribution storm_from_csv(const CsvTable &table);

/// The same, and the table must end at `duration_h` (a 24-hour storm scaled by the 24-hour
/// depth): otherwise an InputError naming the last row's line.
[[nodiscard]] rain::StormDistribution storm_from_csv(const CsvTable &table, double duration_h);

[[nodiscard]] rain::StormDistribution read_storm_table(const std::filesystem::path &path);
[[nodiscard]] rain::StormDistribution read_storm_table(const std::filesystem::path &path,
                                                       double duration_h);

/// The file of an NRCS 24-hour distribution in the config folder:
/// config/storms/nrcs_type_<type>.csv, the type's text in lower case ("i", "ia", "ii", "iii").
[[nodiscard]] std::filesystem::path nrcs_storm_file(const std::filesystem::path &config_dir,
                                                    hydro::StormType type);

} // namespace catchpeak::io
