// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/streams.hpp"

#include "catchpeak/terrain/accumulation.hpp"
#include "catchpeak/terrain/flow_direction.hpp"

#include <gtest/gtest.h>

#include <cmath>

using namespace catchpeak;
using namespace catchpeak::terrain;

TEST(Streams, TwoBranchesJoinIntoASecondOrderTrunk) {
    // A "Y" drawn by hand: (0,0)->(1,1)->(2,2) and (4,0)->(3,1)->(2,2), trunk (2,2)->(2,3)->(2,4)
    // and off the raster. Other cells have no direction.
    Grid<std::uint8_t> dirs(5, 5, d8::none);
    dirs.transform = GeoTransform{0.0, 10.0, 0.0, 50.0, 0.0, -10.0};
    dirs(0, 0) = d8::south_east;
    dirs(1, 1) = d8::south_east;
    dirs(4, 0) = d8::south_west;
    dirs(3, 1) = d8::south_west;
    dirs(2, 2) = d8::south;
    dirs(2, 3) = d8::south;
    dirs(2, 4) = d8::south;
    const auto acc = flow_accumulation(dirs);
    const auto streams = extract_streams(dirs, acc, 100.0); // one cell of 100 m2
    ASSERT_EQ(streams.size(), 3U);
    // Ascending first cell: (0,0), (4,0), (2,2).
    EXPECT_EQ(streams[0].first_cell, 0U);
    EXPECT_EQ(streams[1].first_cell, 4U);
    EXPECT_EQ(streams[2].first_cell, 12U);
    EXPECT_EQ(streams[0].last_cell, 12U);
    EXPECT_EQ(streams[1].last_cell, 12U);
    EXPECT_EQ(streams[2].last_cell, 22U);
    EXPECT_EQ(streams[0].strahler_order, 1);
    EXPECT_EQ(streams[1].strahler_order, 1);
    EXPECT_EQ(streams[2].strahler_order, 2);
    EXPECT_EQ(streams[2].accumulation_end, 7U);
    EXPECT_DOUBLE_EQ(streams[2].accumulation_end_m2, 700.0);
    EXPECT_EQ(streams[0].vertices_xy.size(), 3U);
    EXPECT_DOUBLE_EQ(streams[0].length_m, 2.0 * std::sqrt(200.0));
    EXPECT_DOUBLE_EQ(streams[2].length_m, 20.0);
    EXPECT_DOUBLE_EQ(streams[2].vertices_xy.back().first, 25.0);
    EXPECT_DOUBLE_EQ(streams[2].vertices_xy.back().second, 5.0);

    // A threshold of 3 cells keeps only the trunk (branches reach 2 cells, the junction 5).
    const auto trunk = extract_streams(dirs, acc, 300.0);
    ASSERT_EQ(trunk.size(), 1U);
    EXPECT_EQ(trunk[0].first_cell, 12U);
    EXPECT_EQ(trunk[0].strahler_order, 1);
}
