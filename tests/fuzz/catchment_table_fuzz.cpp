// SPDX-License-Identifier: MIT
// Fuzz target: the catchment table (CSV) reader, with the bytes as the file's text.
#include "fuzz_input.hpp"

#include "catchpeak/app/inputs.hpp"
#include "catchpeak/core/csv.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t *data, std::size_t size) {
    using namespace catchpeak;
    return fuzz::parse_or_input_error([&] {
        const auto rows = app::catchment_table_from_csv(
            parse_csv(fuzz::as_text(data, size), "fuzz/catchments.csv"));
        (void)rows;
    });
}
