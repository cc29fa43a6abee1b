// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/catchments.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/terrain/accumulation.hpp"
#include "catchpeak/terrain/conditioning.hpp"
#include "catchpeak/terrain/flow_direction.hpp"
#include "test_dems.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

using namespace catchpeak;
using namespace catchpeak::terrain;

namespace {

/// V-shaped valley: z = a |c - cc| + b (h - 1 - r) (metres), channel on the centre column,
/// outlet at the bottom. With a > (1 + sqrt 2) b the steepest D8 step of a side cell is straight
/// toward the channel (drop a over one cell against (a + b) over sqrt 2 cells diagonally), so
/// side cells join the channel on their own row.
Grid<float> v_valley(std::size_t w, std::size_t h, double a, double b) {
    auto dem = test::blank_dem(w, h);
    const double cc = static_cast<double>(w / 2);
    for (std::size_t r = 0; r < h; ++r) {
        for (std::size_t c = 0; c < w; ++c) {
            dem(c, r) = static_cast<float>(a * std::abs(static_cast<double>(c) - cc) +
                                           b * static_cast<double>(h - 1 - r));
        }
    }
    return dem;
}

} // namespace

TEST(Catchments, VValleyAreasAreExact) {
    // Point on the channel at row r0: its catchment is every cell on rows 0..r0, i.e.
    // w (r0 + 1) cells (computed from the geometry); the outlet at the bottom gets the rest.
    const std::size_t w = 41;
    const std::size_t h = 60;
    const auto dem = v_valley(w, h, 3.0, 1.0);
    const auto dirs = conditioned_directions(dem, {}, 1);
    const std::size_t r0 = 29;
    for (const auto how : {CatchmentSearch::every_cell, CatchmentSearch::from_outlets}) {
        const auto c = delineate_catchments(dirs, {dem.index(20, h - 1), dem.index(20, r0)}, how);
        EXPECT_EQ(c.local_cells[1], w * (r0 + 1));
        EXPECT_EQ(c.total_cells[1], w * (r0 + 1));
        EXPECT_EQ(c.total_cells[0], w * h);
        EXPECT_EQ(c.local_cells[0], w * (h - r0 - 1));
        EXPECT_EQ(c.downstream_label[1], 1U);
        EXPECT_EQ(c.downstream_label[0], 0U);
        ASSERT_EQ(c.upstream_labels[0].size(), 1U);
        EXPECT_EQ(c.upstream_labels[0][0], 2U);
        for (std::size_t r = 0; r < h; ++r) {
            for (std::size_t col = 0; col < w; ++col) {
                EXPECT_EQ(c.labels(col, r), r <= r0 ? 2U : 1U);
            }
        }
        EXPECT_EQ(total_catchment_labels(c, 1), (std::vector<std::uint32_t>{1, 2}));
    }
}

TEST(Catchments, NestedPointsAreConsistentOnRandomDems) {
    for (const unsigned seed : {41U, 42U, 43U}) {
        const auto dem = test::random_dem(100, 150, seed);
        const auto dirs = conditioned_directions(dem, {}, 2);
        const auto acc = flow_accumulation(dirs);
        // Outlets: every 37th valid cell with some accumulation (many nest).
        std::vector<std::size_t> outlets;
        for (std::size_t i = 0; i < dirs.size(); i += 37) {
            if (acc[i] >= 3) {
                outlets.push_back(i);
            }
        }
        ASSERT_GT(outlets.size(), 10U);
        // Both ways of finding the cells give the same catchments; the checks below are on
        // the walk from every cell.
        const auto c = delineate_catchments(dirs, outlets, CatchmentSearch::every_cell);
        const auto searched = delineate_catchments(dirs, outlets, CatchmentSearch::from_outlets);
        EXPECT_TRUE(std::equal(c.labels.cells().begin(), c.labels.cells().end(),
                               searched.labels.cells().begin()))
            << "seed " << seed;
        EXPECT_EQ(c.local_cells, searched.local_cells) << "seed " << seed;
        EXPECT_EQ(c.total_cells, searched.total_cells) << "seed " << seed;
        EXPECT_EQ(c.upstream_labels, searched.upstream_labels) << "seed " << seed;
        // The walks on several threads (blocks of 64 rows) give the same catchments.
        for (const unsigned threads : {2U, 3U, 5U}) {
            const auto parallel =
                delineate_catchments(dirs, outlets, CatchmentSearch::every_cell, threads);
            EXPECT_TRUE(std::equal(c.labels.cells().begin(), c.labels.cells().end(),
                                   parallel.labels.cells().begin()))
                << "seed " << seed << ", " << threads << " threads";
            EXPECT_EQ(c.local_cells, parallel.local_cells) << "seed " << seed;
            EXPECT_EQ(c.total_cells, parallel.total_cells) << "seed " << seed;
        }
        std::size_t nested = 0;
        for (std::size_t k = 0; k < outlets.size(); ++k) {
            // Accumulation at each outlet equals its catchment's cell count.
            EXPECT_EQ(c.total_cells[k], acc[outlets[k]]) << "seed " << seed << " outlet " << k;
            std::uint64_t sum = c.local_cells[k];
            for (const std::uint32_t up : c.upstream_labels[k]) {
                sum += c.total_cells[up - 1];
                ++nested;
            }
            EXPECT_EQ(c.total_cells[k], sum);
        }
        EXPECT_GT(nested, 0U) << "the test should contain nested points (seed " << seed << ")";
        // Each labelled cell's path meets its own outlet before any other.
        for (std::size_t i = 0; i < dirs.size(); ++i) {
            if (c.labels[i] == 0) {
                continue;
            }
            std::size_t j = i;
            while (c.labels[j] != 0 && outlets[c.labels[j] - 1] != j) {
                EXPECT_EQ(c.labels[j], c.labels[i]);
                j = downstream_cell(dirs, j);
            }
            EXPECT_EQ(outlets[c.labels[i] - 1], j);
        }
    }
}

TEST(Catchments, RepeatedOutletIsAnInternalError) {
    const auto dem = test::random_dem(20, 20, 5, false);
    const auto dirs = conditioned_directions(dem, {}, 1);
    EXPECT_THROW((void)delineate_catchments(dirs, {3, 3}), InternalError);
    EXPECT_THROW((void)delineate_catchments(dirs, {3, 3}, CatchmentSearch::from_outlets),
                 InternalError);
}
