// SPDX-License-Identifier: MIT
#include "catchpeak/core/grid.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>

using catchpeak::Grid;

TEST(Grid, RowMajorIndexing) {
    Grid<int> g(3, 2, 7);
    EXPECT_EQ(g.width(), 3u);
    EXPECT_EQ(g.height(), 2u);
    EXPECT_EQ(g.size(), 6u);
    g(2, 1) = 5;
    EXPECT_EQ(g[5], 5);
    EXPECT_EQ(g.index(1, 1), 4u);
    EXPECT_TRUE(g.in_bounds(0, 0));
    EXPECT_FALSE(g.in_bounds(3, 0));
    EXPECT_FALSE(g.in_bounds(-1, 0));
    EXPECT_FALSE(g.in_bounds(0, 2));
}

TEST(Grid, UnfilledGridHasItsSizeAndKeepsWhatIsWritten) {
    Grid<float> g(4, 3, catchpeak::no_fill);
    EXPECT_EQ(g.width(), 4u);
    EXPECT_EQ(g.height(), 3u);
    ASSERT_EQ(g.size(), 12u);
    for (std::size_t i = 0; i < g.size(); ++i) {
        g[i] = static_cast<float>(i) * 0.5f;
    }
    EXPECT_EQ(g(3, 2), 5.5f);
    // A filled grid of the same type still fills.
    const Grid<float> filled(4, 3, 2.0f);
    for (std::size_t i = 0; i < filled.size(); ++i) {
        EXPECT_EQ(filled[i], 2.0f);
    }
}

TEST(Grid, NodataValueAndNaNAreInvalid) {
    Grid<float> g(2, 2, 1.0f);
    g.nodata = -9999.0f;
    g[1] = -9999.0f;
    g[2] = std::numeric_limits<float>::quiet_NaN();
    EXPECT_TRUE(g.is_valid(0));
    EXPECT_FALSE(g.is_valid(1));
    EXPECT_FALSE(g.is_valid(2));
    const auto mask = g.valid_mask();
    EXPECT_EQ(mask[0], 1);
    EXPECT_EQ(mask[1], 0);
    EXPECT_EQ(mask[2], 0);
    EXPECT_EQ(mask[3], 1);
}

TEST(Grid, CellCentresFollowTheGeotransform) {
    Grid<float> g(4, 3);
    g.transform = {1000.0, 2.0, 0.0, 5000.0, 0.0, -2.0};
    const auto [x, y] = g.transform.cell_centre(0, 0);
    EXPECT_DOUBLE_EQ(x, 1001.0);
    EXPECT_DOUBLE_EQ(y, 4999.0);
    const auto [x2, y2] = g.transform.cell_centre(3, 2);
    EXPECT_DOUBLE_EQ(x2, 1007.0);
    EXPECT_DOUBLE_EQ(y2, 4995.0);
    EXPECT_DOUBLE_EQ(g.transform.cell_area(), 4.0);
    EXPECT_TRUE(g.transform.is_north_up());
    Grid<int> derived(4, 3);
    derived.copy_georef_from(g);
    EXPECT_DOUBLE_EQ(derived.transform.origin_x, 1000.0);
}
