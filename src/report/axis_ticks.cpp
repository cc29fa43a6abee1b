// SPDX-License-Identifier: MIT
#include "internal/axis_ticks.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

namespace catchpeak::report {

double nice_step(double raw) {
    if (!(raw > 0.0) || !std::isfinite(raw)) {
        return 1.0;
    }
    const double p = std::pow(10.0, std::floor(std::log10(raw)));
    const double f = raw / p;
    return (f < 1.5 ? 1.0 : f < 3.5 ? 2.0 : f < 7.5 ? 5.0 : 10.0) * p;
}

std::string tick_label(double v, double step) {
    int decimals = 0;
    if (step < 1.0) {
        decimals = std::min(6, static_cast<int>(std::ceil(-std::log10(step) - 1e-9)));
    }
    if (std::abs(v) < step * 1e-6) {
        v = 0.0;
    }
    return fmt::format("{:.{}f}", v, decimals);
}

std::vector<double> ticks_between(double from, double to, double step) {
    std::vector<double> out;
    if (!(step > 0.0)) {
        return out;
    }
    for (double v = std::ceil(from / step) * step; v <= to; v += step) {
        out.push_back(v);
    }
    return out;
}

} // namespace catchpeak::report
