// SPDX-License-Identifier: MIT
#pragma once

#include <cstddef>
#include <vector>

namespace catchpeak::rain {

/// Rainfall (or rainfall excess) in equal time steps: depth_mm[k] falls during
/// [k * step_s, (k + 1) * step_s). Depths are incremental, not cumulative, in mm.
struct Hyetograph {
    double step_s = 0.0;
    std::vector<double> depth_mm;

    [[nodiscard]] std::size_t steps() const noexcept { return depth_mm.size(); }
    [[nodiscard]] double duration_s() const noexcept {
        return step_s * static_cast<double>(depth_mm.size());
    }
    [[nodiscard]] double total_mm() const noexcept {
        double sum = 0.0;
        for (double d : depth_mm) {
            sum += d;
        }
        return sum;
    }
};

} // namespace catchpeak::rain
