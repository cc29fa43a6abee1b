// SPDX-License-Identifier: MIT
#include "catchpeak/app/inputs.hpp"
#include "catchpeak/app/culverts.hpp"

#include "catchpeak/app/catchment_land.hpp"
#include "catchpeak/app/point_hydrology.hpp"
#include "catchpeak/core/csv.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/limits.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/io/idf_csv.hpp"
#include "catchpeak/rain/frequency.hpp"
#include "catchpeak/rain/idf.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <fstream>
#include <set>
#include <utility>

namespace catchpeak::app {

using project::closest_match;
using project::InputPath;
using project::PointOverride;
using project::Problems;
using project::Project;

namespace fs = std::filesystem;

namespace {

/// The one column of `t` among `names` (with its index), or nullopt; two present is an error.
std::optional<std::pair<std::string, std::size_t>>
one_of(const CsvTable &t, const std::vector<std::string> &names, const std::string &what) {
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

std::pair<std::string, std::size_t>
required_one_of(const CsvTable &t, const std::vector<std::string> &names, const std::string &what) {
    auto c = one_of(t, names, what);
    if (!c) {
        throw_input_error(
            t.source,
            fmt::format("no column for {}; columns present: {}", what, fmt::join(t.header, ", ")),
            "one of the columns " + fmt::format("{}", fmt::join(names, ", ")));
    }
    return *c;
}

double positive(const CsvTable &t, const CsvTable::Row &row, std::size_t col) {
    const double v = t.number(row, col);
    if (!(v > 0.0) || !std::isfinite(v)) {
        throw_input_error(t.where(row, col), fmt::format("{} is not positive", v), "a number > 0");
    }
    return v;
}

/// A figure of a catchment in column `col`, whose unit is `unit` and `to_si` SI units, within
/// the physical bound `range` (SI; core/limits.hpp). Gives it in SI; throws naming the cell,
/// the value and the bound in the column's unit.
double physical(const CsvTable &t, const CsvTable::Row &row, std::size_t col, double to_si,
                std::string_view unit, const limits::Range &range) {
    const double v = t.number(row, col);
    const double si = v * to_si;
    if (range.contains(si)) {
        return si;
    }
    const std::string what = !std::isfinite(v) ? fmt::format("{} is not a finite number", v)
                             : !(si > range.min)
                                 ? fmt::format("{} is not positive", v)
                                 : fmt::format("{} is beyond what is physically possible", v);
    throw_input_error(t.where(row, col), what,
                      fmt::format("a value above {:g} and at most {:g} {} ({})", range.min / to_si,
                                  range.max / to_si, unit, range.reason));
}

/// The unit of a column named "<quantity>_<unit>": "ha" of "area_ha", "%" of "slope_percent".
std::string unit_of(const std::string &column) {
    const std::string u = column.substr(column.find('_') + 1);
    return u == "percent" ? "%" : u == "m_per_m" ? "m/m" : u;
}

/// The area column of a table: one of the columns with the unit in the name.
std::pair<std::string, std::size_t> area_column(const CsvTable &t) {
    return required_one_of(t, {"area_m2", "area_ha", "area_km2", "area_ac", "area_ft2", "area_mi2"},
                           "the area");
}

/// An area in the unit of its column (one of area_column's names), in m2.
double area_to_m2(const std::string &column, double a) {
    return column == "area_m2"    ? a
           : column == "area_ha"  ? units::ha_to_m2(a)
           : column == "area_km2" ? units::km2_to_m2(a)
           : column == "area_ac"  ? units::acre_to_m2(a)
           : column == "area_ft2" ? units::ft2_to_m2(a)
                                  : units::mi2_to_m2(a);
}

/// The columns of a catchment table's area, longest flow path and relief or slope.
struct FigureColumns {
    std::pair<std::string, std::size_t> area;
    std::pair<std::string, std::size_t> length;
    std::pair<std::string, std::size_t> fall;
};

/// Reads the area, longest flow path, relief and slope of a row into `c`, each within its
/// physical bound (core/limits.hpp): the one given, and the one it gives (the slope of a relief
/// over the path, the relief of a slope along it).
void read_figures(const CsvTable &t, const CsvTable::Row &row, const FigureColumns &cols,
                  TableCatchment &c) {
    const auto &[area, length, fall] = cols;
    c.area_m2 = physical(t, row, area.second, area_to_m2(area.first, 1.0), unit_of(area.first),
                         limits::catchment_area_m2);
    const double ft = units::ft_to_m(1.0);
    c.longest_flow_path_m = physical(t, row, length.second, length.first == "length_m" ? 1.0 : ft,
                                     unit_of(length.first), limits::flow_path_length_m);
    const bool relief = fall.first == "relief_m" || fall.first == "relief_ft";
    if (relief) {
        c.relief_m = physical(t, row, fall.second, fall.first == "relief_m" ? 1.0 : ft,
                              unit_of(fall.first), limits::relief_m);
        c.slope = c.relief_m / c.longest_flow_path_m;
    } else {
        c.slope = physical(t, row, fall.second, fall.first == "slope_m_per_m" ? 1.0 : 0.01,
                           unit_of(fall.first), limits::flow_path_slope);
        c.relief_m = c.slope * c.longest_flow_path_m;
    }
    const auto &bound = relief ? limits::flow_path_slope : limits::relief_m;
    const double derived = relief ? c.slope : c.relief_m;
    if (!bound.contains(derived)) {
        throw_input_error(
            t.where(row),
            fmt::format("{} = {} {} along a longest flow path of {} {} gives a {} of {:.4g} {}, "
                        "beyond what is physically possible",
                        fall.first, t.text(row, fall.second), unit_of(fall.first),
                        t.text(row, length.second), unit_of(length.first),
                        relief ? "slope" : "relief", derived, relief ? "m/m" : "m"),
            fmt::format("a {} of at most {:g} {} ({})", relief ? "slope" : "relief", bound.max,
                        relief ? "m/m" : "m", bound.reason));
    }
}

} // namespace

std::filesystem::path config_dir() {
    const char *env = std::getenv("CATCHPEAK_CONFIG_DIR");
    if (env != nullptr && *env != '\0') {
        return env;
    }
    return CATCHPEAK_BUILT_CONFIG_DIR;
}

std::vector<TableCatchment> read_catchment_table(const fs::path &path) {
    return catchment_table_from_csv(read_csv(path));
}

std::vector<TableCatchment> catchment_table_from_csv(const CsvTable &t) {
    const std::size_t id_col = t.column("id");
    const auto area = area_column(t);
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
        read_figures(t, row, {area, length, fall}, c);
        if (c_col && !t.text(row, *c_col).empty()) {
            c.c = t.number(row, *c_col);
            if (!limits::runoff_coefficient.contains(*c.c)) {
                throw_input_error(t.where(row, *c_col), fmt::format("C = {} is out of range", *c.c),
                                  "a runoff coefficient in " +
                                      limits::runoff_coefficient.interval());
            }
        }
        if (cn_col && !t.text(row, *cn_col).empty()) {
            c.cn = t.number(row, *cn_col);
            if (!limits::curve_number.contains(*c.cn)) {
                throw_input_error(t.where(row, *cn_col),
                                  fmt::format("CN = {} is out of range", *c.cn),
                                  "a curve number " + limits::curve_number.accepted("CN"));
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

std::vector<TableLandPart> read_catchment_land_table(const fs::path &path, bool drained) {
    const CsvTable t = read_csv(path);
    const std::size_t id_col = t.column("id");
    const std::size_t class_col = t.column("class");
    const std::size_t group_col = t.column("soil_group");
    const auto area = area_column(t);
    if (t.rows.empty()) {
        throw_input_error(t.source, "the table has no land parts",
                          "one row per part of a catchment (id, class, soil_group, area)");
    }
    std::vector<TableLandPart> out;
    out.reserve(t.rows.size());
    for (const auto &row : t.rows) {
        TableLandPart part;
        part.line = row.line;
        part.id = t.text(row, id_col);
        if (part.id.empty()) {
            throw_input_error(t.where(row, id_col), "the id is empty",
                              "the id of a catchment of the catchment table");
        }
        part.land_class = t.text(row, class_col);
        if (part.land_class.empty()) {
            throw_input_error(t.where(row, class_col), "the class is empty",
                              "a land-cover class of the C and CN tables");
        }
        part.soil_group_text = t.text(row, group_col);
        part.soil = land::read_soil_group(part.soil_group_text, drained, t.where(row, group_col));
        part.area_column = area.first;
        part.area_m2 = physical(t, row, area.second, area_to_m2(area.first, 1.0),
                                unit_of(area.first), limits::catchment_area_m2);
        part.area_given = t.number(row, area.second);
        out.push_back(std::move(part));
    }
    return out;
}

AnnualMaximumSeries read_annual_maximum_series(const fs::path &path, const std::string &given) {
    const CsvTable t = read_csv(path);
    AnnualMaximumSeries s;
    s.source = given;
    const std::size_t year_col = t.column("year");
    const auto depth =
        required_one_of(t, {"depth_24h_mm", "depth_24h_in"}, "the annual maximum 24-hour depth");
    s.column = depth.first;
    const double factor = depth.first == "depth_24h_mm" ? 1.0 : units::in_to_mm(1.0);
    std::set<int> seen;
    for (const auto &row : t.rows) {
        const double y = t.number(row, year_col);
        if (!(y == std::floor(y)) || y < 1.0 || y > 9999.0) {
            throw_input_error(t.where(row, year_col), fmt::format("'{}' is not a year", y),
                              "a year as a whole number, e.g. 1994");
        }
        const int year = static_cast<int>(y);
        if (!seen.insert(year).second) {
            throw_input_error(t.where(row, year_col), fmt::format("year {} is listed twice", year),
                              "one value per year (the largest 24-hour depth of that year)");
        }
        const double d = t.number(row, depth.second);
        if (!std::isfinite(d) || d < 0.0) {
            throw_input_error(t.where(row, depth.second), fmt::format("depth {} is negative", d),
                              "a depth >= 0");
        }
        s.years.push_back(year);
        s.depth_mm.push_back(d * factor);
    }
    if (s.depth_mm.size() < rain::min_record_years) {
        throw_input_error(
            t.source, fmt::format("{} years of annual maxima", s.depth_mm.size()),
            fmt::format("at least {} years (common practice, no source)", rain::min_record_years));
    }
    if (std::all_of(s.depth_mm.begin(), s.depth_mm.end(),
                    [&](double d) { return d == s.depth_mm.front(); })) {
        throw_input_error(t.source, "all depths are equal",
                          "a series that varies from year to year");
    }
    return s;
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

/// Checks that the catchment has the C and CN its methods need (by their registrations), when
/// neither land parts nor land layers give them.
void check_catchment_inputs(const Project &p, const TableCatchment &c, Problems &problems) {
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
    const TcMethod tc_method = (o != nullptr && o->tc_method) ? *o->tc_method : p.methods.tc_method;
    const bool given_tc = (o != nullptr && o->tc_min && !o->tc_method) ||
                          (c.tc_min && (o == nullptr || !o->tc_method));
    const bool needs_c =
        std::any_of(peaks.begin(), peaks.end(), [](auto m) { return needs_of(m).c; });
    const bool needs_cn =
        std::any_of(peaks.begin(), peaks.end(), [](auto m) { return needs_of(m).cn; }) ||
        (needs_of(tc_method).cn && !given_tc);
    if (needs_c && !c.c) {
        problems.add(input_message(where,
                                   fmt::format("catchment '{}' has no runoff coefficient", c.id),
                                   "a value in column 'c', or land parts of the catchment in the "
                                   "land table ([inputs] catchment_land_table)"));
    }
    if (needs_cn && !c.cn) {
        problems.add(input_message(where, fmt::format("catchment '{}' has no curve number", c.id),
                                   "a value in column 'cn', or land parts of the catchment in the "
                                   "land table ([inputs] catchment_land_table)"));
    }
}

/// Checks the catchment table: the inputs of every catchment, and that every [[methods.point]]
/// names one of its catchments.
void check_catchment_table(const Project &p, Problems &problems) {
    std::set<std::string> ids;
    collect(problems, [&] {
        const auto rows = read_catchment_table(p.inputs.catchment_table->resolved);
        const bool land_layers = p.inputs.land_cover.has_value();
        const LandPartsById land_parts = read_land_parts(p, rows, problems);
        for (const auto &c : rows) {
            ids.insert(c.id);
            // C and CN come from the land parts (checked above) or the land layers.
            if (land_parts.count(c.id) == 0 && !land_layers) {
                check_catchment_inputs(p, c, problems);
            }
        }
    });
    for (const auto &po : p.methods.points) {
        if (!ids.empty() && ids.count(po.id) == 0 && !po.id.empty()) {
            std::vector<std::string> all(ids.begin(), ids.end());
            const std::string hint = closest_match(po.id, all);
            problems.add(input_message(
                fmt::format("{}:{}: [[methods.point]] id", p.file.string(), po.line),
                fmt::format("design point '{}' is not in the catchment table{}", po.id,
                            hint.empty() ? "" : fmt::format(" (did you mean '{}'?)", hint)),
                "an id of the catchment table"));
        }
    }
}

} // namespace

void check_project(const Project &p, Problems &problems) {
    const std::string pf = p.file.string();
    const std::size_t before = problems.size();
    check_file(p.inputs.dem, pf, "[inputs] dem", problems);
    check_file(p.inputs.design_points, pf, "[inputs] design_points", problems);
    check_file(p.inputs.catchment_table, pf, "[inputs] catchment_table", problems);
    check_file(p.inputs.catchment_land_table, pf, "[inputs] catchment_land_table", problems);
    check_file(p.inputs.land_cover, pf, "[inputs] land_cover", problems);
    check_file(p.inputs.soils, pf, "[inputs] soils", problems);
    check_file(p.inputs.land_cover_codes, pf, "[inputs] land_cover_codes", problems);
    check_file(p.inputs.soil_group_codes, pf, "[inputs] soil_group_codes", problems);
    check_file(p.inputs.breach_lines, pf, "[inputs] breach_lines", problems);
    check_file(p.inputs.c_table, pf, "[inputs] c_table", problems);
    check_file(p.inputs.cn_table, pf, "[inputs] cn_table", problems);
    check_file(p.inputs.culvert_table, pf, "[inputs] culvert_table", problems);
    check_file(p.design.culvert_sizes, pf, "[design] culvert_sizes", problems);
    check_file(p.inputs.impervious_table, pf, "[inputs] impervious_table", problems);
    check_file(p.rainfall.idf, pf, "[rainfall] idf", problems);
    check_file(p.rainfall.annual_maximum_series, pf, "[rainfall] annual_maximum_series", problems);
    check_file(p.rainfall.storm_table, pf, "[rainfall] storm_table", problems);
    if (problems.size() != before) {
        return; // the tables below cannot be read
    }

    if (p.rainfall.annual_maximum_series) {
        collect(problems, [&] {
            (void)read_annual_maximum_series(p.rainfall.annual_maximum_series->resolved,
                                             p.rainfall.annual_maximum_series->given);
        });
    }
    if (p.rainfall.storm_table) {
        collect(problems, [&] { (void)read_project_storm_table(*p.rainfall.storm_table); });
    }
    if (p.rainfall.idf) {
        collect(problems, [&] {
            const rain::Idf idf = io::read_idf_csv(p.rainfall.idf->resolved);
            check_storm_idf(p, idf, problems);
            const auto have = idf.return_periods_yr();
            for (double rp : p.rainfall.return_periods_yr) {
                if (std::find(have.begin(), have.end(), rp) == have.end()) {
                    problems.add(input_message(
                        fmt::format("{}: [rainfall] return_periods_yr", pf),
                        fmt::format("the {}-year return period is not in the IDF '{}'", rp,
                                    p.rainfall.idf->given),
                        fmt::format("return periods of the IDF: {}", fmt::join(have, ", "))));
                }
            }
        });
    }
    // The configuration tables the chosen methods need.
    if (needs_of(p).frequency_factors) {
        const auto cf = config_dir() / frequency_factor_file;
        if (!fs::exists(cf)) {
            problems.add(input_message(cf.string(), "the frequency factor table is missing",
                                       "config/rational_frequency_factors.csv, or "
                                       "CATCHPEAK_CONFIG_DIR naming a folder that has it"));
        }
    }
    if (p.inputs.catchment_table) {
        check_catchment_table(p, problems);
    }
    if (p.inputs.culvert_table) {
        // A DEM project's design point ids are checked by the run, after delineation.
        std::vector<std::string> ids;
        if (p.inputs.catchment_table) {
            collect(problems, [&] {
                for (const auto &c : read_catchment_table(p.inputs.catchment_table->resolved)) {
                    ids.push_back(c.id);
                }
            });
        }
        check_culverts(p, ids, problems);
    }
}

} // namespace catchpeak::app
