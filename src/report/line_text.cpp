// SPDX-License-Identifier: MIT
#include "catchpeak/report/line_text.hpp"

#include <fmt/format.h>

#include <stdexcept>

namespace catchpeak::report {

namespace {

[[noreturn]] void bad_pattern(std::string_view pattern, const CalcLine &line,
                              std::string_view what) {
    throw std::logic_error(fmt::format("calculation line '{}' (key '{}'): template \"{}\": {}",
                                       line.id, line.key, pattern, what));
}

const Quantity *find(std::string_view symbol, const CalcLine &line,
                     const std::vector<Quantity> *row) {
    if (row != nullptr) {
        for (const auto &q : *row) {
            if (q.symbol == symbol) {
                return &q;
            }
        }
    }
    for (const auto &q : line.inputs) {
        if (q.symbol == symbol) {
            return &q;
        }
    }
    if (line.result.symbol == symbol) {
        return &line.result;
    }
    return nullptr;
}

} // namespace

namespace {

std::string number(const Quantity &q) {
    switch (q.shown.style) {
    case Shown::Style::significant:
        return sig(q.value, q.shown.digits);
    case Shown::Style::fixed:
        return fmt::format("{:.{}f}", q.value, q.shown.digits);
    case Shown::Style::full:
        return full(q.value);
    }
    return sig(q.value);
}

} // namespace

std::string shown(const Quantity &q) {
    if (q.text) {
        return *q.text;
    }
    if (q.shown.negative_in_parentheses && q.value < 0.0) {
        return "(" + number(q) + ")";
    }
    return number(q);
}

std::string fill(std::string_view pattern, const CalcLine &line, const std::vector<Quantity> *row) {
    std::string out;
    out.reserve(pattern.size() + 16);
    std::size_t i = 0;
    while (i < pattern.size()) {
        const char c = pattern[i];
        if (c == '}') {
            if (i + 1 < pattern.size() && pattern[i + 1] == '}') {
                out += '}';
                i += 2;
                continue;
            }
            bad_pattern(pattern, line, "a lone '}' (write '}}')");
        }
        if (c != '{') {
            out += c;
            ++i;
            continue;
        }
        if (i + 1 < pattern.size() && pattern[i + 1] == '{') {
            out += '{';
            i += 2;
            continue;
        }
        if (i + 1 < pattern.size() && pattern[i + 1] == '[') {
            const std::size_t end = pattern.find("]}", i + 2);
            if (end == std::string_view::npos) {
                bad_pattern(pattern, line, "'{[' without ']}'");
            }
            const std::string_view inner = pattern.substr(i + 2, end - i - 2);
            const std::size_t bar = inner.rfind('|');
            if (bar == std::string_view::npos) {
                bad_pattern(pattern, line, "'{[ ... ]}' without '|' before its separator");
            }
            const std::string_view body = inner.substr(0, bar);
            const std::string_view sep = inner.substr(bar + 1);
            for (std::size_t r = 0; r < line.rows.size(); ++r) {
                if (r > 0) {
                    out += sep;
                }
                out += fill(body, line, &line.rows[r]);
            }
            i = end + 2;
            continue;
        }
        const std::size_t end = pattern.find('}', i + 1);
        if (end == std::string_view::npos) {
            bad_pattern(pattern, line, "'{' without '}'");
        }
        std::string_view name = pattern.substr(i + 1, end - i - 1);
        bool unit = false;
        if (name.size() > 2 && name.substr(name.size() - 2) == ":u") {
            unit = true;
            name.remove_suffix(2);
        }
        const Quantity *q = find(name, line, row);
        if (q == nullptr) {
            bad_pattern(pattern, line, fmt::format("no quantity '{}'", name));
        }
        out += unit ? std::string(symbol(q->unit)) : shown(*q);
        i = end + 1;
    }
    return out;
}

LineText text_of(const CalcLine &line) {
    if (line.text) {
        return *line.text;
    }
    LineText t;
    t.label = fill(line.pattern.label, line);
    t.symbols = fill(line.pattern.symbols, line);
    t.numbers = fill(line.pattern.numbers, line);
    t.unit = std::string(symbol(line.result.unit));
    t.source = std::string(short_form(line.ref)) + fill(line.pattern.where, line);
    return t;
}

} // namespace catchpeak::report
