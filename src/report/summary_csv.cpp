// SPDX-License-Identifier: MIT
#include "catchpeak/report/summary_csv.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/csv.hpp"
#include "catchpeak/core/files.hpp"
#include "catchpeak/report/sheet_units.hpp"

#include <fmt/format.h>

#include <algorithm>

namespace catchpeak::report {

namespace {

bool has_culverts(const RunResults &results) {
    return std::any_of(results.points.begin(), results.points.end(),
                       [](const DesignPointResult &p) { return p.culvert.has_value(); });
}

/// The columns a run with culverts adds after the peak columns (empty on the peak rows).
void culvert_header(CsvWriter &csv, units::System system) {
    const auto len = length_key_unit(system);
    const auto flow = flow_key_unit(system);
    csv.field("culvert_size")
        .field("size_basis")
        .field("barrels")
        .field(fmt::format("culvert_flow_{}", flow))
        .field(fmt::format("road_flow_{}", flow))
        .field(fmt::format("headwater_{}", len))
        .field(fmt::format("headwater_elevation_{}", len))
        .field("hw_over_d")
        .field("control")
        .field(fmt::format("outlet_velocity_{}", velocity_key_unit(system)))
        .field("passes")
        .field("headwater_line_id");
}

constexpr int culvert_column_count = 12;

std::string_view size_basis(const CulvertResult &c) {
    if (!c.sized) {
        return "given";
    }
    return c.size_found ? "chosen" : "largest, fails";
}

/// One row per flow the culvert of `p` was checked for: the point's columns with method
/// "culvert", q the flow at the crossing and peak_line_id the line of the peak it is.
void culvert_rows(CsvWriter &csv, const DesignPointResult &p, units::System system) {
    const CulvertResult &c = *p.culvert;
    const auto area = sheet_area(p.catchment.area_m2, system);
    const auto len = [&](double m) { return sig(sheet_length(m, system).value); };
    const auto flow = [&](double q) { return sig(sheet_flow(q, system).value); };
    const std::string size = culvert_size_title(c.shape == "box", c.span_m, c.rise_m, system);
    for (const auto &k : c.cases) {
        csv.field(p.id)
            .field(fmt::format("{:g}", k.return_period_yr))
            .field("culvert")
            .field(sig(area.value))
            .field(sig(p.tc_min))
            .field(flow(k.flow_m3_s))
            .field(k.flow_line_id)
            .count(p.lines.warning_count())
            .field(size)
            .field(size_basis(c))
            .count(static_cast<std::size_t>(c.barrels))
            .field(flow(k.culvert_flow_m3_s))
            .field(flow(k.overtopping_flow_m3_s))
            .field(len(k.headwater_m))
            // An elevation at a fixed 0.001 m or 0.01 ft, as the sheet prints it.
            .field(fmt::format("{:.{}f}", sheet_length(k.headwater_elevation_m, system).value,
                               system == units::System::us_customary ? 2 : 3))
            .field(sig(k.headwater_m / c.rise_m))
            .field(k.control)
            .field(sig(sheet_velocity(k.outlet_velocity_m_per_s, system).value))
            .field(k.passes ? "yes" : "no")
            .field(k.headwater_line_id)
            .end_row();
    }
}

} // namespace

std::string summary_csv(const RunResults &results) {
    const auto system = results.project.units;
    const bool culverts = has_culverts(results);
    CsvWriter csv;
    csv.field("design_point")
        .field("return_period_yr")
        .field("method")
        .field(fmt::format("area_{}", area_key_unit(system)))
        .field("tc_min")
        .field(fmt::format("q_{}", flow_key_unit(system)))
        .field("peak_line_id")
        .field("warning_count");
    if (culverts) {
        culvert_header(csv, system);
    }
    csv.end_row();
    for (const auto &p : results.points) {
        const auto area = sheet_area(p.catchment.area_m2, system);
        const auto warnings = p.lines.warning_count();
        for (const auto &pk : p.peaks) {
            // Numbers as the sheet prints them (4 significant figures), not at full precision.
            csv.field(p.id)
                .field(fmt::format("{:g}", pk.return_period_yr))
                .field(key_of(pk.method))
                .field(sig(area.value))
                .field(sig(p.tc_min))
                .field(sig(sheet_flow(pk.q_m3_s, system).value))
                .field(pk.line_id)
                .count(warnings);
            for (int i = 0; culverts && i < culvert_column_count; ++i) {
                csv.field("");
            }
            csv.end_row();
        }
        if (p.culvert) {
            culvert_rows(csv, p, system);
        }
    }
    return csv.text();
}

void write_summary_csv(const RunResults &results, const std::filesystem::path &dir) {
    write_text_file_atomic(dir / summary_file_name, summary_csv(results));
}

} // namespace catchpeak::report
