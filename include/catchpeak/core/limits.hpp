// SPDX-License-Identifier: MIT
#pragma once

#include <cmath>
#include <string>
#include <string_view>

/// The accepted ranges of inputs that more than one place checks: the project parser, the
/// table readers (`io`, `land`, the catchment table of `app`), `check` and the hydro
/// functions. Each is defined here once, with its reason, and every check uses it, so that a
/// value one reader accepts is never refused by another.
namespace catchpeak::limits {

/// A closed, open or half-open interval of accepted values; never NaN or infinite.
struct Range {
    double min;
    double max;
    bool min_inclusive;
    bool max_inclusive;
    std::string_view reason;

    [[nodiscard]] constexpr bool contains(double v) const noexcept {
        return std::isfinite(v) && (min_inclusive ? v >= min : v > min) &&
               (max_inclusive ? v <= max : v < max);
    }
    /// "[30, 100]", "(0, 1]".
    [[nodiscard]] std::string interval() const;
    /// What is accepted, for a message: "30 <= CN <= 100 (<reason>)" for symbol "CN".
    [[nodiscard]] std::string accepted(std::string_view symbol) const;
};

/// Curve number CN of a catchment or of a land-cover class and soil group. TR-55 (1986) Tables
/// 2-2a to 2-2c list CN from 30 (woods in good condition and meadow on soil group A) to 98;
/// 100 is the limit of a surface that sheds all rain. 30 itself is accepted.
inline constexpr Range curve_number{30.0, 100.0, true, true,
                                    "TR-55 (1986) Tables 2-2a to 2-2c list CN 30 to 98"};

/// Runoff coefficient C of a catchment, as the Rational Method uses it: a share of the rainfall
/// intensity that runs off, above 0 (a catchment that sheds nothing has no Rational peak).
inline constexpr Range runoff_coefficient{0.0, 1.0, false, true,
                                          "a share of the rainfall intensity, above 0"};

/// Runoff coefficient C of a land-cover class: 0 is allowed for a class that sheds nothing,
/// the weighted C of a catchment must still be above 0 (runoff_coefficient).
inline constexpr Range class_runoff_coefficient{0.0, 1.0, true, true,
                                                "a share of the rainfall intensity"};

/// A share given in percent: impervious share of a class, ponds and swamps of a catchment.
inline constexpr Range percent{0.0, 100.0, true, true, "a share of an area"};

/// Frequency factor Cf of the Rational Method, in its table and in the Rational Method alike:
/// 1 (no increase) up to 2, a bound of our own that leaves room for a local table.
inline constexpr Range frequency_factor{1.0, 2.0, true, true, "our choice, no source"};

// Physical bounds: what no catchment on Earth lies outside. A value outside them is a mistake
// of the input (a unit, a misplaced decimal point), refused with the bound in the message; within
// them, the methods warn outside their own ranges of applicability.

/// Catchment area, m2: above 0, at most 10 million km2, more than the largest river basin on
/// Earth (the Amazon's, about 7 million km2; value from memory, not checked).
inline constexpr Range catchment_area_m2{
    0.0, 1.0e13, false, true,
    "10 million km2, more than the largest river basin on Earth (the Amazon's, about 7 million "
    "km2)"};

/// Longest flow path length, m: above 0, at most 7,000 km, longer than the longest river on
/// Earth (the Nile, about 6,650 km; value from memory, not checked).
inline constexpr Range flow_path_length_m{
    0.0, 7.0e6, false, true, "7,000 km, longer than the longest river on Earth (about 6,650 km)"};

/// Relief of the longest flow path (top minus outlet), m: above 0, at most 10,000 m, more than
/// the height of the highest mountain above the lowest shore (about 8,850 m + 430 m; values
/// from memory, not checked).
inline constexpr Range relief_m{0.0, 1.0e4, false, true,
                                "10,000 m, more than the highest summit above the lowest shore "
                                "on Earth (about 9,300 m)"};

/// Slope of the longest flow path, m/m: above 0 (a flat path has no tc), at most 10 m/m (84
/// degrees, a cliff: our choice, no source).
inline constexpr Range flow_path_slope{0.0, 10.0, false, true,
                                       "10 m/m (84 degrees, a cliff; our choice, no source)"};

} // namespace catchpeak::limits
