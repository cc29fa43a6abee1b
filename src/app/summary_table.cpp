// SPDX-License-Identifier: MIT
// The summary table printed at the end of a run (the files are written by report).
#include "catchpeak/app/pipeline.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/report/sheet_units.hpp"

#include <fmt/format.h>
#include <glib.h>

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

/// Width of the point column, in terminal columns.
constexpr std::size_t id_columns = 12;

/// Terminal columns a character takes: 2 for East Asian wide and fullwidth characters, 0 for
/// combining marks and other zero-width characters, 1 otherwise (glib's Unicode tables).
std::size_t char_columns(gunichar c) {
    if (g_unichar_iszerowidth(c)) {
        return 0;
    }
    return g_unichar_iswide(c) ? 2 : 1;
}

/// An id cut into pieces of at most `columns` terminal columns each, never inside a character
/// (a wide character that does not fit goes to the next piece), each piece padded with blanks
/// to `columns`. Bytes that are not UTF-8 count one column each, as a terminal shows them as
/// one replacement character.
std::vector<std::string> id_pieces(const std::string &id, std::size_t columns) {
    std::vector<std::string> pieces;
    std::string piece;
    std::size_t width = 0;
    const auto close = [&] {
        pieces.push_back(piece + std::string(columns - width, ' '));
        piece.clear();
        width = 0;
    };
    for (std::size_t i = 0; i < id.size();) {
        const gchar *at = id.data() + i;
        const gunichar c = g_utf8_get_char_validated(at, static_cast<gssize>(id.size() - i));
        const bool valid = c != static_cast<gunichar>(-1) && c != static_cast<gunichar>(-2);
        const std::size_t bytes = valid ? static_cast<std::size_t>(g_utf8_next_char(at) - at) : 1;
        const std::size_t w = valid ? char_columns(c) : 1;
        if (width + w > columns) {
            close();
        }
        piece.append(id, i, bytes);
        width += w;
        i += bytes;
    }
    if (!piece.empty() || pieces.empty()) {
        close();
    }
    return pieces;
}

/// A piece without its padding, for a line that holds nothing else.
std::string trimmed(const std::string &piece) {
    return piece.substr(0, piece.find_last_not_of(' ') + 1);
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
            // A long id goes on in the point column of the lines below its row.
            const auto pieces = id_pieces(dp.id, id_columns);
            s += fmt::format("{} {:>10} {:>8}", pieces[0], area(dp), sig(dp.tc_min));
            for (const double rp : periods) {
                s += fmt::format(" {:>12}", methods.empty() ? "-" : peak(dp, rp, methods[0]));
            }
            s += fmt::format("  {}\n", dp.lines.warning_count());
            for (std::size_t k = 1; k < pieces.size(); ++k) {
                s += trimmed(pieces[k]) + "\n";
            }
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
        // A long id goes on in the point column of the rows below, and of lines of its own
        // when the point has fewer rows than pieces.
        const auto pieces = id_pieces(dp.id, id_columns);
        const std::string blank(id_columns, ' ');
        std::size_t k = 0;
        for (const double rp : periods) {
            const std::string &name = k < pieces.size() ? pieces[k] : blank;
            if (k == 0) {
                s += fmt::format("{} {:>10} {:>8}", name, area(dp), sig(dp.tc_min));
            } else {
                s += fmt::format("{} {:>10} {:>8}", name, "", "");
            }
            s += fmt::format(" {:>6}", rp);
            for (const auto &m : methods) {
                s += fmt::format(" {:>14}", peak(dp, rp, m));
            }
            s += k == 0 ? fmt::format("  {}\n", dp.lines.warning_count()) : "\n";
            ++k;
        }
        for (; k < pieces.size(); ++k) {
            s += trimmed(pieces[k]) + "\n";
        }
    }
    s += "T: return period; " + warnings_note;
    return s;
}

} // namespace catchpeak::app
