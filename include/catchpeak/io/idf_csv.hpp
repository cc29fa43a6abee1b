// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/csv.hpp"
#include "catchpeak/rain/idf.hpp"

#include <filesystem>

/// Reading an IDF from a CSV file (read with catchpeak::read_csv).
///
/// Two forms, told apart by the first column of the header.
///
/// Table form: intensities for durations (rows) and return periods (columns):
///
///     # name: example IDF         (optional; default: the file name without folder/extension)
///     # unit: mm/h                (required: mm/h or in/h, the unit of every intensity)
///     # source: ...               (optional, for the reader)
///     duration_min,2,5,10,25,50,100
///     5,105.0,136.0,157.0,183.0,203.0,222.0
///     ...
///
/// The header is `duration_min` followed by the return periods in years. Durations in minutes,
/// strictly increasing down the file; intensities > 0, decreasing down each column and
/// increasing along each row. A table in in/h is converted to mm/h on reading.
///
/// Formula form: i = a / (t + b)^c, t in min, one row of constants per return period:
///
///     # name: example IDF formula
///     # unit: in/h                (required: the unit the constants give i in)
///     # min_duration_min: 5       (optional, with max_duration_min: the fitted range)
///     # max_duration_min: 1440
///     return_period_yr,a,b_min,c
///     2,40.1,8.0,0.80
///
/// Every message names the file, and where it can the line and the column.
namespace catchpeak::io {

/// Builds an Idf from a parsed CSV table (either form).
[[nodiscard]] rain::Idf idf_from_csv(const CsvTable &table);

/// Reads an IDF CSV file (either form).
[[nodiscard]] rain::Idf read_idf_csv(const std::filesystem::path &path);

} // namespace catchpeak::io
