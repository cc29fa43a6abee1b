// SPDX-License-Identifier: MIT
#include "catchpeak/core/units.hpp"

#include "catchpeak/core/error.hpp"

#include <algorithm>
#include <cctype>
#include <string>

namespace catchpeak::units {

std::string_view to_string(System s) noexcept { return s == System::si ? "SI" : "US customary"; }

System parse_system(std::string_view text, std::string_view where) {
    std::string lower(text);
    std::transform(lower.begin(), lower.end(), lower.begin(),
                   [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
    if (lower == "si" || lower == "metric") {
        return System::si;
    }
    if (lower == "us" || lower == "us_customary" || lower == "us customary") {
        return System::us_customary;
    }
    throw_input_error(std::string(where), "unknown unit system '" + std::string(text) + "'",
                      "\"SI\" or \"US\"");
}

} // namespace catchpeak::units
