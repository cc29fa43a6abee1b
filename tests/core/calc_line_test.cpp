// SPDX-License-Identifier: MIT
#include "catchpeak/core/calc_line.hpp"
#include "support/calc_lines.hpp"

#include <gtest/gtest.h>

#include <cmath>

using catchpeak::CalcLines;
using catchpeak::sig;

TEST(Sig, FourSignificantFigures) {
    EXPECT_EQ(sig(31.8912), "31.89");
    EXPECT_EQ(sig(0.0095), "0.009500");
    EXPECT_EQ(sig(4780.0), "4780");
    EXPECT_EQ(sig(123456.0), "123500");
    EXPECT_EQ(sig(9.99996), "10.00");
    EXPECT_EQ(sig(-2.5), "-2.500");
    EXPECT_EQ(sig(0.0), "0");
    EXPECT_EQ(sig(1.0), "1.000");
    EXPECT_EQ(sig(1.5e-6), "1.500e-06");
    EXPECT_EQ(sig(std::nan("")), "n/a");
    EXPECT_EQ(sig(2.0 / 3.0, 3), "0.667");
}

TEST(Full, RoundTrips) {
    const double v = 0.1 + 0.2;
    EXPECT_EQ(std::stod(catchpeak::full(v)), v);
}

TEST(CalcLines, NumberedWithPrefix) {
    CalcLines lines;
    lines.add(catchpeak::test::text_calc("Area", "A", "A = 2.000", 2.0, "ha", "project input"));
    lines.add(catchpeak::test::text_warn("Area limit", "A = 90 ha exceeds 80 ha",
                                         "common practice, no source"));
    lines.add(catchpeak::test::text_note("Method", "Rational Method", "project input"));
    const auto next = catchpeak::number_lines(lines, "DP3");
    EXPECT_EQ(next, 4u);
    ASSERT_EQ(lines.size(), 3u);
    EXPECT_EQ(lines.lines()[0].id, "DP3-L1");
    EXPECT_EQ(lines.lines()[2].id, "DP3-L3");
    EXPECT_EQ(lines.warning_count(), 1u);
    EXPECT_EQ(lines.lines()[1].kind, catchpeak::LineKind::warning);
    EXPECT_TRUE(std::isnan(lines.lines()[1].value()));

    CalcLines more;
    more.add(catchpeak::test::text_calc("Q", "Q = C i A", "Q = ...", 1.5, "m3/s", "x"));
    lines.append(more);
    EXPECT_EQ(lines.size(), 4u);
}

TEST(CalcLines, FoundByKeyAndComparedByContent) {
    constexpr catchpeak::Formula f{
        "test.q", "Q", "Q = C i A", "Q = {C} x {i} x {A}", catchpeak::Ref::none, ""};
    CalcLines lines;
    lines.calc(f, {catchpeak::qty("C", 0.5)}, catchpeak::qty("Q", 1.0));
    lines.calc(f, {catchpeak::qty("C", 0.6)}, catchpeak::qty("Q", 2.0));
    ASSERT_NE(lines.find_last("test.q"), nullptr);
    EXPECT_DOUBLE_EQ(lines.find_last("test.q")->value(), 2.0);
    EXPECT_FALSE(lines.has("test.other"));
    auto a = lines.lines()[0];
    auto b = lines.lines()[0];
    b.id = "DP1-L9"; // ids do not count
    EXPECT_TRUE(catchpeak::same_content(a, b));
    b.flags.capped = true;
    EXPECT_FALSE(catchpeak::same_content(a, b));
    // Two warnings without a value are the same (NaN results compare equal here).
    CalcLines w;
    w.warn(f);
    w.warn(f);
    EXPECT_TRUE(catchpeak::same_content(w.lines()[0], w.lines()[1]));
    EXPECT_FALSE(catchpeak::same_content(lines.lines()[0], lines.lines()[1]));
}
