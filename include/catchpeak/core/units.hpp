// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/option_table.hpp"

#include <string_view>

/// Units. Everything inside catchpeak is SI: m, m2, s, mm, m3/s (and min for durations where a
/// method is published in minutes, always with `_min` in the name). US customary values exist
/// only at the edges: input conversion and the sheet of a project that chose US customary.
///
/// The US customary definitions are exact (international yard and pound agreement of 1959;
/// NIST SP 811, 2008 ed., appendix B).
namespace catchpeak::units {

/// Unit system of a project's calculation sheet.
enum class System { si, us_customary };

/// The texts of [project] units.
inline constexpr OptionTable<System, 2> system_options{{
    {"SI", System::si},
    {"US", System::us_customary},
}};

[[nodiscard]] std::string_view to_string(System s) noexcept;
/// Parses "SI" or "US" (case-insensitive; also "us_customary"). Throws InputError otherwise.
[[nodiscard]] System parse_system(std::string_view text, std::string_view where);

// Exact definitions.
inline constexpr double m_per_ft = 0.3048;                // 1 ft = 0.3048 m
inline constexpr double mm_per_in = 25.4;                 // 1 in = 25.4 mm
inline constexpr double m2_per_acre = 4046.8564224;       // 1 acre = 4046.8564224 m2 (int'l ft)
inline constexpr double m_per_mi = 1609.344;              // 1 mi = 5280 ft = 1609.344 m
inline constexpr double m3s_per_cfs = 0.028316846592;     // 1 ft3/s = 0.3048^3 m3/s
inline constexpr double m2_per_ha = 10000.0;              // 1 ha = 10^4 m2
inline constexpr double m2_per_km2 = 1.0e6;               // 1 km2 = 10^6 m2
inline constexpr double m2_per_ft2 = m_per_ft * m_per_ft; // 1 ft2 = 0.09290304 m2
inline constexpr double m2_per_mi2 = m_per_mi * m_per_mi; // 1 mi2 = 2589988.110336 m2
inline constexpr double s_per_min = 60.0;
inline constexpr double s_per_h = 3600.0;
inline constexpr double min_per_h = 60.0;

// Length.
[[nodiscard]] constexpr double ft_to_m(double ft) noexcept { return ft * m_per_ft; }
[[nodiscard]] constexpr double m_to_ft(double m) noexcept { return m / m_per_ft; }
[[nodiscard]] constexpr double mi_to_m(double mi) noexcept { return mi * m_per_mi; }
[[nodiscard]] constexpr double m_to_mi(double m) noexcept { return m / m_per_mi; }
[[nodiscard]] constexpr double in_to_mm(double in) noexcept { return in * mm_per_in; }
[[nodiscard]] constexpr double mm_to_in(double mm) noexcept { return mm / mm_per_in; }

// Area.
[[nodiscard]] constexpr double acre_to_m2(double acre) noexcept { return acre * m2_per_acre; }
[[nodiscard]] constexpr double m2_to_acre(double m2) noexcept { return m2 / m2_per_acre; }
[[nodiscard]] constexpr double ha_to_m2(double ha) noexcept { return ha * m2_per_ha; }
[[nodiscard]] constexpr double m2_to_ha(double m2) noexcept { return m2 / m2_per_ha; }
[[nodiscard]] constexpr double km2_to_m2(double km2) noexcept { return km2 * m2_per_km2; }
[[nodiscard]] constexpr double m2_to_km2(double m2) noexcept { return m2 / m2_per_km2; }
[[nodiscard]] constexpr double mi2_to_m2(double mi2) noexcept { return mi2 * m2_per_mi2; }
[[nodiscard]] constexpr double m2_to_mi2(double m2) noexcept { return m2 / m2_per_mi2; }
[[nodiscard]] constexpr double ft2_to_m2(double ft2) noexcept { return ft2 * m2_per_ft2; }
[[nodiscard]] constexpr double m2_to_ft2(double m2) noexcept { return m2 / m2_per_ft2; }

// Flow.
[[nodiscard]] constexpr double cfs_to_m3s(double cfs) noexcept { return cfs * m3s_per_cfs; }
[[nodiscard]] constexpr double m3s_to_cfs(double m3s) noexcept { return m3s / m3s_per_cfs; }

// Rainfall intensity.
[[nodiscard]] constexpr double in_per_h_to_mm_per_h(double v) noexcept { return v * mm_per_in; }
[[nodiscard]] constexpr double mm_per_h_to_in_per_h(double v) noexcept { return v / mm_per_in; }

// Time.
[[nodiscard]] constexpr double min_to_s(double min) noexcept { return min * s_per_min; }
[[nodiscard]] constexpr double s_to_min(double s) noexcept { return s / s_per_min; }
[[nodiscard]] constexpr double h_to_min(double h) noexcept { return h * min_per_h; }
[[nodiscard]] constexpr double min_to_h(double min) noexcept { return min / min_per_h; }

} // namespace catchpeak::units
