// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/conditioning.hpp"

#include "catchpeak/terrain/accumulation.hpp"
#include "catchpeak/terrain/flow_direction.hpp"
#include "test_dems.hpp"

#include <gtest/gtest.h>

#include <limits>
#include <random>
#include <string>

using namespace catchpeak;
using namespace catchpeak::terrain;

namespace {

bool is_data(float v) { return !std::isnan(v) && v != test::nodata_value; }

/// Reference fill by the method of Planchon and Darboux (2001, Catena 46:159-176), with no
/// minimal slope: start from an infinitely high water surface W everywhere except on the outlet
/// cells (raster edge, next to nodata), where W = Z, and lower W cell by cell
/// (W(c) = max(Z(c), min over neighbours W(n))) until nothing changes. A different algorithm
/// from Priority-Flood with the same result for a plain fill.
Grid<float> planchon_darboux_fill(const Grid<float> &z) {
    const std::size_t w = z.width();
    const std::size_t h = z.height();
    Grid<float> out = z;
    const float inf = std::numeric_limits<float>::infinity();
    const auto at = [&](long long c, long long r) -> const float * {
        if (c < 0 || r < 0 || c >= static_cast<long long>(w) || r >= static_cast<long long>(h)) {
            return nullptr;
        }
        return &z(static_cast<std::size_t>(c), static_cast<std::size_t>(r));
    };
    for (std::size_t r = 0; r < h; ++r) {
        for (std::size_t c = 0; c < w; ++c) {
            if (!is_data(z(c, r))) {
                continue;
            }
            bool border = false;
            for (int dr = -1; dr <= 1; ++dr) {
                for (int dc = -1; dc <= 1; ++dc) {
                    const float *n =
                        at(static_cast<long long>(c) + dc, static_cast<long long>(r) + dr);
                    border = border || n == nullptr || !is_data(*n);
                }
            }
            out(c, r) = border ? z(c, r) : inf;
        }
    }
    bool changed = true;
    while (changed) {
        changed = false;
        for (std::size_t r = 1; r + 1 < h; ++r) {
            for (std::size_t c = 1; c + 1 < w; ++c) {
                if (!is_data(z(c, r)) || out(c, r) == z(c, r)) {
                    continue;
                }
                for (int dr = -1; dr <= 1; ++dr) {
                    for (int dc = -1; dc <= 1; ++dc) {
                        const float wn = out(c + static_cast<std::size_t>(dc + 1) - 1,
                                             r + static_cast<std::size_t>(dr + 1) - 1);
                        if (!is_data(wn) || (dc == 0 && dr == 0)) {
                            continue;
                        }
                        if (z(c, r) >= wn) {
                            out(c, r) = z(c, r); // the cell can drain as it is
                            changed = true;
                        } else if (out(c, r) > wn) {
                            out(c, r) = wn; // lower the water surface to the neighbour's
                            changed = true;
                        }
                    }
                }
            }
        }
    }
    return out;
}

} // namespace

TEST(Conditioning, FillEqualsPlanchonDarbouxReferenceOnRandomDems) {
    for (const unsigned seed : {1U, 2U, 3U, 4U}) {
        const auto dem = test::random_dem(70, 55, seed);
        auto filled = dem;
        fill_depressions(filled);
        const auto reference = planchon_darboux_fill(dem);
        std::size_t raised = 0;
        for (std::size_t i = 0; i < dem.size(); ++i) {
            ASSERT_EQ(filled[i], reference[i]) << "seed " << seed << " cell " << i;
            raised += filled[i] > dem[i] ? 1 : 0;
        }
        EXPECT_GT(raised, 0U) << "the test DEM should have depressions (seed " << seed << ")";
    }
}

TEST(Conditioning, FillInBandsOnSeveralThreadsEqualsPlanchonDarbouxReference) {
    // The fill on several threads floods bands of rows on their own and joins them through the
    // spill elevations between the bands' areas (Barnes 2016). It must give exactly the
    // reference fill. The DEMs: noise with little trend (many depressions, some crossing the
    // band boundaries), a wide bowl across the middle rows, and nodata cells on the rows where
    // bands meet (for 2, 3 and 4 bands).
    for (const unsigned seed : {31U, 32U, 33U}) {
        auto dem = test::random_dem(48, 320, seed);
        std::mt19937 rng(seed);
        for (std::size_t r = 0; r < dem.height(); ++r) {
            for (std::size_t c = 0; c < dem.width(); ++c) {
                if (!is_data(dem(c, r))) {
                    continue;
                }
                const double dr = static_cast<double>(r) - 160.0;
                const double dc = static_cast<double>(c) - 24.0;
                const double bowl = std::min(30.0, 0.004 * (dr * dr + dc * dc));
                dem(c, r) = static_cast<float>(0.01 * static_cast<double>(r) + bowl +
                                               static_cast<double>(rng() % 1000U) / 100.0);
            }
        }
        for (const std::size_t r : {79U, 80U, 106U, 107U, 159U, 160U, 213U, 240U}) {
            dem(5 + r % 30, r) = test::nodata_value;
        }
        const auto reference = planchon_darboux_fill(dem);
        std::size_t raised = 0;
        for (std::size_t i = 0; i < dem.size(); ++i) {
            raised += is_data(dem[i]) && reference[i] > dem[i] ? 1 : 0;
        }
        EXPECT_GT(raised, dem.size() / 4) << "the bowl should be filled (seed " << seed << ")";
        for (const unsigned threads : {1U, 2U, 3U, 4U, 7U}) {
            auto filled = dem;
            fill_depressions(filled, threads);
            for (std::size_t i = 0; i < dem.size(); ++i) {
                if (is_data(dem[i])) {
                    ASSERT_EQ(filled[i], reference[i])
                        << "seed " << seed << ", " << threads << " threads, cell " << i;
                } else {
                    ASSERT_EQ(filled[i], dem[i]) << "nodata must stay as it is";
                }
            }
        }
    }
}

TEST(Conditioning, EveryValidCellDrainsToTheEdgeOrNodata) {
    for (const unsigned seed : {11U, 12U, 13U}) {
        const auto dem = test::random_dem(80, 60, seed);
        const auto dirs = conditioned_directions(dem, {}, 1);
        auto filled = dem;
        fill_depressions(filled);
        for (std::size_t i = 0; i < dem.size(); ++i) {
            if (!is_data(dem[i])) {
                EXPECT_EQ(dirs[i], d8::none);
                continue;
            }
            ASSERT_NE(dirs[i], d8::none) << "seed " << seed << " cell " << i;
            const std::size_t end = test::path_end(dirs, i);
            ASSERT_NE(end, no_cell) << "seed " << seed << " cell " << i;
            // The last cell hands its water off the raster or to nodata.
            const std::size_t d = downstream_cell(dirs, end);
            EXPECT_TRUE(d == no_cell || !is_data(dem[d]));
            // Directions never lead up on the filled DEM.
            const std::size_t next = downstream_cell(dirs, i);
            if (next != no_cell && is_data(dem[next])) {
                EXPECT_LE(filled[next], filled[i]);
            }
        }
    }
}

TEST(Conditioning, ClosedBowlDrainsThroughItsSpillPoint) {
    // A bowl (lowest in the middle) behind a rim of 50 m on the raster edge, with one spill
    // cell of 6 m on the east edge. After the fill the bowl is a 6 m flat; every cell must
    // drain through the spill cell.
    const std::size_t n = 31;
    auto dem = test::blank_dem(n, n);
    for (std::size_t r = 0; r < n; ++r) {
        for (std::size_t c = 0; c < n; ++c) {
            const double dc = static_cast<double>(c) - 15.0;
            const double dr = static_cast<double>(r) - 15.0;
            const bool rim = (r == 0 || c == 0 || r + 1 == n || c + 1 == n);
            dem(c, r) = rim ? 50.0F : static_cast<float>(5.0 + 0.001 * (dc * dc + dr * dr));
        }
    }
    const std::size_t spill = dem.index(n - 1, 9);
    dem[spill] = 6.0F;
    const auto dirs = conditioned_directions(dem, {}, 2);
    for (std::size_t i = 0; i < dem.size(); ++i) {
        ASSERT_EQ(test::path_end(dirs, i), spill) << "cell " << i;
    }
    const auto acc = flow_accumulation(dirs);
    EXPECT_EQ(acc[spill], n * n);
}

TEST(Conditioning, FlatsDrainTowardLowerTerrainAwayFromHigher) {
    // A flat of 10 m between high walls (20 m) on the west, north and south and an outlet
    // column on the east (the raster edge at 5 m). Every flat cell must drain, and directions in
    // the flat must never point west (toward higher terrain).
    auto dem = test::blank_dem(12, 7);
    for (std::size_t r = 0; r < dem.height(); ++r) {
        for (std::size_t c = 0; c < dem.width(); ++c) {
            const bool wall = c == 0 || r == 0 || r + 1 == dem.height();
            dem(c, r) = wall ? 20.0F : (c + 1 == dem.width() ? 5.0F : 10.0F);
        }
    }
    const auto dirs = conditioned_directions(dem, {}, 1);
    for (std::size_t r = 1; r + 1 < dem.height(); ++r) {
        for (std::size_t c = 1; c + 1 < dem.width(); ++c) {
            const std::uint8_t k = dirs(c, r);
            ASSERT_NE(k, d8::none);
            EXPECT_GE(d8::dcol[k], 0) << "col " << c << " row " << r;
            EXPECT_NE(test::path_end(dirs, dirs.index(c, r)), no_cell);
        }
    }
}

TEST(Conditioning, TwoFlatsSharingOneOutletCellBothDrainThroughIt) {
    // Two flats of 10 m (columns 1-3 and 5-7, rows 1-4) inside 20 m walls, not connected to
    // each other through flat cells. Their only way out is one 10 m cell below the dividing
    // wall, touching a corner of each flat, which drains to a 5 m cell on the raster edge (no
    // flat cell touches that one). Both flats use the same outlet cell, so each must get it
    // when flats are resolved one at a time.
    auto dem = test::blank_dem(9, 7);
    for (std::size_t r = 0; r < dem.height(); ++r) {
        for (std::size_t c = 0; c < dem.width(); ++c) {
            const bool wall = c == 0 || c == 4 || c == 8 || r == 0 || r >= 5;
            dem(c, r) = wall ? 20.0F : 10.0F;
        }
    }
    dem(4, 5) = 10.0F; // the shared outlet cell
    dem(4, 6) = 5.0F;  // on the raster edge
    const auto dirs = conditioned_directions(dem, {}, 1);
    for (std::size_t r = 1; r <= 4; ++r) {
        for (const std::size_t c : {1U, 2U, 3U, 5U, 6U, 7U}) {
            ASSERT_NE(dirs(c, r), d8::none) << "col " << c << " row " << r;
            EXPECT_EQ(test::path_end(dirs, dirs.index(c, r)), dirs.index(4, 6))
                << "col " << c << " row " << r;
        }
    }
}

namespace {

/// D8 directions of a DEM after the fill and flat resolution on `threads` threads.
Grid<std::uint8_t> directions_on_threads(const Grid<float> &dem, unsigned threads) {
    auto filled = dem;
    fill_depressions(filled);
    auto dirs = d8_directions(filled);
    resolve_flats(filled, dirs, threads);
    return dirs;
}

void expect_every_valid_cell_drains(const Grid<float> &dem, const Grid<std::uint8_t> &dirs,
                                    const std::string &what) {
    for (std::size_t i = 0; i < dem.size(); ++i) {
        if (is_data(dem[i])) {
            ASSERT_NE(test::path_end(dirs, i), no_cell) << what << " cell " << i;
        }
    }
}

} // namespace

TEST(Conditioning, FlatsResolvedOnSeveralThreadsGiveTheSameDirections) {
    // Flats are resolved in bands of rows, one per thread; a flat reaching out of its band is
    // resolved afterwards over the whole grid. The directions must not depend on the thread
    // count. Wide flats (whole metres over a gentle trend) cross the band boundaries.
    for (const unsigned seed : {21U, 22U}) {
        auto dem = test::random_dem(70, 420, seed);
        std::mt19937 rng(seed);
        for (std::size_t r = 0; r < dem.height(); ++r) {
            for (std::size_t c = 0; c < dem.width(); ++c) {
                if (is_data(dem(c, r))) {
                    const double z = 0.01 * static_cast<double>(r) +
                                     0.005 * static_cast<double>(c) +
                                     static_cast<double>(rng() % 100U) / 100.0 * 1.5;
                    dem(c, r) = static_cast<float>(std::floor(z));
                }
            }
        }
        const auto one = directions_on_threads(dem, 1);
        expect_every_valid_cell_drains(dem, one, "seed " + std::to_string(seed));
        for (const unsigned threads : {2U, 3U, 4U, 7U}) {
            ASSERT_EQ(directions_on_threads(dem, threads).cells(), one.cells())
                << "seed " << seed << ", " << threads << " threads";
        }
    }
}

TEST(Conditioning, FlatPutOffByItsBandDoesNotTakeANeighbouringFlatsSearch) {
    // Two flats of 10 m (columns 1-3, rows 95-150, and columns 5-7, rows 110-150) inside 20 m
    // walls, sharing one outlet cell (4, 151) that touches a corner of each; below it a channel
    // falls to the south edge. With two threads the lower band starts at row 102: the west flat
    // reaches out of it (it is found first and put off), the east flat lies inside it. The east
    // flat's search from the shared outlet must not run into the west flat's cells.
    auto dem = test::blank_dem(9, 200);
    for (std::size_t r = 0; r < dem.height(); ++r) {
        for (std::size_t c = 0; c < dem.width(); ++c) {
            const bool west = c >= 1 && c <= 3 && r >= 95 && r <= 150;
            const bool east = c >= 5 && c <= 7 && r >= 110 && r <= 150;
            dem(c, r) = west || east ? 10.0F : 20.0F;
        }
    }
    dem(4, 151) = 10.0F;
    for (std::size_t r = 152; r < dem.height(); ++r) {
        dem(4, r) = static_cast<float>(5.0 - 0.01 * static_cast<double>(r - 152));
    }
    const std::size_t south = dem.index(4, dem.height() - 1);
    for (const unsigned threads : {1U, 2U, 3U}) {
        const auto dirs = directions_on_threads(dem, threads);
        for (std::size_t r = 95; r <= 150; ++r) {
            for (const std::size_t c : {1U, 2U, 3U, 5U, 6U, 7U}) {
                if (c >= 5 && r < 110) {
                    continue;
                }
                ASSERT_EQ(test::path_end(dirs, dirs.index(c, r)), south)
                    << threads << " threads, col " << c << " row " << r;
            }
        }
        expect_every_valid_cell_drains(dem, dirs, std::to_string(threads) + " threads");
    }
}

TEST(Conditioning, NarrowTallDemsGiveTheSameFillAndDirectionsOnSeveralThreads) {
    // One and two columns, 300 rows: every cell of a band lies on its edge, and bands meet
    // across a row of one or two cells. Also 129 rows (two bands of 64 and 65 rows).
    for (const auto &[w, h] : {std::pair<std::size_t, std::size_t>{1, 300}, {2, 300}, {3, 129}}) {
        auto dem = test::random_dem(w, h, 51, false);
        std::mt19937 rng(52);
        for (auto &v : dem.cells()) {
            v = static_cast<float>(std::floor(static_cast<double>(rng() % 1000U) / 100.0));
        }
        dem(0, h / 2) = test::nodata_value;
        const auto reference = planchon_darboux_fill(dem);
        const auto one = directions_on_threads(dem, 1);
        expect_every_valid_cell_drains(dem, one, std::to_string(w) + " columns");
        for (const unsigned threads : {2U, 3U, 4U}) {
            auto filled = dem;
            fill_depressions(filled, threads);
            for (std::size_t i = 0; i < dem.size(); ++i) {
                if (is_data(dem[i])) {
                    ASSERT_EQ(filled[i], reference[i])
                        << w << " columns, " << threads << " threads";
                }
            }
            EXPECT_EQ(directions_on_threads(dem, threads).cells(), one.cells())
                << w << " columns, " << threads << " threads";
        }
    }
}

TEST(Conditioning, RasterizedPolylineIsAnEightConnectedChain) {
    const auto dem = test::blank_dem(40, 30);
    // A polyline with a shallow and a steep leg, in CRS metres (cells 10 m, origin 1000, 5000).
    const std::vector<std::pair<double, double>> line{
        {1005.0, 4995.0}, {1255.0, 4905.0}, {1275.0, 4705.0}};
    const auto cells = rasterize_polyline(dem.transform, dem.width(), dem.height(), line);
    ASSERT_GE(cells.size(), 2U);
    EXPECT_EQ(cells.front(), dem.index(0, 0));
    EXPECT_EQ(cells.back(), dem.index(27, 29));
    for (std::size_t k = 1; k < cells.size(); ++k) {
        const long long dc =
            static_cast<long long>(cells[k] % 40) - static_cast<long long>(cells[k - 1] % 40);
        const long long dr =
            static_cast<long long>(cells[k] / 40) - static_cast<long long>(cells[k - 1] / 40);
        EXPECT_LE(std::abs(dc), 1);
        EXPECT_LE(std::abs(dr), 1);
        EXPECT_NE(cells[k], cells[k - 1]);
    }
}

TEST(Conditioning, BreachLineDescendsFromItsHigherEndAndNeverRaises) {
    auto dem = test::blank_dem(10, 3);
    const float z[10] = {8, 9, 12, 12, 7, 11, 6, 6, 5, 4};
    for (std::size_t c = 0; c < 10; ++c) {
        dem(c, 1) = z[c];
    }
    const auto original = dem;
    // Drawn from the low end (east) to the high end (west): the rule walks from the higher end.
    apply_breach_lines(dem, {BreachLine{"culvert", {{1095.0, 4985.0}, {1005.0, 4985.0}}}});
    const float expected[10] = {8, 8, 8, 8, 7, 7, 6, 6, 5, 4}; // running minimum from the west
    for (std::size_t c = 0; c < 10; ++c) {
        EXPECT_EQ(dem(c, 1), expected[c]) << "col " << c;
        EXPECT_LE(dem(c, 1), original(c, 1));
    }
}

TEST(Conditioning, BreachLineLetsWaterThroughAnEmbankment) {
    // A valley falling south along column 20, crossed by a road embankment on row 20 (crest
    // 30 m above the valley) whose lowest point is at column 3, walled on the other sides. Without
    // a breach line the water above the road crosses it at column 3 (after filling); with a breach
    // line drawn along the valley through the embankment it crosses at column 20.
    const std::size_t w = 41;
    const std::size_t h = 40;
    auto dem = test::blank_dem(w, h);
    for (std::size_t r = 0; r < h; ++r) {
        for (std::size_t c = 0; c < w; ++c) {
            const double side = std::abs(static_cast<double>(c) - 20.0);
            dem(c, r) = static_cast<float>(0.5 * side + 0.2 * static_cast<double>(h - 1 - r));
        }
    }
    for (std::size_t c = 0; c < w; ++c) {
        dem(c, 20) = c == 3 ? 35.0F : 40.0F;
        dem(c, 0) = 50.0F; // walls around the part above the road, so it can only leave
    }                      // across the road
    for (std::size_t r = 0; r < 20; ++r) {
        dem(0, r) = 50.0F;
        dem(w - 1, r) = 50.0F;
    }
    const std::size_t upstream = dem.index(20, 5);
    const auto crossing_col = [&](const Grid<std::uint8_t> &dirs) {
        std::size_t i = upstream;
        while (i != no_cell && i / w < 20) {
            i = downstream_cell(dirs, i);
        }
        if (i == no_cell) {
            return w; // left the raster elsewhere
        }
        return i % w;
    };
    EXPECT_EQ(crossing_col(conditioned_directions(dem, {}, 1)), 3U);
    const BreachLine culvert{"C1",
                             {{1205.0, 5000.0 - 18.5 * 10.0}, {1205.0, 5000.0 - 22.5 * 10.0}}};
    EXPECT_EQ(crossing_col(conditioned_directions(dem, {culvert}, 1)), 20U);
}
