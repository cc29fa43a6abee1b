// SPDX-License-Identifier: MIT
#include "catchpeak/core/error.hpp"
#include "catchpeak/io/csv.hpp"
#include "support/input_error.hpp"

#include <gtest/gtest.h>

#include <string>

using catchpeak::InputError;
using catchpeak::io::parse_csv;

namespace {} // namespace

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
    EXPECT_DOUBLE_EQ(catchpeak::io::parse_number("1.5e-3", "x"), 1.5e-3);
    EXPECT_DOUBLE_EQ(catchpeak::io::parse_number(" +2.25 ", "x"), 2.25);
    EXPECT_THROW((void)catchpeak::io::parse_number("1,5", "x"), InputError);
    EXPECT_THROW((void)catchpeak::io::parse_number("", "x"), InputError);
    EXPECT_THROW((void)catchpeak::io::parse_number("12abc", "x"), InputError);
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

TEST(Csv, MalformedInputIsRefused) {
    EXPECT_THROW((void)parse_csv("", "e.csv"), InputError);
    EXPECT_THROW((void)parse_csv("# only a comment\n", "e.csv"), InputError);
    EXPECT_THROW((void)parse_csv("a,b\n\"open,1\n", "e.csv"), InputError);
    const auto msg =
        catchpeak::test::input_error_of([] { (void)parse_csv("a,b\n1,2,3\n", "e.csv"); });
    EXPECT_NE(msg.find("e.csv:2"), std::string::npos) << msg;
}

TEST(Csv, MissingFileIsBadInput) {
    const auto msg = catchpeak::test::input_error_of(
        [] { (void)catchpeak::io::read_csv("/nonexistent/idf.csv"); });
    EXPECT_NE(msg.find("/nonexistent/idf.csv"), std::string::npos) << msg;
}

TEST(Text, TrimRemovesBlanksAtBothEndsOnly) {
    using catchpeak::io::trim;
    EXPECT_EQ(trim("  a b\t\r\n"), "a b");
    EXPECT_EQ(trim("\n\t "), "");
    EXPECT_EQ(trim(""), "");
    EXPECT_EQ(trim("x"), "x");
}

TEST(Text, AsciiLowerChangesOnlyAsciiLetters) {
    using catchpeak::io::ascii_lower;
    EXPECT_EQ(ascii_lower("US Survey Foot"), "us survey foot");
    EXPECT_EQ(ascii_lower("A/D-1 \xC3\x89"), "a/d-1 \xC3\x89"); // UTF-8 bytes kept as they are
}
