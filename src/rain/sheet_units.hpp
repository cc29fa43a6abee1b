// SPDX-License-Identifier: MIT
// The units in which rain's calculation lines show depths and intensities on a sheet.
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/sheet_units.hpp"
#include "catchpeak/core/units.hpp"

#include <cstddef>
#include <string>
#include <utility>

namespace catchpeak::rain::detail {

[[nodiscard]] inline bool us_sheet(units::System s) noexcept { return units::is_us(s); }
using units::depth_qty;
using units::depth_unit;
using units::intensity_qty;
using units::intensity_unit;

[[nodiscard]] inline double mm_to_sheet(double mm, units::System s) noexcept {
    return units::sheet_depth(mm, s);
}
[[nodiscard]] inline double sheet_to_mm(double v, units::System s) noexcept {
    return us_sheet(s) ? units::in_to_mm(v) : v;
}
[[nodiscard]] inline double mm_h_to_sheet(double v, units::System s) noexcept {
    return units::sheet_intensity(v, s);
}

/// A count (years, steps, blocks), printed as an integer.
[[nodiscard]] inline Quantity count_qty(std::string symbol, std::size_t n) {
    return qty(std::move(symbol), static_cast<double>(n), Unit::none, Shown::integer());
}

/// The return period T of a line, yr.
[[nodiscard]] inline Quantity return_period_qty(double t_yr) { return qty("T", t_yr, Unit::yr); }

} // namespace catchpeak::rain::detail
