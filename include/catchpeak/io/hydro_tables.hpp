// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/hydro/tables.hpp"

#include <filesystem>

/// Readers of the hydrology method tables in config/. Each reads a CSV with
/// catchpeak::read_csv, checks every value and returns the plain table with its `source`
/// and `status` metadata ("# source: ...", "# status: ..." comment lines). Bad values throw
/// InputError naming the file, the line, the column, the value and what is accepted.
namespace catchpeak::io {

/// Columns return_period_yr, cf; return periods > 0 and strictly ascending; 1 <= cf <= 2.
[[nodiscard]] hydro::FrequencyFactorTable
read_frequency_factor_table(const std::filesystem::path &path);

/// Columns storm_type (I, IA, II, III), ia_over_p, c0, c1, c2; 0 < ia_over_p < 1, strictly
/// ascending within a storm type.
[[nodiscard]] hydro::PeakCoefficientTable
read_peak_coefficient_table(const std::filesystem::path &path);

/// Columns pond_percent, fp; pond_percent in [0, 100] strictly ascending; 0 < fp <= 1.
[[nodiscard]] hydro::PondFactorTable read_pond_factor_table(const std::filesystem::path &path);

/// Columns t_over_tp, q_over_qp; t/tp starts at 0 and strictly ascends; 0 <= q/qp <= 1.
[[nodiscard]] hydro::DimensionlessUnitHydrograph
read_dimensionless_unit_hydrograph(const std::filesystem::path &path);

} // namespace catchpeak::io
