// SPDX-License-Identifier: MIT
// Culvert sizing: 1,000 culverts at 4 flows each, sized from 12 standard pipe sizes (every
// analysis with its lines), then for each the split with a road crest at every flow and a
// performance curve of 40 steps to 1.5 times the largest flow. Prints figures; not a timed test.
#include "catchpeak/hydraulics/culvert.hpp"
#include "catchpeak/hydraulics/overtopping.hpp"

#include "hydraulics/inlet_rows.hpp"

#include <sys/resource.h>

#include <chrono>
#include <cstdio>
#include <vector>

int main() {
    using namespace catchpeak;
    using namespace catchpeak::hydraulics;
    const auto inlets = test::hds5_inlets();
    std::vector<Section> sizes;
    for (const double d : {0.3, 0.375, 0.45, 0.525, 0.6, 0.75, 0.9, 1.05, 1.2, 1.35, 1.5, 1.8}) {
        sizes.push_back(Section::circular(d));
    }
    const auto start = std::chrono::steady_clock::now();
    std::size_t lines = 0;
    std::size_t sized = 0;
    std::size_t overtopped = 0;
    std::size_t curve_points = 0;
    double split_s = 0.0;
    for (int i = 0; i < 1000; ++i) {
        const Culvert c{
            Section::circular(0.6), 1,     20.0 + 0.05 * i,
            0.002 + 0.00002 * i,    0.013, inlets.rows()[static_cast<std::size_t>(i) % 6]};
        const Site site{100.0, 0.1 + 0.0005 * i, {101.5 + 0.001 * i, 1.5}};
        for (const double q : {0.2, 0.6, 1.5, 3.0}) {
            const auto z = size_culvert(c, sizes, q * (1.0 + 0.0003 * i), site, units::System::si);
            lines += z.lines.size();
            sized += z.value.chosen ? 1 : 0;
        }
        // The crossing at its chosen (or largest) size: the road split at each flow, the curve.
        const auto t0 = std::chrono::steady_clock::now();
        Culvert sized_c = c;
        sized_c.section = Section::circular(1.05);
        const RoadCrest road{102.0 + 0.001 * i, 30.0, default_weir_coefficient_si()};
        for (const double q : {0.2, 0.6, 1.5, 3.0}) {
            const auto w =
                split_with_road(sized_c, q * (1.0 + 0.0003 * i), site, road, units::System::si);
            lines += w.lines.size();
            overtopped += w.value.overtops ? 1 : 0;
        }
        curve_points += performance_curve(sized_c, site, road, 4.5, 40, units::System::si).size();
        split_s += std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    }
    const double s =
        std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    std::printf("culvert sizing: 4000 sizings (1000 culverts x 4 flows, 12 sizes) in %.3f s, "
                "%.1f us each; %zu sized, %zu lines\n",
                s - split_s, (s - split_s) * 1e6 / 4000.0, sized, lines);
    std::printf("road split and curve: 4000 splits (%zu overtop) and 1000 curves (%zu points) in "
                "%.3f s, %.1f us per culvert\n",
                overtopped, curve_points, split_s, split_s * 1e6 / 1000.0);
    std::printf("all: %.3f s for 1000 culverts x 4 flows with a curve each (target < 2 s)\n", s);
    rusage ru{};
    getrusage(RUSAGE_SELF, &ru);
    std::printf("peak memory (max RSS): %.1f MB\n", static_cast<double>(ru.ru_maxrss) / 1024.0);
    return 0;
}
