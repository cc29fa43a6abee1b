// SPDX-License-Identifier: MIT
#pragma once

#include <string>
#include <vector>

/// Steps and labels of axis ticks, shared by the map's grid and scale bar and the charts.
/// Internal to `report`.
namespace catchpeak::report {

/// A "nice" step (1, 2 or 5 times a power of ten) near `raw`; 1 for a step that is not a
/// positive finite number.
[[nodiscard]] double nice_step(double raw);

/// A tick label: no decimals when the step is whole, else as many as the step needs.
[[nodiscard]] std::string tick_label(double v, double step);

/// The multiples of `step` from the first at or above `from` up to `to`, each the one before
/// plus `step` (as the drawing loops take them).
[[nodiscard]] std::vector<double> ticks_between(double from, double to, double step);

} // namespace catchpeak::report
