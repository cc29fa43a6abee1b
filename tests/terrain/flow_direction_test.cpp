// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/flow_direction.hpp"

#include "test_dems.hpp"

#include <gtest/gtest.h>

#include <cmath>

using namespace catchpeak;
using namespace catchpeak::terrain;

TEST(FlowDirection, InclinedPlaneAllCellsPointDownSlope) {
    // Plane falling 0.5 m per row to the south: every cell drains south, the bottom row off
    // the raster (the only way out of the low edge).
    auto dem = test::blank_dem(20, 15);
    for (std::size_t r = 0; r < dem.height(); ++r) {
        for (std::size_t c = 0; c < dem.width(); ++c) {
            dem(c, r) = static_cast<float>(100.0 - 0.5 * static_cast<double>(r));
        }
    }
    const auto dirs = d8_directions(dem, 1);
    for (std::size_t i = 0; i < dirs.size(); ++i) {
        EXPECT_EQ(dirs[i], d8::south) << "cell " << i;
    }
}

TEST(FlowDirection, SteepestDropPerDistanceWithNonSquareCells) {
    // Cells 10 m wide and 30 m high. Centre 10 m; east neighbour 9 m (drop 1 over 10 m = 0.1),
    // south neighbour 6 m (drop 4 over 30 m = 0.133), south-east 5 m (drop 5 over
    // sqrt(10^2 + 30^2) = 31.62 m = 0.158): south-east wins (computed from the D8 rule).
    auto dem = test::blank_dem(3, 3, 10.0, 30.0);
    for (auto &v : dem.cells()) {
        v = 20.0F;
    }
    dem(1, 1) = 10.0F;
    dem(2, 1) = 9.0F;
    dem(1, 2) = 6.0F;
    dem(2, 2) = 5.0F;
    const auto dirs = d8_directions(dem, 1);
    EXPECT_EQ(dirs(1, 1), d8::south_east);
    // With square 10 m cells the same drops give east 0.1, south 0.4, south-east 0.354: south.
    auto square = dem;
    square.transform = test::blank_dem(3, 3).transform;
    EXPECT_EQ(d8_directions(square, 1)(1, 1), d8::south);
}

TEST(FlowDirection, FlatsAndPitsStayUnresolvedInsideAndEdgesDrainOut) {
    auto dem = test::blank_dem(5, 5);
    for (auto &v : dem.cells()) {
        v = 10.0F;
    }
    dem(2, 2) = 5.0F; // a pit
    const auto dirs = d8_directions(dem, 1);
    EXPECT_EQ(dirs(2, 2), d8::none);
    EXPECT_NE(dirs(1, 1), d8::none); // drains into the pit
    EXPECT_EQ(dirs(1, 1), d8::south_east);
    // Edge cells of the flat rim have no lower neighbour except toward the pit (for those next
    // to it) and point off the raster otherwise, cardinal first.
    EXPECT_EQ(dirs(0, 0), d8::west);
    EXPECT_EQ(dirs(4, 4), d8::east);
    EXPECT_EQ(dirs(2, 0), d8::north);
}

TEST(FlowDirection, CellsNextToNodataDrainIntoIt) {
    auto dem = test::blank_dem(5, 5);
    for (auto &v : dem.cells()) {
        v = 10.0F;
    }
    dem(2, 2) = test::nodata_value;
    const auto dirs = d8_directions(dem, 1);
    EXPECT_EQ(dirs(2, 2), d8::none);
    EXPECT_EQ(dirs(1, 2), d8::east);
    EXPECT_EQ(dirs(2, 1), d8::south);
    EXPECT_EQ(dirs(1, 1), d8::south_east);
    EXPECT_EQ(downstream_cell(dirs, dirs.index(1, 2)), dirs.index(2, 2));
    EXPECT_EQ(downstream_cell(dirs, dirs.index(0, 0)), no_cell); // points off the raster
}

TEST(FlowDirection, SameResultWithOneAndTwoThreads) {
    const auto dem = test::random_dem(150, 140, 7);
    const auto a = d8_directions(dem, 1);
    const auto b = d8_directions(dem, 2);
    EXPECT_EQ(a.cells(), b.cells());
}

TEST(FlowDirection, StepLengths) {
    EXPECT_DOUBLE_EQ(step_length_m(d8::east, 10.0, 30.0), 10.0);
    EXPECT_DOUBLE_EQ(step_length_m(d8::north, 10.0, 30.0), 30.0);
    EXPECT_DOUBLE_EQ(step_length_m(d8::north_east, 10.0, 30.0), std::sqrt(1000.0));
    for (std::uint8_t k = 1; k <= 8; ++k) {
        EXPECT_EQ(d8::opposite[d8::opposite[k]], k);
        EXPECT_EQ(d8::dcol[k] + d8::dcol[d8::opposite[k]], 0);
        EXPECT_EQ(d8::drow[k] + d8::drow[d8::opposite[k]], 0);
    }
}
