// SPDX-License-Identifier: MIT
// Fuzz target: the project file (TOML) parser, with the bytes as the file's text.
#include "fuzz_input.hpp"

#include "catchpeak/project/project.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t *data, std::size_t size) {
    using namespace catchpeak;
    return fuzz::parse_or_input_error([&] {
        project::Problems problems;
        const auto p =
            project::parse_project(fuzz::as_text(data, size), "fuzz/project.toml", problems);
        (void)p;
        problems.throw_if_any();
    });
}
