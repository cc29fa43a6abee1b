// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/hydro/tables.hpp"

/// TR-55 graphical peak discharge method (TR-55 ch. 4).
namespace catchpeak::hydro {

struct Tr55Peak {
    double ia_over_p = 0.0;            ///< Ia/P as used (clamped to the table's 0.10-0.50)
    double unit_peak_csm_per_in = 0.0; ///< qu, ft3/s per mi2 per inch of runoff
    double fp = 1.0;                   ///< pond and swamp adjustment factor
    double peak_m3_s = 0.0;            ///< qp
};

/// qp = qu Am Q Fp with log10(qu) = C0 + C1 log10 tc + C2 (log10 tc)^2 (tc in h), coefficients
/// interpolated linearly between the table's Ia/P rows of the storm type. Ia/P is clamped to
/// the table's range (0.10-0.50) and tc to 0.1-10 h, each with a warning. An SI sheet computes
/// qu in csm/in (the method's only published form) and shows the conversions as lines.
/// `ia_mm` and `runoff_mm` come from cn_runoff(); `pond_percent` is the share of ponds and
/// swamps (0 for none).
[[nodiscard]] WithLines<Tr55Peak> tr55_peak(const PeakCoefficientTable &coefficients,
                                            const PondFactorTable &pond_factors,
                                            StormType storm_type, double area_m2, double tc_min,
                                            double rainfall_mm, double ia_mm, double runoff_mm,
                                            double pond_percent, units::System system);

} // namespace catchpeak::hydro
