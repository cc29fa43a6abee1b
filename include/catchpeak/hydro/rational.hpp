// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/hydro/tables.hpp"

#include <optional>
#include <string_view>

/// Rational Method peak flow.
namespace catchpeak::hydro {

/// The frequency factor Cf for a return period from the table: the row of that return period,
/// or of the next longer one listed (the larger factor); beyond the table, its last row.
[[nodiscard]] WithLines<double> frequency_factor(const FrequencyFactorTable &table,
                                                 double return_period_yr);

namespace keys {
/// The line of Cf C, and of Cf C capped at 1.0 (when the cap applies).
inline constexpr std::string_view rational_cf_c = "rational.cf_c";
inline constexpr std::string_view rational_cf_c_capped = "rational.cf_c_capped";
} // namespace keys

struct RationalSettings {
    /// Largest catchment area without a warning. Unset: 80 ha on an SI sheet, 200 ac on a US
    /// sheet (common practice, no source; local codes vary).
    std::optional<double> max_area_m2;
};

/// Rational Method: US Q[ft3/s] = Cf C i[in/h] A[ac] x 43560/43200 (1 acre-in/h = 1.00833
/// ft3/s, exact, its own line); SI Q[m3/s] = Cf C i[mm/h] A[ha] / 360. C Cf is capped at 1.0
/// (line keys::rational_cf_c_capped; the product used is the value of that line, else of
/// keys::rational_cf_c).
/// `intensity_mm_per_h` is the IDF intensity at duration tc. Returns Q in m3/s.
[[nodiscard]] WithLines<double> rational_peak_m3_s(double c, double cf, double intensity_mm_per_h,
                                                   double area_m2, units::System system,
                                                   const RationalSettings &settings = {});

} // namespace catchpeak::hydro
