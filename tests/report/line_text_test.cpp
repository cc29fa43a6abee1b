// SPDX-License-Identifier: MIT
// The report turns a line (formula, quantities, reference key) into the text the sheet prints.
#include "catchpeak/report/line_text.hpp"

#include <gtest/gtest.h>

#include <stdexcept>

namespace catchpeak::report {
namespace {

constexpr Formula retention{"test.retention",   "Potential maximum retention",
                            "S = 1000/CN - 10", "S = 1000/{CN} - 10",
                            Ref::tr55_1986,     " eq. 2-4"};

TEST(LineText, FillsTheTemplatesWithTheQuantities) {
    CalcLines lines;
    lines.calc(retention, {qty("CN", 80.0)}, qty("S", 2.5, Unit::in));
    const LineText t = text_of(lines.lines()[0]);
    EXPECT_EQ(t.label, "Potential maximum retention");
    EXPECT_EQ(t.symbols, "S = 1000/CN - 10");
    EXPECT_EQ(t.numbers, "S = 1000/80.00 - 10");
    EXPECT_EQ(t.unit, "in");
    EXPECT_EQ(t.source, "TR-55 (1986) eq. 2-4"); // short form of the reference, then `where`
    EXPECT_EQ(lines.lines()[0].key, "test.retention");
    EXPECT_DOUBLE_EQ(lines.lines()[0].value(), 2.5);
}

TEST(LineText, PrintsEachQuantityAsItsShownSays) {
    constexpr Formula f{"test.shown", "Peak, {T}-year",     "", "{a} | {b} | {c} | {d} | {w}",
                        Ref::none,    "table {w}, line {n}"};
    CalcLines lines;
    lines.calc(f,
               {qty("T", 10.0, Unit::yr, Shown::integer()), qty("a", 0.0095),
                qty("b", 2.0 / 3.0, Unit::none, Shown::sig(3)),
                qty("c", 1.23456, Unit::none, Shown::fixed(2)),
                qty("d", 0.1 + 0.2, Unit::none, Shown::exact()), word("w", "C table"),
                qty("n", 12.0, Unit::none, Shown::integer())},
               qty("Q", 1.0, Unit::ft3_per_s));
    const LineText t = text_of(lines.lines()[0]);
    EXPECT_EQ(t.label, "Peak, 10-year");
    EXPECT_EQ(t.numbers, "0.009500 | 0.667 | 1.23 | 0.30000000000000004 | C table");
    EXPECT_EQ(t.source, "table C table, line 12");
    EXPECT_EQ(t.unit, "ft3/s");
}

TEST(LineText, NegativeNumbersInParenthesesWhereTheFormulaSaysSo) {
    constexpr Formula f{"test.neg", "Frequency factor", "", "x = {m} + {K} x {s} + {K2}", Ref::none,
                        ""};
    CalcLines lines;
    lines.calc(f,
               {qty("m", 80.0), qty("K", -0.164, Unit::none, Shown::sig(4).parenthesised()),
                qty("s", 20.0), qty("K2", 0.5, Unit::none, Shown::sig(4).parenthesised())},
               qty("x", 76.72));
    // Only a negative value gets the parentheses (TR-55 Table 4-1 prints "(-0.51202)" so).
    EXPECT_EQ(text_of(lines.lines()[0]).numbers, "x = 80.00 + (-0.1640) x 20.00 + 0.5000");
}

TEST(LineText, RepeatsOverRowsAndPrintsUnits) {
    constexpr Formula f{"test.sum",
                        "Composite",
                        "CN = sum(CN A) / sum(A)",
                        "CN = ({[{CN} x {A}| + ]}) / ({[{A}| + ]}) ({A:u}, {{braces}})",
                        Ref::tr55_1986,
                        ""};
    CalcLines lines;
    auto &l = lines.calc(f, {qty("A", 3.0, Unit::ac)}, qty("CN", 75.0));
    l.rows = {{qty("CN", 80.0), qty("A", 1.0, Unit::ac)}, {qty("CN", 70.0), qty("A", 2.0)}};
    const LineText t = text_of(lines.lines()[0]);
    // Inside the repeat, a row's quantities come first; outside, the line's inputs.
    EXPECT_EQ(t.numbers, "CN = (80.00 x 1.000 + 70.00 x 2.000) / (1.000 + 2.000) (ac, {braces})");
}

TEST(LineText, AnUnknownSymbolIsAProgrammingError) {
    constexpr Formula f{"test.bad", "Bad", "", "x = {missing}", Ref::none, ""};
    CalcLines lines;
    lines.calc(f, {qty("x", 1.0)}, qty("y", 2.0));
    EXPECT_THROW((void)text_of(lines.lines()[0]), std::logic_error);
    constexpr Formula open{"test.open", "Open", "", "x = {x", Ref::none, ""};
    lines.calc(open, {qty("x", 1.0)}, qty("y", 2.0));
    EXPECT_THROW((void)text_of(lines.lines()[1]), std::logic_error);
    constexpr Formula lone{"test.lone", "Lone", "", "x = }", Ref::none, ""};
    lines.calc(lone, {}, qty("y", 2.0));
    EXPECT_THROW((void)text_of(lines.lines()[2]), std::logic_error);
}

TEST(LineText, ALineReadBackKeepsItsText) {
    CalcLine l;
    l.text = LineText{"Area", "A", "A = 2.000", "ha", "project input"};
    l.result.value = 2.0;
    EXPECT_EQ(text_of(l), *l.text);
}

TEST(LineText, WarningsAndNotes) {
    constexpr Formula limit{"test.limit",
                            "Area above the Rational Method's limit",
                            "",
                            "A = {A} {A:u} exceeds {Amax} {Amax:u}",
                            Ref::common_practice,
                            ""};
    CalcLines lines;
    lines.warn(limit, {qty("A", 90.0, Unit::ha), qty("Amax", 80.0, Unit::ha)});
    const LineText t = text_of(lines.lines()[0]);
    EXPECT_EQ(lines.lines()[0].kind, LineKind::warning);
    EXPECT_EQ(t.numbers, "A = 90.00 ha exceeds 80.00 ha");
    EXPECT_EQ(t.source, "common practice, no source");
    EXPECT_EQ(t.unit, "");
}

TEST(References, EveryPublicationHasAShortFormAndTheProjectsOwnHaveNoCitation) {
    EXPECT_EQ(short_form(Ref::tr55_1986), "TR-55 (1986)");
    EXPECT_NE(citation(Ref::tr55_1986).find("Technical Release 55"), std::string_view::npos);
    EXPECT_EQ(citation(Ref::project_input), "");
    EXPECT_EQ(short_form(Ref::none), "");
    for (int r = static_cast<int>(Ref::tr55_1986); r <= static_cast<int>(Ref::nist_sp811); ++r) {
        EXPECT_FALSE(short_form(static_cast<Ref>(r)).empty()) << r;
    }
}

} // namespace
} // namespace catchpeak::report
