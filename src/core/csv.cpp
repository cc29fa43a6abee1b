// SPDX-License-Identifier: MIT
#include "catchpeak/core/csv.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/core/files.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <charconv>
#include <cmath>
#include <utility>

namespace catchpeak {

namespace {

/// What a CSV file of ours is separated by, for the messages about another separator.
constexpr std::string_view comma_separated =
    "columns separated by commas (','), with '.' as the decimal point (in a spreadsheet "
    "program: save as \"CSV UTF-8 (comma delimited)\")";

bool is_blank(char c) noexcept { return c == ' ' || c == '\t' || c == '\r'; }

/// Reads one record from text[pos], the start of a line that is neither blank nor a comment,
/// up to and including the line break that ends it (or the end of the text). A quoted field
/// may run over line breaks; `line_no` (the current line) counts every line break read.
std::vector<std::string> read_record(std::string_view text, std::size_t &pos, std::size_t &line_no,
                                     const std::string &source) {
    const std::size_t first_line = line_no;
    std::vector<std::string> cells;
    for (;;) {
        while (pos < text.size() && is_blank(text[pos])) {
            ++pos;
        }
        std::string cell;
        if (pos < text.size() && text[pos] == '"') {
            bool closed = false;
            for (++pos; pos < text.size() && !closed;) {
                const char c = text[pos++];
                if (c != '"') {
                    line_no += c == '\n' ? 1 : 0;
                    cell += c;
                } else if (pos < text.size() && text[pos] == '"') {
                    cell += '"';
                    ++pos;
                } else {
                    closed = true;
                }
            }
            if (!closed) {
                throw_input_error(fmt::format("{}:{}", source, first_line),
                                  "a quoted field is not closed",
                                  "fields quoted as \"text\", with \"\" for a quote inside");
            }
            while (pos < text.size() && is_blank(text[pos])) {
                ++pos;
            }
            if (pos < text.size() && (text[pos] == ';' || text[pos] == '\t')) {
                throw_input_error(fmt::format("{}:{}", source, line_no),
                                  fmt::format("the fields are separated by {}",
                                              text[pos] == ';' ? "semicolons (';')" : "tabs"),
                                  std::string(comma_separated));
            }
            if (pos < text.size() && text[pos] != ',' && text[pos] != '\n') {
                throw_input_error(fmt::format("{}:{}", source, line_no),
                                  "text follows the closing quote of a field",
                                  "a quoted field alone between commas, with \"\" for a quote "
                                  "inside");
            }
        } else {
            const auto end = std::min(text.find_first_of(",\n", pos), text.size());
            cell = std::string(trim(text.substr(pos, end - pos)));
            pos = end;
        }
        cells.push_back(std::move(cell));
        if (pos >= text.size()) {
            return cells;
        }
        if (text[pos++] == '\n') {
            ++line_no;
            return cells;
        }
    }
}

/// Keeps a "# key: value" comment (the body after '#') in the table's metadata; other comments
/// are dropped.
void add_metadata(CsvTable &table, std::string_view body) {
    const auto colon = body.find(':');
    if (colon != std::string_view::npos && colon > 0 &&
        body.substr(0, colon).find(' ') == std::string_view::npos) {
        table.metadata[std::string(body.substr(0, colon))] =
            std::string(trim(body.substr(colon + 1)));
    }
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

namespace {

/// The byte-order mark that spreadsheet programs put before the text of a "CSV UTF-8" file.
constexpr std::string_view utf8_bom = "\xEF\xBB\xBF";

/// Throws when the header row is separated by something else than commas: a semicolon (what
/// spreadsheet programs write where the decimal separator is a comma) or a tab.
void check_separator(const CsvTable &table, std::size_t line) {
    for (const auto &[sep_found, name] :
         {std::pair{';', "semicolons (';')"}, std::pair{'\t', "tabs"}}) {
        const char sep = sep_found; // a structured binding is not captured by clang 14
        const bool found = std::any_of(table.header.begin(), table.header.end(),
                                       [sep](auto &h) { return h.find(sep) != std::string::npos; });
        if (found) {
            throw_input_error(fmt::format("{}:{}", table.source, line),
                              fmt::format("the header '{}' is separated by {}",
                                          fmt::join(table.header, ","), name),
                              std::string(comma_separated));
        }
    }
}

} // namespace

CsvTable parse_csv(std::string_view text, std::string source) {
    CsvTable table;
    table.source = std::move(source);
    if (text.substr(0, utf8_bom.size()) == utf8_bom) {
        text.remove_prefix(utf8_bom.size());
    }
    std::size_t line_no = 1;
    std::size_t pos = 0;
    bool have_header = false;
    while (pos < text.size()) {
        const auto end = std::min(text.find('\n', pos), text.size());
        const std::string_view line = trim(text.substr(pos, end - pos));
        if (line.empty() || line.front() == '#') {
            if (!line.empty()) {
                add_metadata(table, trim(line.substr(1)));
            }
            pos = end + 1;
            ++line_no;
            continue;
        }
        const std::size_t record_line = line_no;
        auto cells = read_record(text, pos, line_no, table.source);
        if (!have_header) {
            table.header = std::move(cells);
            have_header = true;
            check_separator(table, record_line);
            continue;
        }
        if (cells.size() > table.header.size()) {
            throw_input_error(fmt::format("{}:{}", table.source, record_line),
                              fmt::format("{} values, but the header has {} columns", cells.size(),
                                          table.header.size()),
                              "one value per column of the header");
        }
        table.rows.push_back({record_line, std::move(cells)});
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

std::string csv_field(std::string_view text) {
    const bool plain = text.find_first_of(",\"\r\n") == std::string_view::npos &&
                       (text.empty() || (text.front() != '#' && trim(text).size() == text.size()));
    if (plain) {
        return std::string(text);
    }
    std::string out = "\"";
    for (const char c : text) {
        if (c == '"') {
            out += '"';
        }
        out += c;
    }
    out += '"';
    return out;
}

std::string csv_number(double value) {
    if (!std::isfinite(value)) {
        throw InternalError(fmt::format("a CSV number is not finite: {}", value));
    }
    std::array<char, 32> buf{};
    const auto [end, ec] = std::to_chars(buf.data(), buf.data() + buf.size(), value);
    if (ec != std::errc()) {
        throw InternalError("a number does not fit its CSV field");
    }
    return std::string(buf.data(), end);
}

CsvWriter &CsvWriter::raw(std::string_view formed) {
    if (fields_in_row_ > 0) {
        text_ += ',';
    }
    text_ += formed;
    ++fields_in_row_;
    return *this;
}

CsvWriter &CsvWriter::field(std::string_view text) { return raw(csv_field(text)); }

CsvWriter &CsvWriter::number(double value) { return raw(csv_number(value)); }

CsvWriter &CsvWriter::count(std::size_t value) { return raw(fmt::format("{}", value)); }

CsvWriter &CsvWriter::end_row() {
    if (fields_in_row_ == 1 && (text_.empty() || text_.back() == '\n')) {
        text_ += "\"\"";
    }
    text_ += '\n';
    fields_in_row_ = 0;
    return *this;
}

} // namespace catchpeak
