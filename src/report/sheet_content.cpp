// SPDX-License-Identifier: MIT
#include "internal/sheet_content.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/report/line_text.hpp"
#include "catchpeak/report/sheet.hpp"
#include "catchpeak/report/sheet_units.hpp"
#include "internal/sheet_culvert.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <optional>

namespace catchpeak::report {

using style::Rgb;
using style::Style;

namespace {

/// Columns of the given titles (markup) and alignments with nominal widths from the style.
template <std::size_t N>
std::vector<Column> columns(const std::array<double, N> &widths_pt,
                            std::vector<std::pair<std::string, PangoAlignment>> titles) {
    std::vector<Column> cols;
    for (std::size_t i = 0; i < N && i < titles.size(); ++i) {
        cols.push_back({std::move(titles[i].first), widths_pt[i], titles[i].second});
    }
    return cols;
}

constexpr PangoAlignment left = PANGO_ALIGN_LEFT;
constexpr PangoAlignment right = PANGO_ALIGN_RIGHT;

/// Values in the sheet's unit system, as text.
class Formats {
  public:
    explicit Formats(units::System system) : system_(system) {}
    [[nodiscard]] std::string area(double m2) const {
        const auto v = sheet_area(m2, system_);
        return sig(v.value) + " " + std::string(v.unit);
    }
    [[nodiscard]] std::string area_value(double m2) const {
        return sig(sheet_area(m2, system_).value);
    }
    [[nodiscard]] std::string length(double m) const {
        const auto v = sheet_length(m, system_);
        return sig(v.value) + " " + std::string(v.unit);
    }
    [[nodiscard]] std::string slope(double s) const {
        return sig(s) + (system_ == units::System::si ? " m/m" : " ft/ft");
    }
    [[nodiscard]] std::string flow(double q_m3_s) const {
        return sig(sheet_flow(q_m3_s, system_).value);
    }
    [[nodiscard]] std::string flow_unit() const {
        return std::string(sheet_flow(0.0, system_).unit);
    }
    [[nodiscard]] std::string area_unit() const {
        return std::string(sheet_area(0.0, system_).unit);
    }
    [[nodiscard]] units::System system() const { return system_; }

  private:
    units::System system_;
};

std::string coord(double v) { return fmt::format("{:.1f}", v); }

// ----- cover ------------------------------------------------------------------------------------

SheetSection cover(const RunResults &r) {
    const auto &p = r.project;
    SheetSection s{"Cover", {}};
    s.blocks.emplace_back(CoverTitleBlock{"Design peak flow calculation sheet",
                                          p.name.empty() ? "(unnamed project)" : p.name});
    s.blocks.emplace_back(
        InfoWithSealBlock{{
                              {"Project", p.name},
                              {"Project number", p.number},
                              {"Client", p.client},
                              {"Location", p.location},
                              {"Unit system of this sheet", std::string(units::to_string(p.units))},
                              {"Prepared by", p.prepared_by},
                              {"Checked by", p.checked_by},
                              {"Date of the run", r.stamp.run_time_utc.substr(0, 10)},
                              {"Revision", p.revision},
                          },
                          "Engineer's seal, signature and date"});
    s.blocks.emplace_back(HeadingBlock{"Stamp of the run", Style::subheading});
    s.blocks.emplace_back(KeyValuesBlock{{
        {"Program", "catchpeak " + r.stamp.tool_version},
        {"Commit", r.stamp.git_commit},
        {"Time of the run (UTC)", r.stamp.run_time_utc},
    }});
    s.blocks.emplace_back(SpaceBlock{style::key_values_after_pt});
    if (!r.stamp.inputs.empty()) {
        TableBlock t{
            columns(style::stamp_columns_pt, {{"Input", left},
                                              {"File (as given in the project file)", left},
                                              {"SHA-256", left}}),
            {}};
        for (const auto &in : r.stamp.inputs) {
            t.rows.push_back({{{esc(in.role), Style::small},
                               {esc(in.path), Style::small},
                               {esc(in.sha256), Style::mono}},
                              std::nullopt});
        }
        s.blocks.emplace_back(std::move(t));
    }
    s.blocks.emplace_back(HeadingBlock{"Cautions", Style::subheading});
    const auto &notes = r.caution_notes.empty() ? default_caution_notes() : r.caution_notes;
    ListBlock list{{}, true};
    for (const auto &note : notes) {
        list.items.push_back(esc(note));
    }
    s.blocks.emplace_back(std::move(list));
    return s;
}

// ----- summary ----------------------------------------------------------------------------------

void summary_rows(const DesignPointResult &p, const Formats &f, std::vector<Row> &rows) {
    const auto flag = warning_flag(p);
    const std::optional<Rgb> fill =
        flag.empty() ? std::nullopt : std::optional<Rgb>(style::warn_fill);
    if (p.peaks.empty()) {
        rows.push_back({{{bold(p.id)},
                         {esc(f.area_value(p.catchment.area_m2))},
                         {esc(sig(p.tc_min))},
                         {"-"},
                         {esc("(no peak flow)")},
                         {"-"},
                         {""},
                         {flag, Style::small}},
                        fill});
    }
    for (std::size_t k = 0; k < p.peaks.size(); ++k) {
        const auto &pk = p.peaks[k];
        const bool first = k == 0;
        const std::string repeated_id = "<span foreground=\"" +
                                        std::string(style::repeated_id_markup_colour) + "\">" +
                                        esc(p.id) + "</span>";
        rows.push_back({{{first ? bold(p.id) : repeated_id, first ? Style::body : Style::small},
                         {first ? esc(f.area_value(p.catchment.area_m2)) : ""},
                         {first ? esc(sig(p.tc_min)) : ""},
                         {esc(return_period_title(pk.return_period_yr))},
                         {esc(method_title(pk.method))},
                         {bold(f.flow(pk.q_m3_s))},
                         {esc(pk.line_id), Style::small},
                         {first ? flag : "", Style::small}},
                        fill});
    }
}

SheetSection summary(const RunResults &r, const Formats &f) {
    SheetSection s{"Summary", {}};
    s.blocks.emplace_back(HeadingBlock{"Summary of design peak flows"});
    s.blocks.emplace_back(
        ParagraphBlock{esc(fmt::format("{} design points. Peak flows in {}; areas in {}; time of "
                                       "concentration tc in min. A design point with warnings is "
                                       "shaded; its warning lines are listed.",
                                       r.points.size(), f.flow_unit(), f.area_unit())),
                       Style::small, style::dark_grey});
    s.blocks.emplace_back(SpaceBlock{style::note_gap_after_pt});
    TableBlock t{
        columns(style::summary_columns_pt, {{"Design point", left},
                                            {esc("Area\n(" + f.area_unit() + ")"), right},
                                            {"tc\n(min)", right},
                                            {"Return\nperiod", right},
                                            {"Method", left},
                                            {esc("Peak flow\n(" + f.flow_unit() + ")"), right},
                                            {"Line", left},
                                            {"Warnings", left}}),
        {}};
    for (const auto &p : r.points) {
        summary_rows(p, f, t.rows);
    }
    s.blocks.emplace_back(std::move(t));
    return s;
}

// ----- design point -----------------------------------------------------------------------------

void warnings(const DesignPointResult &p, std::vector<SheetBlock> &out) {
    if (p.lines.warning_count() == 0) {
        return;
    }
    WarningsBlock w;
    for (const auto &l : p.lines.lines()) {
        if (l.kind == LineKind::warning) {
            const LineText t = text_of(l);
            w.items.push_back("<b>" + esc(l.id) + "  " + esc(t.label) + ":</b> " + esc(t.numbers));
        }
    }
    w.title =
        fmt::format("<b>\u26a0 Warnings of design point {} ({})</b>", esc(p.id), w.items.size());
    out.emplace_back(std::move(w));
}

void figures(const DesignPointResult &p, const Formats &f, std::vector<SheetBlock> &out) {
    out.emplace_back(HeadingBlock{"Catchment", Style::subheading});
    const auto &c = p.catchment;
    std::vector<std::pair<std::string, std::string>> items = {
        {"Catchment area, A", f.area(c.area_m2)},
    };
    if (std::abs(c.local_area_m2 - c.area_m2) > 1e-9 * std::max(1.0, c.area_m2)) {
        items.emplace_back("Local area (own part, without upstream design points)",
                           f.area(c.local_area_m2));
    }
    items.emplace_back("Longest flow path, L", f.length(c.longest_flow_path_m));
    items.emplace_back("Elevation at the top of the longest flow path",
                       f.length(c.elevation_top_m));
    items.emplace_back("Elevation at the outlet", f.length(c.elevation_outlet_m));
    items.emplace_back("Slope along the longest flow path, H/L", f.slope(c.slope_flow_path));
    items.emplace_back("Slope between 10 % and 85 % of L", f.slope(c.slope_10_85));
    items.emplace_back("Mean catchment slope", f.slope(c.mean_slope));
    if (!c.upstream_points.empty()) {
        std::string ids;
        for (const auto &id : c.upstream_points) {
            ids += (ids.empty() ? "" : ", ") + id;
        }
        items.emplace_back("Design points upstream", ids);
    }
    items.emplace_back("Time of concentration, tc",
                       sig(p.tc_min) + " min" +
                           (p.tc_method ? " (" + method_title(*p.tc_method) + ")" : ""));
    TableBlock t{columns(style::figure_columns_pt, {{"Figure", left}, {"Value", left}}), {}};
    for (const auto &[k, v] : items) {
        t.rows.push_back({{{esc(k)}, {bold(v)}}, std::nullopt});
    }
    out.emplace_back(std::move(t));
}

std::string percent(double share) { return fmt::format("{:.1f}", 100.0 * share); }

void land_table(const DesignPointResult &p, const Formats &f, std::vector<SheetBlock> &out) {
    const auto &w = p.land;
    if (w.parts.empty()) {
        return;
    }
    out.emplace_back(HeadingBlock{"Land cover and soils", Style::subheading});
    double total_m2 = 0.0;
    for (const auto &part : w.parts) {
        total_m2 += part.area_m2;
    }
    TableBlock t{columns(style::land_columns_pt, {{"Land cover", left},
                                                  {"Soil group", left},
                                                  {esc("Area (" + f.area_unit() + ")"), right},
                                                  {"Share (%)", right},
                                                  {"C", right},
                                                  {"CN", right},
                                                  {"Impervious (%)", right}}),
                 {}};
    for (const auto &part : w.parts) {
        t.rows.push_back(
            {{{esc(part.land_class)},
              {esc(part.soil_group)},
              {esc(f.area_value(part.area_m2))},
              {esc(fmt::format("{:.1f}", total_m2 > 0.0 ? 100.0 * part.area_m2 / total_m2 : 0.0))},
              {esc(sig(part.c, 3))},
              {esc(sig(part.cn, 3))},
              {esc(percent(part.impervious_share))}},
             std::nullopt});
    }
    t.rows.push_back({{{bold("Area-weighted")},
                       {""},
                       {bold(f.area_value(total_m2))},
                       {bold("100.0")},
                       {bold(sig(w.c_weighted, 3))},
                       {bold(sig(w.cn_weighted, 3))},
                       {bold(percent(w.impervious_share))}},
                      style::total_fill});
    out.emplace_back(std::move(t));
    std::string tables;
    if (!w.c_table.empty()) {
        tables += "C values from " + w.c_table + ". ";
    }
    if (!w.cn_table.empty()) {
        tables += "CN values from " + w.cn_table + ".";
    }
    if (!tables.empty()) {
        out.emplace_back(SpaceBlock{-style::table_note_pull_up_pt});
        out.emplace_back(ParagraphBlock{esc(tables), Style::small, style::dark_grey});
        out.emplace_back(SpaceBlock{style::note_gap_after_pt});
    }
}

void calc_lines(const DesignPointResult &p, std::vector<SheetBlock> &out) {
    if (p.lines.empty()) {
        return;
    }
    out.emplace_back(HeadingBlock{"Calculation", Style::subheading});
    TableBlock t{columns(style::line_columns_pt, {{"Line", left},
                                                  {"Quantity, equation, numbers put in", left},
                                                  {"Result", right},
                                                  {"Source", left}}),
                 {}};
    t.rows.reserve(p.lines.size());
    for (const auto &l : p.lines.lines()) {
        t.rows.push_back(calc_line_row(l));
    }
    out.emplace_back(std::move(t));
}

/// How a design point of a DEM was snapped, after its snap distance: the move's direction,
/// the rule, and the catchments under the given point, at the snapped cell and within the
/// radius.
std::string snap_text(const SnapFigures &s, const Formats &f) {
    const std::string radius = f.length(s.radius_m);
    std::string rule;
    if (s.rule == SnapRule::none) {
        rule = "not snapped: the cell under the point";
    } else if (s.no_stream_within_radius) {
        rule = "no stream cell within " + radius + ": the cell under the point";
    } else if (s.rule == SnapRule::nearest_stream) {
        rule = "to the nearest stream cell within " + radius;
    } else {
        rule = "to the cell of largest flow accumulation within " + radius;
    }
    return fmt::format("{}, {} ([settings] snap = \"{}\"). Catchment of the cell under the "
                       "given point {}, of the snapped cell {}; within the snap radius smallest "
                       "{}, largest {}.",
                       s.direction.empty() ? "" : " to the " + s.direction, rule,
                       option_key(snap_rule_options, s.rule), f.area(s.given_cell_area_m2),
                       f.area(s.snapped_area_m2), f.area(s.min_area_within_radius_m2),
                       f.area(s.max_area_within_radius_m2));
}

SheetSection design_point(const DesignPointResult &p, const Formats &f) {
    SheetSection s{"Design point " + p.id, {}};
    s.blocks.emplace_back(HeadingBlock{"Design point " + p.id});
    s.blocks.emplace_back(ParagraphBlock{
        esc(fmt::format("Given at ({}, {}); snapped to ({}, {}) (grid coordinates, m); snap "
                        "distance {}{} Catchment {}.",
                        coord(p.given_xy.first), coord(p.given_xy.second),
                        coord(p.snapped_xy.first), coord(p.snapped_xy.second),
                        f.length(p.snap_distance_m), p.snap ? snap_text(*p.snap, f) : ".",
                        p.from_table ? "from the catchment table" : "delineated from the DEM")),
        Style::small, style::dark_grey});
    s.blocks.emplace_back(SpaceBlock{style::note_gap_after_pt});
    warnings(p, s.blocks);
    if (p.map) {
        s.blocks.emplace_back(MapBlock{&*p.map, p.id});
    }
    figures(p, f, s.blocks);
    land_table(p, f, s.blocks);
    culvert_blocks(p, f.system(), s.blocks);
    calc_lines(p, s.blocks);
    for (const auto &pk : p.peaks) {
        if (pk.hydrograph && !pk.hydrograph->q_m3_s.empty()) {
            s.blocks.emplace_back(ChartBlock{fmt::format("Hyetograph and hydrograph, {}, {}",
                                                         return_period_title(pk.return_period_yr),
                                                         method_title(pk.method)),
                                             &*pk.hydrograph, p.id});
        }
    }
    return s;
}

// ----- references -------------------------------------------------------------------------------

SheetSection references(const RunResults &r) {
    SheetSection s{"References", {}};
    s.blocks.emplace_back(HeadingBlock{"References"});
    if (r.references.empty()) {
        s.blocks.emplace_back(ParagraphBlock{esc("No published source was used by this run.")});
        return s;
    }
    ListBlock list{{}, false};
    for (const auto &ref : r.references) {
        list.items.push_back(bold(ref.key) + "\n" + esc(ref.citation));
    }
    s.blocks.emplace_back(std::move(list));
    return s;
}

} // namespace

std::string warning_flag(const DesignPointResult &p) {
    std::string ids;
    for (const auto &l : p.lines.lines()) {
        if (l.kind == LineKind::warning) {
            ids += (ids.empty() ? "" : ", ") + l.id;
        }
    }
    if (ids.empty()) {
        return "";
    }
    return "<b>\u26a0 " + std::to_string(p.lines.warning_count()) + "</b>: " + esc(ids);
}

Row calc_line_row(const CalcLine &l) {
    const LineText t = text_of(l);
    std::string main = bold(t.label);
    std::string result;
    std::optional<Rgb> fill;
    if (l.kind == LineKind::warning) {
        main = "<b>\u26a0 WARNING: " + esc(t.label) + "</b>\n" + esc(t.numbers);
        fill = style::warn_fill;
    } else {
        if (!t.symbols.empty()) {
            main += "\n" + esc(t.symbols);
        }
        if (!t.numbers.empty()) {
            main += "\n" + esc(t.numbers);
        }
        if (std::isfinite(l.value())) {
            result = bold(sig(l.value())) + (t.unit.empty() ? "" : " " + esc(t.unit));
        }
        if (l.kind == LineKind::note) {
            main = "<i>" + main + "</i>";
        }
    }
    return {{{bold(l.id), Style::small}, {main}, {result}, {esc(t.source), Style::tiny}}, fill};
}

SheetDocument sheet_content(const RunResults &r) {
    const Formats f(r.project.units);
    SheetDocument doc;
    doc.system = r.project.units;
    doc.sections.push_back(cover(r));
    doc.sections.push_back(summary(r, f));
    for (const auto &p : r.points) {
        doc.sections.push_back(design_point(p, f));
    }
    doc.sections.push_back(references(r));
    doc.pdf = {"Calculation sheet: " + r.project.name, "catchpeak " + r.stamp.tool_version,
               r.stamp.run_time_utc};
    doc.frame.project =
        r.project.number.empty() ? r.project.name : r.project.name + " (" + r.project.number + ")";
    doc.frame.stamp = fmt::format("catchpeak {} · commit {} · run {}", r.stamp.tool_version,
                                  r.stamp.git_commit, r.stamp.run_time_utc);
    return doc;
}

} // namespace catchpeak::report
