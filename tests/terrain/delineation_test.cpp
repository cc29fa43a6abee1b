// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/delineation.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/terrain/accumulation.hpp"
#include "catchpeak/terrain/flow_direction.hpp"
#include "catchpeak/terrain/slope.hpp"
#include "test_dems.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <string>

using namespace catchpeak;
using namespace catchpeak::terrain;

namespace {

std::vector<DesignPoint> grid_points(const Grid<float> &dem, std::size_t step) {
    std::vector<DesignPoint> pts;
    for (std::size_t i = step / 2; i < dem.size(); i += step) {
        if (dem[i] == test::nodata_value) {
            continue;
        }
        const auto [x, y] = dem.transform.cell_centre(i % dem.width(), i / dem.width());
        pts.push_back({"P" + std::to_string(pts.size() + 1), x + 1.0, y - 2.0});
    }
    return pts;
}

} // namespace

TEST(Delineation, VValleyPointsGetExactAreasAndNesting) {
    // V valley z = 3 |c - 20| + (59 - r) on 10 m cells (see catchments_test.cpp): a point on
    // the channel at row 29 drains rows 0..29 (41 x 30 cells), the outlet all 41 x 60 cells.
    auto dem = test::blank_dem(41, 60);
    for (std::size_t r = 0; r < 60; ++r) {
        for (std::size_t c = 0; c < 41; ++c) {
            dem(c, r) = static_cast<float>(3.0 * std::abs(static_cast<double>(c) - 20.0) +
                                           static_cast<double>(59 - r));
        }
    }
    TerrainSettings s;
    s.snap_radius_m = 16.0; // reaches the channel cell on the point's row only
    s.stream_threshold_m2 = 50.0 * 100.0;
    // Given 15 m off the channel; they snap onto it.
    const std::vector<DesignPoint> pts{{"OUT", 1190.0, 5000.0 - 595.0},
                                       {"MID", 1190.0, 5000.0 - 295.0}};
    std::vector<std::string> steps;
    const auto r = run_terrain(dem, pts, {}, s,
                               [&](std::string_view step, double) { steps.emplace_back(step); });
    ASSERT_EQ(r.points.size(), 2U);
    const auto &out = r.points[0];
    const auto &mid = r.points[1];
    EXPECT_DOUBLE_EQ(out.snapped_x, 1205.0);
    EXPECT_DOUBLE_EQ(out.snap_distance_m, 15.0);
    EXPECT_EQ(out.total_cells, 41U * 60U);
    EXPECT_EQ(mid.total_cells, 41U * 30U);
    EXPECT_EQ(out.local_cells, 41U * 30U);
    EXPECT_DOUBLE_EQ(out.area_m2, 41.0 * 60.0 * 100.0);
    EXPECT_DOUBLE_EQ(mid.local_area_m2, 41.0 * 30.0 * 100.0);
    EXPECT_EQ(out.accumulation, out.total_cells);
    ASSERT_TRUE(mid.downstream_point.has_value());
    EXPECT_EQ(*mid.downstream_point, 0U);
    EXPECT_FALSE(out.downstream_point.has_value());
    EXPECT_EQ(out.upstream_points, (std::vector<std::size_t>{1}));
    EXPECT_EQ(all_upstream_points(r, 0), (std::vector<std::size_t>{1}));
    // The whole valley lies on the raster: its catchments touch the raster edge.
    EXPECT_TRUE(out.touches_dem_edge);
    // Flow path of the outlet: 20 cells across and 59 down (see flow_path_test.cpp).
    EXPECT_NEAR(out.longest_flow_path.length_m, 790.0, 1e-9);
    // Mean slope: cells off the channel have slope sqrt((3/10)^2 + (1/10)^2) = 0.3162 (Horn,
    // computed), channel cells less; so the mean lies between 0.1 and 0.3163.
    EXPECT_GT(out.mean_slope_m_per_m, 0.1);
    EXPECT_LT(out.mean_slope_m_per_m, 0.3163);
    EXPECT_FALSE(r.streams.empty());
    EXPECT_EQ(r.labels.size(), dem.size());
    EXPECT_EQ(steps.front(), "conditioning");
    EXPECT_EQ(steps.back(), "done");
    EXPECT_TRUE(r.directions.empty());
    EXPECT_TRUE(r.accumulation.empty());
}

TEST(Delineation, SameResultsWithOneAndTwoThreads) {
    const auto dem = test::random_dem(130, 110, 61);
    const auto pts = grid_points(dem, 97);
    TerrainSettings s;
    s.snap_radius_m = 40.0;
    s.keep_directions = true;
    s.threads = 1;
    const auto a = run_terrain(dem, pts, {}, s);
    s.threads = 2;
    const auto b = run_terrain(dem, pts, {}, s);
    EXPECT_EQ(a.labels.cells(), b.labels.cells());
    EXPECT_EQ(a.directions.cells(), b.directions.cells());
    ASSERT_EQ(a.points.size(), b.points.size());
    for (std::size_t p = 0; p < a.points.size(); ++p) {
        EXPECT_EQ(a.points[p].cell, b.points[p].cell);
        EXPECT_EQ(a.points[p].total_cells, b.points[p].total_cells);
        // Bit-identical doubles, not merely close.
        EXPECT_EQ(a.points[p].mean_slope_m_per_m, b.points[p].mean_slope_m_per_m);
        EXPECT_EQ(a.points[p].longest_flow_path.length_m, b.points[p].longest_flow_path.length_m);
        EXPECT_EQ(a.points[p].longest_flow_path.slope_10_85_m_per_m,
                  b.points[p].longest_flow_path.slope_10_85_m_per_m);
    }
    ASSERT_EQ(a.streams.size(), b.streams.size());
}

TEST(Delineation, NestedTotalsAndAccumulationAgreeOnRandomDems) {
    for (const unsigned seed : {71U, 72U}) {
        const auto dem = test::random_dem(120, 100, seed);
        const auto pts = grid_points(dem, 53);
        TerrainSettings s;
        s.snap_radius_m = 30.0;
        s.keep_accumulation = true;
        const auto r = run_terrain(dem, pts, {}, s);
        std::size_t nested = 0;
        for (std::size_t p = 0; p < r.points.size(); ++p) {
            const auto &dp = r.points[p];
            EXPECT_EQ(dp.total_cells, dp.accumulation) << dp.id;
            EXPECT_EQ(r.accumulation[dp.cell], dp.accumulation);
            // total = local + totals of the points directly upstream (shared cells counted once).
            std::uint64_t sum = dp.local_cells;
            std::vector<std::uint32_t> seen;
            for (const std::size_t q : dp.upstream_points) {
                if (std::find(seen.begin(), seen.end(), r.points[q].label) == seen.end()) {
                    sum += r.points[q].total_cells;
                    seen.push_back(r.points[q].label);
                }
                ++nested;
                ASSERT_TRUE(r.points[q].downstream_point.has_value());
                EXPECT_EQ(r.points[r.points[q].downstream_point.value()].label, dp.label);
            }
            EXPECT_EQ(dp.total_cells, sum) << dp.id;
            EXPECT_GE(dp.longest_flow_path.length_m, 0.0);
            EXPECT_EQ(dp.longest_flow_path.cells.back(), dp.cell);
        }
        EXPECT_GT(nested, 0U);
    }
}

TEST(Delineation, WarnsOnFarSnapTinyCatchmentAndSharedCell) {
    const auto dem = test::random_dem(60, 60, 81, false);
    TerrainSettings s;
    s.snap_radius_m = 200.0;
    s.far_snap_warning_m = 5.0;
    s.tiny_catchment_m2 = 1.0e12;
    const auto [x, y] = dem.transform.cell_centre(30, 30);
    const auto r = run_terrain(dem, {{"A", x, y}, {"B", x, y}}, {}, s);
    const auto has = [](const DesignPointTerrain &p, const std::string &word) {
        for (const auto &w : p.warnings) {
            if (w.find(word) != std::string::npos) {
                return true;
            }
        }
        return false;
    };
    EXPECT_TRUE(has(r.points[0], "snapped"));
    EXPECT_TRUE(has(r.points[0], "only"));
    EXPECT_TRUE(has(r.points[1], "same cell as design point 'A'"));
    EXPECT_EQ(r.points[0].label, r.points[1].label);
}

TEST(Delineation, BadInputsAreInputErrors) {
    const auto dem = test::random_dem(30, 30, 91, false);
    TerrainSettings s;
    EXPECT_THROW((void)run_terrain(dem, {{"X", 0.0, 0.0}}, {}, s), InputError);
    auto rotated = dem;
    rotated.transform.row_rotation = 0.5;
    EXPECT_THROW((void)run_terrain(rotated, {}, {}, s), InputError);
    auto all_nodata = dem;
    for (auto &v : all_nodata.cells()) {
        v = test::nodata_value;
    }
    EXPECT_THROW((void)run_terrain(all_nodata, {}, {}, s), InputError);
    s.snap_radius_m = -1.0;
    EXPECT_THROW((void)run_terrain(dem, {}, {}, s), InputError);
}

TEST(Delineation, DesignPointOnNodataIsRefusedBeforeTheTerrainSteps) {
    // A bad point is reported at once, not after the conditioning of a large DEM.
    auto dem = test::random_dem(30, 30, 92, false);
    dem(10, 10) = test::nodata_value;
    const auto [x, y] = dem.transform.cell_centre(10, 10);
    const auto [gx, gy] = dem.transform.cell_centre(20, 20);
    std::vector<std::string> steps;
    const ProgressFn record = [&](std::string_view step, double) { steps.emplace_back(step); };
    try {
        (void)run_terrain(dem, {{"GOOD", gx, gy}, {"ON-NODATA", x, y}}, {}, {}, record, "pts.gpkg");
        FAIL() << "a point on nodata must be refused";
    } catch (const InputError &e) {
        EXPECT_NE(std::string(e.what()).find("'ON-NODATA'"), std::string::npos) << e.what();
        EXPECT_NE(std::string(e.what()).find("nodata cell"), std::string::npos) << e.what();
    }
    EXPECT_TRUE(steps.empty()) << "first step started: " << steps.front();
}

TEST(Delineation, MeanSlopeIsTheMeanOfHornSlopeOverTheTotalCatchment) {
    // Few points, so that most cells are outside every catchment (the chain then skips them).
    const auto dem = test::random_dem(120, 90, 83);
    const auto pts = grid_points(dem, 2711);
    ASSERT_GE(pts.size(), 3U);
    TerrainSettings s;
    s.snap_radius_m = 40.0;
    const auto r = run_terrain(dem, pts, {}, s);
    const auto slope = horn_slope_grid(dem, 1);
    for (std::size_t p = 0; p < r.points.size(); ++p) {
        // Labels of the total catchment: the point's own and those of every point upstream.
        std::vector<std::uint32_t> labels{r.points[p].label};
        for (const std::size_t q : all_upstream_points(r, p)) {
            labels.push_back(r.points[q].label);
        }
        double sum = 0.0;
        std::size_t n = 0;
        for (std::size_t i = 0; i < dem.size(); ++i) {
            if (dem.is_valid(i) &&
                std::find(labels.begin(), labels.end(), r.labels[i]) != labels.end()) {
                sum += static_cast<double>(slope[i]);
                ++n;
            }
        }
        ASSERT_GT(n, 0U);
        // The grid holds floats and the chain sums in steps of 2^-24 m/m: close, not equal.
        EXPECT_NEAR(r.points[p].mean_slope_m_per_m, sum / static_cast<double>(n), 1e-5)
            << "point " << p;
    }
}
