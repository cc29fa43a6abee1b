// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/error.hpp"

#include <cstddef>
#include <cstdint>
#include <string_view>

/// What every fuzz target shares: the bytes as text, and the rule that a parser given any bytes
/// either returns or throws InputError (the user's fault, exit 2). Any other exception escapes
/// the target, and libFuzzer reports it as a crash, like a sanitizer's finding.
namespace catchpeak::fuzz {

inline std::string_view as_text(const std::uint8_t *data, std::size_t size) {
    // A char may alias any object's bytes; libFuzzer's buffer is plain bytes.
    return {reinterpret_cast<const char *>(data), size};
}

template <class Parse> int parse_or_input_error(Parse &&parse) {
    try {
        parse();
    } catch (const InputError &) {
        // Expected for most inputs: the message names the file, line and column.
    }
    return 0;
}

} // namespace catchpeak::fuzz
