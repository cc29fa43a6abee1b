// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/snap.hpp"

#include "catchpeak/core/error.hpp"
#include "test_dems.hpp"

#include <gtest/gtest.h>

#include <cmath>

using namespace catchpeak;
using namespace catchpeak::terrain;

namespace {

Grid<std::uint32_t> acc_grid() {
    // 10 x 10 cells of 10 m, origin (1000, 5000); accumulation 1 everywhere, with a channel.
    Grid<std::uint32_t> acc(10, 10, 1);
    acc.transform = GeoTransform{1000.0, 10.0, 0.0, 5000.0, 0.0, -10.0};
    acc(6, 4) = 50;
    acc(7, 4) = 80; // the channel cell
    acc(2, 2) = 0;  // nodata
    return acc;
}

} // namespace

TEST(Snap, MovesToTheLargestAccumulationWithinTheRadius) {
    const auto acc = acc_grid();
    // Point in cell (5, 4); centre of (7, 4) is 20 m east of the cell centre.
    const DesignPoint p{"DP-1", 1055.0, 4955.0};
    const auto s = snap_point(acc, p, 25.0);
    EXPECT_EQ(s.col, 7U);
    EXPECT_EQ(s.row, 4U);
    EXPECT_DOUBLE_EQ(s.x, 1075.0);
    EXPECT_DOUBLE_EQ(s.y, 4955.0);
    EXPECT_DOUBLE_EQ(s.distance_m, 20.0);
    EXPECT_EQ(s.accumulation, 80U);
    EXPECT_DOUBLE_EQ(s.accumulation_m2, 8000.0);
    // A radius that does not reach (7, 4) picks (6, 4).
    EXPECT_EQ(snap_point(acc, p, 15.0).col, 6U);
    // Radius 0 keeps the cell containing the point.
    const auto own = snap_point(acc, p, 0.0);
    EXPECT_EQ(own.col, 5U);
    EXPECT_EQ(own.accumulation, 1U);
}

TEST(Snap, TiesGoToTheNearestThenTheLowestIndex) {
    Grid<std::uint32_t> acc(10, 10, 1);
    acc.transform = GeoTransform{0.0, 10.0, 0.0, 100.0, 0.0, -10.0};
    acc(3, 5) = 9;
    acc(7, 5) = 9;
    // Point nearer (7, 5).
    EXPECT_EQ(snap_point(acc, {"A", 61.0, 45.0}, 30.0).col, 7U);
    // Point at equal distance from both: the lower index (3, 5).
    EXPECT_EQ(snap_point(acc, {"B", 55.0, 45.0}, 30.0).col, 3U);
}

TEST(Snap, PointOutsideTheGridIsAnInputErrorNamingPointAndExtent) {
    const auto acc = acc_grid();
    try {
        (void)snap_point(acc, {"DP-9", 900.0, 4950.0}, 10.0, "points.csv");
        FAIL() << "expected InputError";
    } catch (const InputError &e) {
        const std::string msg = e.what();
        EXPECT_NE(msg.find("points.csv"), std::string::npos) << msg;
        EXPECT_NE(msg.find("DP-9"), std::string::npos) << msg;
        EXPECT_NE(msg.find("900.000"), std::string::npos) << msg;
        EXPECT_NE(msg.find("outside"), std::string::npos) << msg;
        EXPECT_NE(msg.find("x 1000.000 to 1100.000, y 4900.000 to 5000.000"), std::string::npos)
            << msg;
    }
}

TEST(Snap, PointOnNodataIsAnInputError) {
    const auto acc = acc_grid();
    try {
        (void)snap_point(acc, {"DP-3", 1025.0, 4975.0}, 50.0);
        FAIL() << "expected InputError";
    } catch (const InputError &e) {
        const std::string msg = e.what();
        EXPECT_NE(msg.find("DP-3"), std::string::npos) << msg;
        EXPECT_NE(msg.find("nodata"), std::string::npos) << msg;
    }
}
