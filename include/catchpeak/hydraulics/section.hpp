// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"

#include <cstdint>

/// Culvert barrel sections: circular (diameter) and box (span, rise). Geometry, critical depth,
/// Manning full-flow capacity and normal depth in the barrel. SI inside (m, m2, m3/s).
namespace catchpeak::hydraulics {

enum class Shape : std::uint8_t { circular, box };

/// One barrel's section. For a circle span and rise are both the diameter.
struct Section {
    Shape shape = Shape::circular;
    double span_m = 0.0; ///< diameter, or the box's inside width B
    double rise_m = 0.0; ///< diameter, or the box's inside height D

    [[nodiscard]] static Section circular(double diameter_m) noexcept {
        return {Shape::circular, diameter_m, diameter_m};
    }
    [[nodiscard]] static Section box(double span_m, double rise_m) noexcept {
        return {Shape::box, span_m, rise_m};
    }
};

/// The flow area of a section at a depth (any consistent length unit).
struct FlowArea {
    double area = 0.0;
    double wetted_perimeter = 0.0;
    double top_width = 0.0; ///< 0 when the section flows full
    [[nodiscard]] double hydraulic_radius() const noexcept { return area / wetted_perimeter; }
};

/// The section flowing full (lengths in the unit of `s`).
[[nodiscard]] FlowArea full_flow_area(const Section &s) noexcept;
/// The section flowing at `depth` (0 < depth <= rise; lengths in the unit of `s`).
[[nodiscard]] FlowArea flow_area_at(const Section &s, double depth) noexcept;

/// Full-flow area, wetted perimeter and hydraulic radius of one barrel, each its own line.
[[nodiscard]] WithLines<FlowArea> full_flow(const Section &s, units::System system);

/// Critical depth of one barrel carrying `q_m3_s`: Q^2 T = g A^3 solved with TOMS 748 (Boost.Math)
/// to a relative tolerance of 2^-43 (about 1e-13). Capped at the rise (a flag and line say so).
/// Evaluated in the sheet's units (g = 9.81 m/s2 or 32.2 ft/s2). Returns m.
[[nodiscard]] WithLines<double> critical_depth_m(const Section &s, double q_m3_s,
                                                 units::System system);

/// Manning full-flow capacity of one barrel: Q = (Kn/n) A R^(2/3) S^(1/2), Kn = 1.0 SI, 1.486 US.
/// Returns m3/s.
[[nodiscard]] WithLines<double> full_flow_capacity_m3_s(const Section &s, double manning_n,
                                                        double slope_m_per_m, units::System system);

/// Normal depth in the barrel (Manning), for the outlet velocity under inlet control; the rise
/// when the flow is beyond the part-full maximum. Returns m.
[[nodiscard]] WithLines<double> barrel_normal_depth_m(const Section &s, double q_m3_s,
                                                      double manning_n, double slope_m_per_m,
                                                      units::System system);

} // namespace catchpeak::hydraulics
