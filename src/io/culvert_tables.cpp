// SPDX-License-Identifier: MIT
#include "catchpeak/io/culvert_tables.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/csv.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/units.hpp"

#include <array>
#include <set>
#include <utility>

namespace catchpeak::io {

namespace {

void require_metadata(const CsvTable &t) {
    for (const char *key : {"source", "status"}) {
        const auto it = t.metadata.find(key);
        if (it == t.metadata.end() || it->second.empty()) {
            throw_input_error(t.source, std::string("no '# ") + key + ": ...' line",
                              "a table that names its source and how sure its values are");
        }
    }
    if (t.rows.empty()) {
        throw_input_error(t.source, "no data rows", "one row or more");
    }
}

hydraulics::Shape shape_of(const CsvTable &t, const CsvTable::Row &row, std::size_t col) {
    const std::string &s = t.text(row, col);
    if (s == "circular") {
        return hydraulics::Shape::circular;
    }
    if (s == "box") {
        return hydraulics::Shape::box;
    }
    throw_input_error(t.where(row, col), "'" + s + "' is not a shape", "circular or box");
}

double in_range(const CsvTable &t, const CsvTable::Row &row, std::size_t col, double lo,
                bool lo_open, double hi, const std::string &accepted) {
    const double v = t.number(row, col);
    if (!((lo_open ? v > lo : v >= lo) && v <= hi)) {
        throw_input_error(t.where(row, col), "value " + full(v) + " is out of range", accepted);
    }
    return v;
}

hydraulics::InletRow inlet_row(const CsvTable &t, const CsvTable::Row &row) {
    hydraulics::InletRow r;
    r.key = t.text(row, t.column("key"));
    r.shape = shape_of(t, row, t.column("shape"));
    const std::size_t form_col = t.column("form");
    const std::string &form = t.text(row, form_col);
    if (form != "1" && form != "2") {
        throw_input_error(t.where(row, form_col), "'" + form + "' is not a form",
                          "1 (HDS-5 eq. A.1) or 2 (eq. A.2)");
    }
    r.form = form == "1" ? hydraulics::InletForm::form1 : hydraulics::InletForm::form2;
    r.k = in_range(t, row, t.column("k"), 0.0, true, 1.0, "0 < K <= 1");
    r.m = in_range(t, row, t.column("m"), 0.0, true, 3.0, "0 < M <= 3");
    r.c = in_range(t, row, t.column("c"), 0.0, true, 1.0, "0 < c <= 1");
    r.y = in_range(t, row, t.column("y"), 0.0, false, 2.0, "0 <= Y <= 2");
    r.ks = in_range(t, row, t.column("ks"), -1.0, false, 1.0, "-1 <= Ks <= 1");
    r.ke = in_range(t, row, t.column("ke"), 0.0, false, 1.5, "0 <= ke <= 1.5");
    r.source = t.text(row, t.column("source"));
    return r;
}

/// The span and rise columns present and their factor to metres.
struct SizeColumns {
    std::size_t span = 0;
    std::size_t rise = 0;
    double to_m = 1.0;
};

SizeColumns size_columns(const CsvTable &t) {
    constexpr std::array<std::pair<const char *, double>, 4> units_{
        {{"mm", 0.001}, {"m", 1.0}, {"in", 0.0254}, {"ft", units::m_per_ft}}};
    for (const auto &[u, f] : units_) {
        const auto s = t.find_column(std::string("span_") + u);
        const auto r = t.find_column(std::string("rise_") + u);
        if (s && r) {
            return {*s, *r, f};
        }
    }
    throw_input_error(t.source, "no span and rise columns with a unit",
                      "columns span_mm and rise_mm (or _m, _in, _ft)");
}

} // namespace

hydraulics::InletTable read_culvert_inlet_table(const std::filesystem::path &path) {
    const CsvTable t = read_csv(path);
    require_metadata(t);
    std::vector<hydraulics::InletRow> rows;
    for (const auto &row : t.rows) {
        rows.push_back(inlet_row(t, row));
    }
    return hydraulics::InletTable(std::move(rows));
}

std::vector<hydraulics::Section> read_culvert_sizes(const std::filesystem::path &path) {
    const CsvTable t = read_csv(path);
    require_metadata(t);
    const std::size_t shape_col = t.column("shape");
    const SizeColumns c = size_columns(t);
    std::vector<hydraulics::Section> sizes;
    std::set<std::tuple<int, double, double>> seen;
    for (const auto &row : t.rows) {
        const auto shape = shape_of(t, row, shape_col);
        const double span = in_range(t, row, c.span, 0.0, true, 1e6, "a span > 0") * c.to_m;
        const double rise = in_range(t, row, c.rise, 0.0, true, 1e6, "a rise > 0") * c.to_m;
        if (shape == hydraulics::Shape::circular && span != rise) {
            throw_input_error(t.where(row, c.rise), "the rise differs from the span",
                              "span = rise (the diameter) for a circular pipe");
        }
        if (!seen.emplace(static_cast<int>(shape), span, rise).second) {
            throw_input_error(t.where(row), "this size is listed twice", "each size once");
        }
        sizes.push_back(shape == hydraulics::Shape::circular
                            ? hydraulics::Section::circular(span)
                            : hydraulics::Section::box(span, rise));
    }
    return sizes;
}

std::string culvert_sizes_file(bool us_customary) {
    return us_customary ? "culvert_sizes_us.csv" : "culvert_sizes_si.csv";
}

} // namespace catchpeak::io
