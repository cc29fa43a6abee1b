// SPDX-License-Identifier: MIT
#include "catchpeak/app/inputs.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/io/csv.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <set>
#include <utility>

namespace catchpeak::app {

namespace fs = std::filesystem;

namespace {

bool ends_with(std::string_view s, std::string_view suffix) {
    return s.size() >= suffix.size() && s.substr(s.size() - suffix.size()) == suffix;
}

/// The one column of `t` among `names` (with its index), or nullopt; two present is an error.
std::optional<std::pair<std::string, std::size_t>>
one_of(const io::CsvTable &t, const std::vector<std::string> &names, const std::string &what) {
    std::optional<std::pair<std::string, std::size_t>> found;
    for (const auto &n : names) {
        if (auto c = t.find_column(n)) {
            if (found) {
                throw_input_error(t.source,
                                  fmt::format("{} is given twice, in columns '{}' and '{}'", what,
                                              found->first, n),
                                  "one of the columns " +
                                      fmt::format("{}", fmt::join(names, ", ")));
            }
            found = std::make_pair(n, *c);
        }
    }
    return found;
}

std::pair<std::string, std::size_t> required_one_of(const io::CsvTable &t,
                                                    const std::vector<std::string> &names,
                                                    const std::string &what) {
    auto c = one_of(t, names, what);
    if (!c) {
        throw_input_error(
            t.source,
            fmt::format("no column for {}; columns present: {}", what, fmt::join(t.header, ", ")),
            "one of the columns " + fmt::format("{}", fmt::join(names, ", ")));
    }
    return *c;
}

double positive(const io::CsvTable &t, const io::CsvTable::Row &row, std::size_t col) {
    const double v = t.number(row, col);
    if (!(v > 0.0) || !std::isfinite(v)) {
        throw_input_error(t.where(row, col), fmt::format("{} is not positive", v), "a number > 0");
    }
    return v;
}

} // namespace

IdfTable read_idf_table(const fs::path &path) {
    const io::CsvTable t = io::read_csv(path);
    IdfTable idf;
    idf.source = t.source;
    const std::size_t dcol = t.column("duration_min");
    std::vector<std::pair<double, std::size_t>> cols;
    std::vector<double> factors;
    for (std::size_t c = 0; c < t.header.size(); ++c) {
        if (c == dcol) {
            continue;
        }
        const std::string &h = t.header[c];
        double factor = 1.0;
        std::string_view rest;
        if (ends_with(h, "yr_mm_per_h")) {
            rest = std::string_view(h).substr(0, h.size() - 11);
        } else if (ends_with(h, "yr_in_per_h")) {
            rest = std::string_view(h).substr(0, h.size() - 11);
            factor = units::mm_per_in;
        } else {
            throw_input_error(fmt::format("{}: column '{}'", t.source, h),
                              "not a return period column",
                              "'duration_min' and columns '<T>yr_mm_per_h' or '<T>yr_in_per_h', "
                              "e.g. '10yr_mm_per_h'");
        }
        const double rp = io::parse_number(rest, fmt::format("{}: column '{}'", t.source, h));
        if (!(rp > 1.0)) {
            throw_input_error(fmt::format("{}: column '{}'", t.source, h),
                              fmt::format("return period {} is not above 1 year", rp),
                              "a return period > 1 year");
        }
        if (idf.intensity_mm_per_h.count(rp) != 0) {
            throw_input_error(fmt::format("{}: column '{}'", t.source, h),
                              fmt::format("the {}-year return period is given twice", rp));
        }
        idf.intensity_mm_per_h[rp] = {};
        cols.emplace_back(rp, c);
        factors.push_back(factor);
    }
    if (cols.empty()) {
        throw_input_error(t.source, "no return period columns",
                          "columns '<T>yr_mm_per_h' or '<T>yr_in_per_h' beside 'duration_min'");
    }
    if (t.rows.size() < 2) {
        throw_input_error(t.source, fmt::format("{} duration rows", t.rows.size()),
                          "at least two durations");
    }
    for (const auto &row : t.rows) {
        const double d = positive(t, row, dcol);
        if (!idf.durations_min.empty() && d <= idf.durations_min.back()) {
            throw_input_error(t.where(row, dcol), fmt::format("duration {} does not increase", d),
                              "durations in increasing order");
        }
        idf.durations_min.push_back(d);
        for (std::size_t k = 0; k < cols.size(); ++k) {
            idf.intensity_mm_per_h[cols[k].first].push_back(positive(t, row, cols[k].second) *
                                                            factors[k]);
        }
    }
    return idf;
}

std::vector<TableCatchment> read_catchment_table(const fs::path &path) {
    const io::CsvTable t = io::read_csv(path);
    const std::size_t id_col = t.column("id");
    const auto area = required_one_of(
        t, {"area_m2", "area_ha", "area_km2", "area_ac", "area_ft2", "area_mi2"}, "the area");
    const auto length = required_one_of(t, {"length_m", "length_ft"}, "the longest flow path");
    const auto fall = required_one_of(
        t, {"relief_m", "relief_ft", "slope_m_per_m", "slope_percent"}, "the relief or slope");
    const auto c_col = t.find_column("c");
    const auto cn_col = t.find_column("cn");
    const auto tc_col = t.find_column("tc_min");
    const auto x_col = t.find_column("x");
    const auto y_col = t.find_column("y");
    if (t.rows.empty()) {
        throw_input_error(t.source, "the table has no catchments", "one row per catchment");
    }
    std::vector<TableCatchment> out;
    std::set<std::string> ids;
    for (const auto &row : t.rows) {
        TableCatchment c;
        c.line = row.line;
        c.id = t.text(row, id_col);
        if (c.id.empty()) {
            throw_input_error(t.where(row, id_col), "the id is empty", "a design point id");
        }
        if (!ids.insert(c.id).second) {
            throw_input_error(t.where(row, id_col), fmt::format("id '{}' is used twice", c.id),
                              "a different id on every row");
        }
        const double a = positive(t, row, area.second);
        const std::string &an = area.first;
        c.area_m2 = an == "area_m2"    ? a
                    : an == "area_ha"  ? units::ha_to_m2(a)
                    : an == "area_km2" ? units::km2_to_m2(a)
                    : an == "area_ac"  ? units::acre_to_m2(a)
                    : an == "area_ft2" ? units::ft2_to_m2(a)
                                       : units::mi2_to_m2(a);
        const double l = positive(t, row, length.second);
        c.longest_flow_path_m = length.first == "length_m" ? l : units::ft_to_m(l);
        const double f = positive(t, row, fall.second);
        if (fall.first == "relief_m" || fall.first == "relief_ft") {
            c.relief_m = fall.first == "relief_m" ? f : units::ft_to_m(f);
            c.slope = c.relief_m / c.longest_flow_path_m;
        } else {
            c.slope = fall.first == "slope_m_per_m" ? f : f / 100.0;
            c.relief_m = c.slope * c.longest_flow_path_m;
        }
        if (c.slope > 1.0) {
            throw_input_error(t.where(row, fall.second),
                              fmt::format("slope {} m/m is steeper than 1:1", c.slope),
                              "a slope between 0 and 1 m/m");
        }
        if (c_col && !t.text(row, *c_col).empty()) {
            c.c = t.number(row, *c_col);
            if (!(*c.c > 0.0 && *c.c <= 1.0)) {
                throw_input_error(t.where(row, *c_col), fmt::format("C = {} is out of range", *c.c),
                                  "a runoff coefficient in (0, 1]");
            }
        }
        if (cn_col && !t.text(row, *cn_col).empty()) {
            c.cn = t.number(row, *cn_col);
            if (!(*c.cn > 30.0 && *c.cn <= 100.0)) {
                throw_input_error(t.where(row, *cn_col),
                                  fmt::format("CN = {} is out of range", *c.cn),
                                  "a curve number in (30, 100]");
            }
        }
        if (tc_col && !t.text(row, *tc_col).empty()) {
            c.tc_min = positive(t, row, *tc_col);
        }
        if (x_col && y_col && !t.text(row, *x_col).empty()) {
            c.x = t.number(row, *x_col);
            c.y = t.number(row, *y_col);
        }
        out.push_back(std::move(c));
    }
    return out;
}

namespace {

void check_file(const std::optional<InputPath> &p, const std::string &project_file,
                const std::string &key, Problems &problems) {
    if (!p) {
        return;
    }
    const std::string where = fmt::format("{}:{}: {}", project_file, p->line, key);
    std::error_code ec;
    if (!fs::exists(p->resolved, ec)) {
        problems.add(input_message(
            where,
            fmt::format("file '{}' does not exist (looked for {})", p->given, p->resolved.string()),
            "a path relative to the project file's folder"));
        return;
    }
    if (fs::is_directory(p->resolved, ec) && p->resolved.extension() != ".gdb") {
        problems.add(
            input_message(where, fmt::format("'{}' is a folder, not a file", p->given), "a file"));
        return;
    }
    std::ifstream in(p->resolved, std::ios::binary);
    if (!in) {
        problems.add(
            input_message(where, fmt::format("file '{}' cannot be opened for reading", p->given)));
    }
}

template <typename F> void collect(Problems &problems, F &&f) {
    try {
        f();
    } catch (const InputError &e) {
        problems.add(e.what());
    }
}

} // namespace

void check_project(const Project &p, Problems &problems) {
    const std::string pf = p.file.string();
    const std::size_t before = problems.size();
    check_file(p.inputs.dem, pf, "[inputs] dem", problems);
    check_file(p.inputs.design_points, pf, "[inputs] design_points", problems);
    check_file(p.inputs.catchment_table, pf, "[inputs] catchment_table", problems);
    check_file(p.inputs.land_cover, pf, "[inputs] land_cover", problems);
    check_file(p.inputs.soils, pf, "[inputs] soils", problems);
    check_file(p.inputs.breach_lines, pf, "[inputs] breach_lines", problems);
    check_file(p.inputs.c_table, pf, "[inputs] c_table", problems);
    check_file(p.inputs.cn_table, pf, "[inputs] cn_table", problems);
    check_file(p.rainfall.idf, pf, "[rainfall] idf", problems);
    check_file(p.rainfall.annual_maximum_series, pf, "[rainfall] annual_maximum_series", problems);
    if (problems.size() != before) {
        return; // the tables below cannot be read
    }

    if (p.rainfall.idf) {
        collect(problems, [&] {
            const IdfTable idf = read_idf_table(p.rainfall.idf->resolved);
            for (double rp : p.rainfall.return_periods_yr) {
                if (idf.intensity_mm_per_h.count(rp) == 0) {
                    std::vector<std::string> have;
                    for (const auto &[k, v] : idf.intensity_mm_per_h) {
                        have.push_back(fmt::format("{}", k));
                    }
                    problems.add(input_message(
                        fmt::format("{}: [rainfall] return_periods_yr", pf),
                        fmt::format("the {}-year return period is not in the IDF table '{}'", rp,
                                    p.rainfall.idf->given),
                        fmt::format("return periods of the table: {}", fmt::join(have, ", "))));
                }
            }
        });
    }

    std::set<std::string> ids;
    if (p.inputs.catchment_table) {
        collect(problems, [&] {
            const auto rows = read_catchment_table(p.inputs.catchment_table->resolved);
            const bool land_layers = p.inputs.land_cover.has_value();
            for (const auto &c : rows) {
                ids.insert(c.id);
                const std::string where =
                    fmt::format("{}:{}", p.inputs.catchment_table->resolved.string(), c.line);
                const PointOverride *o = nullptr;
                for (const auto &po : p.methods.points) {
                    if (po.id == c.id) {
                        o = &po;
                    }
                }
                const auto &peaks =
                    (o != nullptr && o->peak_methods) ? *o->peak_methods : p.methods.peak_methods;
                const bool rational =
                    std::find(peaks.begin(), peaks.end(), "rational") != peaks.end();
                const bool scs = std::any_of(peaks.begin(), peaks.end(),
                                             [](const auto &m) { return m != "rational"; });
                if (rational && !c.c && !land_layers) {
                    problems.add(input_message(
                        where, fmt::format("catchment '{}' has no runoff coefficient", c.id),
                        "a value in column 'c', or a land-cover layer in [inputs]"));
                }
                if (scs && !c.cn && !land_layers) {
                    problems.add(input_message(
                        where, fmt::format("catchment '{}' has no curve number", c.id),
                        "a value in column 'cn', or land-cover and soils layers in [inputs]"));
                }
            }
        });
        for (const auto &po : p.methods.points) {
            if (!ids.empty() && ids.count(po.id) == 0 && !po.id.empty()) {
                std::vector<std::string> all(ids.begin(), ids.end());
                const std::string hint = closest_match(po.id, all);
                problems.add(input_message(
                    fmt::format("{}:{}: [[methods.point]] id", pf, po.line),
                    fmt::format("design point '{}' is not in the catchment table{}", po.id,
                                hint.empty() ? "" : fmt::format(" (did you mean '{}'?)", hint)),
                    "an id of the catchment table"));
            }
        }
    }
}

} // namespace catchpeak::app
