// SPDX-License-Identifier: MIT
// Input checks shared by the hydro sources (internal).
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/limits.hpp"

#include <cmath>
#include <string>

namespace catchpeak::hydro::detail {

/// Throws InputError unless value is finite and > 0.
inline void require_positive(const std::string &quantity, double value, Unit u = Unit::none) {
    const std::string unit(symbol(u));
    if (!std::isfinite(value) || value <= 0.0) {
        throw_input_error(quantity, "value " + full(value) + " " + unit + " is not positive",
                          "a finite value > 0 " + unit);
    }
}

/// Throws InputError unless value is finite and >= 0.
inline void require_non_negative(const std::string &quantity, double value, Unit u = Unit::none) {
    const std::string unit(symbol(u));
    if (!std::isfinite(value) || value < 0.0) {
        throw_input_error(quantity, "value " + full(value) + " " + unit + " is negative",
                          "a finite value >= 0 " + unit);
    }
}

/// Throws InputError unless CN is in limits::curve_number.
inline void require_cn(double cn) {
    if (!limits::curve_number.contains(cn)) {
        throw_input_error("curve number CN", "value " + full(cn) + " is out of range",
                          limits::curve_number.accepted("CN"));
    }
}

} // namespace catchpeak::hydro::detail
