// SPDX-License-Identifier: MIT
// The message of the InputError a piece of code throws, so that tests can check what a user
// would read.
#pragma once

#include "catchpeak/core/error.hpp"

#include <gtest/gtest.h>

#include <string>

namespace catchpeak::test {

/// The InputError message of `fn`, or "" (and a test failure) when it throws none.
template <typename F> std::string input_error_of(F &&fn) {
    try {
        fn();
    } catch (const InputError &e) {
        return e.what();
    }
    ADD_FAILURE() << "no InputError thrown";
    return {};
}

} // namespace catchpeak::test
