// SPDX-License-Identifier: MIT
// Reading calculation lines in the tests: their text as the sheet prints it, and finding a line
// by its key or (for what a reader sees) by its printed label.
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/report/line_text.hpp"

#include <stdexcept>
#include <string>
#include <vector>

namespace catchpeak::test {

/// The line's text as the sheet prints it.
inline LineText text(const CalcLine &l) { return report::text_of(l); }

/// The printed texts of all lines, in order.
inline std::vector<LineText> texts(const CalcLines &lines) {
    std::vector<LineText> out;
    for (const auto &l : lines.lines()) {
        out.push_back(report::text_of(l));
    }
    return out;
}

/// The first line whose printed label is exactly `label`, or null when there is none.
inline const CalcLine *line_labelled(const CalcLines &lines, const std::string &label) {
    for (const auto &l : lines.lines()) {
        if (report::text_of(l).label == label) {
            return &l;
        }
    }
    return nullptr;
}

/// The first line whose printed label starts with `start`; throws std::runtime_error when there
/// is none.
inline const CalcLine &line_starting_with(const CalcLines &lines, const std::string &start) {
    for (const auto &l : lines.lines()) {
        if (report::text_of(l).label.rfind(start, 0) == 0) {
            return l;
        }
    }
    throw std::runtime_error("no line " + start);
}

/// The first line with key `key`; throws std::runtime_error when there is none.
inline const CalcLine &line_keyed(const CalcLines &lines, const std::string &key) {
    for (const auto &l : lines.lines()) {
        if (l.key == key) {
            return l;
        }
    }
    throw std::runtime_error("no line with key " + key);
}

} // namespace catchpeak::test
