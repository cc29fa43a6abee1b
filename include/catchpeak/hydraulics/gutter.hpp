// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"

/// Gutter flow along a street curb: the spread of the flow into the lane and its depth at the
/// curb, for a uniform cross slope and for a composite (depressed) gutter (FHWA HEC-22, 3rd ed.
/// (2009), ch. 4). SI in and out; every equation is evaluated in the sheet's units.
namespace catchpeak::hydraulics {

/// A street gutter. A uniform cross slope when the gutter width or the depression is 0; else a
/// composite gutter: a gutter section of width W beside the curb, depressed by a at the curb
/// below the pavement's cross slope, so that its own cross slope is Sw = Sx + a/W.
struct Gutter {
    double cross_slope_m_per_m = 0.0;        ///< Sx, of the pavement
    double longitudinal_slope_m_per_m = 0.0; ///< SL, along the curb
    double manning_n = 0.0;
    double gutter_width_m = 0.0; ///< W, of the depressed gutter section (0: uniform)
    double depression_m = 0.0;   ///< a, at the curb (0: uniform)

    [[nodiscard]] bool composite() const noexcept {
        return gutter_width_m > 0.0 && depression_m > 0.0;
    }
    /// Sw = Sx + a/W, the gutter section's cross slope (Sx for a uniform gutter).
    [[nodiscard]] double gutter_slope_m_per_m() const noexcept {
        return composite() ? cross_slope_m_per_m + depression_m / gutter_width_m
                           : cross_slope_m_per_m;
    }
};

/// The flow in a gutter at one spread.
struct GutterFlow {
    double flow_m3_s = 0.0; ///< Q
    double spread_m = 0.0;  ///< T, from the curb into the lane
    double depth_m = 0.0;   ///< d, at the curb: T Sx (+ a for a composite gutter)
    /// Eo, the ratio of the flow in the width W beside the curb to the whole flow (1 for a
    /// composite gutter whose spread stays within W; 0 for a uniform gutter).
    double frontal_ratio = 0.0;
};

/// The flow at a given spread. Uniform: Q = (Ku/n) Sx^1.67 SL^0.5 T^2.67 (HEC-22 eq. 4-2, Ku =
/// 0.376 SI, 0.56 US). Composite: Eo by eq. 4-4, Qs by eq. 4-2 over Ts = T - W and Q = Qs/(1 -
/// Eo); a spread within W is a triangle of cross slope Sw.
[[nodiscard]] WithLines<GutterFlow> gutter_flow_at_spread(const Gutter &gutter, double spread_m,
                                                          units::System system);

/// The spread and depth of a given flow: eq. 4-2 solved for T (uniform, closed form), or the
/// composite gutter's Q(T) solved for T with TOMS 748 (Boost.Math).
[[nodiscard]] WithLines<GutterFlow> gutter_spread(const Gutter &gutter, double q_m3_s,
                                                  units::System system);

/// Eo of a composite gutter at spread T > W (HEC-22 eq. 4-4):
/// Eo = 1 / (1 + (Sw/Sx) / ((1 + (Sw/Sx)/(T/W - 1))^2.67 - 1)). No lines; the functions above
/// write its line.
[[nodiscard]] double composite_frontal_ratio(double sw_over_sx, double t_over_w) noexcept;

} // namespace catchpeak::hydraulics
