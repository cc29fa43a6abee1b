// SPDX-License-Identifier: MIT
// Reading calculation lines in the tests: their text as the sheet prints it, and finding a line
// by its key or (for what a reader sees) by its printed label.
#pragma once

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/report/line_text.hpp"

#include <limits>
#include <stdexcept>
#include <string>
#include <vector>

namespace catchpeak::test {

/// A line given as finished text, as results.json holds it (for the tests of the report, which
/// prints what it is given).
inline CalcLine text_line(LineKind kind, std::string label, std::string symbols,
                          std::string numbers, double value, std::string unit, std::string source) {
    CalcLine l;
    l.kind = kind;
    l.result.value = value;
    l.text = LineText{std::move(label), std::move(symbols), std::move(numbers), std::move(unit),
                      std::move(source)};
    return l;
}
inline CalcLine text_calc(std::string label, std::string symbols, std::string numbers, double value,
                          std::string unit, std::string source) {
    return text_line(LineKind::calculation, std::move(label), std::move(symbols),
                     std::move(numbers), value, std::move(unit), std::move(source));
}
inline CalcLine text_warn(std::string label, std::string message, std::string source) {
    return text_line(LineKind::warning, std::move(label), {}, std::move(message),
                     std::numeric_limits<double>::quiet_NaN(), {}, std::move(source));
}
inline CalcLine text_note(std::string label, std::string text, std::string source,
                          double value = std::numeric_limits<double>::quiet_NaN(),
                          std::string unit = {}) {
    return text_line(LineKind::note, std::move(label), {}, std::move(text), value, std::move(unit),
                     std::move(source));
}

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
