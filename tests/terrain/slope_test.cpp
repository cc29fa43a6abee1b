// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/slope.hpp"

#include "test_dems.hpp"

#include <gtest/gtest.h>

#include <cmath>

using namespace catchpeak;
using namespace catchpeak::terrain;

TEST(Slope, HornOnAPlaneEqualsTheAnalyticSlope) {
    // Plane z = 0.03 x + 0.04 y on 10 m by 20 m cells: slope sqrt(0.03^2 + 0.04^2) = 0.05 m/m
    // (computed). Horn's weights are exact on a plane, edges included (missing neighbours take
    // the centre value, which on an edge still gives the one-sided difference of the plane
    // along that axis only, so edges are checked separately below).
    auto dem = test::blank_dem(15, 12, 10.0, 20.0);
    for (std::size_t r = 0; r < dem.height(); ++r) {
        for (std::size_t c = 0; c < dem.width(); ++c) {
            const auto [x, y] = dem.transform.cell_centre(c, r);
            dem(c, r) = static_cast<float>(0.03 * (x - 1000.0) + 0.04 * (y - 4700.0));
        }
    }
    const auto grid = horn_slope_grid(dem, 2);
    for (std::size_t r = 1; r + 1 < dem.height(); ++r) {
        for (std::size_t c = 1; c + 1 < dem.width(); ++c) {
            // Tolerance: float storage of elevations (about 1e-5 m over 10 m cells).
            EXPECT_NEAR(horn_slope(dem, c, r), 0.05, 1e-5);
            EXPECT_NEAR(grid(c, r), 0.05F, 1e-5F);
        }
    }
    EXPECT_TRUE(horn_slope(dem, 0, 0) > 0.0);
}

TEST(Slope, NodataCellsHaveNoSlopeAndMissingNeighboursTakeTheCentre) {
    auto dem = test::blank_dem(3, 3);
    for (auto &v : dem.cells()) {
        v = 1.0F;
    }
    dem(2, 1) = 5.0F;
    dem(0, 0) = test::nodata_value;
    const auto grid = horn_slope_grid(dem, 1);
    EXPECT_TRUE(std::isnan(grid(0, 0)));
    // Centre: a = e = 1 (nodata taken as the centre), f = 5: dz/dx = 2 * 4 / (8 * 10) = 0.1.
    EXPECT_NEAR(horn_slope(dem, 1, 1), 0.1, 1e-12);
}

TEST(Slope, SumsByLabelAreTheSameWithOneAndTwoThreads) {
    const auto dem = test::random_dem(120, 90, 51);
    Grid<std::uint32_t> labels(dem.width(), dem.height(), 0);
    for (std::size_t i = 0; i < labels.size(); ++i) {
        labels[i] = static_cast<std::uint32_t>((i / 7) % 5);
    }
    const auto a = slope_sums_by_label(dem, labels, 4, 1);
    const auto b = slope_sums_by_label(dem, labels, 4, 2);
    EXPECT_EQ(a.sum_m_per_m, b.sum_m_per_m);
    EXPECT_EQ(a.count, b.count);
    // Against a plain double sum: fixed point rounds each cell to 2^-24 m/m.
    const auto grid = horn_slope_grid(dem, 1);
    std::vector<double> sum(5, 0.0);
    std::vector<std::uint64_t> count(5, 0);
    for (std::size_t i = 0; i < dem.size(); ++i) {
        if (!std::isnan(grid[i])) {
            sum[labels[i]] += horn_slope(dem, i % dem.width(), i / dem.width());
            ++count[labels[i]];
        }
    }
    for (std::size_t k = 0; k < 5; ++k) {
        EXPECT_EQ(a.count[k], count[k]);
        EXPECT_NEAR(a.sum_m_per_m[k], sum[k], static_cast<double>(count[k]) * 6e-8);
    }
}
