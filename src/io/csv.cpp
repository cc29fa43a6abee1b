// SPDX-License-Identifier: MIT
#include "catchpeak/io/csv.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/core/files.hpp"

#include <fmt/format.h>

#include <charconv>
#include <fstream>
#include <sstream>

namespace catchpeak::io {

namespace {

/// Splits one record. `line_no` is for messages.
std::vector<std::string> split_record(std::string_view line, const std::string &source,
                                      std::size_t line_no) {
    std::vector<std::string> cells;
    std::string cell;
    bool quoted = false;
    bool was_quoted = false;
    for (std::size_t i = 0; i < line.size(); ++i) {
        const char c = line[i];
        if (quoted) {
            if (c == '"') {
                if (i + 1 < line.size() && line[i + 1] == '"') {
                    cell += '"';
                    ++i;
                } else {
                    quoted = false;
                }
            } else {
                cell += c;
            }
        } else if (c == '"') {
            quoted = true;
            was_quoted = true;
        } else if (c == ',') {
            cells.push_back(was_quoted ? cell : std::string(trim(cell)));
            cell.clear();
            was_quoted = false;
        } else {
            cell += c;
        }
    }
    if (quoted) {
        throw_input_error(fmt::format("{}:{}", source, line_no), "a quoted field is not closed",
                          "fields quoted as \"text\", with \"\" for a quote inside");
    }
    cells.push_back(was_quoted ? cell : std::string(trim(cell)));
    return cells;
}

} // namespace

std::optional<std::size_t> CsvTable::find_column(std::string_view name) const {
    for (std::size_t i = 0; i < header.size(); ++i) {
        if (header[i] == name) {
            return i;
        }
    }
    return std::nullopt;
}

std::size_t CsvTable::column(std::string_view name) const {
    if (auto i = find_column(name)) {
        return *i;
    }
    throw_input_error(source, fmt::format("no column '{}'", name),
                      fmt::format("a header with the column '{}' (columns found: {})", name,
                                  fmt::join(header, ", ")));
}

std::string CsvTable::where(const Row &row) const { return fmt::format("{}:{}", source, row.line); }

std::string CsvTable::where(const Row &row, std::size_t col) const {
    return fmt::format("{}:{}: column '{}'", source, row.line,
                       col < header.size() ? header[col] : std::to_string(col + 1));
}

const std::string &CsvTable::text(const Row &row, std::size_t col) const {
    if (col >= row.cells.size()) {
        throw_input_error(where(row, col), "the row has no value in this column",
                          fmt::format("{} values, one per column of the header", header.size()));
    }
    return row.cells[col];
}

double CsvTable::number(const Row &row, std::size_t col) const {
    return parse_number(text(row, col), where(row, col));
}

CsvTable parse_csv(std::string_view text, std::string source) {
    CsvTable table;
    table.source = std::move(source);
    std::size_t line_no = 0;
    std::size_t pos = 0;
    bool have_header = false;
    while (pos <= text.size()) {
        auto end = text.find('\n', pos);
        if (end == std::string_view::npos) {
            end = text.size();
        }
        const std::string_view raw = text.substr(pos, end - pos);
        pos = end + 1;
        ++line_no;
        const std::string_view line = trim(raw);
        if (line.empty()) {
            if (end == text.size()) {
                break;
            }
            continue;
        }
        if (line.front() == '#') {
            const std::string_view body = trim(line.substr(1));
            const auto colon = body.find(':');
            if (colon != std::string_view::npos && colon > 0 &&
                body.substr(0, colon).find(' ') == std::string_view::npos) {
                table.metadata[std::string(body.substr(0, colon))] =
                    std::string(trim(body.substr(colon + 1)));
            }
            continue;
        }
        auto cells = split_record(line, table.source, line_no);
        if (!have_header) {
            table.header = std::move(cells);
            have_header = true;
            continue;
        }
        if (cells.size() > table.header.size()) {
            throw_input_error(fmt::format("{}:{}", table.source, line_no),
                              fmt::format("{} values, but the header has {} columns", cells.size(),
                                          table.header.size()),
                              "one value per column of the header");
        }
        table.rows.push_back({line_no, std::move(cells)});
    }
    if (!have_header) {
        throw_input_error(table.source, "no header row (the file is empty or all comments)",
                          "a first line naming the columns, separated by commas");
    }
    return table;
}

std::string_view trim(std::string_view text) noexcept {
    constexpr std::string_view blanks = " \t\r\n";
    const auto first = text.find_first_not_of(blanks);
    if (first == std::string_view::npos) {
        return {};
    }
    const auto last = text.find_last_not_of(blanks);
    return text.substr(first, last - first + 1);
}

std::string ascii_lower(std::string_view text) {
    std::string out(text);
    for (char &c : out) {
        if (c >= 'A' && c <= 'Z') {
            c = static_cast<char>(c - 'A' + 'a');
        }
    }
    return out;
}

CsvTable read_csv(const std::filesystem::path &path) {
    return parse_csv(read_text_file(path), path.string());
}

double parse_number(std::string_view text, std::string_view where) {
    const std::string_view t = trim(text);
    double value = 0.0;
    const char *first = t.data();
    const char *last = t.data() + t.size();
    if (!t.empty() && *first == '+') {
        ++first;
    }
    const auto [ptr, ec] = std::from_chars(first, last, value);
    if (t.empty() || ec != std::errc() || ptr != last) {
        throw_input_error(std::string(where), fmt::format("'{}' is not a number", text),
                          "a decimal number such as 12.5 or 1.2e-3");
    }
    return value;
}

} // namespace catchpeak::io
