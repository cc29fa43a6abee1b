// SPDX-License-Identifier: MIT
#include "catchpeak/report/summary_csv.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/files.hpp"
#include "catchpeak/report/sheet_units.hpp"

#include <fmt/format.h>

namespace catchpeak::report {

namespace {

/// A CSV field, quoted (RFC 4180) when it holds a comma, a quote or a line break.
std::string field(std::string_view text) {
    if (text.find_first_of(",\"\r\n") == std::string_view::npos) {
        return std::string(text);
    }
    std::string out = "\"";
    for (char c : text) {
        if (c == '"') {
            out += '"';
        }
        out += c;
    }
    out += '"';
    return out;
}

} // namespace

std::string summary_csv(const RunResults &results) {
    const auto system = results.project.units;
    std::string out = fmt::format("design_point,return_period_yr,method,area_{},tc_min,q_{},"
                                  "peak_line_id,warning_count\n",
                                  area_key_unit(system), flow_key_unit(system));
    for (const auto &p : results.points) {
        const auto area = sheet_area(p.catchment.area_m2, system);
        const auto warnings = p.lines.warning_count();
        for (const auto &pk : p.peaks) {
            out +=
                fmt::format("{},{:g},{},{},{},{},{},{}\n", field(p.id), pk.return_period_yr,
                            field(key_of(pk.method)), sig(area.value), sig(p.tc_min),
                            sig(sheet_flow(pk.q_m3_s, system).value), field(pk.line_id), warnings);
        }
    }
    return out;
}

void write_summary_csv(const RunResults &results, const std::filesystem::path &dir) {
    write_text_file_atomic(dir / summary_file_name, summary_csv(results));
}

} // namespace catchpeak::report
