// SPDX-License-Identifier: MIT
// Root finding for the hydraulics module (internal): TOMS 748 from Boost.Math on a bracket.
#pragma once

#include "catchpeak/core/error.hpp"

#include <boost/math/tools/roots.hpp>
#include <boost/math/tools/toms748_solve.hpp>

#include <cstdint>

namespace catchpeak::hydraulics::detail {

/// Bits of the relative tolerance the solvers stop at: the bracket is narrower than
/// 2^(1-43) of its ends, about 2.3e-13 (Boost.Math eps_tolerance).
inline constexpr int root_tolerance_bits = 43;
/// The printed form of that tolerance, for the lines.
inline constexpr double root_tolerance = 2.3e-13;

/// The root of `f` in [lo, hi], where f(lo) and f(hi) have opposite signs (or one is zero).
template <typename F> double solve_bracketed(F f, double lo, double hi, const char *what) {
    const double f_lo = f(lo);
    const double f_hi = f(hi);
    if (f_lo == 0.0) {
        return lo;
    }
    if (f_hi == 0.0) {
        return hi;
    }
    if ((f_lo < 0.0) == (f_hi < 0.0)) {
        throw InternalError(std::string(what) + ": the root is not bracketed");
    }
    std::uintmax_t iterations = 200;
    const auto [a, b] = boost::math::tools::toms748_solve(
        f, lo, hi, f_lo, f_hi, boost::math::tools::eps_tolerance<double>(root_tolerance_bits),
        iterations);
    return 0.5 * (a + b);
}

} // namespace catchpeak::hydraulics::detail
