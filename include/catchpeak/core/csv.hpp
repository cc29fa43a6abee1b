// SPDX-License-Identifier: MIT
// CSV, read and written in one place: the reader of every table catchpeak reads (config/, the
// project's tables) and the writer of every CSV file it writes (summary.csv), so that what one
// writes the other reads back. Numbers are read and written without the locale.
#pragma once

#include <cstddef>
#include <filesystem>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace catchpeak {

/// A CSV file read whole: a header row and data rows, each row with its line number.
///
/// Format (RFC 4180 with two additions for the tables in config/):
/// - a line starting with '#' is a comment; "# key: value" comments are kept in `metadata`
///   (e.g. "# source: TR-55 (1986) Table 2-2a", "# status: checked (secondary)");
/// - blank lines are skipped;
/// - fields are separated by ','; a field may be quoted with '"', with '""' for a quote; a
///   quoted field may hold commas and line breaks (kept as they are, "\r\n" too);
/// - leading and trailing blanks around a field are trimmed (inside quotes they are kept);
///   nothing but blanks may follow a field's closing quote.
struct CsvTable {
    struct Row {
        std::size_t line = 0; ///< 1-based line number in the file where the row starts
        std::vector<std::string> cells;
    };

    std::string source; ///< the file name, used in every message
    std::vector<std::string> header;
    std::vector<Row> rows;
    std::map<std::string, std::string> metadata;

    /// Index of column `name` (case-sensitive). Throws InputError naming the file, the column
    /// and the columns present.
    [[nodiscard]] std::size_t column(std::string_view name) const;
    [[nodiscard]] std::optional<std::size_t> find_column(std::string_view name) const;

    /// The text of a cell. Throws InputError when the row is too short.
    [[nodiscard]] const std::string &text(const Row &row, std::size_t col) const;
    /// The cell as a number (locale-independent). Throws InputError
    /// "<file>:<line>: column '<name>': '<text>' is not a number".
    [[nodiscard]] double number(const Row &row, std::size_t col) const;
    /// "<file>:<line>" for messages about one row.
    [[nodiscard]] std::string where(const Row &row) const;
    /// "<file>:<line>: column '<name>'" for messages about one cell.
    [[nodiscard]] std::string where(const Row &row, std::size_t col) const;
};

/// Parses CSV text. `source` names it in messages. Throws InputError on an unterminated quote,
/// text after a closing quote, a missing header, or a row with more cells than the header.
[[nodiscard]] CsvTable parse_csv(std::string_view text, std::string source);

/// Reads and parses a CSV file. Throws InputError when it cannot be read.
[[nodiscard]] CsvTable read_csv(const std::filesystem::path &path);

/// `text` without leading and trailing blanks (spaces, tabs, carriage returns, line feeds).
[[nodiscard]] std::string_view trim(std::string_view text) noexcept;

/// `text` with its ASCII letters in lower case (locale-independent; other bytes unchanged).
[[nodiscard]] std::string ascii_lower(std::string_view text);

/// Parses a decimal number with std::from_chars (locale-independent). The whole text (after
/// trimming blanks) must be the number. Throws InputError "<where>: '<text>' is not a number".
[[nodiscard]] double parse_number(std::string_view text, std::string_view where);

/// One field as CsvWriter writes it: as it is, or quoted (RFC 4180, '""' for a quote) when
/// parse_csv would not give it back as it is: it holds a comma, a quote or a line break, starts
/// or ends with a blank, or starts with '#' (a comment when first in a row).
[[nodiscard]] std::string csv_field(std::string_view text);

/// A number as a CSV field: the shortest text that parse_number reads back to the same double
/// (std::to_chars; locale-independent, '.' as the decimal point). Throws InternalError for a
/// NaN or an infinity, which a CSV table of ours never holds.
[[nodiscard]] std::string csv_number(double value);

/// Builds CSV text row by row: fields separated by ',', every row ended by '\n' (a row of one
/// empty field is written as '""', since parse_csv skips blank lines).
///
///     CsvWriter w;
///     w.field("design_point").field("q_m3_s").end_row();
///     w.field("DP-1").number(0.25).end_row();
///     write_text_file_atomic(path, w.text());
class CsvWriter {
  public:
    /// A text field, quoted when needed (csv_field).
    CsvWriter &field(std::string_view text);
    /// A number at full precision (csv_number).
    CsvWriter &number(double value);
    /// A whole number.
    CsvWriter &count(std::size_t value);
    /// Ends the row.
    CsvWriter &end_row();
    /// The text written so far (complete rows, and the fields of an unfinished one).
    [[nodiscard]] const std::string &text() const noexcept { return text_; }

  private:
    /// Appends an already formed field.
    CsvWriter &raw(std::string_view formed);
    std::string text_;
    std::size_t fields_in_row_ = 0;
};

} // namespace catchpeak
