// SPDX-License-Identifier: MIT
// The summary table printed at the end of a run (the files are written by report).
#include "catchpeak/app/pipeline.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <string>
#include <utility>
#include <vector>

namespace catchpeak::app {

namespace {

/// Short method name for a column header.
std::string short_method(const std::string &m) {
    if (m == "rational") {
        return "rational";
    }
    if (m == "tr55_graphical") {
        return "TR-55";
    }
    if (m == "scs_unit_hydrograph") {
        return "SCS UH";
    }
    return m;
}

int method_order(const std::string &m) {
    if (m == "rational") {
        return 0;
    }
    if (m == "tr55_graphical") {
        return 1;
    }
    if (m == "scs_unit_hydrograph") {
        return 2;
    }
    return 3;
}

} // namespace

std::string summary_table(const report::RunResults &r) {
    const bool us = r.project.units == units::System::us_customary;
    // One column per return period and method that any point has, in a fixed order.
    std::vector<std::pair<double, std::string>> cols;
    for (const auto &dp : r.points) {
        for (const auto &pk : dp.peaks) {
            const std::pair<double, std::string> c{pk.return_period_yr, pk.method};
            if (std::find(cols.begin(), cols.end(), c) == cols.end()) {
                cols.push_back(c);
            }
        }
    }
    std::sort(cols.begin(), cols.end(), [](const auto &a, const auto &b) {
        return a.first != b.first ? a.first < b.first
                                  : method_order(a.second) < method_order(b.second);
    });
    const bool one_method = std::all_of(cols.begin(), cols.end(),
                                        [&](const auto &c) { return c.second == "rational"; });
    std::string s =
        fmt::format("{:<12} {:>10} {:>8}", "point", us ? "area ac" : "area ha", "tc min");
    for (const auto &[rp, m] : cols) {
        const std::string head =
            one_method ? fmt::format("Q{} {}", rp, us ? "ft3/s" : "m3/s")
                       : fmt::format("Q{} {} {}", rp, short_method(m), us ? "ft3/s" : "m3/s");
        s += fmt::format(" {:>{}}", head, one_method ? 12 : 20);
    }
    s += "  warnings\n";
    for (const auto &dp : r.points) {
        const double a =
            us ? units::m2_to_acre(dp.catchment.area_m2) : units::m2_to_ha(dp.catchment.area_m2);
        s += fmt::format("{:<12} {:>10} {:>8}", dp.id, sig(a), sig(dp.tc_min));
        for (const auto &[rp, m] : cols) {
            std::string q = "-";
            for (const auto &pk : dp.peaks) {
                if (pk.return_period_yr == rp && pk.method == m) {
                    q = sig(us ? units::m3s_to_cfs(pk.q_m3_s) : pk.q_m3_s);
                }
            }
            s += fmt::format(" {:>{}}", q, one_method ? 12 : 20);
        }
        s += fmt::format("  {}\n", dp.lines.warning_count());
    }
    return s;
}

} // namespace catchpeak::app
