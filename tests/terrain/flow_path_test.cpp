// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/flow_path.hpp"

#include "catchpeak/terrain/accumulation.hpp"
#include "catchpeak/terrain/conditioning.hpp"
#include "catchpeak/terrain/flow_direction.hpp"
#include "test_dems.hpp"

#include <gtest/gtest.h>

#include <cmath>

using namespace catchpeak;
using namespace catchpeak::terrain;

namespace {

// V-shaped valley z = a |c - cc| + b (h - 1 - r) on 10 m cells, a = 3, b = 1 (metres per cell):
// side cells drain straight to the channel (see catchments_test.cpp), the channel runs south.
constexpr std::size_t w = 41;
constexpr std::size_t h = 60;
constexpr double a = 3.0;
constexpr double b = 1.0;
constexpr double cell = 10.0;

Grid<float> v_valley() {
    auto dem = test::blank_dem(w, h, cell, cell);
    for (std::size_t r = 0; r < h; ++r) {
        for (std::size_t c = 0; c < w; ++c) {
            dem(c, r) = static_cast<float>(a * std::abs(static_cast<double>(c) - 20.0) +
                                           b * static_cast<double>(h - 1 - r));
        }
    }
    return dem;
}

} // namespace

TEST(FlowPath, VValleyLengthWithinTheD8FactorAndExactHOverL) {
    const auto dem = v_valley();
    const auto dirs = conditioned_directions(dem, {}, 1);
    const auto al = accumulation_and_length(dirs);
    const std::size_t outlet = dem.index(20, h - 1);
    const FlowPath p = longest_flow_path(dirs, al.upstream_length_m, dem, outlet);

    // D8 path from a top corner: 20 cells across, then 59 down the channel (computed from the
    // D8 rule on this surface).
    const double d8_length = 20.0 * cell + 59.0 * cell;
    EXPECT_NEAR(p.length_m, d8_length, 1e-9); // exact sum of steps, rounding only
    // The true flow line leaves the corner along the gradient (a, b), reaching the channel
    // 20 b/a rows lower, then follows the channel (computed from the surface).
    const double true_length =
        20.0 * cell * std::sqrt(1.0 + (b / a) * (b / a)) + (59.0 - 20.0 * b / a) * cell;
    // D8 path error: at most the factor cos t + (sqrt 2 - 1) sin t <= 1.082 (REFERENCES.md 11).
    EXPECT_LE(p.length_m, true_length * 1.082);
    EXPECT_GE(p.length_m, true_length / 1.082);

    ASSERT_EQ(p.cells.front() / w, 0U); // the remotest cell is on the top row ...
    EXPECT_TRUE(p.cells.front() % w == 0 || p.cells.front() % w == w - 1); // ... in a corner
    EXPECT_EQ(p.cells.back(), outlet);
    // 80 cells; as a polyline only the corner, the turn onto the channel and the outlet.
    EXPECT_EQ(p.cell_count, 80U);
    ASSERT_EQ(p.vertices_xy.size(), 3U);
    EXPECT_DOUBLE_EQ(p.vertices_xy[1].first, 1205.0);
    EXPECT_DOUBLE_EQ(p.vertices_xy[1].second, 4995.0);
    EXPECT_DOUBLE_EQ(p.vertices_xy.back().first, 1205.0);
    EXPECT_DOUBLE_EQ(p.vertices_xy.back().second, 5000.0 - 595.0);

    // Elevations from the DEM formula: top a*20 + b*59, outlet 0; H/L exact.
    EXPECT_DOUBLE_EQ(p.elevation_top_m, a * 20.0 + b * 59.0);
    EXPECT_DOUBLE_EQ(p.elevation_outlet_m, 0.0);
    EXPECT_NEAR(p.slope_m_per_m, (a * 20.0 + b * 59.0) / d8_length, 1e-12);

    // 10-85 slope (USGS practice): along the path, z = d / 10 on the channel (d <= 590 m) and
    // z = 59 + 3 (d - 590) / 10 across the top row (computed from the surface).
    const auto z_at = [](double d) {
        return d <= 590.0 ? d / 10.0 : 59.0 + 3.0 * (d - 590.0) / 10.0;
    };
    const double z10 = z_at(0.10 * d8_length);
    const double z85 = z_at(0.85 * d8_length);
    EXPECT_NEAR(p.elevation_10_m, z10, 1e-9);
    EXPECT_NEAR(p.elevation_85_m, z85, 1e-9);
    EXPECT_NEAR(p.slope_10_85_m_per_m, (z85 - z10) / (0.75 * d8_length), 1e-12);
}

TEST(FlowPath, LongestPathUsesTheUnconditionedElevations) {
    // A pit in the channel is filled for routing, but the reported elevations are those of the
    // DEM as given.
    auto dem = v_valley();
    dem(20, 5) = -5.0F;
    const auto dirs = conditioned_directions(dem, {}, 1);
    const auto al = accumulation_and_length(dirs);
    const std::size_t outlet = dem.index(20, 10);
    const FlowPath p = longest_flow_path(dirs, al.upstream_length_m, dem, outlet);
    EXPECT_DOUBLE_EQ(p.elevation_outlet_m, static_cast<double>(dem[outlet]));
    // The path runs down the channel through the filled pit: its polyline turns onto the
    // channel at the top row and goes straight to the outlet, 10 rows down.
    ASSERT_EQ(p.vertices_xy.size(), 3U);
    EXPECT_DOUBLE_EQ(p.vertices_xy[1].first, 1205.0);
    EXPECT_EQ(p.cell_count, 31U);
    EXPECT_DOUBLE_EQ(p.elevation_top_m, a * 20.0 + b * 59.0);
}

TEST(FlowPath, Slope1085OnAStraightProfile) {
    // Uniform profile z = 2 + 0.05 d: the 10-85 slope equals 0.05 (computed).
    std::vector<double> d;
    std::vector<double> z;
    for (int k = 0; k <= 20; ++k) {
        d.push_back(7.0 * k);
        z.push_back(2.0 + 0.05 * 7.0 * k);
    }
    const auto s = slope_10_85(d, z);
    EXPECT_NEAR(s.slope_m_per_m, 0.05, 1e-12);
    EXPECT_NEAR(s.elevation_10_m, 2.0 + 0.05 * 14.0, 1e-12);
    EXPECT_NEAR(s.elevation_85_m, 2.0 + 0.05 * 119.0, 1e-12);
}

TEST(FlowPath, TracingByStoredCodesEqualsTracingBySearchOnRandomDems) {
    for (const unsigned seed : {101U, 102U}) {
        const auto dem = test::random_dem(90, 80, seed);
        const auto dirs = conditioned_directions(dem, {}, 1);
        const auto al = accumulation_and_length(dirs);
        for (std::size_t i = 0; i < dirs.size(); i += 13) {
            if (dirs[i] == d8::none) {
                continue;
            }
            const FlowPath a = longest_flow_path(dirs, al.upstream_length_m, dem, i);
            const FlowPath b = longest_flow_path(dirs, al.longest_upstream, dem, i);
            ASSERT_EQ(a.cells, b.cells) << "seed " << seed << " outlet " << i;
            EXPECT_EQ(a.length_m, b.length_m);
            // The path length equals the stored upstream length (float storage: 1e-6 relative).
            EXPECT_NEAR(a.length_m, static_cast<double>(al.upstream_length_m[i]),
                        1e-5 * (1.0 + a.length_m));
        }
    }
}
