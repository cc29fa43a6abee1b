// SPDX-License-Identifier: MIT
// The units a sheet shows a hydro quantity in, by unit system (internal).
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"

namespace catchpeak::hydro::detail {

[[nodiscard]] inline bool is_us(units::System system) noexcept {
    return system == units::System::us_customary;
}
/// Rainfall and runoff depth: in or mm.
[[nodiscard]] inline Unit depth_unit(units::System system) noexcept {
    return is_us(system) ? Unit::in : Unit::mm;
}
/// Length: ft or m.
[[nodiscard]] inline Unit length_unit(units::System system) noexcept {
    return is_us(system) ? Unit::ft : Unit::m;
}
/// Catchment area: ac or ha.
[[nodiscard]] inline Unit area_unit(units::System system) noexcept {
    return is_us(system) ? Unit::ac : Unit::ha;
}
/// Flow: ft3/s or m3/s.
[[nodiscard]] inline Unit flow_unit(units::System system) noexcept {
    return is_us(system) ? Unit::ft3_per_s : Unit::m3_per_s;
}
/// A depth in mm in the sheet's unit.
[[nodiscard]] inline double sheet_depth(double mm, units::System system) noexcept {
    return is_us(system) ? units::mm_to_in(mm) : mm;
}
/// A catchment area in m2 in the sheet's unit (ac or ha).
[[nodiscard]] inline double sheet_area(double m2, units::System system) noexcept {
    return is_us(system) ? units::m2_to_acre(m2) : units::m2_to_ha(m2);
}

} // namespace catchpeak::hydro::detail
