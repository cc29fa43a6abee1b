// SPDX-License-Identifier: MIT
#include "catchpeak/core/calc_line.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <utility>

namespace catchpeak {

std::string_view to_string(LineKind k) noexcept {
    switch (k) {
    case LineKind::calculation:
        return "calculation";
    case LineKind::warning:
        return "warning";
    case LineKind::note:
        return "note";
    }
    return "calculation";
}

const CalcLine &CalcLines::calc(std::string label, std::string symbols, std::string numbers,
                                double value, std::string unit, std::string source) {
    CalcLine line;
    line.label = std::move(label);
    line.symbols = std::move(symbols);
    line.numbers = std::move(numbers);
    line.value = value;
    line.unit = std::move(unit);
    line.source = std::move(source);
    line.kind = LineKind::calculation;
    lines_.push_back(std::move(line));
    return lines_.back();
}

const CalcLine &CalcLines::warn(std::string label, std::string message, std::string source) {
    CalcLine line;
    line.label = std::move(label);
    line.numbers = std::move(message);
    line.source = std::move(source);
    line.kind = LineKind::warning;
    lines_.push_back(std::move(line));
    return lines_.back();
}

const CalcLine &CalcLines::note(std::string label, std::string text, std::string source,
                                double value, std::string unit) {
    CalcLine line;
    line.label = std::move(label);
    line.numbers = std::move(text);
    line.source = std::move(source);
    line.value = value;
    line.unit = std::move(unit);
    line.kind = LineKind::note;
    lines_.push_back(std::move(line));
    return lines_.back();
}

void CalcLines::add(CalcLine line) { lines_.push_back(std::move(line)); }

void CalcLines::append(const CalcLines &other) {
    lines_.insert(lines_.end(), other.lines_.begin(), other.lines_.end());
}

std::size_t CalcLines::warning_count() const noexcept {
    return static_cast<std::size_t>(std::count_if(
        lines_.begin(), lines_.end(), [](const auto &l) { return l.kind == LineKind::warning; }));
}

std::size_t number_lines(CalcLines &lines, std::string_view prefix, std::size_t first) {
    std::size_t n = first;
    for (auto &line : lines.lines()) {
        line.id = fmt::format("{}-L{}", prefix, n++);
    }
    return n;
}

std::string sig(double value, int digits) {
    if (std::isnan(value)) {
        return "n/a";
    }
    if (std::isinf(value)) {
        return value > 0 ? "inf" : "-inf";
    }
    if (value == 0.0) {
        return "0";
    }
    digits = std::max(digits, 1);
    const double mag = std::abs(value);
    if (mag < 1e-4 || mag >= 1e9) {
        return fmt::format("{:.{}e}", value, digits - 1);
    }
    // Round to `digits` significant figures first, so that 9.9996 becomes 10.00, not 9.9996.
    int exponent = static_cast<int>(std::floor(std::log10(mag)));
    const double scale = std::pow(10.0, digits - 1 - exponent);
    double rounded = std::round(value * scale) / scale;
    exponent = static_cast<int>(std::floor(std::log10(std::abs(rounded))));
    const int decimals = std::max(0, digits - 1 - exponent);
    return fmt::format("{:.{}f}", rounded, decimals);
}

std::string full(double value) { return fmt::format("{}", value); }

} // namespace catchpeak
