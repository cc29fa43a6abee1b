// SPDX-License-Identifier: MIT
#include "catchpeak/project/options.hpp"

namespace catchpeak::project {

UncoveredLand parse_uncovered_land(std::string_view text) {
    if (text == refuse_uncovered_key) {
        return RefuseUncovered{};
    }
    return UncoveredAsClass{std::string(text)};
}

std::string uncovered_land_key(const UncoveredLand &u) {
    if (const auto *c = std::get_if<UncoveredAsClass>(&u)) {
        return c->land_class;
    }
    return std::string(refuse_uncovered_key);
}

} // namespace catchpeak::project
