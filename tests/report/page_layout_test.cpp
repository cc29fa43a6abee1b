// SPDX-License-Identifier: MIT
#include "../../src/report/internal/page_layout.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <string>
#include <vector>

namespace catchpeak::report {
namespace {

using style::Style;

// Page geometry from the paper sizes: A4 is 210 x 297 mm (ISO 216), 1 pt = 1/72 in = 25.4/72 mm.
constexpr double a4_h_pt = 297.0 / 25.4 * 72.0;
// Positions are sums of text heights; they agree to far below a point.
constexpr double sum_tol_pt = 1e-6;
// Glyph ink can reach a little beyond the text's logical box (accents, italics); a quarter of
// a point is far less than a line of text, so a row that overflowed would still be caught.
constexpr double ink_tol_pt = 0.25;

struct Ink {
    double top, bottom;
};

Ink ink_of(cairo_surface_t *page) {
    double x = 0.0, y = 0.0, w = 0.0, h = 0.0;
    cairo_recording_surface_ink_extents(page, &x, &y, &w, &h);
    return {y, y + h};
}

TEST(PageLayout, ContentAreaLiesBetweenTheMarginsHeaderAndFooter) {
    const PageLayout a4(PageSize::a4);
    EXPECT_NEAR(a4.page_h(), a4_h_pt, 1e-3); // the style rounds to 0.1 mpt
    EXPECT_DOUBLE_EQ(a4.top(), style::margin_pt + style::header_h_pt);
    EXPECT_NEAR(a4.bottom(), a4_h_pt - style::margin_pt - style::footer_h_pt, 1e-3);
    const PageLayout letter(PageSize::letter);
    EXPECT_DOUBLE_EQ(letter.page_w(), 8.5 * 72.0); // US Letter is 8.5 x 11 in
    EXPECT_DOUBLE_EQ(letter.content_w(), 8.5 * 72.0 - 2.0 * style::margin_pt);
}

TEST(PageLayout, ParagraphsGoOnTheNextPageExactlyWhenTheyNoLongerFit) {
    PageLayout page(PageSize::a4);
    page.new_page("List");
    const std::string line = "One line of a long list";
    const double h = page.measure(line, Style::body, page.content_w());
    ASSERT_GT(h, 0.0);
    const std::size_t n = 200;
    for (std::size_t i = 0; i < n; ++i) {
        const double y0 = page.y();
        const std::size_t pages0 = page.page_count();
        page.paragraph(line);
        if (y0 + h <= page.bottom()) {
            EXPECT_EQ(page.page_count(), pages0) << "paragraph " << i;
            EXPECT_NEAR(page.y(), y0 + h, sum_tol_pt);
        } else {
            EXPECT_EQ(page.page_count(), pages0 + 1) << "paragraph " << i;
            EXPECT_NEAR(page.y(), page.top() + h, sum_tol_pt);
        }
    }
    const auto per_page = static_cast<std::size_t>(std::floor((page.bottom() - page.top()) / h));
    EXPECT_EQ(page.page_count(), (n + per_page - 1) / per_page);
    EXPECT_EQ(page.page_section(0), "List");
    for (std::size_t i = 1; i < page.page_count(); ++i) {
        EXPECT_EQ(page.page_section(i), "List (continued)") << i;
    }
    for (std::size_t i = 0; i < page.page_count(); ++i) {
        const auto ink = ink_of(page.page_surface(i));
        EXPECT_GE(ink.top, page.top() - ink_tol_pt) << "page " << i;
        EXPECT_LE(ink.bottom, page.bottom() + ink_tol_pt) << "page " << i;
    }
}

std::vector<Column> two_columns(const PageLayout &page) {
    return page.fit({{"Key", 100.0}, {"Value", 100.0, PANGO_ALIGN_RIGHT}});
}

std::vector<Row> rows_of(std::size_t n) {
    std::vector<Row> rows;
    for (std::size_t i = 0; i < n; ++i) {
        rows.push_back({{{"Row " + std::to_string(i + 1)}, {std::to_string(i * 7)}}, {}});
    }
    return rows;
}

TEST(PageLayout, LongTableRepeatsItsHeaderOnEveryPage) {
    PageLayout page(PageSize::letter);
    page.new_page("Table");
    const auto cols = two_columns(page);
    const auto rows = rows_of(150);
    const double head_h =
        page.row_height(cols, {{{cols[0].title, Style::small}, {cols[1].title, Style::small}}, {}});
    const double row_h = page.row_height(cols, rows.front());
    page.table(cols, rows);
    // Each page holds a header and as many rows as fit below it.
    const auto per_page =
        static_cast<std::size_t>(std::floor((page.bottom() - page.top() - head_h) / row_h));
    const std::size_t pages = (rows.size() + per_page - 1) / per_page;
    ASSERT_EQ(page.page_count(), pages);
    const std::size_t last = rows.size() - (pages - 1) * per_page;
    EXPECT_NEAR(page.y(),
                page.top() + head_h + static_cast<double>(last) * row_h + style::table_gap_after_pt,
                sum_tol_pt);
    for (std::size_t i = 0; i < page.page_count(); ++i) {
        const auto ink = ink_of(page.page_surface(i));
        EXPECT_LE(ink.bottom, page.bottom() + ink_tol_pt) << "page " << i;
    }
}

TEST(PageLayout, ShortTableIsKeptWholeOnOnePage) {
    PageLayout page(PageSize::a4);
    page.new_page("Table");
    const auto cols = two_columns(page);
    const auto rows = rows_of(3);
    const double head_h =
        page.row_height(cols, {{{cols[0].title, Style::small}, {cols[1].title, Style::small}}, {}});
    const double row_h = page.row_height(cols, rows.front());
    // Room for the header and two rows, not for the third.
    page.set_y(page.bottom() - head_h - 2.5 * row_h);
    page.table(cols, rows);
    EXPECT_EQ(page.page_count(), 2u);
    EXPECT_EQ(page.page_section(1), "Table (continued)");
    // All three rows on the new page, under the header.
    EXPECT_NEAR(page.y(), page.top() + head_h + 3.0 * row_h + style::table_gap_after_pt,
                sum_tol_pt);
}

TEST(PageLayout, HeadingIsNotLeftAloneAtTheBottomOfAPage) {
    PageLayout page(PageSize::a4);
    page.new_page("Section");
    const double h = page.measure(esc("Heading"), Style::heading, page.content_w());
    // The heading itself fits, but not with the room kept for what follows it.
    page.set_y(page.bottom() - h - 0.5 * style::heading_keep_pt);
    page.heading("Heading");
    EXPECT_EQ(page.page_count(), 2u);
    EXPECT_NEAR(page.y(), page.top() + h + 2.0 * style::heading_pad_pt, sum_tol_pt);
    // With room for it and what follows, it stays.
    page.set_y(page.bottom() - h - 2.0 * style::heading_keep_pt);
    page.heading("Heading");
    EXPECT_EQ(page.page_count(), 2u);
}

TEST(PageLayout, HeadingGoesToTheNextPageWithTheStartOfItsTable) {
    PageLayout page(PageSize::a4);
    page.new_page("Section");
    const auto cols = two_columns(page);
    // A table of five tall rows: the whole table, kept together, is taller than the room kept
    // below a heading, so a heading near the foot must go with it.
    std::vector<Row> rows;
    for (int i = 0; i < 5; ++i) {
        rows.push_back({{{"line one\nline two\nline three\nline four"}, {"1"}}, {}});
    }
    const double start_h = page.table_start_h(cols, rows);
    ASSERT_GT(start_h, style::heading_keep_pt);
    const double h = page.measure(esc("Catchment"), Style::heading, page.content_w());
    page.set_y(page.bottom() - h - style::heading_keep_pt - 1.0);
    page.heading("Catchment", Style::heading, start_h);
    EXPECT_EQ(page.page_count(), 2u); // not left alone above a table that starts overleaf
    page.table(cols, rows);
    EXPECT_EQ(page.page_count(), 2u); // and the table follows it on the same page
}

TEST(PageLayout, BlockTallerThanAPageIsNotPushedOnToEmptyPages) {
    PageLayout page(PageSize::a4);
    page.new_page("Section");
    EXPECT_FALSE(page.ensure(2.0 * page.page_h())); // at the top already: nothing better
    EXPECT_EQ(page.page_count(), 1u);
}

TEST(PageLayout, ColumnsAreScaledToFillTheContentWidth) {
    const PageLayout page(PageSize::letter);
    const auto cols = page.fit({{"a", 30.0}, {"b", 10.0}});
    EXPECT_DOUBLE_EQ(cols[0].width_pt + cols[1].width_pt, page.content_w());
    EXPECT_DOUBLE_EQ(cols[0].width_pt, 3.0 * cols[1].width_pt);
}

TEST(PageLayout, MarkupIsEscaped) {
    EXPECT_EQ(esc("a < b & c"), "a &lt; b &amp; c");
    EXPECT_EQ(bold("x<y"), "<b>x&lt;y</b>");
}

} // namespace
} // namespace catchpeak::report
