// SPDX-License-Identifier: MIT
#include "catchpeak/core/limits.hpp"

#include <fmt/format.h>

namespace catchpeak::limits {

std::string Range::interval() const {
    return fmt::format("{}{}, {}{}", min_inclusive ? '[' : '(', min, max,
                       max_inclusive ? ']' : ')');
}

} // namespace catchpeak::limits
