// SPDX-License-Identifier: MIT
#include "catchpeak/app/culvert_inputs.hpp"

#include "catchpeak/core/csv.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/units.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <cmath>
#include <set>
#include <utility>

namespace catchpeak::app {

namespace fs = std::filesystem;
using project::Problems;

namespace {

/// A quantity given in one of several columns, each with its unit: the column found and its
/// factor to SI.
struct UnitColumn {
    std::size_t col = 0;
    std::string name;
    double to_si = 1.0;
};

/// The columns of the culvert table, found once per file.
struct Columns {
    std::size_t id = 0;
    std::optional<std::size_t> shape, barrels, inlet, manning_n, hw_d_max, channel_side_slope,
        channel_n, channel_slope, design_return_period;
    std::optional<UnitColumn> diameter, span, rise, length, invert_in, invert_out, headwater_max,
        tailwater, channel_bottom, crest, crest_length, weir_coefficient;
};

/// The one column among `names` (each with its factor to SI); two present is a problem.
std::optional<UnitColumn> unit_column(const CsvTable &t,
                                      const std::vector<std::pair<std::string, double>> &names,
                                      Problems &problems) {
    std::optional<UnitColumn> found;
    for (const auto &[n, f] : names) {
        if (const auto c = t.find_column(n)) {
            if (found) {
                problems.add(input_message(
                    t.source,
                    fmt::format("columns '{}' and '{}' give the same value", found->name, n),
                    "one of them"));
                continue;
            }
            found = UnitColumn{*c, n, f};
        }
    }
    return found;
}

std::optional<UnitColumn> length_column(const CsvTable &t, const std::string &base,
                                        Problems &problems) {
    return unit_column(t, {{base + "_m", 1.0}, {base + "_ft", units::m_per_ft}}, problems);
}

Columns find_columns(const CsvTable &t, Problems &problems) {
    Columns c;
    c.id = t.column("id");
    c.shape = t.find_column("shape");
    c.barrels = t.find_column("barrels");
    c.inlet = t.find_column("inlet");
    c.manning_n = t.find_column("manning_n");
    c.hw_d_max = t.find_column("hw_d_max");
    c.channel_side_slope = t.find_column("channel_side_slope");
    c.channel_n = t.find_column("channel_n");
    c.channel_slope = t.find_column("channel_slope");
    c.design_return_period = t.find_column("design_return_period_yr");
    c.diameter = unit_column(t, {{"diameter_mm", 0.001}, {"diameter_in", 0.0254}}, problems);
    c.span = length_column(t, "span", problems);
    c.rise = length_column(t, "rise", problems);
    c.length = length_column(t, "length", problems);
    c.invert_in = length_column(t, "invert_in", problems);
    c.invert_out = length_column(t, "invert_out", problems);
    c.headwater_max = length_column(t, "headwater_max", problems);
    c.tailwater = length_column(t, "tailwater", problems);
    c.channel_bottom = length_column(t, "channel_bottom", problems);
    c.crest = length_column(t, "crest", problems);
    c.crest_length = length_column(t, "crest_length", problems);
    c.weir_coefficient =
        unit_column(t,
                    {{"weir_coefficient_si", 1.0},
                     {"weir_coefficient_us", hydraulics::weir_coefficient_si_from_us(1.0)}},
                    problems);
    for (const auto &[col, name] :
         {std::pair{c.shape, "shape"}, {c.inlet, "inlet"}, {c.manning_n, "manning_n"}}) {
        if (!col) {
            problems.add(input_message(t.source, fmt::format("no column '{}'", name),
                                       fmt::format("columns: {}", fmt::join(t.header, ", "))));
        }
    }
    if (!c.length) {
        problems.add(
            input_message(t.source, "no column for the barrel length", "length_m or length_ft"));
    }
    return c;
}

/// Reads the cells of one row, adding a problem for each bad cell.
class RowReader {
  public:
    RowReader(const CsvTable &t, const CsvTable::Row &row, Problems &problems)
        : t_(t), row_(row), problems_(problems) {}

    [[nodiscard]] bool given(const std::optional<std::size_t> &col) const {
        return col && !t_.text(row_, *col).empty();
    }
    [[nodiscard]] bool given(const std::optional<UnitColumn> &col) const {
        return col && !t_.text(row_, col->col).empty();
    }
    [[nodiscard]] std::string text(std::size_t col) const { return t_.text(row_, col); }

    /// The number in `col` within [lo, hi] (lo open when `lo_open`), or nullopt (a problem
    /// when the cell is given but bad).
    std::optional<double> number(std::size_t col, double lo, bool lo_open, double hi,
                                 const std::string &accepted) {
        if (t_.text(row_, col).empty()) {
            return std::nullopt;
        }
        double v = 0.0;
        try {
            v = t_.number(row_, col);
        } catch (const InputError &e) {
            problems_.add(e.what());
            return std::nullopt;
        }
        if (!std::isfinite(v) || !(lo_open ? v > lo : v >= lo) || v > hi) {
            problem(col, fmt::format("{} is out of range", full(v)), accepted);
            return std::nullopt;
        }
        return v;
    }
    std::optional<double> number(const std::optional<std::size_t> &col, double lo, bool lo_open,
                                 double hi, const std::string &accepted) {
        return col ? number(*col, lo, lo_open, hi, accepted) : std::nullopt;
    }
    /// A length in its column's unit, in m, with the bounds in m.
    std::optional<double> length(const std::optional<UnitColumn> &col, double lo, bool lo_open,
                                 double hi, const std::string &accepted) {
        if (!col) {
            return std::nullopt;
        }
        const auto v = number(col->col, lo / col->to_si, lo_open, hi / col->to_si, accepted);
        return v ? std::optional<double>(*v * col->to_si) : std::nullopt;
    }
    void problem(std::size_t col, const std::string &what, const std::string &accepted) {
        problems_.add(input_message(t_.where(row_, col), what, accepted));
    }
    void problem(const std::string &what, const std::string &accepted) {
        problems_.add(input_message(t_.where(row_), what, accepted));
    }

  private:
    const CsvTable &t_;
    const CsvTable::Row &row_;
    Problems &problems_;
};

constexpr double elevation_bound_m = 1.0e4; // |elevation| below 10 km: any place on Earth

void read_identity(RowReader &r, const Columns &c, const hydraulics::InletTable &inlets,
                   CulvertSpec &s) {
    if (c.shape && r.given(c.shape)) {
        const std::string shape = r.text(*c.shape);
        if (shape == "circular" || shape == "box") {
            s.shape = shape == "box" ? hydraulics::Shape::box : hydraulics::Shape::circular;
        } else {
            r.problem(*c.shape, fmt::format("'{}' is not a shape", shape), "circular or box");
        }
    } else if (c.shape) {
        r.problem(*c.shape, "the shape is empty", "circular or box");
    }
    if (const auto b = r.number(c.barrels, 1.0, false, 20.0, "a whole number from 1 to 20")) {
        if (std::floor(*b) != *b) {
            r.problem(*c.barrels, fmt::format("{} is not a whole number", full(*b)),
                      "a whole number from 1 to 20");
        }
        s.barrels = static_cast<int>(*b);
    }
    if (!c.inlet) {
        return;
    }
    s.inlet = r.text(*c.inlet);
    std::vector<std::string> keys;
    for (const auto &row : inlets.rows()) {
        if (row.shape == s.shape) {
            keys.push_back(row.key);
        }
        if (row.key == s.inlet) {
            s.inlet_row = row;
        }
    }
    if (s.inlet_row.key.empty() || s.inlet_row.shape != s.shape) {
        const std::string hint = project::closest_match(s.inlet, keys);
        r.problem(*c.inlet,
                  fmt::format("'{}' is not an inlet of a {} culvert{}", s.inlet,
                              s.shape == hydraulics::Shape::box ? "box" : "circular",
                              hint.empty() ? "" : fmt::format(" (did you mean '{}'?)", hint)),
                  fmt::format("{}", fmt::join(keys, ", ")));
    }
}

void read_size(RowReader &r, const Columns &c, CulvertSpec &s) {
    const std::string accepted = "a size above 0 and at most 15 m";
    const auto d = r.length(c.diameter, 0.0, true, 15.0, accepted);
    const auto span = r.length(c.span, 0.0, true, 15.0, accepted);
    const auto rise = r.length(c.rise, 0.0, true, 15.0, accepted);
    if (s.shape == hydraulics::Shape::circular) {
        if (span || rise) {
            r.problem(r.given(c.span) ? c.span->col : c.rise->col,
                      "a circular culvert is sized by its diameter",
                      "diameter_mm or diameter_in, span and rise empty");
        }
        if (d) {
            s.size = hydraulics::Section::circular(*d);
        }
        return;
    }
    if (d) {
        r.problem(c.diameter->col, "a box culvert is sized by its span and rise",
                  "span_m|span_ft and rise_m|rise_ft, diameter empty");
    }
    if (span.has_value() != rise.has_value()) {
        r.problem("a box needs both its span and its rise, or neither (to be sized)",
                  "span and rise both given or both empty");
    } else if (span) {
        s.size = hydraulics::Section::box(*span, *rise);
    }
}

void read_barrel(RowReader &r, const Columns &c, bool inverts_from_dem, CulvertSpec &s) {
    // Manning n of culvert barrels: HDS-5 (2012) Table C.1 lists about 0.011 to 0.033 (from
    // memory, not checked); the bounds refuse only what is not a roughness.
    if (c.manning_n) {
        if (const auto n = r.number(c.manning_n, 0.008, false, 0.1, "0.008 <= n <= 0.1")) {
            s.manning_n = *n;
        } else if (!r.given(c.manning_n)) {
            r.problem(*c.manning_n, "Manning n is empty", "0.008 <= n <= 0.1");
        }
    }
    if (c.length) {
        if (const auto l = r.length(c.length, 0.0, true, 2000.0, "a length above 0, up to 2 km")) {
            s.length_m = *l;
        } else if (!r.given(c.length)) {
            r.problem(c.length->col, "the barrel length is empty", "a length above 0");
        }
    }
    const std::string el = "an elevation within 10 km of sea level";
    s.invert_in_m = r.length(c.invert_in, -elevation_bound_m, false, elevation_bound_m, el);
    s.invert_out_m = r.length(c.invert_out, -elevation_bound_m, false, elevation_bound_m, el);
    const bool in = r.given(c.invert_in);
    const bool out = r.given(c.invert_out);
    if (in != out) {
        r.problem("only one invert is given",
                  "both invert_in and invert_out, or neither (read from the DEM)");
    } else if (!in && !inverts_from_dem) {
        r.problem("no inverts, and the project has no DEM with breach lines to read them from",
                  "invert_in_m|invert_in_ft and invert_out_m|invert_out_ft");
    }
}

void read_limit(RowReader &r, const Columns &c, CulvertSpec &s) {
    s.limit.elevation_m = r.length(c.headwater_max, -elevation_bound_m, false, elevation_bound_m,
                                   "an elevation within 10 km of sea level");
    s.limit.hw_over_d = r.number(c.hw_d_max, 0.0, true, 5.0, "0 < HW/D <= 5");
    if (!r.given(c.headwater_max) && !r.given(c.hw_d_max)) {
        r.problem("no headwater limit",
                  "headwater_max_m|headwater_max_ft (an elevation), hw_d_max, or both");
    }
    if (s.limit.elevation_m && s.invert_in_m && *s.limit.elevation_m <= *s.invert_in_m) {
        r.problem(c.headwater_max->col,
                  fmt::format("the allowed headwater {} m is not above the inlet invert {} m",
                              full(*s.limit.elevation_m), full(*s.invert_in_m)),
                  "an elevation above the inlet invert");
    }
}

void read_outlet(RowReader &r, const Columns &c, CulvertSpec &s) {
    s.tailwater_m = r.length(c.tailwater, 0.0, false, 100.0, "a depth from 0 to 100 m");
    const bool any_channel = r.given(c.channel_bottom) || r.given(c.channel_side_slope) ||
                             r.given(c.channel_n) || r.given(c.channel_slope);
    if (!any_channel) {
        return;
    }
    if (r.given(c.tailwater)) {
        r.problem("both a tailwater and an outlet channel are given",
                  "a tailwater depth or the outlet channel, not both");
        return;
    }
    const auto b = r.length(c.channel_bottom, 0.0, false, 1000.0, "a width from 0 to 1000 m");
    const auto z = r.number(c.channel_side_slope, 0.0, false, 100.0, "0 <= z <= 100 (H:V)");
    const auto n = r.number(c.channel_n, 0.008, false, 0.5, "0.008 <= n <= 0.5");
    const auto so = r.number(c.channel_slope, 0.0, true, 1.0, "0 < slope <= 1 m/m");
    if (!b || !z || !n || !so) {
        r.problem("the outlet channel is given in part",
                  "channel_bottom_m|channel_bottom_ft, channel_side_slope, channel_n and "
                  "channel_slope, all four");
        return;
    }
    if (*b == 0.0 && *z == 0.0) {
        r.problem("the outlet channel has no width: bottom width and side slope are both 0",
                  "a bottom width or a side slope above 0");
        return;
    }
    s.channel = hydraulics::Trapezoid{*b, *z, *n, *so};
}

void read_road(RowReader &r, const Columns &c, CulvertSpec &s) {
    const auto crest = r.length(c.crest, -elevation_bound_m, false, elevation_bound_m,
                                "an elevation within 10 km of sea level");
    const auto length = r.length(c.crest_length, 0.0, true, 1.0e4, "a length above 0");
    if (crest.has_value() != length.has_value()) {
        if (r.given(c.crest) != r.given(c.crest_length)) {
            r.problem("the road crest is given in part",
                      "crest_m|crest_ft and crest_length_m|crest_length_ft, both or neither");
        }
        return;
    }
    if (!crest) {
        return;
    }
    double cd = hydraulics::default_weir_coefficient_si();
    if (c.weir_coefficient && r.given(c.weir_coefficient)) {
        // 1.0 to 4.0 ft^0.5/s spans the roadway coefficients of HDS-5 (2012) ch. 2 (from
        // memory, not checked); in SI x 0.552.
        const double f = c.weir_coefficient->to_si;
        const auto v = r.number(c.weir_coefficient->col,
                                1.0 * hydraulics::weir_coefficient_si_from_us(1.0) / f, false,
                                4.0 * hydraulics::weir_coefficient_si_from_us(1.0) / f,
                                "1.0 to 4.0 ft^0.5/s (0.55 to 2.21 m^0.5/s)");
        if (v) {
            cd = *v * f;
        }
    }
    s.road = hydraulics::RoadCrest{*crest, *length, cd};
    if (s.invert_in_m && *crest <= *s.invert_in_m) {
        r.problem(c.crest->col,
                  fmt::format("the road crest {} m is not above the inlet invert {} m",
                              full(*crest), full(*s.invert_in_m)),
                  "a crest above the inlet invert");
    }
}

} // namespace

std::vector<CulvertSpec> read_culvert_table(const fs::path &path,
                                            const hydraulics::InletTable &inlets,
                                            const std::vector<std::string> &known_ids,
                                            bool inverts_from_dem, Problems &problems) {
    const CsvTable t = read_csv(path);
    const std::size_t before = problems.size();
    const Columns c = find_columns(t, problems);
    if (t.rows.empty()) {
        problems.add(input_message(t.source, "the table has no culverts", "one row per culvert"));
    }
    if (problems.size() > before) {
        return {};
    }
    const std::set<std::string> known(known_ids.begin(), known_ids.end());
    std::set<std::string> seen;
    std::vector<CulvertSpec> out;
    for (const auto &row : t.rows) {
        const std::size_t row_before = problems.size();
        RowReader r(t, row, problems);
        CulvertSpec s;
        s.line = row.line;
        s.id = r.text(c.id);
        if (s.id.empty()) {
            r.problem(c.id, "the id is empty", "a design point id");
        } else if (!known.empty() && known.count(s.id) == 0) {
            const std::string hint = project::closest_match(s.id, known_ids);
            r.problem(c.id,
                      fmt::format("design point '{}' is not in the project{}", s.id,
                                  hint.empty() ? "" : fmt::format(" (did you mean '{}'?)", hint)),
                      "the id of a design point");
        } else if (!seen.insert(s.id).second) {
            r.problem(c.id, fmt::format("design point '{}' has two culverts", s.id),
                      "one row per design point");
        }
        read_identity(r, c, inlets, s);
        read_size(r, c, s);
        read_barrel(r, c, inverts_from_dem, s);
        read_limit(r, c, s);
        read_outlet(r, c, s);
        read_road(r, c, s);
        s.design_return_period_yr = r.number(c.design_return_period, 0.0, true, 1.0e4,
                                             "a return period above 0, up to 10,000 years");
        if (problems.size() == row_before) {
            out.push_back(std::move(s));
        }
    }
    return out;
}

} // namespace catchpeak::app
