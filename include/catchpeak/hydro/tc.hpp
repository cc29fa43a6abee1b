// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"

#include <vector>

/// Time of concentration and travel times. Every function takes SI values, evaluates the
/// published form of the sheet's unit system and returns the time in minutes with its lines.
/// Where a method is published only in US customary units, an SI sheet shows the conversion of
/// the inputs as lines and says so.
namespace catchpeak::hydro {

/// Kirpich (1940): tc[min] = 0.0078 L^0.77 S^-0.385 (US, L ft) or 0.0195 L^0.77 S^-0.385
/// (SI, L m); TxDOT HDM eq. 4-15. `slope_m_per_m` along the longest flow path. Warns outside
/// the range of Kirpich's data (about 1-112 acres, slopes about 3-10 %, from memory).
[[nodiscard]] WithLines<double> kirpich_tc_min(double length_m, double slope_m_per_m,
                                               double area_m2, units::System system);

/// NRCS lag method (NEH 630 ch. 15): lag[h] = l^0.8 (S + 1)^0.7 / (1900 Y^0.5), l in ft,
/// S = 1000/CN - 10 in inches, Y average catchment slope in %; tc = lag / 0.6. Published only
/// in US units. Warns outside the data behind it (1.3 ac to 9.2 mi2).
[[nodiscard]] WithLines<double> nrcs_lag_tc_min(double flow_length_m, double cn,
                                                double slope_percent, double area_m2,
                                                units::System system);

/// Which document's sheet flow length limit applies.
enum class SheetFlowLimit {
    tr55_300_ft,   ///< TR-55 (1986): L <= 300 ft
    neh630_100_ft, ///< NEH 630 ch. 15 (2010): typically L <= 100 ft
};

/// TR-55 sheet flow: Tt[h] = 0.007 (n L)^0.8 / (P2^0.5 s^0.4), L ft, P2 in (2-year 24-hour
/// rainfall). Published only in US units. Warns when L exceeds the chosen limit.
[[nodiscard]] WithLines<double> sheet_flow_tt_min(double manning_n, double length_m,
                                                  double p2_24h_mm, double slope_m_per_m,
                                                  SheetFlowLimit limit, units::System system);

enum class ShallowSurface { paved, unpaved };

/// TR-55 shallow concentrated flow: V = 20.3282 s^0.5 (paved) or 16.1345 s^0.5 (unpaved) ft/s
/// (TR-55 App. F, from memory); SI: the same with the constants times 0.3048 (m/s).
/// Tt = L / (3600 V) h.
[[nodiscard]] WithLines<double> shallow_flow_tt_min(double length_m, double slope_m_per_m,
                                                    ShallowSurface surface, units::System system);

/// Open channel flow, Manning: V = 1.49/n R^(2/3) s^(1/2) (US, ft/s) or 1/n (SI, m/s), with
/// R = a / pw; Tt = L / (3600 V) h.
[[nodiscard]] WithLines<double> channel_flow_tt_min(double manning_n, double flow_area_m2,
                                                    double wetted_perimeter_m, double slope_m_per_m,
                                                    double length_m, units::System system);

/// Kerby (1959) overland flow: tov[min] = 0.828 (L N / S^0.5)^0.467 (US, L ft) or
/// 1.44 (L N / S^0.5)^0.467 (SI, L m; constant from memory); N retardance coefficient.
[[nodiscard]] WithLines<double> kerby_tov_min(double length_m, double retardance_n,
                                              double slope_m_per_m, units::System system);

/// Sum of travel times (TR-55 ch. 3: tc = sum of Tt); `times_min` are the segments' results.
/// The line is in hours on a US sheet (as TR-55 shows it) and in minutes on an SI sheet.
[[nodiscard]] WithLines<double> sum_travel_times_min(const std::vector<double> &times_min,
                                                     units::System system);

/// Applies a minimum time of concentration (a project setting; often 5 or 10 min, common
/// practice, no source) as its own line: tc = max(tc, tc_min).
[[nodiscard]] WithLines<double> apply_minimum_tc(double tc_min, double minimum_tc_min);

} // namespace catchpeak::hydro
