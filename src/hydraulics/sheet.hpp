// SPDX-License-Identifier: MIT
// The sheet's unit system for the hydraulics lines (internal): every equation is evaluated in
// the published form of the sheet's units, so that a checker reproduces each line with the
// numbers it shows. Values enter and leave in SI.
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/units.hpp"

#include <cmath>
#include <string>

namespace catchpeak::hydraulics::detail {

struct Sheet {
    units::System system;

    [[nodiscard]] bool us() const noexcept { return system == units::System::us_customary; }

    // SI to sheet units and back.
    [[nodiscard]] double len(double m) const noexcept { return us() ? units::m_to_ft(m) : m; }
    [[nodiscard]] double len_si(double v) const noexcept { return us() ? units::ft_to_m(v) : v; }
    [[nodiscard]] double flow(double q) const noexcept { return us() ? units::m3s_to_cfs(q) : q; }
    [[nodiscard]] double flow_si(double v) const noexcept {
        return us() ? units::cfs_to_m3s(v) : v;
    }
    [[nodiscard]] double area(double a) const noexcept { return us() ? units::m2_to_ft2(a) : a; }
    [[nodiscard]] double vel(double v) const noexcept { return us() ? units::m_to_ft(v) : v; }
    [[nodiscard]] double vel_si(double v) const noexcept { return us() ? units::ft_to_m(v) : v; }

    [[nodiscard]] Unit u_len() const noexcept { return us() ? Unit::ft : Unit::m; }
    [[nodiscard]] Unit u_area() const noexcept { return us() ? Unit::ft2 : Unit::m2; }
    [[nodiscard]] Unit u_flow() const noexcept { return us() ? Unit::ft3_per_s : Unit::m3_per_s; }
    [[nodiscard]] Unit u_vel() const noexcept { return us() ? Unit::ft_per_s : Unit::m_per_s; }
    [[nodiscard]] Unit u_slope() const noexcept { return us() ? Unit::ft_per_ft : Unit::m_per_m; }

    /// Gravity as HDS-5 (2012) evaluates it: 9.81 m/s2, 32.2 ft/s2.
    [[nodiscard]] double g() const noexcept { return us() ? 32.2 : 9.81; }
    /// Manning's unit constant: 1.0 SI, 1.486 US (Chow (1959) ch. 5).
    [[nodiscard]] double kn() const noexcept { return us() ? 1.486 : 1.0; }

    // Quantities in sheet units, from SI values (`sheet_*`: the value is already in sheet units).
    [[nodiscard]] Quantity q_len(std::string s, double m) const {
        return qty(std::move(s), len(m), u_len());
    }
    /// An elevation, SI in: to the millimetre (SI) or the hundredth of a foot (US), whatever
    /// its size (four significant digits would round 1234.56 m to 1235).
    [[nodiscard]] Quantity q_elev(std::string s, double m) const {
        return qty(std::move(s), len(m), u_len(), Shown::fixed(us() ? 2 : 3));
    }
    [[nodiscard]] Quantity sheet_len(std::string s, double v) const {
        return qty(std::move(s), v, u_len());
    }
    [[nodiscard]] Quantity q_flow(std::string s, double q) const {
        return qty(std::move(s), flow(q), u_flow());
    }
    [[nodiscard]] Quantity sheet_flow(std::string s, double v) const {
        return qty(std::move(s), v, u_flow());
    }
    [[nodiscard]] Quantity sheet_area(std::string s, double v) const {
        return qty(std::move(s), v, u_area());
    }
    [[nodiscard]] Quantity sheet_vel(std::string s, double v) const {
        return qty(std::move(s), v, u_vel());
    }
    [[nodiscard]] Quantity q_slope(std::string s, double v) const {
        return qty(std::move(s), v, u_slope());
    }
    [[nodiscard]] Quantity q_g() const { return qty("g", g(), Unit::none, Shown::exact()); }
    [[nodiscard]] Quantity q_kn() const { return qty("Kn", kn(), Unit::none, Shown::exact()); }
};

/// Throws InputError unless value is finite and > 0.
inline void require_positive(const std::string &what, double value) {
    if (!std::isfinite(value) || value <= 0.0) {
        throw_input_error(what, "value " + full(value) + " is not positive", "a finite value > 0");
    }
}

/// Throws InputError unless value is finite and >= 0.
inline void require_non_negative(const std::string &what, double value) {
    if (!std::isfinite(value) || value < 0.0) {
        throw_input_error(what, "value " + full(value) + " is negative", "a finite value >= 0");
    }
}

} // namespace catchpeak::hydraulics::detail
