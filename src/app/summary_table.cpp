// SPDX-License-Identifier: MIT
// The summary table printed at the end of a run (the files are written by report).
#include "catchpeak/app/pipeline.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/report/sheet_units.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <string>
#include <utility>
#include <vector>

namespace catchpeak::app {

namespace {

/// Short method name for a column header.
std::string short_method(PeakMethod m) {
    switch (m) {
    case PeakMethod::rational:
        return std::string(key_of(m));
    case PeakMethod::tr55_graphical:
        return "TR-55";
    case PeakMethod::scs_unit_hydrograph:
        return "SCS UH";
    }
    return std::string(key_of(m));
}

} // namespace

std::string summary_table(const report::RunResults &r) {
    const bool us = r.project.units == units::System::us_customary;
    const std::string q_unit = us ? "ft3/s" : "m3/s";
    // The return periods and methods that any point has, in a fixed order.
    std::vector<double> periods;
    std::vector<PeakMethod> methods;
    for (const auto &dp : r.points) {
        for (const auto &pk : dp.peaks) {
            if (std::find(periods.begin(), periods.end(), pk.return_period_yr) == periods.end()) {
                periods.push_back(pk.return_period_yr);
            }
            if (std::find(methods.begin(), methods.end(), pk.method) == methods.end()) {
                methods.push_back(pk.method);
            }
        }
    }
    std::sort(periods.begin(), periods.end());
    std::sort(methods.begin(), methods.end()); // in the order of the enum
    const auto peak = [&](const report::DesignPointResult &dp, double rp, PeakMethod m) {
        for (const auto &pk : dp.peaks) {
            if (pk.return_period_yr == rp && pk.method == m) {
                return sig(us ? units::m3s_to_cfs(pk.q_m3_s) : pk.q_m3_s);
            }
        }
        return std::string("-");
    };
    const auto area = [&](const report::DesignPointResult &dp) {
        return sig(us ? units::m2_to_acre(dp.catchment.area_m2)
                      : units::m2_to_ha(dp.catchment.area_m2));
    };
    const std::string warnings_note =
        "warnings: warning lines of the point, listed on the calculation sheet\n";
    std::string s =
        fmt::format("{:<12} {:>10} {:>8}", "point", us ? "area ac" : "area ha", "tc min");
    if (methods.size() <= 1) {
        // One method: a row per point, a column per return period.
        for (const double rp : periods) {
            s += fmt::format(" {:>12}", fmt::format("Q{} {}", rp, q_unit));
        }
        s += "  warnings\n";
        for (const auto &dp : r.points) {
            s += fmt::format("{:<12} {:>10} {:>8}", dp.id, area(dp), sig(dp.tc_min));
            for (const double rp : periods) {
                s += fmt::format(" {:>12}", methods.empty() ? "-" : peak(dp, rp, methods[0]));
            }
            s += fmt::format("  {}\n", dp.lines.warning_count());
        }
        s += fmt::format("QT: peak flow of return period T years by {}; {}",
                         methods.empty() ? "no method" : "the " + report::method_title(methods[0]),
                         warnings_note);
        return s;
    }
    // Several methods: a row per point and return period, a column per method, so that the
    // table stays narrow enough for a terminal.
    s += fmt::format(" {:>6}", "T yr");
    for (const auto &m : methods) {
        s += fmt::format(" {:>14}", fmt::format("{} {}", short_method(m), q_unit));
    }
    s += "  warnings\n";
    for (const auto &dp : r.points) {
        bool first = true;
        for (const double rp : periods) {
            if (first) {
                s += fmt::format("{:<12} {:>10} {:>8}", dp.id, area(dp), sig(dp.tc_min));
            } else {
                s += fmt::format("{:<12} {:>10} {:>8}", "", "", "");
            }
            s += fmt::format(" {:>6}", rp);
            for (const auto &m : methods) {
                s += fmt::format(" {:>14}", peak(dp, rp, m));
            }
            s += first ? fmt::format("  {}\n", dp.lines.warning_count()) : "\n";
            first = false;
        }
    }
    s += "T: return period; " + warnings_note;
    return s;
}

} // namespace catchpeak::app
