// SPDX-License-Identifier: MIT
#include "catchpeak/report/summary_csv.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/csv.hpp"
#include "catchpeak/core/files.hpp"
#include "catchpeak/report/sheet_units.hpp"

#include <fmt/format.h>

namespace catchpeak::report {

std::string summary_csv(const RunResults &results) {
    const auto system = results.project.units;
    CsvWriter csv;
    csv.field("design_point")
        .field("return_period_yr")
        .field("method")
        .field(fmt::format("area_{}", area_key_unit(system)))
        .field("tc_min")
        .field(fmt::format("q_{}", flow_key_unit(system)))
        .field("peak_line_id")
        .field("warning_count")
        .end_row();
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
                .count(warnings)
                .end_row();
        }
    }
    return csv.text();
}

void write_summary_csv(const RunResults &results, const std::filesystem::path &dir) {
    write_text_file_atomic(dir / summary_file_name, summary_csv(results));
}

} // namespace catchpeak::report
