// SPDX-License-Identifier: MIT
// The units in which rain's calculation lines show depths and intensities on a sheet.
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"

#include <cstddef>
#include <string>
#include <utility>

namespace catchpeak::rain::detail {

[[nodiscard]] inline bool us_sheet(units::System s) noexcept {
    return s == units::System::us_customary;
}

/// Rainfall depths on the sheet: in on a US customary sheet, mm on an SI sheet.
[[nodiscard]] inline Unit depth_unit(units::System s) noexcept {
    return us_sheet(s) ? Unit::in : Unit::mm;
}

/// Rainfall intensities on the sheet: in/h on a US customary sheet, mm/h on an SI sheet.
[[nodiscard]] inline Unit intensity_unit(units::System s) noexcept {
    return us_sheet(s) ? Unit::in_per_h : Unit::mm_per_h;
}

[[nodiscard]] inline double mm_to_sheet(double mm, units::System s) noexcept {
    return us_sheet(s) ? units::mm_to_in(mm) : mm;
}

[[nodiscard]] inline double sheet_to_mm(double v, units::System s) noexcept {
    return us_sheet(s) ? units::in_to_mm(v) : v;
}

[[nodiscard]] inline double mm_h_to_sheet(double v, units::System s) noexcept {
    return us_sheet(s) ? units::mm_per_h_to_in_per_h(v) : v;
}

/// A depth on the sheet, in the sheet's unit, from a depth in mm.
[[nodiscard]] inline Quantity depth_qty(std::string symbol, double mm, units::System s) {
    return qty(std::move(symbol), mm_to_sheet(mm, s), depth_unit(s));
}

/// An intensity on the sheet, in the sheet's unit, from an intensity in mm/h.
[[nodiscard]] inline Quantity intensity_qty(std::string symbol, double mm_per_h, units::System s) {
    return qty(std::move(symbol), mm_h_to_sheet(mm_per_h, s), intensity_unit(s));
}

/// A count (years, steps, blocks), printed as an integer.
[[nodiscard]] inline Quantity count_qty(std::string symbol, std::size_t n) {
    return qty(std::move(symbol), static_cast<double>(n), Unit::none, Shown::integer());
}

/// The return period T of a line, yr.
[[nodiscard]] inline Quantity return_period_qty(double t_yr) { return qty("T", t_yr, Unit::yr); }

} // namespace catchpeak::rain::detail
