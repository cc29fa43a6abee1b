// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/accumulation.hpp"

#include "catchpeak/terrain/conditioning.hpp"
#include "catchpeak/terrain/flow_direction.hpp"
#include "test_dems.hpp"

#include <gtest/gtest.h>

using namespace catchpeak;
using namespace catchpeak::terrain;

TEST(Accumulation, InclinedPlaneCountsTheCellsAboveInTheColumn) {
    // Plane falling south: each column drains straight down, so the cell on row r receives the
    // r cells above it plus itself; the upstream length is r x dy (computed from the geometry).
    auto dem = test::blank_dem(8, 12, 10.0, 25.0);
    for (std::size_t r = 0; r < dem.height(); ++r) {
        for (std::size_t c = 0; c < dem.width(); ++c) {
            dem(c, r) = static_cast<float>(100.0 - static_cast<double>(r));
        }
    }
    const auto dirs = d8_directions(dem, 1);
    const auto al = accumulation_and_length(dirs);
    for (std::size_t r = 0; r < dem.height(); ++r) {
        for (std::size_t c = 0; c < dem.width(); ++c) {
            EXPECT_EQ(al.accumulation(c, r), r + 1);
            EXPECT_FLOAT_EQ(al.upstream_length_m(c, r), 25.0F * static_cast<float>(r));
        }
    }
    EXPECT_EQ(flow_accumulation(dirs).cells(), al.accumulation.cells());
}

TEST(Accumulation, OutletsTogetherHoldEveryValidCellOnRandomDems) {
    for (const unsigned seed : {21U, 22U, 23U}) {
        const auto dem = test::random_dem(90, 70, seed);
        const auto dirs = conditioned_directions(dem, {}, 2);
        const auto acc = flow_accumulation(dirs);
        std::uint64_t valid = 0;
        std::uint64_t at_outlets = 0;
        for (std::size_t i = 0; i < dirs.size(); ++i) {
            if (dirs[i] == d8::none) {
                EXPECT_EQ(acc[i], 0U);
                continue;
            }
            ++valid;
            const std::size_t d = downstream_cell(dirs, i);
            if (d == no_cell || dirs[d] == d8::none) {
                at_outlets += acc[i];
            } else {
                // Conservation: a cell holds itself plus what it passes on is counted below.
                EXPECT_LT(acc[i], acc[d] + 1);
            }
        }
        EXPECT_EQ(at_outlets, valid) << "seed " << seed;
    }
}

TEST(Accumulation, EachCellEqualsOnePlusItsInflows) {
    const auto dem = test::random_dem(60, 50, 31);
    const auto dirs = conditioned_directions(dem, {}, 1);
    const auto acc = flow_accumulation(dirs);
    std::vector<std::uint64_t> inflow(dirs.size(), 0);
    for (std::size_t i = 0; i < dirs.size(); ++i) {
        const std::size_t d = downstream_cell(dirs, i);
        if (dirs[i] != d8::none && d != no_cell && dirs[d] != d8::none) {
            inflow[d] += acc[i];
        }
    }
    for (std::size_t i = 0; i < dirs.size(); ++i) {
        if (dirs[i] != d8::none) {
            EXPECT_EQ(acc[i], inflow[i] + 1) << "cell " << i;
        }
    }
}
