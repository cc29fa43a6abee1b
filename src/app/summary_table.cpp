// SPDX-License-Identifier: MIT
// The summary table printed at the end of a run (the files are written by report).
#include "catchpeak/app/pipeline.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <set>

namespace catchpeak::app {

std::string summary_table(const report::RunResults &r) {
    const bool us = r.project.units == units::System::us_customary;
    std::set<double> rps;
    for (const auto &dp : r.points) {
        for (const auto &pk : dp.peaks) {
            rps.insert(pk.return_period_yr);
        }
    }
    std::string s =
        fmt::format("{:<12} {:>10} {:>8}", "point", us ? "area ac" : "area ha", "tc min");
    for (double rp : rps) {
        s += fmt::format(" {:>12}", fmt::format("Q{} {}", rp, us ? "ft3/s" : "m3/s"));
    }
    s += "  warnings\n";
    for (const auto &dp : r.points) {
        const double a =
            us ? units::m2_to_acre(dp.catchment.area_m2) : units::m2_to_ha(dp.catchment.area_m2);
        s += fmt::format("{:<12} {:>10} {:>8}", dp.id, sig(a), sig(dp.tc_min));
        for (double rp : rps) {
            std::string q = "-";
            for (const auto &pk : dp.peaks) {
                if (pk.return_period_yr == rp && pk.method == "rational") {
                    q = sig(us ? units::m3s_to_cfs(pk.q_m3_s) : pk.q_m3_s);
                }
            }
            s += fmt::format(" {:>12}", q);
        }
        s += fmt::format("  {}\n", dp.lines.warning_count());
    }
    return s;
}

} // namespace catchpeak::app
