// SPDX-License-Identifier: MIT
#include "catchpeak/core/error.hpp"

namespace catchpeak {

std::string input_message(const std::string &where, const std::string &what,
                          const std::string &accepted) {
    std::string msg = where.empty() ? what : where + ": " + what;
    if (!accepted.empty()) {
        msg += "; accepted: " + accepted;
    }
    return msg;
}

void throw_input_error(const std::string &where, const std::string &what,
                       const std::string &accepted) {
    throw InputError(input_message(where, what, accepted));
}

} // namespace catchpeak
