// SPDX-License-Identifier: MIT
#include "catchpeak/io/idf_csv.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/units.hpp"

#include <fmt/format.h>

#include <cmath>
#include <utility>
#include <vector>

namespace catchpeak::io {

namespace {

rain::IntensityUnit read_unit(const CsvTable &t) {
    const auto it = t.metadata.find("unit");
    if (it == t.metadata.end()) {
        throw_input_error(t.source, "no '# unit:' line",
                          "a comment line '# unit: mm/h' or '# unit: in/h' before the header");
    }
    if (it->second == "mm/h") {
        return rain::IntensityUnit::mm_per_h;
    }
    if (it->second == "in/h") {
        return rain::IntensityUnit::in_per_h;
    }
    throw_input_error(t.source, fmt::format("unit '{}'", it->second), "mm/h or in/h");
}

std::string read_name(const CsvTable &t) {
    const auto it = t.metadata.find("name");
    if (it != t.metadata.end() && !it->second.empty()) {
        return it->second;
    }
    return std::filesystem::path(t.source).stem().string();
}

double metadata_number(const CsvTable &t, const char *key, double fallback) {
    const auto it = t.metadata.find(key);
    if (it == t.metadata.end()) {
        return fallback;
    }
    return parse_number(it->second, fmt::format("{}: '# {}:'", t.source, key));
}

/// A cell that must be a finite number > 0.
double positive(const CsvTable &t, const CsvTable::Row &row, std::size_t col, const char *what) {
    const double v = t.number(row, col);
    if (!std::isfinite(v) || !(v > 0.0)) {
        throw_input_error(t.where(row, col), fmt::format("{} {} is not positive", what, sig(v)),
                          fmt::format("{} > 0", what));
    }
    return v;
}

rain::Idf table_form(const CsvTable &t) {
    const auto unit = read_unit(t);
    const double to_mm = unit == rain::IntensityUnit::in_per_h ? units::mm_per_in : 1.0;
    rain::IdfTable idf;
    idf.name = read_name(t);
    if (t.header.size() < 2) {
        throw_input_error(t.source, "the header has no return period columns",
                          "duration_min followed by return periods in years, e.g. "
                          "duration_min,2,10,100");
    }
    for (std::size_t c = 1; c < t.header.size(); ++c) {
        const auto where = fmt::format("{}: header, column {}", t.source, c + 1);
        const double rp = parse_number(t.header[c], where);
        if (!std::isfinite(rp) || !(rp > 0.0)) {
            throw_input_error(where, fmt::format("return period {} yr is not positive", sig(rp)),
                              "return periods in years > 0");
        }
        if (!idf.return_periods_yr.empty() && !(rp > idf.return_periods_yr.back())) {
            throw_input_error(where,
                              fmt::format("return period {} yr after {} yr", sig(rp),
                                          sig(idf.return_periods_yr.back())),
                              "return periods in increasing order, each once");
        }
        idf.return_periods_yr.push_back(rp);
    }
    if (t.rows.empty()) {
        throw_input_error(t.source, "no rows of intensities", "one row per duration");
    }
    idf.intensity_mm_per_h.assign(idf.return_periods_yr.size(), {});
    const CsvTable::Row *prev = nullptr;
    for (const auto &row : t.rows) {
        const double d = positive(t, row, 0, "duration");
        if (prev != nullptr && !(d > idf.durations_min.back())) {
            throw_input_error(t.where(row, 0),
                              fmt::format("duration {} min after {} min (line {})", sig(d),
                                          sig(idf.durations_min.back()), prev->line),
                              "durations in increasing order, each once");
        }
        idf.durations_min.push_back(d);
        for (std::size_t c = 1; c < t.header.size(); ++c) {
            const double i = positive(t, row, c, "intensity");
            auto &col = idf.intensity_mm_per_h[c - 1];
            if (!col.empty() && !(i * to_mm < col.back())) {
                throw_input_error(t.where(row, c),
                                  fmt::format("intensity {} {} is not less than {} {} at the "
                                              "shorter duration on line {}",
                                              sig(i), to_string(unit), sig(col.back() / to_mm),
                                              to_string(unit), prev->line),
                                  "intensities that decrease as the duration grows");
            }
            if (c > 1 && !(i * to_mm > idf.intensity_mm_per_h[c - 2].back())) {
                throw_input_error(
                    t.where(row, c),
                    fmt::format("intensity {} {} is not greater than {} {} for the shorter "
                                "return period in column '{}'",
                                sig(i), to_string(unit),
                                sig(idf.intensity_mm_per_h[c - 2].back() / to_mm), to_string(unit),
                                t.header[c - 1]),
                    "intensities that increase with the return period");
            }
            col.push_back(i * to_mm);
        }
        prev = &row;
    }
    return rain::Idf(std::move(idf));
}

rain::Idf formula_form(const CsvTable &t) {
    rain::IdfFormula f;
    f.unit = read_unit(t);
    f.name = read_name(t);
    f.min_duration_min = metadata_number(t, "min_duration_min", 0.0);
    f.max_duration_min = metadata_number(t, "max_duration_min", 0.0);
    const std::size_t c_rp = t.column("return_period_yr");
    const std::size_t c_a = t.column("a");
    const std::size_t c_b = t.column("b_min");
    const std::size_t c_c = t.column("c");
    if (t.rows.empty()) {
        throw_input_error(t.source, "no rows of constants", "one row per return period");
    }
    for (const auto &row : t.rows) {
        rain::IdfFormulaConstants k;
        k.return_period_yr = positive(t, row, c_rp, "return period");
        if (!f.constants.empty() && !(k.return_period_yr > f.constants.back().return_period_yr)) {
            throw_input_error(t.where(row, c_rp),
                              fmt::format("return period {} yr after {} yr",
                                          sig(k.return_period_yr),
                                          sig(f.constants.back().return_period_yr)),
                              "return periods in increasing order, each once");
        }
        k.a = positive(t, row, c_a, "a");
        k.b_min = t.number(row, c_b);
        if (!std::isfinite(k.b_min) || k.b_min < 0.0) {
            throw_input_error(t.where(row, c_b),
                              fmt::format("b = {} min is negative", sig(k.b_min)), "b >= 0 min");
        }
        k.c = positive(t, row, c_c, "c");
        f.constants.push_back(k);
    }
    try {
        return rain::Idf(std::move(f));
    } catch (const InputError &e) {
        // Checks across rows (intensity growing with the return period) name the IDF, the
        // durations and the return periods; add the file.
        throw InputError(fmt::format("{}: {}", t.source, e.what()));
    }
}

} // namespace

rain::Idf idf_from_csv(const CsvTable &table) {
    if (!table.header.empty() && table.header[0] == "duration_min") {
        return table_form(table);
    }
    if (!table.header.empty() && table.header[0] == "return_period_yr") {
        return formula_form(table);
    }
    throw_input_error(table.source,
                      fmt::format("header starts with '{}'",
                                  table.header.empty() ? std::string() : table.header[0]),
                      "'duration_min,<return periods>' (a table) or 'return_period_yr,a,b_min,c' "
                      "(a formula)");
}

rain::Idf read_idf_csv(const std::filesystem::path &path) { return idf_from_csv(read_csv(path)); }

} // namespace catchpeak::io
