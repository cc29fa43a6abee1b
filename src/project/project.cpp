// SPDX-License-Identifier: MIT
#include "catchpeak/project/project.hpp"

#include "catchpeak/core/csv.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/files.hpp"
#include "catchpeak/core/limits.hpp"
#include "catchpeak/core/units.hpp"

#include <fmt/format.h>
#include <toml++/toml.h>

#include <algorithm>
#include <cmath>
#include <set>
#include <utility>

namespace catchpeak::project {

namespace fs = std::filesystem;

namespace {

/// "\"a\", \"b\" or \"c\"".
std::string quoted_or_list(const std::vector<std::string> &items) {
    std::string s;
    for (std::size_t i = 0; i < items.size(); ++i) {
        s += (i == 0 ? "" : (i + 1 == items.size() ? " or " : ", ")) + ("\"" + items[i] + "\"");
    }
    return s;
}

} // namespace

bool Project::uses_method(PeakMethod method) const {
    if (std::find(methods.peak_methods.begin(), methods.peak_methods.end(), method) !=
        methods.peak_methods.end()) {
        return true;
    }
    return std::any_of(methods.points.begin(), methods.points.end(), [&](const auto &p) {
        return p.peak_methods && std::find(p.peak_methods->begin(), p.peak_methods->end(),
                                           method) != p.peak_methods->end();
    });
}

bool Project::uses_tc_method(TcMethod method) const {
    return methods.tc_method == method ||
           std::any_of(methods.points.begin(), methods.points.end(),
                       [&](const auto &o) { return o.tc_method && *o.tc_method == method; });
}

hydro::StormType Rainfall::required_storm_type(const std::string &file) const {
    if (!storm_type) {
        throw_input_error(file + ": [rainfall] storm_type", "no storm type is given",
                          quoted_or_list(option_keys(hydro::storm_type_options)));
    }
    return *storm_type;
}

void Problems::throw_if_any() const {
    if (list_.empty()) {
        return;
    }
    std::string text =
        list_.size() == 1 ? std::string{} : fmt::format("{} problems found:\n", list_.size());
    for (std::size_t i = 0; i < list_.size(); ++i) {
        text += (i == 0 ? "" : "\n") + list_[i];
    }
    throw InputError(text);
}

namespace {

std::string join(const std::vector<std::string> &items, std::string_view sep = ", ") {
    std::string s;
    for (const auto &i : items) {
        s += (s.empty() ? "" : std::string(sep)) + i;
    }
    return s;
}

std::string quoted_list(const std::vector<std::string> &items) {
    std::vector<std::string> q;
    q.reserve(items.size());
    for (const auto &i : items) {
        q.push_back("\"" + i + "\"");
    }
    return join(q);
}

/// Reads one TOML table, remembers which keys were read, and reports the rest as unknown.
class TableReader {
  public:
    TableReader(const toml::table &table, std::string name, std::string file, Problems &problems)
        : table_(table), name_(std::move(name)), file_(std::move(file)), problems_(problems) {}

    [[nodiscard]] std::string where(const toml::node &node) const {
        return fmt::format("{}:{}", file_, node.source().begin.line);
    }
    [[nodiscard]] std::string where_table() const {
        return fmt::format("{}:{}", file_, table_.source().begin.line);
    }
    [[nodiscard]] std::string key_name(std::string_view key) const {
        return fmt::format("[{}] {}", name_, key);
    }
    void problem(const toml::node &node, std::string_view key, const std::string &what,
                 const std::string &accepted = {}) {
        problems_.add(input_message(where(node) + ": " + key_name(key), what, accepted));
    }
    void missing(std::string_view key, const std::string &accepted) {
        problems_.add(input_message(where_table() + ": [" + name_ + "]",
                                    fmt::format("required key '{}' is missing", key), accepted));
    }

    const toml::node *get(std::string_view key) {
        known_.emplace_back(key);
        return table_.get(key);
    }
    [[nodiscard]] std::size_t line_of(std::string_view key) const {
        const toml::node *n = table_.get(key);
        return n == nullptr ? 0 : static_cast<std::size_t>(n->source().begin.line);
    }

    std::optional<std::string> text(std::string_view key, bool required = false,
                                    const std::string &accepted = "a text in quotes") {
        const toml::node *n = get(key);
        if (n == nullptr) {
            if (required) {
                missing(key, accepted);
            }
            return std::nullopt;
        }
        if (!n->is_string()) {
            problem(*n, key, fmt::format("expected a text, found a {}", type_name(*n)), accepted);
            return std::nullopt;
        }
        return n->value<std::string>();
    }

    /// The value of `key` from the option's table; a text not in it is a problem.
    template <class E, std::size_t N>
    std::optional<E> choice(std::string_view key, const OptionTable<E, N> &table,
                            bool required = false) {
        const std::vector<std::string> allowed = option_keys(table);
        auto v = text(key, required, "one of " + quoted_list(allowed));
        if (!v) {
            return std::nullopt;
        }
        const auto value = find_option(table, *v);
        if (!value) {
            const std::string hint = closest_match(*v, allowed);
            problem(*get(key), key,
                    fmt::format("'{}' is not known{}", *v,
                                hint.empty() ? "" : fmt::format(" (did you mean '{}'?)", hint)),
                    "one of " + quoted_list(allowed));
        }
        return value;
    }

    std::optional<double> number(std::string_view key, double min, double max,
                                 bool min_inclusive = true) {
        const toml::node *n = get(key);
        if (n == nullptr) {
            return std::nullopt;
        }
        return number_of(*n, key, min, max, min_inclusive);
    }

    /// A number in one of the shared ranges (core/limits.hpp; their upper bounds are inclusive).
    std::optional<double> number(std::string_view key, const limits::Range &range) {
        return number(key, range.min, range.max, range.min_inclusive);
    }

    std::optional<double> number_of(const toml::node &n, std::string_view key, double min,
                                    double max, bool min_inclusive = true) {
        const std::string accepted =
            fmt::format("a number {} {} and <= {}", min_inclusive ? ">=" : ">", min, max);
        if (!n.is_number()) {
            problem(n, key, fmt::format("expected a number, found a {}", type_name(n)), accepted);
            return std::nullopt;
        }
        const double v = *n.value<double>();
        if (!std::isfinite(v) || v < min || (!min_inclusive && v == min) || v > max) {
            problem(n, key, fmt::format("{} is out of range", v), accepted);
            return std::nullopt;
        }
        return v;
    }

    std::optional<InputPath> path(std::string_view key, const fs::path &dir,
                                  bool required = false) {
        auto v = text(key, required, "a file name in quotes, relative to the project file");
        if (!v) {
            return std::nullopt;
        }
        if (v->empty()) {
            problem(*get(key), key, "the file name is empty",
                    "a file name in quotes, relative to the project file");
            return std::nullopt;
        }
        InputPath p;
        p.given = *v;
        p.resolved = fs::path(*v).is_absolute() ? fs::path(*v) : dir / *v;
        p.line = line_of(key);
        return p;
    }

    /// Reports every key that was not asked for, with a suggestion.
    void finish() {
        for (auto &&[k, v] : table_) {
            const std::string key(k.str());
            if (std::find(known_.begin(), known_.end(), key) != known_.end()) {
                continue;
            }
            const std::string hint = closest_match(key, known_);
            problems_.add(input_message(
                fmt::format("{}:{}: [{}]", file_, k.source().begin.line, name_),
                fmt::format("unknown key '{}'{}", key,
                            hint.empty() ? "" : fmt::format(" (did you mean '{}'?)", hint)),
                "keys " + join(known_)));
        }
    }

    static std::string type_name(const toml::node &n) {
        switch (n.type()) {
        case toml::node_type::table:
            return "table";
        case toml::node_type::array:
            return "list";
        case toml::node_type::string:
            return "text";
        case toml::node_type::integer:
            return "whole number";
        case toml::node_type::floating_point:
            return "number";
        case toml::node_type::boolean:
            return "true/false value";
        default:
            return "date or time";
        }
    }

    [[nodiscard]] const std::string &file() const noexcept { return file_; }
    [[nodiscard]] Problems &problems() noexcept { return problems_; }

  private:
    const toml::table &table_;
    std::string name_;
    std::string file_;
    Problems &problems_;
    std::vector<std::string> known_;
};

/// The sub-table `key` of `root`, or nullptr (with a problem when it is not a table).
const toml::table *sub_table(TableReader &root, std::string_view key) {
    const toml::node *n = root.get(key);
    if (n == nullptr) {
        return nullptr;
    }
    if (!n->is_table()) {
        root.problem(
            *n, key,
            fmt::format("expected a table [{}], found a {}", key, TableReader::type_name(*n)),
            fmt::format("a table written [{}]", key));
        return nullptr;
    }
    return n->as_table();
}

template <class E, std::size_t N>
std::vector<E> method_list(TableReader &t, std::string_view key, const OptionTable<E, N> &table,
                           bool &found) {
    const std::vector<std::string> allowed = option_keys(table);
    std::vector<E> out;
    found = false;
    const toml::node *n = t.get(key);
    if (n == nullptr) {
        return out;
    }
    found = true;
    const std::string accepted = "a list of " + quoted_list(allowed);
    const toml::array *arr = n->as_array();
    if (arr == nullptr) {
        t.problem(*n, key, fmt::format("expected a list, found a {}", TableReader::type_name(*n)),
                  accepted);
        return out;
    }
    if (arr->empty()) {
        t.problem(*n, key, "the list is empty", accepted);
    }
    for (const auto &e : *arr) {
        if (!e.is_string()) {
            t.problem(e, key, fmt::format("expected a text, found a {}", TableReader::type_name(e)),
                      accepted);
            continue;
        }
        const std::string v = *e.value<std::string>();
        const auto value = find_option(table, v);
        if (!value) {
            const std::string hint = closest_match(v, allowed);
            t.problem(e, key,
                      fmt::format("'{}' is not known{}", v,
                                  hint.empty() ? "" : fmt::format(" (did you mean '{}'?)", hint)),
                      accepted);
            continue;
        }
        out.push_back(*value);
    }
    return out;
}

void read_project_info(TableReader &t, report::ProjectInfo &info) {
    if (auto v = t.text("name", true)) {
        info.name = *v;
        if (v->empty()) {
            t.problem(*t.get("name"), "name", "the project name is empty", "a name in quotes");
        }
    }
    info.number = t.text("number").value_or("");
    info.client = t.text("client").value_or("");
    info.location = t.text("location").value_or("");
    info.prepared_by = t.text("prepared_by").value_or("");
    info.checked_by = t.text("checked_by").value_or("");
    info.revision = t.text("revision").value_or("0");
    if (auto u = t.choice("units", units::system_options)) {
        info.units = *u;
    }
    info.page_size = t.choice("page_size", report::page_size_options)
                         .value_or(info.units == units::System::si ? report::PageSize::a4
                                                                   : report::PageSize::letter);
    t.finish();
}

void read_inputs(TableReader &t, const fs::path &dir, Inputs &in) {
    in.dem = t.path("dem", dir);
    in.design_points = t.path("design_points", dir);
    in.design_points_layer = t.text("design_points_layer").value_or("");
    in.design_points_crs = t.text("design_points_crs").value_or("");
    in.design_points_crs_line = t.line_of("design_points_crs");
    in.id_field = t.text("id_field").value_or("id");
    in.catchment_table = t.path("catchment_table", dir);
    in.catchment_land_table = t.path("catchment_land_table", dir);
    in.land_cover = t.path("land_cover", dir);
    in.class_field = t.text("class_field").value_or("class");
    in.soils = t.path("soils", dir);
    in.soil_group_field = t.text("soil_group_field").value_or("hsg");
    in.land_cover_codes = t.path("land_cover_codes", dir);
    in.soil_group_codes = t.path("soil_group_codes", dir);
    in.breach_lines = t.path("breach_lines", dir);
    in.c_table = t.path("c_table", dir);
    in.cn_table = t.path("cn_table", dir);
    in.culvert_table = t.path("culvert_table", dir);
    in.impervious_table = t.path("impervious_table", dir);
    t.finish();

    // A key that is present but wrong has been reported already: count it as present here.
    const bool has_dem = t.line_of("dem") != 0;
    const bool has_points = t.line_of("design_points") != 0;
    const bool has_table = t.line_of("catchment_table") != 0;
    const bool terrain = has_dem || has_points;
    if (terrain && has_table) {
        t.problems().add(
            input_message(t.where_table() + ": [inputs]",
                          "both a DEM with design points and a catchment table are given",
                          "either 'dem' and 'design_points', or 'catchment_table'"));
    } else if (!terrain && !has_table) {
        t.missing("dem", "either 'dem' and 'design_points', or 'catchment_table'");
    } else if (terrain && !has_dem) {
        t.missing("dem", "a DEM file (GeoTIFF or any raster GDAL reads) with 'design_points'");
    } else if (terrain && !has_points) {
        t.missing("design_points", "a point layer (GeoPackage, shapefile, ...) with 'dem'");
    }
    if (const std::size_t line = t.line_of("catchment_land_table"); line != 0 && !has_table) {
        t.problems().add(input_message(
            fmt::format("{}:{}: [inputs] catchment_land_table", t.file(), line),
            "a land table is given without a catchment table",
            "'catchment_land_table' beside 'catchment_table' (a DEM project weights land-cover "
            "and soils layers instead)"));
    }
    if (in.design_points_crs_line != 0 && !has_points) {
        t.problems().add(input_message(
            fmt::format("{}:{}: [inputs] design_points_crs", t.file(), in.design_points_crs_line),
            "the CRS of design points is given without design points",
            "'design_points_crs' beside 'design_points'"));
    }
    if (t.line_of("soils") != 0 && t.line_of("land_cover") == 0) {
        t.missing("land_cover", "a land-cover layer when 'soils' is given");
    }
}

void check_rainfall_keys(TableReader &t, const Rainfall &r);

void read_rainfall(TableReader &t, const fs::path &dir, Rainfall &r) {
    r.idf = t.path("idf", dir);
    r.annual_maximum_series = t.path("annual_maximum_series", dir);
    if (auto d = t.choice("ams_distribution", ams_distribution_options)) {
        r.ams_distribution = *d;
    }
    r.ams_distribution_line = t.line_of("ams_distribution");
    if (const toml::node *n = t.get("return_periods_yr")) {
        const std::string accepted = "a list of return periods in years, each > 1, e.g. [2, 10]";
        if (const toml::array *arr = n->as_array(); arr != nullptr && !arr->empty()) {
            for (const auto &e : *arr) {
                if (auto v = t.number_of(e, "return_periods_yr", 1.0, 10000.0, false)) {
                    if (std::find(r.return_periods_yr.begin(), r.return_periods_yr.end(), *v) !=
                        r.return_periods_yr.end()) {
                        t.problem(e, "return_periods_yr", fmt::format("{} is listed twice", *v),
                                  accepted);
                    } else {
                        r.return_periods_yr.push_back(*v);
                    }
                }
            }
        } else {
            t.problem(*n, "return_periods_yr",
                      arr == nullptr
                          ? fmt::format("expected a list, found a {}", TableReader::type_name(*n))
                          : std::string("the list is empty"),
                      accepted);
        }
    } else {
        t.missing("return_periods_yr", "a list of return periods in years, e.g. [2, 10, 100]");
    }
    r.storm_type = t.choice("storm_type", hydro::storm_type_options);
    r.storm_table = t.path("storm_table", dir);
    r.design_storm_line = t.line_of("design_storm");
    if (auto d = t.choice("design_storm", design_storm_options)) {
        r.design_storm = *d;
    } else if (r.design_storm_line != 0) {
        r.design_storm.reset(); // reported; no rule of either storm applies
    }
    r.storm_duration_min = t.number("storm_duration_min", 0.0, 1440.0, false).value_or(0.0);
    r.storm_duration_line = t.line_of("storm_duration_min");
    for (const auto &[key, factor] :
         {std::pair<std::string, double>{"depths_24h_mm", 1.0}, {"depths_24h_in", 25.4}}) {
        const toml::node *n = t.get(key);
        if (n == nullptr) {
            continue;
        }
        const std::string accepted =
            "a table of return period (years, in quotes) = depth, e.g. { \"10\" = 95.0 }";
        if (!r.depth_24h_mm.empty()) {
            t.problem(*n, key, "24-hour depths are given twice",
                      "either 'depths_24h_mm' or 'depths_24h_in'");
            continue;
        }
        const toml::table *tab = n->as_table();
        if (tab == nullptr) {
            t.problem(*n, key,
                      fmt::format("expected a table, found a {}", TableReader::type_name(*n)),
                      accepted);
            continue;
        }
        r.depth_24h_key = key;
        r.depth_24h_line = static_cast<std::size_t>(n->source().begin.line);
        for (auto &&[k, v] : *tab) {
            double rp = 0.0;
            try {
                rp = parse_number(k.str(), "return period");
            } catch (const InputError &) {
                t.problem(v, key, fmt::format("'{}' is not a return period", k.str()), accepted);
                continue;
            }
            if (auto d = t.number_of(v, key, 0.0, factor == 1.0 ? 2000.0 : 80.0, false)) {
                r.depth_24h_mm[rp] = *d * factor;
            }
        }
    }
    t.finish();
    check_rainfall_keys(t, r);
}

/// The keys of [rainfall] that exclude or need each other.
void check_rainfall_keys(TableReader &t, const Rainfall &r) {
    const std::size_t ams_line = t.line_of("annual_maximum_series");
    const std::size_t depth_line = std::max(t.line_of("depths_24h_mm"), t.line_of("depths_24h_in"));
    if (ams_line != 0 && depth_line != 0) {
        t.problems().add(input_message(
            fmt::format("{}:{}: [rainfall]", t.file(), depth_line),
            fmt::format("both 24-hour depths and an annual maximum series (line {}) are given",
                        ams_line),
            "either 'depths_24h_mm' / 'depths_24h_in' or 'annual_maximum_series', not both"));
    }
    if (r.storm_table && t.line_of("storm_type") != 0) {
        t.problems().add(input_message(
            fmt::format("{}:{}: [rainfall] storm_table", t.file(), r.storm_table->line),
            fmt::format("both a storm table and a storm type (storm_type, line {}) are given",
                        t.line_of("storm_type")),
            "either 'storm_table' (the project's own 24-hour distribution) or 'storm_type' (a "
            "shipped NRCS distribution), not both"));
    }
    if (r.ams_distribution_line != 0 && ams_line == 0) {
        t.problems().add(input_message(
            fmt::format("{}:{}: [rainfall] ams_distribution", t.file(), r.ams_distribution_line),
            "a distribution is chosen but no annual maximum series is given",
            "'ams_distribution' only with 'annual_maximum_series'"));
    }
    if (!r.idf && r.depth_24h_mm.empty() && !r.annual_maximum_series) {
        t.missing("idf", "an IDF table ('idf'), 24-hour depths ('depths_24h_mm' or "
                         "'depths_24h_in') or an annual maximum series");
    }
}

/// Reads the keys of the segmental tc method present in `t` over `s` (the project's table, or
/// a point's keys over the project's values).
void read_segmental(TableReader &t, SegmentalParameters &s) {
    s.sheet_manning_n = t.number("sheet_manning_n", 0.0, 1.0, false).value_or(s.sheet_manning_n);
    s.shallow_surface =
        t.choice("shallow_surface", shallow_surface_options).value_or(s.shallow_surface);
    if (auto v = t.number("shallow_length_m", 0.0, 100000.0)) {
        s.shallow_length_m = *v;
    }
    s.channel_manning_n =
        t.number("channel_manning_n", 0.0, 1.0, false).value_or(s.channel_manning_n);
    s.channel_flow_area_m2 =
        t.number("channel_flow_area_m2", 0.0, 10000.0, false).value_or(s.channel_flow_area_m2);
    s.channel_wetted_perimeter_m = t.number("channel_wetted_perimeter_m", 0.0, 10000.0, false)
                                       .value_or(s.channel_wetted_perimeter_m);
}

void read_kerby(TableReader &t, KerbyParameters &k) {
    k.retardance_n = t.number("retardance_n", 0.0, 1.0, false).value_or(k.retardance_n);
}

/// A point's expected catchment area: expected_area_ha or expected_area_ac, not both.
void read_expected_area(TableReader &t, PointOverride &o) {
    for (const auto &[key, m2_per_unit] :
         {std::pair<std::string, double>{"expected_area_ha", units::m2_per_ha},
          {"expected_area_ac", units::m2_per_acre}}) {
        const auto v = t.number(key, 0.0, 1.0e9, false);
        if (!v) {
            continue;
        }
        if (o.expected_area_m2) {
            t.problem(*t.get(key), key, "an expected area is given twice",
                      "either 'expected_area_ha' or 'expected_area_ac'");
            continue;
        }
        o.expected_area_m2 = *v * m2_per_unit;
        o.expected_area_key = key;
    }
}

void read_methods(TableReader &t, const Project &p, Methods &m, Problems &problems) {
    if (auto v = t.choice("tc", tc_method_options)) {
        m.tc_method = *v;
    }
    const std::string segmental(key_of(TcMethod::tr55_segmental));
    const std::string kerby(key_of(TcMethod::kerby_kirpich));
    if (const auto *seg = sub_table(t, segmental)) {
        TableReader r(*seg, "methods." + segmental, t.file(), problems);
        read_segmental(r, m.tr55_segmental);
        r.finish();
    }
    if (const auto *kk = sub_table(t, kerby)) {
        TableReader r(*kk, "methods." + kerby, t.file(), problems);
        read_kerby(r, m.kerby_kirpich);
        r.finish();
    }
    if (auto w = t.choice("cn_weighting", cn_weighting_options)) {
        m.cn_weighting = *w;
    }
    bool found = false;
    auto peaks = method_list(t, "peak", peak_method_options, found);
    if (found) {
        m.peak_methods = peaks;
    }
    if (const toml::node *n = t.get("point")) {
        const toml::array *arr = n->as_array();
        if (arr == nullptr || !arr->is_array_of_tables()) {
            t.problem(*n, "point", "expected one or more [[methods.point]] tables",
                      "[[methods.point]] tables with 'id' and the choices for that point");
        } else {
            std::set<std::string> seen;
            for (const auto &e : *arr) {
                TableReader pt(*e.as_table(), "methods.point", t.file(), problems);
                PointOverride o;
                o.line = static_cast<std::size_t>(e.source().begin.line);
                o.id = pt.text("id", true, "the id of a design point").value_or("");
                if (!o.id.empty() && !seen.insert(o.id).second) {
                    pt.problem(
                        *pt.get("id"), "id",
                        fmt::format("design point '{}' has two [[methods.point]] tables", o.id),
                        "one table per design point");
                }
                o.tc_method = pt.choice("tc", tc_method_options);
                bool f = false;
                auto pk = method_list(pt, "peak", peak_method_options, f);
                if (f) {
                    o.peak_methods = pk;
                }
                o.tc_min = pt.number("tc_min", 0.0, 10000.0, false);
                o.pond_swamp_percent = pt.number("pond_swamp_percent", limits::percent);
                o.tr55_segmental = m.tr55_segmental;
                read_segmental(pt, o.tr55_segmental);
                o.kerby_kirpich = m.kerby_kirpich;
                read_kerby(pt, o.kerby_kirpich);
                read_expected_area(pt, o);
                if (o.expected_area_m2 && p.uses_table()) {
                    pt.problem(*pt.get(o.expected_area_key), o.expected_area_key,
                               "an expected area is given for a catchment of the catchment table, "
                               "whose area is given",
                               "expected areas for design points of a DEM ([inputs] dem)");
                }
                if (o.tc_method == TcMethod::given && !o.tc_min) {
                    pt.missing("tc_min", fmt::format("a time of concentration in minutes with tc = "
                                                     "\"{}\"",
                                                     key_of(TcMethod::given)));
                }
                pt.finish();
                m.points.push_back(std::move(o));
            }
        }
    }
    t.finish();
    if (m.tc_method == TcMethod::given) {
        t.problems().add(input_message(
            t.where_table() + ": [methods] tc",
            fmt::format("\"{}\" needs a tc per design point and cannot be the project default",
                        key_of(TcMethod::given)),
            "use it in [[methods.point]] with 'tc_min'"));
    }
}

void read_settings(TableReader &t, const Rainfall &rain, Settings &s) {
    s.snap_radius_m = t.number("snap_radius_m", 0.0, 10000.0).value_or(s.snap_radius_m);
    s.snap_radius_line = t.line_of("snap_radius_m");
    s.snap = t.choice("snap", snap_rule_options).value_or(s.snap);
    s.snap_stream_threshold_m2 =
        t.number("snap_stream_threshold_m2", 0.0, 1.0e10).value_or(s.snap_stream_threshold_m2);
    s.snap_area_factor =
        t.number("snap_area_factor", 1.0, 1.0e6, false).value_or(s.snap_area_factor);
    s.expected_area_tolerance_percent =
        t.number("expected_area_tolerance_percent", 0.0, 1000.0, false)
            .value_or(s.expected_area_tolerance_percent);
    s.minimum_tc_min = t.number("minimum_tc_min", 0.0, 60.0).value_or(s.minimum_tc_min);
    s.rational_area_limit_ha =
        t.number("rational_area_limit_ha", 0.0, 1.0e6, false).value_or(s.rational_area_limit_ha);
    s.sheet_flow_max_length_m =
        t.number("sheet_flow_max_length_m", 0.0, 1000.0, false).value_or(s.sheet_flow_max_length_m);
    if (auto r = t.number("initial_abstraction_ratio", 0.0, 1.0, false)) {
        if (*r != 0.2 && *r != 0.05) {
            t.problem(*t.get("initial_abstraction_ratio"), "initial_abstraction_ratio",
                      fmt::format("{} is not supported", *r),
                      "0.2 (TR-55) or 0.05 (Hawkins et al. 2002)");
        } else {
            s.initial_abstraction_ratio = *r;
        }
    }
    s.min_land_part_m2 = t.number("min_land_part_m2", 0.0, 1.0e4).value_or(s.min_land_part_m2);
    s.dual_soil_group =
        t.choice("dual_soil_group", dual_soil_group_options).value_or(s.dual_soil_group);
    if (auto u = t.text("uncovered_land")) {
        s.uncovered_land = parse_uncovered_land(*u);
    }
    s.pond_swamp_percent = t.number("pond_swamp_percent", limits::percent);
    s.pond_swamp_line = t.line_of("pond_swamp_percent");
    if (auto step = t.number("storm_time_step_min", 0.0, 60.0, false)) {
        const double steps = 1440.0 / *step;
        // The alternating block's duration is divided instead (check_design_storm).
        if (!rain.alternating_block() && std::abs(steps - std::round(steps)) > 1e-9 * steps) {
            t.problem(*t.get("storm_time_step_min"), "storm_time_step_min",
                      fmt::format("{} min does not divide the 24-hour storm into whole steps "
                                  "(1440 / {} = {})",
                                  *step, *step, steps),
                      "a step that divides 1440 min, e.g. 1, 2, 3, 5, 6, 10, 12, 15, 30 or 60");
        } else {
            s.storm_time_step_min = *step;
        }
    }
    s.storm_time_step_line = t.line_of("storm_time_step_min");
    t.finish();
}

/// The keys of the design storm fit together: the alternating block has a duration and an IDF
/// and is not used with the TR-55 graphical method; a duration is only given with it.
void check_design_storm(const Project &p, Problems &problems) {
    const std::string name = p.file.string();
    const Rainfall &r = p.rainfall;
    if (r.alternating_block() && r.storm_table) {
        problems.add(input_message(
            fmt::format("{}:{}: [rainfall] storm_table", name, r.storm_table->line),
            "a 24-hour storm table is given but the design storm is the alternating block",
            fmt::format("'storm_table' only with design_storm = \"{}\"",
                        option_key(design_storm_options, DesignStorm::nrcs_24h))));
    }
    if (!r.alternating_block()) {
        if (r.design_storm == DesignStorm::nrcs_24h && r.storm_duration_line != 0) {
            problems.add(input_message(
                fmt::format("{}:{}: [rainfall] storm_duration_min", name, r.storm_duration_line),
                "a storm duration is given but the design storm is the NRCS 24-hour storm",
                fmt::format("'storm_duration_min' only with design_storm = \"{}\"",
                            option_key(design_storm_options, DesignStorm::alternating_block))));
        }
        return;
    }
    const std::string at = fmt::format("{}:{}: [rainfall] design_storm", name, r.design_storm_line);
    if (r.storm_duration_line == 0) {
        problems.add(input_message(at,
                                   "the alternating-block storm needs a duration, none is given",
                                   "storm_duration_min = <minutes>, e.g. 60 to 1440, within the "
                                   "durations of the IDF"));
    } else if (r.storm_duration_min > 0.0) {
        const double step = p.settings.storm_time_step_min;
        const double blocks = r.storm_duration_min / step;
        if (std::abs(blocks - std::round(blocks)) > 1e-9 * blocks || std::round(blocks) < 1.0) {
            const bool given = p.settings.storm_time_step_line != 0;
            problems.add(input_message(
                given ? fmt::format("{}:{}: [settings] storm_time_step_min", name,
                                    p.settings.storm_time_step_line)
                      : fmt::format("{}:{}: [rainfall] storm_duration_min", name,
                                    r.storm_duration_line),
                fmt::format("the storm duration of {} min is not a whole number of blocks of {} "
                            "min{} ({} / {} = {})",
                            r.storm_duration_min, step,
                            given ? "" : " (the default storm_time_step_min)", r.storm_duration_min,
                            step, blocks),
                "a storm_duration_min that [settings] storm_time_step_min divides, e.g. " +
                    fmt::format("{} min", std::max(1.0, std::round(blocks)) * step)));
        }
    }
    if (!r.idf) {
        problems.add(input_message(at,
                                   "the alternating-block storm is built from the IDF, none "
                                   "is given",
                                   "idf = \"<file>.csv\" covering the storm duration"));
    }
    if (p.uses_method(PeakMethod::tr55_graphical)) {
        problems.add(input_message(
            at,
            "the TR-55 graphical method cannot use the alternating-block storm: its unit peak "
            "discharge table was derived for the NRCS 24-hour rainfall distributions (Type I, "
            "IA, II, III) only (TR-55 1986, ch. 4)",
            fmt::format("design_storm = \"{}\" with {}, or the peak methods \"{}\" and \"{}\" with "
                        "the alternating-block storm",
                        option_key(design_storm_options, DesignStorm::nrcs_24h),
                        key_of(PeakMethod::tr55_graphical), key_of(PeakMethod::rational),
                        key_of(PeakMethod::scs_unit_hydrograph))));
    }
}

void read_design(TableReader &t, const fs::path &dir, const Rainfall &rain, Design &d) {
    d.culvert_return_period_yr = t.number("culvert_return_period_yr", 0.0, 1.0e4, false);
    d.culvert_return_period_line = t.line_of("culvert_return_period_yr");
    if (d.culvert_return_period_yr &&
        std::find(rain.return_periods_yr.begin(), rain.return_periods_yr.end(),
                  *d.culvert_return_period_yr) == rain.return_periods_yr.end()) {
        t.problem(*t.get("culvert_return_period_yr"), "culvert_return_period_yr",
                  fmt::format("{} years is not one of the return periods computed",
                              *d.culvert_return_period_yr),
                  "one of [rainfall] return_periods_yr");
    }
    d.culvert_sizes = t.path("culvert_sizes", dir);
    d.outlet_velocity_max_m_per_s = t.number("outlet_velocity_max_m_per_s", 0.0, 30.0, false)
                                        .value_or(d.outlet_velocity_max_m_per_s);
    t.finish();
}

/// What a project file's top level holds, for messages.
constexpr const char *section_hint = "the tables [project], [inputs], [rainfall], [methods], "
                                     "[settings], [design], [output]";

/// Takes the parsed file; reads its tables into `p` (a missing [project], [inputs] or
/// [rainfall] is a problem), the output folder defaulting to reports/latest beside the file.
void read_sections(const toml::table &root, const std::string &name, Project &p,
                   Problems &problems) {
    TableReader top(root, "", name, problems);
    if (const auto *t = sub_table(top, "project")) {
        TableReader r(*t, "project", name, problems);
        read_project_info(r, p.info);
    } else if (root.get("project") == nullptr) {
        problems.add(input_message(name + ":1", "the table [project] is missing", section_hint));
    }
    if (const auto *t = sub_table(top, "inputs")) {
        TableReader r(*t, "inputs", name, problems);
        read_inputs(r, p.dir, p.inputs);
    } else if (root.get("inputs") == nullptr) {
        problems.add(input_message(name + ":1", "the table [inputs] is missing", section_hint));
    }
    if (const auto *t = sub_table(top, "rainfall")) {
        TableReader r(*t, "rainfall", name, problems);
        read_rainfall(r, p.dir, p.rainfall);
    } else if (root.get("rainfall") == nullptr) {
        problems.add(input_message(name + ":1", "the table [rainfall] is missing", section_hint));
    }
    if (const auto *t = sub_table(top, "methods")) {
        TableReader r(*t, "methods", name, problems);
        read_methods(r, p, p.methods, problems);
    }
    if (const auto *t = sub_table(top, "settings")) {
        TableReader r(*t, "settings", name, problems);
        read_settings(r, p.rainfall, p.settings);
    }
    if (const auto *t = sub_table(top, "design")) {
        TableReader r(*t, "design", name, problems);
        read_design(r, p.dir, p.rainfall, p.design);
    }
    p.output_dir = p.dir / "reports" / "latest";
    if (const auto *t = sub_table(top, "output")) {
        TableReader r(*t, "output", name, problems);
        if (auto f = r.path("folder", p.dir)) {
            p.output_dir = f->resolved;
        }
        r.finish();
    }
}

/// Takes the parsed file; adds a problem for each unknown top-level table or key.
void check_unknown_sections(const toml::table &root, const std::string &name, Problems &problems) {
    for (auto &&[k, v] : root) {
        const std::string key(k.str());
        static const std::vector<std::string> sections = {
            "project", "inputs", "rainfall", "methods", "settings", "design", "output"};
        if (std::find(sections.begin(), sections.end(), key) != sections.end()) {
            continue;
        }
        const std::string hint = closest_match(key, sections);
        problems.add(input_message(
            fmt::format("{}:{}", name, k.source().begin.line),
            fmt::format("unknown {} '{}'{}", v.is_table() ? "table" : "key", key,
                        hint.empty() ? "" : fmt::format(" (did you mean '[{}]'?)", hint)),
            section_hint));
    }
}

/// Takes the project read; adds a problem for each method that needs rainfall data the project
/// does not give (an IDF table, 24-hour depths, P2, a storm type).
void check_rainfall_needs(const Project &p, const std::string &name, Problems &problems) {
    // The NRCS 24-hour storm (its type and 24-hour depths) is needed by the TR-55 graphical
    // method always, and by the unit hydrograph unless the storm is the alternating block.
    const bool nrcs_storm =
        p.uses_method(PeakMethod::tr55_graphical) ||
        (p.uses_method(PeakMethod::scs_unit_hydrograph) && !p.rainfall.alternating_block());
    if (p.uses_method(PeakMethod::rational) && !p.rainfall.idf) {
        problems.add(input_message(name + ": [rainfall] idf",
                                   "the Rational Method needs an IDF table, none is given",
                                   "idf = \"<file>.csv\""));
    }
    if (nrcs_storm && p.rainfall.depth_24h_mm.empty() && !p.rainfall.annual_maximum_series) {
        problems.add(input_message(
            name + ": [rainfall]",
            "the SCS Curve Number methods need 24-hour depths, none are given",
            "depths_24h_mm or depths_24h_in, one per return period, or annual_maximum_series"));
    }
    if (p.uses_tc_method(TcMethod::tr55_segmental) && !p.rainfall.annual_maximum_series &&
        p.rainfall.depth_24h_mm.count(2.0) == 0) {
        problems.add(input_message(
            fmt::format("{}: [methods] tc = \"{}\"", name, key_of(TcMethod::tr55_segmental)),
            "TR-55 sheet flow needs the 2-year 24-hour rainfall depth P2, none is given",
            "a \"2\" entry in depths_24h_mm or depths_24h_in, or annual_maximum_series"));
    }
    if (p.rainfall.storm_table && p.uses_method(PeakMethod::tr55_graphical)) {
        problems.add(input_message(
            fmt::format("{}:{}: [rainfall] storm_table", name, p.rainfall.storm_table->line),
            "the TR-55 graphical method cannot use a project's own storm table: its unit peak "
            "discharge table was derived for the NRCS 24-hour rainfall distributions (Type I, "
            "IA, II, III) only (TR-55 1986, ch. 4)",
            fmt::format("storm_type with \"{}\", or the peak methods \"{}\" and \"{}\" with "
                        "storm_table",
                        key_of(PeakMethod::tr55_graphical), key_of(PeakMethod::rational),
                        key_of(PeakMethod::scs_unit_hydrograph))));
    }
    if (nrcs_storm && !p.rainfall.storm_type && !p.rainfall.storm_table) {
        problems.add(input_message(
            name + ": [rainfall] storm_type", "the SCS Curve Number methods need a storm type",
            quoted_or_list(option_keys(hydro::storm_type_options)) +
                (p.uses_method(PeakMethod::tr55_graphical)
                     ? std::string()
                     : ", or storm_table = \"<file>.csv\" (the project's own 24-hour "
                       "distribution)")));
    }
    if (nrcs_storm && !p.rainfall.depth_24h_mm.empty()) {
        for (double rp : p.rainfall.return_periods_yr) {
            if (p.rainfall.depth_24h_mm.count(rp) == 0) {
                problems.add(input_message(
                    fmt::format("{}:{}: [rainfall] {}", name, p.rainfall.depth_24h_line,
                                p.rainfall.depth_24h_key),
                    fmt::format("no 24-hour depth for the {}-year return period", rp),
                    fmt::format("one depth for every return period in return_periods_yr, e.g. "
                                "\"{}\" = <depth>",
                                rp)));
            }
        }
    }
}

} // namespace

Project parse_project(std::string_view text, const fs::path &file, Problems &problems) {
    Project p;
    p.file = file;
    p.dir = file.parent_path();
    const std::string name = file.string();
    toml::table root;
    try {
        root = toml::parse(text, name);
    } catch (const toml::parse_error &e) {
        problems.add(input_message(
            fmt::format("{}:{}:{}", name, e.source().begin.line, e.source().begin.column),
            fmt::format("not valid TOML: {}", e.description()),
            "TOML (https://toml.io); see config/project-template.toml"));
        return p;
    }
    read_sections(root, name, p, problems);
    check_unknown_sections(root, name, problems);
    // Methods that need what the project does not give.
    check_design_storm(p, problems);
    check_rainfall_needs(p, name, problems);
    return p;
}

Project load_project(const fs::path &file) {
    const std::string text = read_text_file(file);
    Problems problems;
    Project p = parse_project(text, file, problems);
    problems.throw_if_any();
    return p;
}

} // namespace catchpeak::project
