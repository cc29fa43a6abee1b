// SPDX-License-Identifier: MIT
#include "catchpeak/land/tables.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/core/limits.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <utility>

namespace catchpeak::land {

namespace {

constexpr std::string_view accepted_groups = "A, B, C, D, A/D, B/D, C/D";

std::string upper_trimmed(std::string_view text) {
    std::string out;
    for (const char ch : text) {
        if (ch != ' ' && ch != '\t' && ch != '\r') {
            out += static_cast<char>(std::toupper(static_cast<unsigned char>(ch)));
        }
    }
    return out;
}

std::optional<SoilGroup> single_group(std::string_view t) {
    if (t == "A") {
        return SoilGroup::a;
    }
    if (t == "B") {
        return SoilGroup::b;
    }
    if (t == "C") {
        return SoilGroup::c;
    }
    if (t == "D") {
        return SoilGroup::d;
    }
    return std::nullopt;
}

TableInfo table_info(const CsvTable &csv) {
    TableInfo info;
    const std::string file = std::filesystem::path(csv.source).filename().string();
    const auto name = csv.metadata.find("name");
    info.name = name != csv.metadata.end() ? fmt::format("{} ({})", file, name->second) : file;
    if (const auto s = csv.metadata.find("source"); s != csv.metadata.end()) {
        info.source = s->second;
    }
    if (const auto s = csv.metadata.find("status"); s != csv.metadata.end()) {
        info.status = s->second;
    }
    return info;
}

/// A cell that is blank gives `fallback`, otherwise the number.
double number_or(const CsvTable &csv, const CsvTable::Row &row, std::size_t col, double fallback) {
    if (col >= row.cells.size() || row.cells[col].empty()) {
        return fallback;
    }
    return csv.number(row, col);
}

const std::string &class_cell(const CsvTable &csv, const CsvTable::Row &row, std::size_t col) {
    const std::string &cls = csv.text(row, col);
    if (cls.empty()) {
        throw_input_error(csv.where(row, col), "the class name is empty",
                          "a land-cover class name such as residential_1_4_ac");
    }
    return cls;
}

[[noreturn]] void missing_class(std::string_view land_class, const TableInfo &info,
                                std::string_view what) {
    throw_input_error(
        info.name, fmt::format("land-cover class '{}' is not in this {} table", land_class, what),
        "a table that lists every class of the land-cover layer (a project may "
        "point to its own table)");
}

template <typename Row> using RowsByClass = std::map<std::string, Row, std::less<>>;

/// The rows of a table by class: `make_row` reads one CSV row; its reference is the row's
/// `reference` cell, or the table's source. Throws InputError for a class listed twice.
template <typename MakeRow>
auto class_rows(const CsvTable &csv, std::size_t col_class, const TableInfo &info,
                const MakeRow &make_row) {
    using Row = decltype(make_row(csv.rows.front()));
    RowsByClass<Row> rows;
    const auto col_ref = csv.find_column("reference");
    for (const auto &r : csv.rows) {
        const std::string &cls = class_cell(csv, r, col_class);
        Row row = make_row(r);
        row.reference =
            col_ref && !csv.text(r, *col_ref).empty() ? csv.text(r, *col_ref) : info.source;
        if (!rows.emplace(cls, std::move(row)).second) {
            throw_input_error(csv.where(r, col_class),
                              fmt::format("class '{}' is listed twice", cls), "each class once");
        }
    }
    return rows;
}

template <typename Row> std::vector<std::string> class_names(const RowsByClass<Row> &rows) {
    std::vector<std::string> out;
    out.reserve(rows.size());
    for (const auto &[cls, row] : rows) {
        out.push_back(cls);
    }
    return out;
}

/// The row of a class; throws InputError naming the class and the `what` table when missing.
template <typename Row>
const Row &class_row(const RowsByClass<Row> &rows, std::string_view land_class,
                     const TableInfo &info, std::string_view what) {
    const auto it = rows.find(land_class);
    if (it == rows.end()) {
        missing_class(land_class, info, what);
    }
    return it->second;
}

} // namespace

std::string_view to_string(SoilGroup g) noexcept {
    switch (g) {
    case SoilGroup::a:
        return "A";
    case SoilGroup::b:
        return "B";
    case SoilGroup::c:
        return "C";
    case SoilGroup::d:
        return "D";
    }
    return "?";
}

SoilGroupReading read_soil_group(std::string_view text, bool drained, std::string_view where) {
    const std::string t = upper_trimmed(text);
    if (const auto g = single_group(t)) {
        return {*g, false};
    }
    if (t.size() == 3 && t[1] == '/' && t[2] == 'D' && t[0] != 'D') {
        if (const auto first = single_group(t.substr(0, 1))) {
            return {drained ? *first : SoilGroup::d, true};
        }
    }
    throw_input_error(std::string(where), fmt::format("'{}' is not a hydrologic soil group", text),
                      std::string(accepted_groups));
}

// ---- runoff coefficients -------------------------------------------------------------------

RunoffCoefficientTable RunoffCoefficientTable::from_csv(const CsvTable &csv) {
    RunoffCoefficientTable table;
    table.info_ = table_info(csv);
    const auto col_class = csv.column("class");
    const auto col_group = csv.column("soil_group");
    const auto col_min = csv.column("slope_min_percent");
    const auto col_max = csv.column("slope_max_percent");
    const auto col_c = csv.column("c");
    for (const auto &r : csv.rows) {
        Row row;
        row.land_class = class_cell(csv, r, col_class);
        row.line = r.line;
        const std::string group = upper_trimmed(csv.text(r, col_group));
        if (group != "ANY") {
            row.soil_group = single_group(group);
            if (!row.soil_group) {
                throw_input_error(csv.where(r, col_group),
                                  fmt::format("'{}' is not a soil group", csv.text(r, col_group)),
                                  "A, B, C, D or any (dual groups are resolved before the "
                                  "look-up)");
            }
        }
        row.slope_min_percent = number_or(csv, r, col_min, row.slope_min_percent);
        row.slope_max_percent = number_or(csv, r, col_max, row.slope_max_percent);
        if (!(row.slope_min_percent < row.slope_max_percent)) {
            throw_input_error(csv.where(r),
                              fmt::format("slope band {} to {} % is empty", row.slope_min_percent,
                                          row.slope_max_percent),
                              "slope_min_percent < slope_max_percent, or blank for no limit");
        }
        row.c = csv.number(r, col_c);
        if (!limits::class_runoff_coefficient.contains(row.c)) {
            throw_input_error(csv.where(r, col_c), fmt::format("C = {} is out of range", row.c),
                              "a runoff coefficient from 0 to 1");
        }
        table.rows_.push_back(std::move(row));
    }
    return table;
}

bool RunoffCoefficientTable::has_class(std::string_view land_class) const {
    return std::any_of(rows_.begin(), rows_.end(),
                       [&](const Row &r) { return r.land_class == land_class; });
}

std::vector<std::string> RunoffCoefficientTable::classes() const {
    std::vector<std::string> out;
    for (const auto &r : rows_) {
        out.push_back(r.land_class);
    }
    std::sort(out.begin(), out.end());
    out.erase(std::unique(out.begin(), out.end()), out.end());
    return out;
}

bool RunoffCoefficientTable::uses_slope(std::string_view land_class) const {
    return std::any_of(rows_.begin(), rows_.end(),
                       [&](const Row &r) { return r.land_class == land_class && r.has_band(); });
}

const RunoffCoefficientTable::Row &
RunoffCoefficientTable::lookup(std::string_view land_class, SoilGroup group,
                               std::optional<double> slope_percent) const {
    if (!has_class(land_class)) {
        missing_class(land_class, info_, "runoff coefficient");
    }
    bool needs_slope = false;
    // Best rows: those of the group itself; else those for any group.
    for (const bool own_group : {true, false}) {
        std::vector<const Row *> hits;
        for (const auto &r : rows_) {
            if (r.land_class != land_class) {
                continue;
            }
            if (own_group ? (r.soil_group != group) : r.soil_group.has_value()) {
                continue;
            }
            if (!slope_percent && r.has_band()) {
                needs_slope = true;
                continue;
            }
            if (slope_percent &&
                !(*slope_percent >= r.slope_min_percent && *slope_percent < r.slope_max_percent)) {
                continue;
            }
            hits.push_back(&r);
        }
        if (hits.size() == 1) {
            return *hits.front();
        }
        if (hits.size() > 1) {
            throw_input_error(fmt::format("{}:{}", info_.name, hits[1]->line),
                              fmt::format("rows {} and {} both apply to class '{}', soil group {}",
                                          hits[0]->line, hits[1]->line, land_class,
                                          to_string(group)),
                              "one row per class, soil group and slope band");
        }
    }
    if (needs_slope) {
        throw_input_error(info_.name,
                          fmt::format("land-cover class '{}', soil group {} has C by slope band, "
                                      "and no catchment slope is known",
                                      land_class, to_string(group)),
                          "a catchment with a mean slope, or a table without slope bands");
    }
    throw_input_error(
        info_.name,
        fmt::format("no row for land-cover class '{}', soil group {}{}", land_class,
                    to_string(group),
                    slope_percent ? fmt::format(", slope {:.2f} %", *slope_percent) : ""),
        "a row for every soil group and slope band of each class, or an 'any' row");
}

// ---- curve numbers -------------------------------------------------------------------------

CurveNumberTable CurveNumberTable::from_csv(const CsvTable &csv) {
    CurveNumberTable table;
    table.info_ = table_info(csv);
    const auto col_class = csv.column("class");
    const std::array<std::size_t, 4> cols = {csv.column("A"), csv.column("B"), csv.column("C"),
                                             csv.column("D")};
    table.rows_ = class_rows(csv, col_class, table.info_, [&](const CsvTable::Row &r) {
        Row row;
        for (std::size_t g = 0; g < 4; ++g) {
            const double cn = csv.number(r, cols[g]);
            if (!limits::curve_number.contains(cn)) {
                throw_input_error(csv.where(r, cols[g]), fmt::format("CN = {} is out of range", cn),
                                  "a curve number " + limits::curve_number.accepted("CN"));
            }
            row.cn[g] = cn;
        }
        return row;
    });
    return table;
}

bool CurveNumberTable::has_class(std::string_view land_class) const {
    return rows_.find(land_class) != rows_.end();
}

std::vector<std::string> CurveNumberTable::classes() const { return class_names(rows_); }

const CurveNumberTable::Row &CurveNumberTable::lookup(std::string_view land_class) const {
    return class_row(rows_, land_class, info_, "curve number");
}

double CurveNumberTable::cn(std::string_view land_class, SoilGroup group) const {
    return lookup(land_class).cn[static_cast<std::size_t>(group)];
}

// ---- impervious shares ---------------------------------------------------------------------

ImperviousShareTable ImperviousShareTable::from_csv(const CsvTable &csv) {
    ImperviousShareTable table;
    table.info_ = table_info(csv);
    const auto col_class = csv.column("class");
    const auto col_pct = csv.column("impervious_percent");
    table.rows_ = class_rows(csv, col_class, table.info_, [&](const CsvTable::Row &r) {
        const double pct = csv.number(r, col_pct);
        if (!limits::percent.contains(pct)) {
            throw_input_error(csv.where(r, col_pct),
                              fmt::format("impervious share {} % is out of range", pct),
                              "a percentage from 0 to 100");
        }
        Row row;
        row.share = pct / 100.0;
        return row;
    });
    return table;
}

bool ImperviousShareTable::has_class(std::string_view land_class) const {
    return rows_.find(land_class) != rows_.end();
}

std::vector<std::string> ImperviousShareTable::classes() const { return class_names(rows_); }

const ImperviousShareTable::Row &ImperviousShareTable::lookup(std::string_view land_class) const {
    return class_row(rows_, land_class, info_, "impervious share");
}

// ---- reading ---------------------------------------------------------------------------------

LandTables read_land_tables(const std::filesystem::path &c_csv, const std::filesystem::path &cn_csv,
                            const std::filesystem::path &impervious_csv) {
    LandTables tables;
    tables.c = RunoffCoefficientTable::from_csv(read_csv(c_csv));
    tables.cn = CurveNumberTable::from_csv(read_csv(cn_csv));
    tables.impervious = ImperviousShareTable::from_csv(read_csv(impervious_csv));
    return tables;
}

LandTables read_default_land_tables(const std::filesystem::path &config_dir) {
    return read_land_tables(config_dir / "land" / "runoff_coefficients.csv",
                            config_dir / "land" / "curve_numbers.csv",
                            config_dir / "land" / "impervious_shares.csv");
}

} // namespace catchpeak::land
