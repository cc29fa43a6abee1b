// SPDX-License-Identifier: MIT
#include "catchpeak/io/hydro_tables.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/csv.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/limits.hpp"

#include <map>
#include <string>
#include <utility>
#include <vector>

namespace catchpeak::io {

namespace {

hydro::TableOrigin origin_of(const CsvTable &t) {
    hydro::TableOrigin o;
    o.file = std::filesystem::path(t.source).filename().string();
    const auto s = t.metadata.find("source");
    if (s == t.metadata.end() || s->second.empty()) {
        throw_input_error(t.source, "no '# source: ...' line", "a table that names its source");
    }
    o.source = s->second;
    const auto st = t.metadata.find("status");
    if (st == t.metadata.end() || st->second.empty()) {
        throw_input_error(t.source, "no '# status: ...' line",
                          "a table that says how sure its values are");
    }
    o.status = st->second;
    return o;
}

void require_rows(const CsvTable &t, std::size_t min_rows) {
    if (t.rows.size() < min_rows) {
        throw_input_error(t.source, std::to_string(t.rows.size()) + " data rows",
                          "at least " + std::to_string(min_rows));
    }
}

/// The cell as a number in `range`.
double number_in(const CsvTable &t, const CsvTable::Row &row, std::size_t col,
                 const limits::Range &range, const std::string &accepted) {
    const double v = t.number(row, col);
    if (!range.contains(v)) {
        throw_input_error(t.where(row, col), "value " + full(v) + " is out of range", accepted);
    }
    return v;
}

/// The cell as a number in [lo, hi] (either bound may be open).
double number_in(const CsvTable &t, const CsvTable::Row &row, std::size_t col, double lo,
                 bool lo_open, double hi, bool hi_open, const std::string &accepted) {
    const double v = t.number(row, col);
    const bool ok = (lo_open ? v > lo : v >= lo) && (hi_open ? v < hi : v <= hi);
    if (!ok) {
        throw_input_error(t.where(row, col), "value " + full(v) + " is out of range", accepted);
    }
    return v;
}

void require_ascending(const CsvTable &t, const CsvTable::Row &row, std::size_t col, double prev,
                       double v) {
    if (!(v > prev)) {
        throw_input_error(t.where(row, col),
                          "value " + full(v) + " does not exceed the row before (" + full(prev) +
                              ")",
                          "strictly ascending values");
    }
}

/// A numeric column of a table and the values it accepts.
struct ColumnRule {
    const char *name;
    double lo;
    bool lo_open;
    double hi;
    bool hi_open;
    const char *accepted;
};

/// The rows of a two-column table (at least one), each value within its column's rule, the
/// first column strictly ascending.
std::vector<std::pair<double, double>> ascending_pairs(const CsvTable &t, const ColumnRule &key,
                                                       const ColumnRule &value) {
    require_rows(t, 1);
    const auto c_key = t.column(key.name);
    const auto c_value = t.column(value.name);
    std::vector<std::pair<double, double>> out;
    for (const auto &row : t.rows) {
        const double k =
            number_in(t, row, c_key, key.lo, key.lo_open, key.hi, key.hi_open, key.accepted);
        const double v = number_in(t, row, c_value, value.lo, value.lo_open, value.hi,
                                   value.hi_open, value.accepted);
        if (!out.empty()) {
            require_ascending(t, row, c_key, out.back().first, k);
        }
        out.emplace_back(k, v);
    }
    return out;
}

} // namespace

hydro::FrequencyFactorTable read_frequency_factor_table(const std::filesystem::path &path) {
    const CsvTable t = read_csv(path);
    hydro::FrequencyFactorTable out;
    out.origin = origin_of(t);
    require_rows(t, 1);
    const auto c_t = t.column("return_period_yr");
    const auto c_cf = t.column("cf");
    for (const auto &row : t.rows) {
        hydro::FrequencyFactorTable::Row r;
        r.return_period_yr = number_in(t, row, c_t, 0.0, true, 1.0e6, false, "0 < T <= 1e6 years");
        r.cf = number_in(t, row, c_cf, limits::frequency_factor, "1 <= Cf <= 2");
        if (!out.rows.empty()) {
            require_ascending(t, row, c_t, out.rows.back().return_period_yr, r.return_period_yr);
        }
        out.rows.push_back(r);
    }
    return out;
}

hydro::PeakCoefficientTable read_peak_coefficient_table(const std::filesystem::path &path) {
    const CsvTable t = read_csv(path);
    hydro::PeakCoefficientTable out;
    out.origin = origin_of(t);
    require_rows(t, 1);
    const auto c_type = t.column("storm_type");
    const auto c_r = t.column("ia_over_p");
    const auto c0 = t.column("c0");
    const auto c1 = t.column("c1");
    const auto c2 = t.column("c2");
    std::map<hydro::StormType, double> last;
    for (const auto &row : t.rows) {
        hydro::PeakCoefficientTable::Row r;
        r.storm_type = hydro::parse_storm_type(t.text(row, c_type), t.where(row, c_type));
        r.ia_over_p = number_in(t, row, c_r, 0.0, true, 1.0, true, "0 < Ia/P < 1");
        r.c0 = number_in(t, row, c0, -10.0, false, 10.0, false, "-10 <= C0 <= 10");
        r.c1 = number_in(t, row, c1, -10.0, false, 10.0, false, "-10 <= C1 <= 10");
        r.c2 = number_in(t, row, c2, -10.0, false, 10.0, false, "-10 <= C2 <= 10");
        const auto it = last.find(r.storm_type);
        if (it != last.end()) {
            require_ascending(t, row, c_r, it->second, r.ia_over_p);
        }
        last[r.storm_type] = r.ia_over_p;
        out.rows.push_back(r);
    }
    return out;
}

hydro::PondFactorTable read_pond_factor_table(const std::filesystem::path &path) {
    const CsvTable t = read_csv(path);
    hydro::PondFactorTable out;
    out.origin = origin_of(t);
    for (const auto &[percent, fp] :
         ascending_pairs(t, {"pond_percent", 0.0, false, 100.0, false, "0-100 %"},
                         {"fp", 0.0, true, 1.0, false, "0 < Fp <= 1"})) {
        out.rows.push_back({percent, fp});
    }
    return out;
}

hydro::DimensionlessUnitHydrograph
read_dimensionless_unit_hydrograph(const std::filesystem::path &path) {
    const CsvTable t = read_csv(path);
    hydro::DimensionlessUnitHydrograph out;
    out.origin = origin_of(t);
    require_rows(t, 2);
    const auto c_t = t.column("t_over_tp");
    const auto c_q = t.column("q_over_qp");
    for (const auto &row : t.rows) {
        const double x = number_in(t, row, c_t, 0.0, false, 100.0, false, "0 <= t/tp <= 100");
        const double y = number_in(t, row, c_q, 0.0, false, 1.0, false, "0 <= q/qp <= 1");
        if (out.t_over_tp.empty()) {
            if (x != 0.0) {
                throw_input_error(t.where(row, c_t), "first t/tp is " + full(x),
                                  "a table starting at t/tp = 0");
            }
        } else {
            require_ascending(t, row, c_t, out.t_over_tp.back(), x);
        }
        out.t_over_tp.push_back(x);
        out.q_over_qp.push_back(y);
    }
    return out;
}

} // namespace catchpeak::io
