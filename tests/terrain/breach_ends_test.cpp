// SPDX-License-Identifier: MIT
// The ends of the breach line at a design point: the nearest line, the higher end as inlet,
// the DEM in the cells under the end vertices. Plain geometry, checked against values worked
// out by hand on a 10 m grid.
#include "catchpeak/terrain/breach_ends.hpp"

#include "test_dems.hpp"

#include <gtest/gtest.h>

using catchpeak::terrain::BreachLine;
using catchpeak::terrain::nearest_breach_ends;

namespace {

/// 10 x 10 cells of 10 m, origin (1000, 5000); the DEM falls 1 m per column eastwards.
catchpeak::Grid<float> tilted() {
    auto g = catchpeak::test::blank_dem(10, 10);
    for (std::size_t r = 0; r < 10; ++r) {
        for (std::size_t c = 0; c < 10; ++c) {
            g(c, r) = static_cast<float>(100 - c);
        }
    }
    return g;
}

} // namespace

TEST(BreachEnds, TheNearestLineIsTakenWithItsHigherEndAsInlet) {
    const auto dem = tilted();
    // Line 0 far north; line 1 drawn from east (low) to west (high) through the point's row.
    const std::vector<BreachLine> lines{
        {"far", {{1005.0, 4995.0}, {1095.0, 4995.0}}},
        {"road", {{1075.0, 4955.0}, {1045.0, 4955.0}, {1025.0, 4955.0}}},
    };
    const auto e = nearest_breach_ends(dem, lines, 1050.0, 4952.0);
    ASSERT_TRUE(e.has_value());
    EXPECT_EQ(e->line, 1U);
    EXPECT_EQ(e->line_id, "road");
    EXPECT_NEAR(e->distance_m, 3.0, 1e-9); // 4955 - 4952
    EXPECT_NEAR(e->length_m, 50.0, 1e-9);  // 30 + 20 along the vertices
    // Inlet: the west end (x 1025: column 2, elevation 98); outlet: x 1075, column 7, 93.
    EXPECT_EQ(e->inlet.col, 2U);
    EXPECT_EQ(e->inlet.row, 4U);
    ASSERT_TRUE(e->inlet.elevation_m.has_value());
    EXPECT_DOUBLE_EQ(*e->inlet.elevation_m, 98.0);
    ASSERT_TRUE(e->outlet.elevation_m.has_value());
    EXPECT_DOUBLE_EQ(*e->outlet.elevation_m, 93.0);
    EXPECT_DOUBLE_EQ(e->inlet.xy.first, 1025.0);
}

TEST(BreachEnds, AnEndOnNodataOrOffTheGridHasNoElevation) {
    auto dem = tilted();
    dem(7, 4) = catchpeak::test::nodata_value;
    const std::vector<BreachLine> lines{{"road", {{1025.0, 4955.0}, {1075.0, 4955.0}}},
                                        {"off", {{1200.0, 4955.0}, {1250.0, 4955.0}}}};
    const auto e = nearest_breach_ends(dem, lines, 1050.0, 4955.0);
    ASSERT_TRUE(e.has_value());
    EXPECT_TRUE(e->inlet.elevation_m.has_value());
    EXPECT_FALSE(e->outlet.elevation_m.has_value());
    const auto off = nearest_breach_ends(dem, lines, 1230.0, 4955.0);
    ASSERT_TRUE(off.has_value());
    EXPECT_EQ(off->line_id, "off");
    EXPECT_FALSE(off->inlet.elevation_m.has_value());
    EXPECT_FALSE(off->outlet.elevation_m.has_value());
}

TEST(BreachEnds, NoLinesGiveNothing) {
    const auto dem = tilted();
    EXPECT_FALSE(nearest_breach_ends(dem, {}, 1050.0, 4955.0).has_value());
    EXPECT_FALSE(nearest_breach_ends(dem, {{"dot", {{1050.0, 4955.0}}}}, 1050.0, 4955.0));
}
