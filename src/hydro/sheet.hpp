// SPDX-License-Identifier: MIT
// The units a sheet shows a hydro quantity in (internal): those of core/sheet_units.hpp.
#pragma once

#include "catchpeak/core/sheet_units.hpp"

namespace catchpeak::hydro::detail {

using units::area_unit;
using units::depth_unit;
using units::flow_unit;
using units::is_us;
using units::length_unit;
using units::sheet_area;
using units::sheet_depth;

} // namespace catchpeak::hydro::detail
