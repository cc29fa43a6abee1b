// SPDX-License-Identifier: MIT
// Fuzz target: the IDF table reader (table and formula forms), with the bytes as the file's
// text; an IDF it accepts is also asked for an intensity.
#include "fuzz_input.hpp"

#include "catchpeak/core/csv.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/io/idf_csv.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t *data, std::size_t size) {
    using namespace catchpeak;
    return fuzz::parse_or_input_error([&] {
        const rain::Idf idf =
            io::idf_from_csv(parse_csv(fuzz::as_text(data, size), "fuzz/idf.csv"));
        const auto range = idf.duration_range_min();
        const double t_min = range ? 0.5 * (range->first + range->second) : 10.0;
        for (const double t_r : idf.return_periods_yr()) {
            const auto i = idf.intensity(t_min, t_r, units::System::us_customary);
            (void)i;
        }
    });
}
