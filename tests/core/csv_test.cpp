// SPDX-License-Identifier: MIT
#include "catchpeak/core/csv.hpp"

#include "catchpeak/core/error.hpp"
#include "support/input_error.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <string>
#include <vector>

using catchpeak::CsvWriter;
using catchpeak::InputError;
using catchpeak::parse_csv;

TEST(Csv, HeaderRowsCommentsAndMetadata) {
    const auto t = parse_csv("# source: TR-55 (1986) Table 2-2a\n"
                             "# status: checked (secondary)\n"
                             "# a plain comment, not metadata\n"
                             "class, A, B\n"
                             "\n"
                             "meadow, 30, 58\n"
                             "\"woods, good\", 30, 55\n",
                             "cn.csv");
    ASSERT_EQ(t.header.size(), 3u);
    EXPECT_EQ(t.header[1], "A");
    ASSERT_EQ(t.rows.size(), 2u);
    EXPECT_EQ(t.rows[0].line, 6u);
    EXPECT_EQ(t.text(t.rows[1], 0), "woods, good");
    EXPECT_DOUBLE_EQ(t.number(t.rows[1], t.column("B")), 55.0);
    EXPECT_EQ(t.metadata.at("source"), "TR-55 (1986) Table 2-2a");
    EXPECT_EQ(t.metadata.at("status"), "checked (secondary)");
    EXPECT_EQ(t.metadata.size(), 2u);
}

TEST(Csv, NumbersAreLocaleIndependent) {
    EXPECT_DOUBLE_EQ(catchpeak::parse_number("1.5e-3", "x"), 1.5e-3);
    EXPECT_DOUBLE_EQ(catchpeak::parse_number(" +2.25 ", "x"), 2.25);
    EXPECT_THROW((void)catchpeak::parse_number("1,5", "x"), InputError);
    EXPECT_THROW((void)catchpeak::parse_number("", "x"), InputError);
    EXPECT_THROW((void)catchpeak::parse_number("12abc", "x"), InputError);
}

TEST(Csv, MessagesNameFileLineAndColumn) {
    const auto t = parse_csv("d_min,i_mm_per_h\n5,abc\n", "idf.csv");
    const auto msg = catchpeak::test::input_error_of([&] { (void)t.number(t.rows[0], 1); });
    EXPECT_NE(msg.find("idf.csv:2: column 'i_mm_per_h'"), std::string::npos) << msg;
    EXPECT_NE(msg.find("'abc' is not a number"), std::string::npos) << msg;

    const auto missing = catchpeak::test::input_error_of([&] { (void)t.column("depth"); });
    EXPECT_NE(missing.find("no column 'depth'"), std::string::npos) << missing;
    EXPECT_NE(missing.find("d_min, i_mm_per_h"), std::string::npos) << missing;
}

// A CSV saved as "CSV UTF-8" by a spreadsheet program starts with a byte-order mark; it was
// refused with "no column 'id'" while the columns listed showed `id`.
TEST(Csv, AByteOrderMarkBeforeTheHeaderIsNotPartOfTheFirstColumn) {
    const auto t = parse_csv("\xEF\xBB\xBFid,area_ha\r\nA,2\r\n", "catchments.csv");
    EXPECT_EQ(t.column("id"), 0u);
    EXPECT_EQ(t.header[0], "id");
    ASSERT_EQ(t.rows.size(), 1u);
    EXPECT_EQ(t.rows[0].line, 2u);
    // Before a comment line too.
    const auto c = parse_csv("\xEF\xBB\xBF# source: invented\nid\nA\n", "c.csv");
    EXPECT_EQ(c.metadata.at("source"), "invented");
    EXPECT_EQ(c.column("id"), 0u);
}

TEST(Csv, ASemicolonOrTabSeparatedFileIsToldTheSeparatorMustBeAComma) {
    for (const std::string text : {"id;area_ha;c\nA;2,5;0,4\n", "\xEF\xBB\xBFid;area_ha\nA;2\n",
                                   "\"id\";\"area_ha\"\n\"A\";2\n", "# t\nid\tarea_ha\nA\t2\n"}) {
        const auto msg =
            catchpeak::test::input_error_of([&] { (void)parse_csv(text, "catchments.csv"); });
        EXPECT_NE(msg.find("catchments.csv:"), std::string::npos) << msg;
        EXPECT_NE(msg.find("separated by"), std::string::npos) << msg;
        EXPECT_NE(msg.find("commas (',')"), std::string::npos) << msg;
    }
    const auto msg = catchpeak::test::input_error_of(
        [&] { (void)parse_csv("# t\nid;area_ha\nA;2\n", "catchments.csv"); });
    EXPECT_NE(msg.find("catchments.csv:2"), std::string::npos) << msg;
    EXPECT_NE(msg.find("semicolons"), std::string::npos) << msg;
}

TEST(Csv, MalformedInputIsRefused) {
    EXPECT_THROW((void)parse_csv("", "e.csv"), InputError);
    EXPECT_THROW((void)parse_csv("# only a comment\n", "e.csv"), InputError);
    EXPECT_THROW((void)parse_csv("a,b\n\"open,1\n", "e.csv"), InputError);
    const auto msg =
        catchpeak::test::input_error_of([] { (void)parse_csv("a,b\n1,2,3\n", "e.csv"); });
    EXPECT_NE(msg.find("e.csv:2"), std::string::npos) << msg;
}

TEST(Csv, QuotedFieldsMayHoldLineBreaks) {
    const auto t = parse_csv("id,note\n"
                             "A-1,\"two\nlines\"\n"
                             "A-2, \"kept \"\"as is\"\"\" \n"
                             "A-3,\"crlf\r\ninside\"\r\n",
                             "notes.csv");
    ASSERT_EQ(t.rows.size(), 3u);
    EXPECT_EQ(t.text(t.rows[0], 1), "two\nlines");
    EXPECT_EQ(t.rows[0].line, 2u);
    // Blanks outside the quotes are dropped, those inside kept.
    EXPECT_EQ(t.text(t.rows[1], 1), "kept \"as is\"");
    EXPECT_EQ(t.rows[1].line, 4u); // the row after a two-line row starts on line 4
    EXPECT_EQ(t.text(t.rows[2], 1), "crlf\r\ninside");
    EXPECT_EQ(t.rows[2].line, 5u);
}

TEST(Csv, QuotedFieldMessagesNameTheLine) {
    const auto open = catchpeak::test::input_error_of(
        [] { (void)parse_csv("a,b\n1,2\n3,\"open\n4,5\n", "q.csv"); });
    EXPECT_NE(open.find("q.csv:3: a quoted field is not closed"), std::string::npos) << open;
    const auto after =
        catchpeak::test::input_error_of([] { (void)parse_csv("a,b\n1,\"x\" y\n", "q.csv"); });
    EXPECT_NE(after.find("q.csv:2: text follows the closing quote"), std::string::npos) << after;
}

TEST(CsvWriter, FieldsAreQuotedOnlyWhenNeeded) {
    EXPECT_EQ(catchpeak::csv_field("DP-1"), "DP-1");
    EXPECT_EQ(catchpeak::csv_field(""), "");
    EXPECT_EQ(catchpeak::csv_field("a,b"), "\"a,b\"");
    EXPECT_EQ(catchpeak::csv_field("say \"hi\""), "\"say \"\"hi\"\"\"");
    EXPECT_EQ(catchpeak::csv_field("two\nlines"), "\"two\nlines\"");
    EXPECT_EQ(catchpeak::csv_field(" padded"), "\" padded\"");
    EXPECT_EQ(catchpeak::csv_field("#3"), "\"#3\"");
}

TEST(CsvWriter, WhatIsWrittenReadsBackTheSame) {
    // Fields with a comma, a quote, a line break (LF and CR LF), blanks at the ends, a leading
    // '#', and an empty row: every one comes back as it was written.
    const std::vector<std::vector<std::string>> rows = {
        {"id", "note", "q_m3_s"},   {"A,1", "say \"hi\"", "0.1"},      {"A-2", "two\nlines", "3"},
        {"A-3", "crlf\r\nend", ""}, {"  A-4 ", "#not a comment", "x"}, {"", "", ""},
    };
    CsvWriter w;
    for (const auto &row : rows) {
        for (const auto &f : row) {
            w.field(f);
        }
        w.end_row();
    }
    const auto t = parse_csv(w.text(), "round.csv");
    EXPECT_EQ(t.header, rows[0]);
    ASSERT_EQ(t.rows.size(), rows.size() - 1) << w.text();
    for (std::size_t i = 1; i < rows.size(); ++i) {
        EXPECT_EQ(t.rows[i - 1].cells, rows[i]) << "row " << i << " of\n" << w.text();
    }
}

TEST(CsvWriter, ARowOfOneEmptyFieldIsNotABlankLine) {
    CsvWriter w;
    w.field("id").end_row();
    w.field("").end_row();
    w.field("B").end_row();
    const auto t = parse_csv(w.text(), "one.csv");
    ASSERT_EQ(t.rows.size(), 2u) << w.text();
    EXPECT_EQ(t.rows[0].cells, std::vector<std::string>{""});
    EXPECT_EQ(t.rows[1].cells, std::vector<std::string>{"B"});
}

TEST(CsvWriter, NumbersReadBackToTheSameDouble) {
    // Full precision, whatever the locale: the shortest text that reads back exactly.
    const std::vector<double> values = {0.1,     1.0 / 3.0, 2.0 / 3.0e-7, 123456789.0123,
                                        -4.5e21, 0.0,       1e-300,       5e-324};
    CsvWriter w;
    w.field("v").field("n").end_row();
    for (const double v : values) {
        w.number(v).count(7).end_row();
    }
    const auto t = parse_csv(w.text(), "numbers.csv");
    ASSERT_EQ(t.rows.size(), values.size());
    for (std::size_t i = 0; i < values.size(); ++i) {
        EXPECT_EQ(t.number(t.rows[i], 0), values[i]) << t.text(t.rows[i], 0);
        EXPECT_EQ(t.text(t.rows[i], 1), "7");
    }
    EXPECT_EQ(catchpeak::csv_number(0.25), "0.25");
    EXPECT_EQ(catchpeak::csv_number(1500.0), "1500");
    EXPECT_THROW((void)catchpeak::csv_number(std::nan("")), catchpeak::InternalError);
    EXPECT_THROW((void)catchpeak::csv_number(std::numeric_limits<double>::infinity()),
                 catchpeak::InternalError);
}

TEST(Csv, MissingFileIsBadInput) {
    const auto msg =
        catchpeak::test::input_error_of([] { (void)catchpeak::read_csv("/nonexistent/idf.csv"); });
    EXPECT_NE(msg.find("/nonexistent/idf.csv"), std::string::npos) << msg;
}

TEST(Text, TrimRemovesBlanksAtBothEndsOnly) {
    using catchpeak::trim;
    EXPECT_EQ(trim("  a b\t\r\n"), "a b");
    EXPECT_EQ(trim("\n\t "), "");
    EXPECT_EQ(trim(""), "");
    EXPECT_EQ(trim("x"), "x");
}

TEST(Text, AsciiLowerChangesOnlyAsciiLetters) {
    using catchpeak::ascii_lower;
    EXPECT_EQ(ascii_lower("US Survey Foot"), "us survey foot");
    EXPECT_EQ(ascii_lower("A/D-1 \xC3\x89"), "a/d-1 \xC3\x89"); // UTF-8 bytes kept as they are
}
