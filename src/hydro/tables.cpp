// SPDX-License-Identifier: MIT
#include "catchpeak/hydro/tables.hpp"

#include "catchpeak/core/error.hpp"

#include <algorithm>
#include <cctype>

namespace catchpeak::hydro {

std::string TableOrigin::cite() const {
    std::string text = source.empty() ? std::string("table without source") : source;
    std::string detail = file.empty() ? std::string() : "table " + file;
    if (!status.empty()) {
        detail += (detail.empty() ? "" : "; ") + status;
    }
    if (!detail.empty()) {
        text += " [" + detail + "]";
    }
    return text;
}

std::string to_string(StormType t) { return std::string(option_key(storm_type_options, t)); }

StormType parse_storm_type(const std::string &text, const std::string &where) {
    std::string t;
    for (char ch : text) {
        if (ch != ' ') {
            t += static_cast<char>(std::toupper(static_cast<unsigned char>(ch)));
        }
    }
    if (t.rfind("TYPE", 0) == 0) {
        t = t.substr(4);
    }
    if (const auto v = find_option(storm_type_options, t)) {
        return *v;
    }
    std::string accepted;
    for (const auto &o : storm_type_options) {
        accepted += (accepted.empty() ? "" : ", ") + std::string(o.key);
    }
    throw_input_error(where, "storm type '" + text + "' is not known", accepted);
}

double DimensionlessUnitHydrograph::ratio_at(double x) const {
    if (t_over_tp.empty() || x <= t_over_tp.front() || x >= t_over_tp.back()) {
        return 0.0;
    }
    const auto it = std::upper_bound(t_over_tp.begin(), t_over_tp.end(), x);
    const auto i = static_cast<std::size_t>(it - t_over_tp.begin());
    const double x0 = t_over_tp[i - 1];
    const double x1 = t_over_tp[i];
    const double w = (x - x0) / (x1 - x0);
    return q_over_qp[i - 1] + w * (q_over_qp[i] - q_over_qp[i - 1]);
}

} // namespace catchpeak::hydro
