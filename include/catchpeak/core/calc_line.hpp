// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/references.hpp"

#include <cstdint>
#include <initializer_list>
#include <limits>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace catchpeak {

/// What a calculation line is: a computed number, a warning, or a note (an input echoed, a
/// choice made).
enum class LineKind { calculation, warning, note };

[[nodiscard]] std::string_view to_string(LineKind k) noexcept;

/// The unit of a quantity on a line. The sheet shows its symbol (symbol()).
enum class Unit : std::uint8_t {
    none, ///< dimensionless
    percent,
    mm,
    in,
    m,
    ft,
    km,
    mi,
    m2,
    ft2,
    ha,
    ac,
    km2,
    mi2,
    s,
    min,
    h,
    yr,
    mm_per_h,
    in_per_h,
    m_per_s,
    ft_per_s,
    m3_per_s,
    ft3_per_s,
    m_per_m,
    ft_per_ft,
    m3,
    ft3,
    per_yr,
    ac_in_per_h,
    csm_per_in, ///< ft3/s per mi2 per inch of runoff
    ft3_per_s_per_in,
    m3_per_s_per_mm,
    ac_ft,
    years,         ///< a count of years (the length of a record)
    us_ft,         ///< US survey foot, of a coordinate in a CRS that uses it
    m_half_per_s,  ///< m^0.5/s, of a weir coefficient in Q = Cd L H^1.5 (SI)
    ft_half_per_s, ///< ft^0.5/s, of a weir coefficient in Q = Cd L H^1.5 (US customary)
};

/// The symbol of a unit as the sheet prints it ("ft3/s", "mm/h", "" for none).
[[nodiscard]] std::string_view symbol(Unit u) noexcept;

/// How a number is printed on the sheet.
struct Shown {
    enum class Style : std::uint8_t {
        significant, ///< `digits` significant figures (sig())
        fixed,       ///< `digits` decimals
        full,        ///< shortest text that round-trips (full())
    };
    Style style = Style::significant;
    int digits = 4;
    bool negative_in_parentheses = false; ///< "(-0.6151)", as the published tables print them

    friend constexpr bool operator==(const Shown &, const Shown &) = default;

    [[nodiscard]] static constexpr Shown sig(int d = 4) noexcept { return {Style::significant, d}; }
    [[nodiscard]] static constexpr Shown fixed(int decimals) noexcept {
        return {Style::fixed, decimals};
    }
    [[nodiscard]] static constexpr Shown integer() noexcept { return {Style::fixed, 0}; }
    [[nodiscard]] static constexpr Shown exact() noexcept { return {Style::full, 0}; }
    /// The same, with a negative value put in parentheses.
    [[nodiscard]] constexpr Shown parenthesised() const noexcept { return {style, digits, true}; }
};

/// One input or result of a line: a symbol, a value in `unit`, and how it is printed. A
/// quantity with `text` set is a word, not a number (a class name, a method, a file).
struct Quantity {
    std::string symbol;
    double value = std::numeric_limits<double>::quiet_NaN();
    Unit unit = Unit::none;
    Shown shown{};
    std::optional<std::string> text;

    /// Equal symbol, unit, printing and text, and the same value (two NaN are the same).
    friend bool operator==(const Quantity &a, const Quantity &b) noexcept;
};

/// A numeric quantity.
[[nodiscard]] Quantity qty(std::string symbol, double value, Unit unit = Unit::none,
                           Shown shown = {});
/// A word put into a line's text (a class name, a method name, a file name).
[[nodiscard]] Quantity word(std::string symbol, std::string text);

/// Typed facts about a line that decisions may read (never the line's text).
struct LineFlags {
    bool averaged = false;        ///< a value averaged over a table interval
    bool capped = false;          ///< a value limited to a maximum
    bool clamped = false;         ///< a value brought into a table's range
    bool minimum_governs = false; ///< a minimum (e.g. minimum tc) replaced the computed value

    friend constexpr bool operator==(const LineFlags &, const LineFlags &) = default;
};

/// The wording of a formula: templates the report fills with the line's quantities.
///
/// In every template `{X}` is the value of the quantity with symbol X (an input, else the
/// result), printed as its `shown` says (or its text, for a word); `{X:u}` is the symbol of its
/// unit; `{[ ... | sep ]}` repeats what is between `{[` and `|` once per row of the line's
/// `rows` (its `{X}` taken from that row), joined by `sep`; `{{` and `}}` are braces.
struct Formula {
    std::string_view key;     ///< stable key of the formula, e.g. "cn.retention"
    std::string_view label;   ///< what the line computes, in words
    std::string_view symbols; ///< the equation in symbols
    std::string_view numbers; ///< the equation with the numbers put in; a warning's message
    Ref ref = Ref::none;      ///< the publication (or project input) the line cites
    std::string_view where;   ///< appended to the citation: " eq. 2-4", ", line {n}"
};

/// The templates of a line's text (see Formula), filled by the report.
struct Patterns {
    std::string label;
    std::string symbols;
    std::string numbers;
    std::string where; ///< appended to the citation of the line's `ref`

    friend bool operator==(const Patterns &, const Patterns &) = default;
};

/// The text of a line as the sheet and results.json show it.
struct LineText {
    std::string label;
    std::string symbols;
    std::string numbers;
    std::string unit;
    std::string source;

    friend bool operator==(const LineText &, const LineText &) = default;
};

/// One numbered line of the calculation sheet. Every number on the sheet is one of these.
///
/// A line is data: the formula's key and wording, its inputs and result as quantities with
/// units, the source as a reference key, typed flags. The report module turns it into text
/// (report/line_text.hpp). Example (US customary sheet):
///   key      "tc.kirpich"
///   wording  label "Time of concentration, Kirpich", symbols "tc = 0.0078 L^0.77 S^-0.385",
///            numbers "tc = 0.0078 x {L}^0.77 x {S}^-0.385"
///   inputs   L = 4780 ft, S = 0.0095 ft/ft
///   result   tc = 31.89... min (full precision)
///   source   Ref::kirpich_1940
struct CalcLine {
    std::string id;  ///< assigned by number_lines(); empty until then
    std::string key; ///< the formula's stable key; decisions compare keys, never labels
    LineKind kind = LineKind::calculation;
    Patterns pattern; ///< the formula's wording, filled with the quantities below
    std::vector<Quantity> inputs;
    std::vector<std::vector<Quantity>> rows; ///< for `{[ ... ]}` in the templates
    Quantity result;                         ///< the result (NaN for a warning or a note)
    Ref ref = Ref::none;
    LineFlags flags;
    /// The finished text, for a line read back from results.json: then the templates are
    /// empty and the report prints this as it stands.
    std::optional<LineText> text;

    [[nodiscard]] double value() const noexcept { return result.value; }
};

/// The lines produced by one computation step, in order.
class CalcLines {
  public:
    /// Appends a calculation line: formula `f` evaluated with `inputs` to `result`.
    CalcLine &calc(const Formula &f, std::vector<Quantity> inputs, Quantity result);
    /// Appends a warning; `f.numbers` is its message (what is outside which limit and what
    /// follows from it).
    CalcLine &warn(const Formula &f, std::vector<Quantity> inputs = {});
    /// Appends a note: an input echoed or a choice made, with a value when `result` has one.
    CalcLine &note(const Formula &f, std::vector<Quantity> inputs = {}, Quantity result = {});
    void add(CalcLine line);

    void append(const CalcLines &other);

    [[nodiscard]] const std::vector<CalcLine> &lines() const noexcept { return lines_; }
    [[nodiscard]] std::vector<CalcLine> &lines() noexcept { return lines_; }
    [[nodiscard]] std::size_t size() const noexcept { return lines_.size(); }
    [[nodiscard]] bool empty() const noexcept { return lines_.empty(); }
    [[nodiscard]] std::size_t warning_count() const noexcept;
    /// The last line with key `key`, or null.
    [[nodiscard]] const CalcLine *find_last(std::string_view key) const noexcept;
    [[nodiscard]] bool has(std::string_view key) const noexcept;

  private:
    std::vector<CalcLine> lines_;
};

/// A result together with the lines that produced it. Hydrology and rainfall functions return
/// this so that no number reaches the sheet without its calculation.
template <typename T> struct WithLines {
    T value;
    CalcLines lines;
};

/// Whether two lines say the same thing: equal in everything but their ids (the same formula,
/// quantities, source and flags, or the same finished text).
[[nodiscard]] bool same_content(const CalcLine &a, const CalcLine &b) noexcept;

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
