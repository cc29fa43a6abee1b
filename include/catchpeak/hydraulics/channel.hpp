// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"

/// The outlet channel, for the tailwater: normal depth in a trapezoidal channel (Manning).
namespace catchpeak::hydraulics {

/// A trapezoidal channel (a rectangle with side slope 0, a triangle with bottom width 0).
struct Trapezoid {
    double bottom_width_m = 0.0;
    double side_slope_h_per_v = 0.0; ///< z, horizontal per vertical, both sides
    double manning_n = 0.0;
    double slope_m_per_m = 0.0;
};

/// Normal depth: Q = (Kn/n) A R^(2/3) S^(1/2), A = (b + z y) y, P = b + 2 y (1 + z^2)^(1/2),
/// Kn = 1.0 SI, 1.486 US; solved with TOMS 748 (Boost.Math). Returns m.
[[nodiscard]] WithLines<double> normal_depth_m(const Trapezoid &channel, double q_m3_s,
                                               units::System system);

} // namespace catchpeak::hydraulics
