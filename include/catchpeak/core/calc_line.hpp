// SPDX-License-Identifier: MIT
#pragma once

#include <limits>
#include <string>
#include <string_view>
#include <vector>

namespace catchpeak {

/// What a calculation line is: a computed number, a warning, or a note (an input echoed, a
/// choice made).
enum class LineKind { calculation, warning, note };

[[nodiscard]] std::string_view to_string(LineKind k) noexcept;

/// One numbered line of the calculation sheet. Every number on the sheet is one of these.
///
/// Example (US customary sheet):
///   id       "DP3-L12"
///   label    "Time of concentration, Kirpich"
///   symbols  "tc = 0.0078 L^0.77 S^-0.385"
///   numbers  "tc = 0.0078 x 4780^0.77 x 0.009500^-0.385"
///   value    31.89...   (full precision, in `unit`)
///   unit     "min"
///   source   "Kirpich (1940); TxDOT Hydraulic Design Manual eq. 4-15"
///
/// For a warning, `numbers` holds the message and `value` is NaN.
struct CalcLine {
    std::string id;      ///< assigned by number_lines(); empty until then
    std::string label;   ///< what the line computes, in words
    std::string symbols; ///< the equation in symbols
    std::string numbers; ///< the equation with the numbers put in (4 significant figures)
    double value = std::numeric_limits<double>::quiet_NaN(); ///< result, in `unit`
    std::string unit;   ///< unit of `value` in the sheet's unit system ("" if dimensionless)
    std::string source; ///< published reference (document, equation or table), or "project input"
    LineKind kind = LineKind::calculation;
};

/// The lines produced by one computation step, in order.
class CalcLines {
  public:
    /// Appends a calculation line and returns it.
    const CalcLine &calc(std::string label, std::string symbols, std::string numbers, double value,
                         std::string unit, std::string source);
    /// Appends a warning. `message` says what is outside which limit and what follows from it.
    const CalcLine &warn(std::string label, std::string message, std::string source);
    /// Appends a note: an input echoed or a choice made, optionally with a value.
    const CalcLine &note(std::string label, std::string text, std::string source,
                         double value = std::numeric_limits<double>::quiet_NaN(),
                         std::string unit = {});
    void add(CalcLine line);
    void append(const CalcLines &other);

    [[nodiscard]] const std::vector<CalcLine> &lines() const noexcept { return lines_; }
    [[nodiscard]] std::vector<CalcLine> &lines() noexcept { return lines_; }
    [[nodiscard]] std::size_t size() const noexcept { return lines_.size(); }
    [[nodiscard]] bool empty() const noexcept { return lines_.empty(); }
    [[nodiscard]] std::size_t warning_count() const noexcept;

  private:
    std::vector<CalcLine> lines_;
};

/// A result together with the lines that produced it. Hydrology and rainfall functions return
/// this so that no number reaches the sheet without its calculation.
template <typename T> struct WithLines {
    T value;
    CalcLines lines;
};

/// Gives every line the id "<prefix>-L<n>", n counting from `first` (1 by default).
/// Returns the next free number.
std::size_t number_lines(CalcLines &lines, std::string_view prefix, std::size_t first = 1);

/// Formats a number with `digits` significant figures, locale-independent, without exponent
/// for 1e-4 <= |v| < 1e9 (e.g. 0.009500, 31.89, 4780, 123500); in scientific notation outside.
/// This is how every number is shown on the sheet ("4 significant figures", DESIGN.md).
[[nodiscard]] std::string sig(double value, int digits = 4);

/// Formats a number with full precision (shortest representation that round-trips), for JSON
/// and for recheck.
[[nodiscard]] std::string full(double value);

} // namespace catchpeak
