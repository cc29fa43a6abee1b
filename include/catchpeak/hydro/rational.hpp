// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/hydro/tables.hpp"

#include <optional>

/// Rational Method peak flow.
namespace catchpeak::hydro {

/// The frequency factor Cf for a return period from the table: the row of that return period,
/// or of the next longer one listed (the larger factor); beyond the table, its last row.
[[nodiscard]] WithLines<double> frequency_factor(const FrequencyFactorTable &table,
                                                 double return_period_yr);

struct RationalSettings {
    /// Largest catchment area without a warning. Unset: 80 ha on an SI sheet, 200 ac on a US
    /// sheet (common practice, no source; local codes vary).
    std::optional<double> max_area_m2;
};

/// Rational Method: US Q[ft3/s] = 1.008 Cf C i[in/h] A[ac] (1 acre-in/h = 1.008 ft3/s, its own
/// line); SI Q[m3/s] = Cf C i[mm/h] A[ha] / 360. C Cf is capped at 1.0 (a line says so).
/// `intensity_mm_per_h` is the IDF intensity at duration tc. Returns Q in m3/s.
[[nodiscard]] WithLines<double> rational_peak_m3_s(double c, double cf, double intensity_mm_per_h,
                                                   double area_m2, units::System system,
                                                   const RationalSettings &settings = {});

} // namespace catchpeak::hydro
