// SPDX-License-Identifier: MIT
// Input checks shared by the hydro sources (internal).
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/error.hpp"

#include <cmath>
#include <string>

namespace catchpeak::hydro::detail {

/// Throws InputError unless value is finite and > 0.
inline void require_positive(const std::string &quantity, double value, const std::string &unit) {
    if (!std::isfinite(value) || value <= 0.0) {
        throw_input_error(quantity, "value " + full(value) + " " + unit + " is not positive",
                          "a finite value > 0 " + unit);
    }
}

/// Throws InputError unless value is finite and >= 0.
inline void require_non_negative(const std::string &quantity, double value,
                                 const std::string &unit) {
    if (!std::isfinite(value) || value < 0.0) {
        throw_input_error(quantity, "value " + full(value) + " " + unit + " is negative",
                          "a finite value >= 0 " + unit);
    }
}

/// Throws InputError unless CN is in [30, 100]. TR-55 Tables 2-2a to 2-2c list CN 30 (woods in
/// good condition and meadow on soil group A), so 30 itself is accepted.
inline void require_cn(double cn) {
    if (!std::isfinite(cn) || cn < 30.0 || cn > 100.0) {
        throw_input_error("curve number CN", "value " + full(cn) + " is out of range",
                          "30 <= CN <= 100 (TR-55 tables list CN 30 to 98)");
    }
}

} // namespace catchpeak::hydro::detail
