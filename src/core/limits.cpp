// SPDX-License-Identifier: MIT
#include "catchpeak/core/limits.hpp"

#include <fmt/format.h>

namespace catchpeak::limits {

std::string Range::interval() const {
    return fmt::format("{}{}, {}{}", min_inclusive ? '[' : '(', min, max,
                       max_inclusive ? ']' : ')');
}

std::string Range::accepted(std::string_view symbol) const {
    return fmt::format("{} {} {} {} {} ({})", min, min_inclusive ? "<=" : "<", symbol,
                       max_inclusive ? "<=" : "<", max, reason);
}

} // namespace catchpeak::limits
