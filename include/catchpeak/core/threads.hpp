// SPDX-License-Identifier: MIT
#pragma once

#include <cstddef>
#include <exception>
#include <thread>
#include <vector>

namespace catchpeak {

/// Runs body(t) for t in [0, n) on n threads (the calling thread takes t = 0) and rethrows the
/// first exception a body threw once all have finished.
template <typename Body> void run_on_threads(std::size_t n, Body body) {
    std::vector<std::exception_ptr> errors(n);
    const auto guarded = [&](std::size_t t) {
        try {
            body(t);
        } catch (...) {
            errors[t] = std::current_exception();
        }
    };
    std::vector<std::thread> pool;
    pool.reserve(n);
    for (std::size_t t = 1; t < n; ++t) {
        pool.emplace_back(guarded, t);
    }
    if (n > 0) {
        guarded(0);
    }
    for (auto &th : pool) {
        th.join();
    }
    for (const auto &e : errors) {
        if (e) {
            std::rethrow_exception(e);
        }
    }
}

} // namespace catchpeak
