// SPDX-License-Identifier: MIT
#include "catchpeak/io/storm_table.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/error.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <cctype>
#include <cmath>
#include <string>

namespace catchpeak::io {

namespace {

std::string required_metadata(const CsvTable &t, const char *key, const char *example) {
    const auto it = t.metadata.find(key);
    if (it == t.metadata.end() || it->second.empty()) {
        throw_input_error(t.source, fmt::format("no '# {}:' line", key),
                          fmt::format("a comment line '# {}: {}' before the header", key, example));
    }
    return it->second;
}

} // namespace

rain::StormDistribution storm_from_csv(const CsvTable &t) {
    rain::StormDistribution d;
    d.name = required_metadata(t, "name", "NRCS 24-hour Type II");
    d.source = required_metadata(t, "source", "TP-149 (1973) Table 1");
    d.status = required_metadata(t, "status", "checked (primary)");
    const std::size_t c_h = t.column("hour");
    const std::size_t c_f = t.column("cumulative_fraction");
    if (t.rows.size() < 2) {
        throw_input_error(t.source, fmt::format("{} rows", t.rows.size()),
                          "at least two rows, from 0 h to the end of the storm");
    }
    for (std::size_t r = 0; r < t.rows.size(); ++r) {
        const auto &row = t.rows[r];
        const double h = t.number(row, c_h);
        const double f = t.number(row, c_f);
        if (!std::isfinite(h) || h < 0.0) {
            throw_input_error(t.where(row, c_h), fmt::format("hour {}", sig(h)), "hours >= 0");
        }
        if (!std::isfinite(f) || f < 0.0 || f > 1.0) {
            throw_input_error(t.where(row, c_f), fmt::format("cumulative fraction {}", sig(f)),
                              "fractions from 0 to 1");
        }
        if (r == 0 && (h != 0.0 || f != 0.0)) {
            throw_input_error(t.where(row),
                              fmt::format("the first row is ({} h, {})", sig(h), sig(f)),
                              "a first row '0,0'");
        }
        if (r > 0 && !(h > d.hours.back())) {
            throw_input_error(t.where(row, c_h),
                              fmt::format("hour {} after {} h", sig(h), sig(d.hours.back())),
                              "hours in increasing order, each once");
        }
        if (r > 0 && f < d.cumulative_fraction.back()) {
            throw_input_error(t.where(row, c_f),
                              fmt::format("cumulative fraction {} after {}", sig(f),
                                          sig(d.cumulative_fraction.back())),
                              "cumulative fractions that never decrease");
        }
        if (r + 1 == t.rows.size() && f != 1.0) {
            throw_input_error(t.where(row, c_f),
                              fmt::format("the last cumulative fraction is {}", sig(f, 6)),
                              "a last row with fraction 1");
        }
        d.hours.push_back(h);
        d.cumulative_fraction.push_back(f);
    }
    rain::validate(d);
    return d;
}

rain::StormDistribution storm_from_csv(const CsvTable &t, double duration_h) {
    rain::StormDistribution d = storm_from_csv(t);
    if (std::abs(d.duration_h() - duration_h) > 1e-9 * duration_h) {
        throw_input_error(t.where(t.rows.back(), t.column("hour")),
                          fmt::format("the table ends at {:g} h", d.duration_h()),
                          fmt::format("a {:g}-hour distribution: a last row at {:g} h with "
                                      "fraction 1 (it is scaled by the {:g}-hour depth)",
                                      duration_h, duration_h, duration_h));
    }
    return d;
}

rain::StormDistribution read_storm_table(const std::filesystem::path &path) {
    return storm_from_csv(read_csv(path));
}

rain::StormDistribution read_storm_table(const std::filesystem::path &path, double duration_h) {
    return storm_from_csv(read_csv(path), duration_h);
}

std::filesystem::path nrcs_storm_file(const std::filesystem::path &config_dir,
                                      hydro::StormType type) {
    std::string lower;
    for (char ch : hydro::to_string(type)) {
        lower += static_cast<char>(std::tolower(static_cast<unsigned char>(ch)));
    }
    return config_dir / "storms" / fmt::format("nrcs_type_{}.csv", lower);
}

} // namespace catchpeak::io
