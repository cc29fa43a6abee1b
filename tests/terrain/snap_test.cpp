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

SnapSettings largest(double radius_m) { return {SnapRule::largest_flow, radius_m, 0.0}; }

} // namespace

TEST(Snap, LargestFlowMovesToTheLargestAccumulationWithinTheRadius) {
    const auto acc = acc_grid();
    // Point in cell (5, 4); centre of (7, 4) is 20 m east of the cell centre.
    const DesignPoint p{"DP-1", 1055.0, 4955.0};
    const auto s = snap_point(acc, p, largest(25.0));
    EXPECT_EQ(s.col, 7U);
    EXPECT_EQ(s.row, 4U);
    EXPECT_DOUBLE_EQ(s.x, 1075.0);
    EXPECT_DOUBLE_EQ(s.y, 4955.0);
    EXPECT_DOUBLE_EQ(s.distance_m, 20.0);
    EXPECT_EQ(s.accumulation, 80U);
    EXPECT_DOUBLE_EQ(s.accumulation_m2, 8000.0);
    // A radius that does not reach (7, 4) picks (6, 4).
    EXPECT_EQ(snap_point(acc, p, largest(15.0)).col, 6U);
    // Radius 0 keeps the cell containing the point.
    const auto own = snap_point(acc, p, largest(0.0));
    EXPECT_EQ(own.col, 5U);
    EXPECT_EQ(own.accumulation, 1U);
}

TEST(Snap, LargestFlowTiesGoToTheNearestThenTheLowestIndex) {
    Grid<std::uint32_t> acc(10, 10, 1);
    acc.transform = GeoTransform{0.0, 10.0, 0.0, 100.0, 0.0, -10.0};
    acc(3, 5) = 9;
    acc(7, 5) = 9;
    // Point nearer (7, 5).
    EXPECT_EQ(snap_point(acc, {"A", 61.0, 45.0}, largest(30.0)).col, 7U);
    // Point at equal distance from both: the lower index (3, 5).
    EXPECT_EQ(snap_point(acc, {"B", 55.0, 45.0}, largest(30.0)).col, 3U);
}

TEST(Snap, PointOutsideTheGridIsAnInputErrorNamingPointAndExtent) {
    const auto acc = acc_grid();
    try {
        (void)snap_point(acc, {"DP-9", 900.0, 4950.0}, largest(10.0), "points.csv");
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
        (void)snap_point(acc, {"DP-3", 1025.0, 4975.0}, largest(50.0));
        FAIL() << "expected InputError";
    } catch (const InputError &e) {
        const std::string msg = e.what();
        EXPECT_NE(msg.find("DP-3"), std::string::npos) << msg;
        EXPECT_NE(msg.find("nodata"), std::string::npos) << msg;
    }
}

namespace {

/// A small swale beside a big creek, as in the report of the fault: 1 m cells, origin (0, 20).
/// The creek runs along column 15 (accumulation 50,000 cells = 5 ha), the swale along column 4
/// (2,000 cells = 0.2 ha); every other cell drains itself alone (1 cell), but for a strip of
/// cells beside the creek draining 300 cells.
Grid<std::uint32_t> swale_and_creek() {
    Grid<std::uint32_t> acc(20, 20, 1);
    acc.transform = GeoTransform{0.0, 1.0, 0.0, 20.0, 0.0, -1.0};
    for (std::size_t r = 0; r < 20; ++r) {
        acc(4, r) = 2000;
        acc(15, r) = 50000;
        acc(14, r) = 300;
    }
    return acc;
}

/// A point in the cell beside the swale, cell (5, 10): 0.7 m east of the swale's cell centres,
/// 10.3 m west of the creek's.
const DesignPoint beside_swale{"DP-1", 5.2, 9.5};

} // namespace

TEST(Snap, NearestStreamKeepsAPointBesideASwaleOnTheSwale) {
    const auto acc = swale_and_creek();
    // The stream threshold 0.1 ha: the swale (0.2 ha) and the creek are streams. Radius 12 m
    // reaches the creek.
    const SnapSettings nearest{SnapRule::nearest_stream, 12.0, 1000.0};
    const auto s = snap_point(acc, beside_swale, nearest);
    EXPECT_EQ(s.col, 4U);
    EXPECT_EQ(s.row, 10U);
    EXPECT_EQ(s.accumulation, 2000U);
    EXPECT_FALSE(s.no_stream_within_radius);
    // The same point moved 1.5 m east (cell (6, 10)): the swale, 2.2 m west, is nearer than
    // the creek, 8.8 m east; largest_flow takes the creek.
    const DesignPoint off{"DP-2", 6.7, 9.5};
    EXPECT_EQ(snap_point(acc, off, nearest).col, 4U);
    const auto big = snap_point(acc, off, largest(12.0));
    EXPECT_EQ(big.col, 15U);
    EXPECT_EQ(big.accumulation, 50000U);
}

TEST(Snap, LargestFlowMovesTheSwalePointOntoTheCreekAndTheFiguresShowTheFactor) {
    const auto acc = swale_and_creek();
    const auto s = snap_point(acc, beside_swale, largest(12.0));
    EXPECT_EQ(s.col, 15U);
    // The cell under the point (1 cell) and the snapped cell: far more than a factor 4 apart.
    EXPECT_EQ(s.given_accumulation, 1U);
    EXPECT_DOUBLE_EQ(s.given_accumulation_m2, 1.0);
    EXPECT_DOUBLE_EQ(s.accumulation_m2, 50000.0);
    EXPECT_GT(s.accumulation_m2, 4.0 * s.given_accumulation_m2);
    // The move: 10.3 m east (from x 5.2 to the creek's centre 15.5).
    EXPECT_NEAR(s.distance_m, 10.3, 1e-9); // exact geometry, rounding of doubles only
    EXPECT_EQ(compass_direction(s.x - beside_swale.x, s.y - beside_swale.y), "east");
}

TEST(Snap, SmallestAndLargestWithinTheRadiusIncludeEveryCellSearched) {
    const auto acc = swale_and_creek();
    // Radius 5 m from (5.2, 9.5): columns 1 to 9 at most; the swale (2,000) is the largest,
    // a plain cell (1) the smallest, whatever the rule.
    for (const SnapRule rule : {SnapRule::nearest_stream, SnapRule::largest_flow, SnapRule::none}) {
        const auto s = snap_point(acc, beside_swale, SnapSettings{rule, 5.0, 1000.0});
        EXPECT_EQ(s.max_accumulation, 2000U);
        EXPECT_EQ(s.min_accumulation, 1U);
        EXPECT_DOUBLE_EQ(s.max_accumulation_m2, 2000.0);
        EXPECT_DOUBLE_EQ(s.min_accumulation_m2, 1.0);
    }
    // Radius 12 m reaches the creek: the largest is the creek.
    EXPECT_EQ(snap_point(acc, beside_swale, largest(12.0)).max_accumulation, 50000U);
    // Radius 0: the cell under the point alone.
    const auto own = snap_point(acc, beside_swale, largest(0.0));
    EXPECT_EQ(own.min_accumulation, 1U);
    EXPECT_EQ(own.max_accumulation, 1U);
}

TEST(Snap, NoneKeepsTheCellUnderThePoint) {
    const auto acc = swale_and_creek();
    const DesignPoint off{"DP-2", 6.7, 9.5};
    const auto s = snap_point(acc, off, SnapSettings{SnapRule::none, 12.0, 1000.0});
    EXPECT_EQ(s.col, 6U);
    EXPECT_EQ(s.row, 10U);
    EXPECT_EQ(s.accumulation, 1U);
    EXPECT_EQ(s.given_accumulation, 1U);
    EXPECT_EQ(s.max_accumulation, 50000U); // the figures are found all the same
}

TEST(Snap, NearestStreamWithoutAStreamInTheRadiusStaysOnTheCellUnderThePoint) {
    const auto acc = swale_and_creek();
    // (10.5, 9.5): 6 m from the swale, 4 m from the strip of 300 cells (below the 0.1 ha
    // threshold), 5 m from the creek; radius 3 m reaches none.
    const DesignPoint p{"DP-3", 10.5, 9.5};
    const auto s = snap_point(acc, p, SnapSettings{SnapRule::nearest_stream, 3.0, 1000.0});
    EXPECT_TRUE(s.no_stream_within_radius);
    EXPECT_EQ(s.col, 10U);
    EXPECT_EQ(s.accumulation, 1U);
    // A radius of 5 m reaches the creek (5 m): it is taken, not the nearer strip of 300 cells.
    const auto r5 = snap_point(acc, p, SnapSettings{SnapRule::nearest_stream, 5.0, 1000.0});
    EXPECT_FALSE(r5.no_stream_within_radius);
    EXPECT_EQ(r5.col, 15U);
}

TEST(Snap, NearestStreamTiesGoToTheLargerAccumulation) {
    Grid<std::uint32_t> acc(9, 3, 1);
    acc.transform = GeoTransform{0.0, 1.0, 0.0, 3.0, 0.0, -1.0};
    acc(2, 1) = 2000;
    acc(6, 1) = 3000;
    // (4.5, 1.5): both stream cells 2 m away (to their squares 1.5 m).
    const auto s =
        snap_point(acc, {"T", 4.5, 1.5}, SnapSettings{SnapRule::nearest_stream, 3.0, 1000.0});
    EXPECT_EQ(s.col, 6U);
}

TEST(Snap, CompassDirectionsOfEightSectors) {
    EXPECT_EQ(compass_direction(0.0, 5.0), "north");
    EXPECT_EQ(compass_direction(8.5, 8.5), "north-east");
    EXPECT_EQ(compass_direction(3.0, 0.0), "east");
    EXPECT_EQ(compass_direction(1.0, -1.0), "south-east");
    EXPECT_EQ(compass_direction(0.0, -2.0), "south");
    EXPECT_EQ(compass_direction(-1.0, -1.0), "south-west");
    EXPECT_EQ(compass_direction(-4.0, 0.1), "west");
    EXPECT_EQ(compass_direction(-1.0, 1.0), "north-west");
    EXPECT_EQ(compass_direction(0.0, 0.0), "");
}
