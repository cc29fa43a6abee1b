// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"

#include <cstddef>
#include <span>

/// Design rainfall depths from an annual maximum series (one largest depth per year, mm).
///
/// Record length rules (common practice, no source): fewer than `min_record_years` values is
/// refused with an InputError; fewer than `short_record_years` gives a warning line; a return
/// period longer than twice the record length gives a warning line (extrapolation).
namespace catchpeak::rain {

inline constexpr std::size_t min_record_years = 10;
inline constexpr std::size_t short_record_years = 20;

/// Gumbel (EV1) frequency factor
/// K_T = -(sqrt(6)/pi) (0.5772 + ln(ln(T/(T-1)))), T > 1 yr
/// (Chow, Maidment & Mays 1988, Applied Hydrology, eq. 12.3.8). Throws InputError for T <= 1.
[[nodiscard]] double gumbel_frequency_factor(double return_period_yr);

/// Gumbel (EV1) depth by the method of moments: x_T = mean + K_T s, with s the sample standard
/// deviation (n - 1 divisor) (Chow, Maidment & Mays 1988, sec. 12.3, with eq. 12.3.8).
/// Value in mm; lines in the sheet's units (in on a US customary sheet).
/// Throws InputError: series too short, a value negative or not finite, all values equal,
/// T <= 1 yr.
[[nodiscard]] WithLines<double> gumbel_depth(std::span<const double> annual_max_mm,
                                             double return_period_yr, units::System sheet_units);

/// Sample L-moments from the unbiased probability-weighted moments b0, b1, b2
/// (Hosking 1990; Hosking & Wallis 1997, sec. 2.4).
struct SampleLMoments {
    double l1 = 0.0;   ///< mean, mm
    double l2 = 0.0;   ///< L-scale, mm
    double tau3 = 0.0; ///< L-skewness l3/l2
};

[[nodiscard]] SampleLMoments sample_l_moments(std::span<const double> values);

/// GEV parameters in Hosking's convention: F(x) = exp(-(1 - k (x - xi)/alpha)^(1/k)),
/// k > 0 bounded above, k < 0 heavy upper tail, k = 0 the Gumbel distribution.
struct GevParameters {
    double location_mm = 0.0; ///< xi
    double scale_mm = 0.0;    ///< alpha > 0
    double shape = 0.0;       ///< k
};

/// GEV quantile x(F) = xi + alpha (1 - (-ln F)^k) / k (xi - alpha ln(-ln F) for k = 0),
/// 0 < F < 1.
[[nodiscard]] double gev_quantile(const GevParameters &p, double non_exceedance);

/// GEV parameters from the sample L-moments: k from tau3 by the approximation
/// c = 2/(3 + tau3) - ln 2/ln 3, k = 7.8590 c + 2.9554 c^2; then
/// alpha = l2 k / ((1 - 2^-k) Gamma(1 + k)), xi = l1 - alpha (1 - Gamma(1 + k)) / k
/// (Hosking, Wallis & Wood 1985; Hosking & Wallis 1997, appendix on the GEV). The
/// approximation of k is good to about 9e-4 for -0.5 <= tau3 <= 0.5 (value from memory);
/// outside that range gev_depth adds a warning line. Throws InputError when k <= -1 (no finite
/// mean) or l2 <= 0.
[[nodiscard]] GevParameters gev_from_l_moments(const SampleLMoments &m);

/// GEV depth by L-moments for return period T: x_T = x(1 - 1/T). Value in mm; lines show
/// the L-moments, k, alpha, xi and x_T in the sheet's units. Same input rules as gumbel_depth.
[[nodiscard]] WithLines<double> gev_depth(std::span<const double> annual_max_mm,
                                          double return_period_yr, units::System sheet_units);

} // namespace catchpeak::rain
