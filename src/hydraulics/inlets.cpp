// SPDX-License-Identifier: MIT
#include "catchpeak/hydraulics/inlets.hpp"

#include "sheet.hpp"

#include <algorithm>
#include <cmath>

namespace catchpeak::hydraulics {

InletTable::InletTable(std::vector<InletRow> rows) : rows_(std::move(rows)) {
    for (std::size_t i = 0; i < rows_.size(); ++i) {
        const InletRow &r = rows_[i];
        const std::string where = "culvert inlet table, row '" + r.key + "'";
        if (r.key.empty()) {
            throw_input_error("culvert inlet table, row " + std::to_string(i + 1),
                              "the row has no key", "a key such as concrete_square_headwall");
        }
        detail::require_positive(where + ": K", r.k);
        detail::require_positive(where + ": M", r.m);
        detail::require_positive(where + ": c", r.c);
        detail::require_non_negative(where + ": ke", r.ke);
        if (!std::isfinite(r.y) || !std::isfinite(r.ks)) {
            throw_input_error(where, "Y or Ks is not a number", "finite Y and Ks");
        }
        const auto same = [&](const InletRow &o) { return o.key == r.key; };
        if (std::count_if(rows_.begin(), rows_.end(), same) > 1) {
            throw_input_error(where, "the key is listed twice", "each key once");
        }
    }
}

const InletRow &InletTable::at(std::string_view key) const {
    for (const auto &r : rows_) {
        if (r.key == key) {
            return r;
        }
    }
    std::string keys;
    for (const auto &r : rows_) {
        keys += (keys.empty() ? "" : ", ") + r.key;
    }
    throw_input_error("culvert inlet '" + std::string(key) + "'", "not in the inlet table", keys);
}

} // namespace catchpeak::hydraulics
