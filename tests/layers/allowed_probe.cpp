// SPDX-License-Identifier: MIT
// A header that the pure modules use: with the same include path as the guarded probes, this
// compiles, so the guarded probes fail because of their header and nothing else.
#include "catchpeak/core/calc_line.hpp"

#include <fmt/format.h>

#include <string>

std::string probe_text() { return catchpeak::sig(1.0) + fmt::format("{}", 1); }
