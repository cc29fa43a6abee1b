// SPDX-License-Identifier: MIT
// Fuzz target: the land tables (runoff coefficients, curve numbers, impervious shares), each
// reader given the same bytes as its file's text.
#include "fuzz_input.hpp"

#include "catchpeak/core/csv.hpp"
#include "catchpeak/land/tables.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t *data, std::size_t size) {
    using namespace catchpeak;
    const std::string_view text = fuzz::as_text(data, size);
    fuzz::parse_or_input_error([&] {
        const auto t = land::RunoffCoefficientTable::from_csv(parse_csv(text, "fuzz/c.csv"));
        (void)t;
    });
    fuzz::parse_or_input_error([&] {
        const auto t = land::CurveNumberTable::from_csv(parse_csv(text, "fuzz/cn.csv"));
        (void)t;
    });
    return fuzz::parse_or_input_error([&] {
        const auto t = land::ImperviousShareTable::from_csv(parse_csv(text, "fuzz/imp.csv"));
        (void)t;
    });
}
