// SPDX-License-Identifier: MIT
#pragma once

#include <cstddef>
#include <filesystem>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace catchpeak::io {

/// A CSV file read whole: a header row and data rows, each row with its line number.
///
/// Format (RFC 4180 with two additions for the tables in config/):
/// - a line starting with '#' is a comment; "# key: value" comments are kept in `metadata`
///   (e.g. "# source: TR-55 (1986) Table 2-2a", "# status: checked (secondary)");
/// - blank lines are skipped;
/// - fields are separated by ','; a field may be quoted with '"', with '""' for a quote;
/// - leading and trailing blanks around a field are trimmed.
struct CsvTable {
    struct Row {
        std::size_t line = 0; ///< 1-based line number in the file
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
/// a missing header, or a row with more cells than the header.
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

} // namespace catchpeak::io
