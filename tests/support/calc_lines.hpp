// SPDX-License-Identifier: MIT
// Finding calculation lines by their label, for the tests.
#pragma once

#include "catchpeak/core/calc_line.hpp"

#include <stdexcept>
#include <string>

namespace catchpeak::test {

/// The first line whose label is exactly `label`, or null when there is none.
inline const CalcLine *line_labelled(const CalcLines &lines, const std::string &label) {
    for (const auto &l : lines.lines()) {
        if (l.label == label) {
            return &l;
        }
    }
    return nullptr;
}

/// The first line whose label starts with `start`; throws std::runtime_error when there is none.
inline const CalcLine &line_starting_with(const CalcLines &lines, const std::string &start) {
    for (const auto &l : lines.lines()) {
        if (l.label.rfind(start, 0) == 0) {
            return l;
        }
    }
    throw std::runtime_error("no line " + start);
}

} // namespace catchpeak::test
