// SPDX-License-Identifier: MIT
// What the sheet says of a culvert: its description, the table of the flows checked and the
// performance curve's block. No cairo.
#include "internal/sheet_culvert.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/report/sheet_units.hpp"

#include <fmt/format.h>

#include <optional>

namespace catchpeak::report {

using style::Style;

namespace {

constexpr PangoAlignment left = PANGO_ALIGN_LEFT;
constexpr PangoAlignment right = PANGO_ALIGN_RIGHT;

std::string size_basis_words(const CulvertResult &c) {
    if (!c.sized) {
        return "size given";
    }
    return c.size_found ? "size chosen from the standard sizes"
                        : "no standard size passes: the largest is checked";
}

std::string description(const CulvertResult &c, units::System system) {
    const std::string unit(sheet_length(0.0, system).unit);
    std::string s = fmt::format(
        "{} {}, {} barrel{} of {} ({}); inlet {}; length {} {}; inverts {} {} (inlet) and {} "
        "{} (outlet)",
        c.shape == "box" ? "Box" : "Circular", c.shape == "box" ? "culvert" : "pipe", c.barrels,
        c.barrels == 1 ? "" : "s", culvert_size_title(c.shape == "box", c.span_m, c.rise_m, system),
        size_basis_words(c), c.inlet, sig(sheet_length(c.length_m, system).value), unit,
        elevation_text(c.inlet_invert_m, system), unit, elevation_text(c.outlet_invert_m, system),
        unit);
    if (c.crest_elevation_m) {
        s += fmt::format("; road crest {} {}", elevation_text(*c.crest_elevation_m, system), unit);
    }
    return s + ".";
}

std::vector<Column> table_columns(units::System system) {
    const std::string q = "(" + std::string(sheet_flow(0.0, system).unit) + ")";
    const std::string len = "(" + std::string(sheet_length(0.0, system).unit) + ")";
    const std::string v = "(" + std::string(sheet_velocity(0.0, system).unit) + ")";
    const std::vector<std::pair<std::string, PangoAlignment>> titles = {
        {"Return\nperiod", left},
        {esc("Flow Q\n" + q), right},
        {esc("Barrels Qc\n" + q), right},
        {esc("Road Qr\n" + q), right},
        {esc("HW elev.\n" + len), right},
        {"HW/D", right},
        {"Control", left},
        {esc("Outlet V\n" + v), right},
        {esc("Allowed HW\nelev. " + len), right},
        {"Check", left},
        {"Line", left}};
    std::vector<Column> cols;
    for (std::size_t i = 0; i < titles.size(); ++i) {
        cols.push_back({titles[i].first, style::culvert_columns_pt[i], titles[i].second});
    }
    return cols;
}

Row case_row(const CulvertResult &c, const CulvertCase &k, units::System system) {
    const auto flow = [&](double q) { return esc(sig(sheet_flow(q, system).value)); };
    const std::string rp = return_period_title(k.return_period_yr) + (k.design ? " (design)" : "");
    const std::optional<style::Rgb> fill =
        k.passes ? std::nullopt : std::optional<style::Rgb>(style::warn_fill);
    return {{{k.design ? bold(rp) : esc(rp)},
             {flow(k.flow_m3_s)},
             {flow(k.culvert_flow_m3_s)},
             {flow(k.overtopping_flow_m3_s)},
             {bold(elevation_text(k.headwater_elevation_m, system))},
             {esc(sig(k.headwater_m / c.rise_m))},
             {esc(k.control)},
             {esc(sig(sheet_velocity(k.outlet_velocity_m_per_s, system).value))},
             {esc(elevation_text(c.inlet_invert_m + k.allowed_headwater_m, system))},
             {k.passes ? esc("passes") : bold("\u26a0 fails")},
             {esc(k.headwater_line_id), Style::small}},
            fill};
}

} // namespace

std::string elevation_text(double elevation_m, units::System system) {
    return fmt::format("{:.{}f}", sheet_length(elevation_m, system).value,
                       system == units::System::us_customary ? 2 : 3);
}

void culvert_blocks(const DesignPointResult &p, units::System system,
                    std::vector<SheetBlock> &out) {
    if (!p.culvert) {
        return;
    }
    const CulvertResult &c = *p.culvert;
    out.emplace_back(HeadingBlock{"Culvert at design point " + p.id, Style::subheading});
    out.emplace_back(ParagraphBlock{
        esc(description(c, system) +
            " HW is the controlling headwater (the higher of inlet and outlet control, FHWA "
            "HDS-5), Qc the flow through the barrels and Qr over the road at that headwater; "
            "the line named gives HW."),
        Style::small, style::dark_grey});
    out.emplace_back(SpaceBlock{style::note_gap_after_pt});
    TableBlock t{table_columns(system), {}};
    for (const auto &k : c.cases) {
        t.rows.push_back(case_row(c, k, system));
    }
    out.emplace_back(std::move(t));
    if (c.curve.size() > 1) {
        out.emplace_back(CulvertCurveBlock{std::string(culvert_curve_title), &c});
    }
}

} // namespace catchpeak::report
