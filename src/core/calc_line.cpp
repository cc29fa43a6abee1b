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

std::string_view symbol(Unit u) noexcept {
    switch (u) {
    case Unit::none:
        return "";
    case Unit::percent:
        return "%";
    case Unit::mm:
        return "mm";
    case Unit::in:
        return "in";
    case Unit::m:
        return "m";
    case Unit::ft:
        return "ft";
    case Unit::km:
        return "km";
    case Unit::mi:
        return "mi";
    case Unit::m2:
        return "m2";
    case Unit::ft2:
        return "ft2";
    case Unit::ha:
        return "ha";
    case Unit::ac:
        return "ac";
    case Unit::km2:
        return "km2";
    case Unit::mi2:
        return "mi2";
    case Unit::s:
        return "s";
    case Unit::min:
        return "min";
    case Unit::h:
        return "h";
    case Unit::yr:
        return "yr";
    case Unit::mm_per_h:
        return "mm/h";
    case Unit::in_per_h:
        return "in/h";
    case Unit::m_per_s:
        return "m/s";
    case Unit::ft_per_s:
        return "ft/s";
    case Unit::m3_per_s:
        return "m3/s";
    case Unit::ft3_per_s:
        return "ft3/s";
    case Unit::m_per_m:
        return "m/m";
    case Unit::ft_per_ft:
        return "ft/ft";
    case Unit::m3:
        return "m3";
    case Unit::ft3:
        return "ft3";
    case Unit::per_yr:
        return "1/yr";
    case Unit::ac_in_per_h:
        return "ac-in/h";
    case Unit::csm_per_in:
        return "ft3/s/mi2/in";
    case Unit::ft3_per_s_per_in:
        return "ft3/s per in";
    case Unit::m3_per_s_per_mm:
        return "m3/s per mm";
    case Unit::ac_ft:
        return "ac-ft";
    case Unit::years:
        return "years";
    case Unit::us_ft:
        return "US ft";
    case Unit::m_half_per_s:
        return "m^0.5/s";
    case Unit::ft_half_per_s:
        return "ft^0.5/s";
    }
    return "";
}

Quantity qty(std::string symbol, double value, Unit unit, Shown shown) {
    Quantity q;
    q.symbol = std::move(symbol);
    q.value = value;
    q.unit = unit;
    q.shown = shown;
    return q;
}

Quantity word(std::string symbol, std::string text) {
    Quantity q;
    q.symbol = std::move(symbol);
    q.text = std::move(text);
    return q;
}

bool operator==(const Quantity &a, const Quantity &b) noexcept {
    const bool same_value = a.value == b.value || (std::isnan(a.value) && std::isnan(b.value));
    return same_value && a.symbol == b.symbol && a.unit == b.unit && a.shown == b.shown &&
           a.text == b.text;
}

namespace {

CalcLine from_formula(const Formula &f, LineKind kind, std::vector<Quantity> inputs,
                      Quantity result) {
    CalcLine line;
    line.key = std::string(f.key);
    line.kind = kind;
    line.pattern = {std::string(f.label), std::string(f.symbols), std::string(f.numbers),
                    std::string(f.where)};
    line.inputs = std::move(inputs);
    line.result = std::move(result);
    line.ref = f.ref;
    return line;
}

} // namespace

CalcLine &CalcLines::calc(const Formula &f, std::vector<Quantity> inputs, Quantity result) {
    lines_.push_back(from_formula(f, LineKind::calculation, std::move(inputs), std::move(result)));
    return lines_.back();
}

CalcLine &CalcLines::warn(const Formula &f, std::vector<Quantity> inputs) {
    lines_.push_back(from_formula(f, LineKind::warning, std::move(inputs), {}));
    return lines_.back();
}

CalcLine &CalcLines::note(const Formula &f, std::vector<Quantity> inputs, Quantity result) {
    lines_.push_back(from_formula(f, LineKind::note, std::move(inputs), std::move(result)));
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

const CalcLine *CalcLines::find_last(std::string_view key) const noexcept {
    for (auto it = lines_.rbegin(); it != lines_.rend(); ++it) {
        if (it->key == key) {
            return &*it;
        }
    }
    return nullptr;
}

bool CalcLines::has(std::string_view key) const noexcept { return find_last(key) != nullptr; }

bool same_content(const CalcLine &a, const CalcLine &b) noexcept {
    return a.key == b.key && a.kind == b.kind && a.pattern == b.pattern && a.inputs == b.inputs &&
           a.rows == b.rows && a.result == b.result && a.ref == b.ref && a.flags == b.flags &&
           a.text == b.text;
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
