// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/accumulation.hpp"

#include "../../src/terrain/internal.hpp"
#include "catchpeak/terrain/conditioning.hpp"
#include "catchpeak/terrain/flow_direction.hpp"
#include "test_dems.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <bit>
#include <cmath>
#include <string>
#include <utility>
#include <vector>

using namespace catchpeak;
using namespace catchpeak::terrain;

TEST(Accumulation, InclinedPlaneCountsTheCellsAboveInTheColumn) {
    // Plane falling south: each column drains straight down, so the cell on row r receives the
    // r cells above it plus itself; the upstream length is r x dy (computed from the geometry).
    auto dem = test::blank_dem(8, 12, 10.0, 25.0);
    for (std::size_t r = 0; r < dem.height(); ++r) {
        for (std::size_t c = 0; c < dem.width(); ++c) {
            dem(c, r) = static_cast<float>(100.0 - static_cast<double>(r));
        }
    }
    const auto dirs = d8_directions(dem, 1);
    const auto al = accumulation_and_length(dirs);
    for (std::size_t r = 0; r < dem.height(); ++r) {
        for (std::size_t c = 0; c < dem.width(); ++c) {
            EXPECT_EQ(al.accumulation(c, r), r + 1);
            EXPECT_FLOAT_EQ(al.upstream_length_m(c, r), 25.0F * static_cast<float>(r));
        }
    }
    EXPECT_EQ(flow_accumulation(dirs).cells(), al.accumulation.cells());
}

TEST(Accumulation, OutletsTogetherHoldEveryValidCellOnRandomDems) {
    for (const unsigned seed : {21U, 22U, 23U}) {
        const auto dem = test::random_dem(90, 70, seed);
        const auto dirs = conditioned_directions(dem, {}, 2);
        const auto acc = flow_accumulation(dirs);
        std::uint64_t valid = 0;
        std::uint64_t at_outlets = 0;
        for (std::size_t i = 0; i < dirs.size(); ++i) {
            if (dirs[i] == d8::none) {
                EXPECT_EQ(acc[i], 0U);
                continue;
            }
            ++valid;
            const std::size_t d = downstream_cell(dirs, i);
            if (d == no_cell || dirs[d] == d8::none) {
                at_outlets += acc[i];
            } else {
                // Conservation: a cell holds itself plus what it passes on is counted below.
                EXPECT_LT(acc[i], acc[d] + 1);
            }
        }
        EXPECT_EQ(at_outlets, valid) << "seed " << seed;
    }
}

TEST(Accumulation, EachCellEqualsOnePlusItsInflows) {
    const auto dem = test::random_dem(60, 50, 31);
    const auto dirs = conditioned_directions(dem, {}, 1);
    const auto acc = flow_accumulation(dirs);
    std::vector<std::uint64_t> inflow(dirs.size(), 0);
    for (std::size_t i = 0; i < dirs.size(); ++i) {
        const std::size_t d = downstream_cell(dirs, i);
        if (dirs[i] != d8::none && d != no_cell && dirs[d] != d8::none) {
            inflow[d] += acc[i];
        }
    }
    for (std::size_t i = 0; i < dirs.size(); ++i) {
        if (dirs[i] != d8::none) {
            EXPECT_EQ(acc[i], inflow[i] + 1) << "cell " << i;
        }
    }
}

// The walk on strips of rows, one a thread (detail::accumulation_and_length_into): the same
// three grids, bit for bit, whatever the thread count.
namespace {

using Codes = std::vector<std::vector<std::uint8_t>>; // rows of direction codes

Grid<std::uint8_t> directions(const Codes &rows, double dx = 10.0, double dy = 10.0) {
    Grid<std::uint8_t> dirs(rows.front().size(), rows.size(), d8::none);
    dirs.transform = GeoTransform{1000.0, dx, 0.0, 5000.0, 0.0, -dy};
    for (std::size_t r = 0; r < rows.size(); ++r) {
        for (std::size_t c = 0; c < rows[r].size(); ++c) {
            dirs(c, r) = rows[r][c];
        }
    }
    return dirs;
}

AccumulationAndLength on_threads(const Grid<std::uint8_t> &dirs, unsigned threads,
                                 detail::AccumulationWalkStats *stats = nullptr) {
    AccumulationAndLength out;
    detail::accumulation_and_length_into(dirs, out, threads, stats);
    return out;
}

/// The three grids from their definitions (accumulation.hpp), by Kahn's topological order over
/// the valid cells: acc = 1 + the inflows' acc; len = the longest of the inflows' len + step;
/// the code of the lowest-coded neighbour giving that longest length.
AccumulationAndLength by_definition(const Grid<std::uint8_t> &dirs) {
    const std::size_t w = dirs.width();
    const std::size_t n = dirs.size();
    const auto into = [&](std::size_t i) {
        const std::size_t d = downstream_cell(dirs, i);
        return (d != no_cell && dirs[d] != d8::none) ? d : no_cell;
    };
    std::vector<int> inflows(n, 0);
    for (std::size_t i = 0; i < n; ++i) {
        if (dirs[i] != d8::none && into(i) != no_cell) {
            ++inflows[into(i)];
        }
    }
    AccumulationAndLength out;
    out.accumulation = Grid<std::uint32_t>(w, dirs.height(), 0);
    out.upstream_length_m = Grid<float>(w, dirs.height(), 0.0F);
    out.longest_upstream = Grid<std::uint8_t>(w, dirs.height(), d8::none);
    std::vector<std::size_t> ready;
    for (std::size_t i = 0; i < n; ++i) {
        if (dirs[i] != d8::none && inflows[i] == 0) {
            ready.push_back(i);
        }
    }
    while (!ready.empty()) {
        const std::size_t i = ready.back();
        ready.pop_back();
        std::uint32_t acc = 1;
        float best = 0.0F;
        std::uint8_t best_code = d8::none;
        const auto c = static_cast<std::ptrdiff_t>(i % w);
        const auto r = static_cast<std::ptrdiff_t>(i / w);
        for (std::uint8_t k = 1; k <= 8; ++k) { // k: the way from i to the neighbour u
            const std::ptrdiff_t uc = c + d8::dcol[k];
            const std::ptrdiff_t ur = r + d8::drow[k];
            if (uc < 0 || ur < 0 || uc >= static_cast<std::ptrdiff_t>(w) ||
                ur >= static_cast<std::ptrdiff_t>(dirs.height())) {
                continue;
            }
            const auto u = static_cast<std::size_t>(ur) * w + static_cast<std::size_t>(uc);
            if (dirs[u] != d8::opposite[k]) {
                continue;
            }
            acc += out.accumulation[u];
            const auto step = static_cast<float>(
                step_length_m(dirs[u], dirs.transform.cell_dx(), dirs.transform.cell_dy()));
            const float cand = out.upstream_length_m[u] + step;
            if (best_code == d8::none || cand > best) { // k rises: a tie keeps the lower
                best = cand;
                best_code = k;
            }
        }
        out.accumulation[i] = acc;
        out.upstream_length_m[i] = best;
        out.longest_upstream[i] = best_code;
        const std::size_t d = into(i);
        if (d != no_cell && --inflows[d] == 0) {
            ready.push_back(d);
        }
    }
    return out;
}

template <typename T> std::vector<T> plain(const Grid<T> &g) {
    return {g.cells().begin(), g.cells().end()};
}

std::vector<std::uint32_t> bits(const Grid<float> &g) {
    std::vector<std::uint32_t> out;
    for (const float v : g.cells()) {
        out.push_back(std::bit_cast<std::uint32_t>(v));
    }
    return out;
}

void expect_same(const AccumulationAndLength &a, const AccumulationAndLength &b,
                 const std::string &what) {
    EXPECT_EQ(a.accumulation.cells(), b.accumulation.cells()) << what;
    EXPECT_EQ(bits(a.upstream_length_m), bits(b.upstream_length_m)) << what;
    EXPECT_EQ(a.longest_upstream.cells(), b.longest_upstream.cells()) << what;
}

/// Every valid cell is counted at the end of its path, so each outlet's acc is the number of
/// cells upstream of it, itself included.
void expect_outlets_hold_their_cells(const Grid<std::uint8_t> &dirs, const Grid<std::uint32_t> &acc,
                                     const std::string &what) {
    std::vector<std::uint32_t> cells_above(dirs.size(), 0);
    for (std::size_t i = 0; i < dirs.size(); ++i) {
        const std::size_t end = test::path_end(dirs, i);
        if (end != no_cell) {
            ++cells_above[end];
        }
    }
    for (std::size_t i = 0; i < dirs.size(); ++i) {
        if (cells_above[i] != 0) {
            EXPECT_EQ(acc[i], cells_above[i]) << what << ", outlet " << i;
        }
    }
}

/// The cells below the cells entered from another strip (rows split as the walk splits them):
/// the walk after the strips must visit each of them once.
std::size_t cells_below_strip_entries(const Grid<std::uint8_t> &dirs, unsigned threads) {
    const std::size_t w = dirs.width();
    const std::size_t strip_rows = (dirs.height() + threads - 1) / threads;
    std::vector<bool> below(dirs.size(), false);
    std::size_t count = 0;
    for (std::size_t i = 0; i < dirs.size(); ++i) {
        std::size_t d = downstream_cell(dirs, i);
        if (dirs[i] == d8::none || d == no_cell || dirs[d] == d8::none ||
            (i / w) / strip_rows == (d / w) / strip_rows) {
            continue;
        }
        for (; d != no_cell && dirs[d] != d8::none && !below[d]; d = downstream_cell(dirs, d)) {
            below[d] = true;
            ++count;
        }
    }
    return count;
}

void expect_same_for_any_thread_count(const Grid<std::uint8_t> &dirs, const std::string &what) {
    const auto expected = by_definition(dirs);
    for (const unsigned threads : {1U, 2U, 3U, 4U, 7U}) {
        const std::string label = what + ", threads " + std::to_string(threads);
        detail::AccumulationWalkStats stats;
        const auto got = on_threads(dirs, threads, &stats);
        expect_same(got, expected, label);
        expect_outlets_hold_their_cells(dirs, got.accumulation, label);
        EXPECT_EQ(stats.affected_cells, cells_below_strip_entries(dirs, threads)) << label;
    }
}

/// A path through every cell: along the rows in a spiral from the north-west corner inwards,
/// so that it crosses every boundary between strips of rows several times.
Grid<std::uint8_t> spiral(std::size_t w, std::size_t h) {
    Codes rows(h, std::vector<std::uint8_t>(w, d8::none));
    std::size_t top = 0;
    std::size_t bottom = h - 1;
    std::size_t left = 0;
    std::size_t right = w - 1;
    std::vector<std::pair<std::size_t, std::size_t>> order; // (c, r) along the path
    while (top <= bottom && left <= right) {
        for (std::size_t c = left; c <= right; ++c) {
            order.emplace_back(c, top);
        }
        for (std::size_t r = top + 1; r <= bottom; ++r) {
            order.emplace_back(right, r);
        }
        if (top < bottom) {
            for (std::size_t c = right; c-- > left;) {
                order.emplace_back(c, bottom);
            }
        }
        if (left < right) {
            for (std::size_t r = bottom; r-- > top + 1;) {
                order.emplace_back(left, r);
            }
        }
        ++top;
        ++left;
        if (bottom == 0 || right == 0) {
            break;
        }
        --bottom;
        --right;
    }
    for (std::size_t p = 0; p + 1 < order.size(); ++p) {
        const auto [c, r] = order[p];
        const auto [nc, nr] = order[p + 1];
        for (std::uint8_t k = 1; k <= 8; ++k) {
            if (static_cast<std::ptrdiff_t>(nc) - static_cast<std::ptrdiff_t>(c) == d8::dcol[k] &&
                static_cast<std::ptrdiff_t>(nr) - static_cast<std::ptrdiff_t>(r) == d8::drow[k]) {
                rows[r][c] = k;
            }
        }
    }
    // The last cell, in the middle, keeps d8::none: the cell before it is the outlet.
    return directions(rows, 10.0, 25.0);
}

} // namespace

TEST(AccumulationStrips, HandWorkedGridAcrossOneBoundary) {
    // 3 x 4 cells of 10 m; on 2 threads rows 0-1 and rows 2-3 are walked apart. The path from
    // (0,1) goes down into row 2, back up to (2,1) and down again to (2,3), which drains off
    // the raster's south edge. Expected values worked out by hand from the definitions:
    //   E=1 SE=2 S=3 SW=4 W=5 NW=6 N=7 NE=8
    //   row 0:  S  E  S       acc 1 1  2     len 0  0  10
    //   row 1:  S  W  S           3 1 10         10 0  44.14
    //   row 2:  E NE  S           5 7 11         20 30 54.14
    //   row 3:  N  N  S           1 1 12          0  0 64.14
    // (0,1) takes (0,0) and (1,1), both 10 m: the tie goes to the lower code, east (1).
    const auto dirs = directions({{3, 1, 3}, {3, 5, 3}, {1, 8, 3}, {7, 7, 3}});
    const float diagonal = std::sqrt(200.0F);
    const std::vector<std::uint32_t> acc{1, 1, 2, 3, 1, 10, 5, 7, 11, 1, 1, 12};
    const std::vector<float> len{0, 0, 10,           10, 0, 30 + diagonal, 20, 30, 40 + diagonal,
                                 0, 0, 50 + diagonal};
    const std::vector<std::uint8_t> up{0, 0, 5, 1, 0, 4, 7, 5, 7, 0, 0, 7};
    for (const unsigned threads : {1U, 2U, 3U, 4U, 7U}) {
        detail::AccumulationWalkStats stats;
        const auto got = on_threads(dirs, threads, &stats);
        EXPECT_EQ(plain(got.accumulation), acc) << "threads " << threads;
        for (std::size_t i = 0; i < len.size(); ++i) {
            EXPECT_FLOAT_EQ(got.upstream_length_m[i], len[i]) << "threads " << threads;
        }
        EXPECT_EQ(plain(got.longest_upstream), up) << "threads " << threads;
        if (threads == 2) {
            // Leaving their strip: (0,1), (1,2) and (2,1); below their entries (0,2), (2,1)
            // and (2,2): (0,2) (1,2) (2,1) (2,2) (2,3), each walked once.
            EXPECT_EQ(stats.strips, 2U);
            EXPECT_EQ(stats.leaving_cells, 3U);
            EXPECT_EQ(stats.affected_cells, 5U);
        }
    }
}

TEST(AccumulationStrips, RandomDemsGiveTheSameGridsOnAnyThreadCount) {
    for (const unsigned seed : {41U, 42U, 43U}) {
        for (const auto &[w, h] : {std::pair<std::size_t, std::size_t>{90, 70}, {37, 53}}) {
            const auto dem = test::random_dem(w, h, seed);
            const std::string label =
                std::to_string(w) + " x " + std::to_string(h) + ", seed " + std::to_string(seed);
            expect_same_for_any_thread_count(conditioned_directions(dem, {}, 2),
                                             "conditioned, " + label);
            // Unconditioned: pits without direction end paths inside the raster.
            expect_same_for_any_thread_count(d8_directions(dem, 1), "unconditioned, " + label);
        }
    }
}

TEST(AccumulationStrips, SpiralCrossingTheStripsManyTimes) {
    for (const auto &[w, h] : {std::pair<std::size_t, std::size_t>{9, 11}, {16, 16}, {5, 30}}) {
        const auto dirs = spiral(w, h);
        expect_same_for_any_thread_count(dirs,
                                         "spiral " + std::to_string(w) + " x " + std::to_string(h));
        // One path through all cells: its last cell holds them all.
        const auto got = on_threads(dirs, 4);
        EXPECT_EQ(
            *std::max_element(got.accumulation.cells().begin(), got.accumulation.cells().end()),
            w * h - 1);
    }
}

TEST(AccumulationStrips, ZigZagThroughEveryColumn) {
    // Down column 0, up column 1, down column 2, ...: one path through every cell, crossing
    // every boundary between strips once a column.
    const std::size_t w = 8;
    const std::size_t h = 13;
    Codes rows(h, std::vector<std::uint8_t>(w, d8::none));
    for (std::size_t c = 0; c < w; ++c) {
        const bool down = c % 2 == 0;
        for (std::size_t r = 0; r < h; ++r) {
            const bool turn = down ? r + 1 == h : r == 0;
            rows[r][c] = turn ? d8::east : (down ? d8::south : d8::north);
        }
    }
    const auto dirs = directions(rows);
    expect_same_for_any_thread_count(dirs, "zig-zag");
    const auto got = on_threads(dirs, 3);
    EXPECT_EQ(got.accumulation(w - 1, 0), w * h); // column 7 goes up and leaves east at row 0
}

TEST(AccumulationStrips, ManyEntriesJoiningOneLongPathAreWalkedOnce) {
    // Rows 0-31 drain south into row 32, which drains west to column 0, which runs south to
    // the edge. On 2 threads all 64 cells of row 32 are entered from the strip above; below
    // them lie row 32 and column 0 down to row 63: 64 + 31 cells, each walked once (following
    // each entry to the path's end would take 4,064 steps).
    const std::size_t n = 64;
    Codes rows(n, std::vector<std::uint8_t>(n, d8::south));
    for (std::size_t r = n / 2; r < n; ++r) {
        for (std::size_t c = 1; c < n; ++c) {
            rows[r][c] = d8::west;
        }
    }
    const auto dirs = directions(rows);
    detail::AccumulationWalkStats stats;
    const auto got = on_threads(dirs, 2, &stats);
    EXPECT_EQ(stats.leaving_cells, n);
    EXPECT_EQ(stats.affected_cells, n + n / 2 - 1);
    EXPECT_EQ(got.accumulation(0, n - 1), n * n);
    expect_same_for_any_thread_count(dirs, "join");
}

TEST(AccumulationStrips, OneRowOneColumnAndMoreThreadsThanRows) {
    // Cells 0-3 east and 5-8 west into cell 4, which drains south off the raster; cell 9 east.
    const auto row = directions({{1, 1, 1, 1, 3, 5, 5, 5, 5, 1}});
    // Rows 0-3 south and rows 5-6 north into row 4, which drains west off the raster.
    const auto column = directions({{3}, {3}, {3}, {3}, {5}, {7}, {7}});
    for (const unsigned threads : {1U, 2U, 3U, 4U, 7U, 16U}) {
        const std::string label = "threads " + std::to_string(threads);
        EXPECT_EQ(plain(on_threads(row, threads).accumulation),
                  (std::vector<std::uint32_t>{1, 2, 3, 4, 9, 4, 3, 2, 1, 1}))
            << label;
        EXPECT_EQ(plain(on_threads(column, threads).accumulation),
                  (std::vector<std::uint32_t>{1, 2, 3, 4, 7, 2, 1}))
            << label;
    }
    expect_same_for_any_thread_count(row, "one row");
    expect_same_for_any_thread_count(column, "one column");
}
