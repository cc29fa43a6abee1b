// SPDX-License-Identifier: MIT
// Fuzz target: the design storm distribution reader, with the bytes as the file's text; a
// distribution it accepts is also read at mid-storm.
#include "fuzz_input.hpp"

#include "catchpeak/core/csv.hpp"
#include "catchpeak/io/storm_table.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t *data, std::size_t size) {
    using namespace catchpeak;
    return fuzz::parse_or_input_error([&] {
        const auto storm =
            io::storm_from_csv(parse_csv(fuzz::as_text(data, size), "fuzz/storm.csv"));
        const double mid = rain::cumulative_fraction_at(storm, 0.5 * storm.duration_h());
        (void)mid;
    });
}
