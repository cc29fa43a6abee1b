// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"

#include <string>
#include <utility>

/// The unit in which a calculation line shows each kind of quantity, by the sheet's unit system
/// (US customary or SI), and the conversion of an SI value into it. One place for every module
/// that writes lines.
namespace catchpeak::units {

[[nodiscard]] inline bool is_us(System s) noexcept { return s == System::us_customary; }

/// Rainfall and runoff depth: in or mm.
[[nodiscard]] inline Unit depth_unit(System s) noexcept { return is_us(s) ? Unit::in : Unit::mm; }
/// Length: ft or m.
[[nodiscard]] inline Unit length_unit(System s) noexcept { return is_us(s) ? Unit::ft : Unit::m; }
/// Catchment area: ac or ha.
[[nodiscard]] inline Unit area_unit(System s) noexcept { return is_us(s) ? Unit::ac : Unit::ha; }
/// Flow: ft3/s or m3/s.
[[nodiscard]] inline Unit flow_unit(System s) noexcept {
    return is_us(s) ? Unit::ft3_per_s : Unit::m3_per_s;
}
/// Rainfall intensity: in/h or mm/h.
[[nodiscard]] inline Unit intensity_unit(System s) noexcept {
    return is_us(s) ? Unit::in_per_h : Unit::mm_per_h;
}

/// A depth in mm in the sheet's unit.
[[nodiscard]] inline double sheet_depth(double mm, System s) noexcept {
    return is_us(s) ? mm_to_in(mm) : mm;
}
/// A catchment area in m2 in the sheet's unit (ac or ha).
[[nodiscard]] inline double sheet_area(double m2, System s) noexcept {
    return is_us(s) ? m2_to_acre(m2) : m2_to_ha(m2);
}
/// An intensity in mm/h in the sheet's unit.
[[nodiscard]] inline double sheet_intensity(double mm_per_h, System s) noexcept {
    return is_us(s) ? mm_per_h_to_in_per_h(mm_per_h) : mm_per_h;
}

/// A depth quantity in the sheet's unit, from mm.
[[nodiscard]] inline Quantity depth_qty(std::string symbol, double mm, System s) {
    return qty(std::move(symbol), sheet_depth(mm, s), depth_unit(s));
}
/// An area quantity in the sheet's unit, from m2.
[[nodiscard]] inline Quantity area_qty(std::string symbol, double m2, System s) {
    return qty(std::move(symbol), sheet_area(m2, s), area_unit(s));
}
/// An intensity quantity in the sheet's unit, from mm/h.
[[nodiscard]] inline Quantity intensity_qty(std::string symbol, double mm_per_h, System s) {
    return qty(std::move(symbol), sheet_intensity(mm_per_h, s), intensity_unit(s));
}

} // namespace catchpeak::units
