// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/accumulation.hpp"

#include "catchpeak/terrain/flow_direction.hpp"
#include "internal.hpp"

#include <algorithm>
#include <array>
#include <cstddef>
#include <cstring>
#include <type_traits>
#include <unordered_map>
#include <utility>
#include <vector>

namespace catchpeak::terrain {

namespace {

/// Sixteen bytes processed as one value (GCC and Clang vector extension).
using Bytes16 = std::int8_t __attribute__((vector_size(16)));
static_assert(d8::dcol[1] == 1 && d8::drow[1] == 0 && d8::opposite[1] == 5 && d8::dcol[2] == 1 &&
                  d8::drow[2] == 1 && d8::opposite[2] == 6 && d8::dcol[3] == 0 &&
                  d8::drow[3] == 1 && d8::opposite[3] == 7 && d8::dcol[4] == -1 &&
                  d8::drow[4] == 1 && d8::opposite[4] == 8 && d8::dcol[5] == -1 &&
                  d8::drow[5] == 0 && d8::dcol[6] == -1 && d8::drow[6] == -1 && d8::dcol[7] == 0 &&
                  d8::drow[7] == -1 && d8::dcol[8] == 1 && d8::drow[8] == -1,
              "the inflow count below spells out the D8 codes");

/// Walks the cells in topological order: visit(i, downstream) is called for each cell after
/// all cells draining into it; `downstream` is the downstream cell on the grid or no_cell.
template <typename Visit> void topological_walk(const Grid<std::uint8_t> &dirs, Visit visit) {
    const std::size_t n = dirs.size();
    constexpr std::uint8_t done = 0x80;
    // In-degree of each cell (0..8), then `done` once visited.
    std::vector<std::uint8_t> indegree(n, 0);
    for (std::size_t i = 0; i < n; ++i) {
        const std::size_t d = downstream_cell(dirs, i);
        if (d != no_cell) {
            ++indegree[d];
        }
    }
    for (std::size_t start = 0; start < n; ++start) {
        if (indegree[start] != 0) {
            continue;
        }
        std::size_t i = start;
        while (true) {
            indegree[i] = done;
            const std::size_t d = downstream_cell(dirs, i);
            visit(i, d);
            if (d == no_cell || indegree[d] == done) {
                break;
            }
            if (--indegree[d] != 0) {
                break;
            }
            i = d;
        }
    }
}

} // namespace

Grid<std::uint32_t> flow_accumulation(const Grid<std::uint8_t> &dirs) {
    Grid<std::uint32_t> acc(dirs.width(), dirs.height(), 0);
    acc.copy_georef_from(dirs);
    topological_walk(dirs, [&](std::size_t i, std::size_t d) {
        if (dirs[i] == d8::none) {
            return;
        }
        acc[i] += 1;
        if (d != no_cell && dirs[d] != d8::none) {
            acc[d] += acc[i];
        }
    });
    return acc;
}

AccumulationAndLength accumulation_and_length(const Grid<std::uint8_t> &dirs) {
    AccumulationAndLength out;
    detail::accumulation_and_length_into(dirs, out, 1);
    return out;
}

namespace {

constexpr std::uint8_t count_mask = 0x0F;
constexpr std::uint8_t visited = 0x0F;

/// Sizes `g` to the directions grid (its cells left as they are when the size already fits),
/// with the directions' georeference and no nodata value.
template <typename T> void reshape_like(Grid<T> &g, const Grid<std::uint8_t> &dirs) {
    if (g.width() != dirs.width() || g.height() != dirs.height()) {
        g = Grid<T>(dirs.width(), dirs.height(), no_fill);
    }
    g.copy_georef_from(dirs);
    g.nodata.reset();
}

/// What the steps of accumulation_and_length_into share: the directions, the output grids and
/// one state byte a cell. The low nibble of the state counts the inflows still to come (0..8,
/// 15 once the cell is visited); the high nibble holds the code of the upstream neighbour on
/// the longest path (ties: the lowest code). It becomes out.longest_upstream.
struct AccumulationWalk {
    const Grid<std::uint8_t> &dirs;
    const std::uint8_t *dir;
    std::size_t w;
    std::size_t h;
    Grid<std::uint32_t> &acc;
    Grid<float> &len;
    Grid<std::uint8_t>::Cells &state;
    std::array<float, 9> step{};

    /// Takes the directions and the output (sized here, its cells not yet set); gives the walk
    /// with the step length of each code.
    AccumulationWalk(const Grid<std::uint8_t> &d, AccumulationAndLength &out)
        : dirs(d), dir(d.cells().data()), w(d.width()), h(d.height()), acc(out.accumulation),
          len(out.upstream_length_m), state(out.longest_upstream.cells()) {
        const double dx = d.transform.cell_dx();
        const double dy = d.transform.cell_dy();
        for (std::uint8_t k = 1; k <= 8; ++k) {
            step[k] = static_cast<float>(step_length_m(k, dx, dy));
        }
    }

    /// Takes a cell (c, r); gives its downstream cell from its code, and its column and row in
    /// (dc, dr) so that no division is needed; no_cell when the cell has no direction or
    /// drains off the raster.
    std::size_t downstream(std::size_t c, std::size_t r, std::size_t &dc, std::size_t &dr) const {
        const std::uint8_t k = dir[r * w + c];
        if (k == d8::none || k > 8) {
            return no_cell;
        }
        dc = c + static_cast<std::size_t>(static_cast<std::ptrdiff_t>(d8::dcol[k]));
        dr = r + static_cast<std::size_t>(static_cast<std::ptrdiff_t>(d8::drow[k]));
        if (dc >= w || dr >= h) { // a step off column 0 or row 0 wraps to a huge value
            return no_cell;
        }
        return dr * w + dc;
    }

    /// Takes a cell (c, r) anywhere on the raster; gives the number of its neighbours whose
    /// code points at it (bounds checked).
    [[nodiscard]] std::uint8_t inflows_checked(std::size_t c, std::size_t r) const {
        std::uint8_t n = 0;
        for (std::uint8_t k = 1; k <= 8; ++k) {
            const std::size_t nc = c + static_cast<std::size_t>(std::ptrdiff_t{d8::dcol[k]});
            const std::size_t nr = r + static_cast<std::size_t>(std::ptrdiff_t{d8::drow[k]});
            if (nc < w && nr < h && dir[nr * w + nc] == d8::opposite[k]) {
                ++n;
            }
        }
        return n;
    }

    /// Takes a cell d and a length candidate `cand` arriving from its upstream code `up`; the
    /// candidate wins over the cell's (len, code) when longer, or as long with a lower code.
    /// Taking the maximum this way does not depend on the order in which a cell's inflows
    /// arrive.
    void take_longer(std::size_t d, float cand, std::uint8_t up) {
        const auto current = static_cast<std::uint8_t>(state[d] >> 4);
        if (cand > len[d] || current == d8::none || (cand == len[d] && up < current)) {
            len[d] = std::max(len[d], cand);
            state[d] = static_cast<std::uint8_t>((up << 4) | (state[d] & count_mask));
        }
    }

    /// Takes the rows [r0, r1); gives each of their cells its inflow count in the state (the
    /// high nibble zero). Cells away from the raster's edge test their neighbours without
    /// bounds checks, sixteen at a time.
    void count_inflows(std::size_t r0, std::size_t r1) {
        for (std::size_t r = r0; r < r1; ++r) {
            std::uint8_t *row_state = &state[r * w];
            if (r == 0 || r + 1 == h || w < 3) {
                for (std::size_t c = 0; c < w; ++c) {
                    row_state[c] = inflows_checked(c, r);
                }
                continue;
            }
            row_state[0] = inflows_checked(0, r);
            const std::uint8_t *up = dir + (r - 1) * w;
            const std::uint8_t *mid = dir + r * w;
            const std::uint8_t *down = dir + (r + 1) * w;
            // Sixteen cells at a time: a true comparison is all ones (-1) in a lane.
            std::size_t c = 1;
            for (; c + 17 <= w; c += 16) {
                const auto at = [](const std::uint8_t *p) {
                    Bytes16 v;
                    std::memcpy(&v, p, sizeof v);
                    return v;
                };
                const Bytes16 n = (at(mid + c + 1) == 5) + (at(down + c + 1) == 6) +
                                  (at(down + c) == 7) + (at(down + c - 1) == 8) +
                                  (at(mid + c - 1) == 1) + (at(up + c - 1) == 2) +
                                  (at(up + c) == 3) + (at(up + c + 1) == 4);
                const Bytes16 count = -n;
                std::memcpy(row_state + c, &count, sizeof count);
            }
            for (; c + 1 < w; ++c) {
                row_state[c] = static_cast<std::uint8_t>(
                    (mid[c + 1] == 5) + (down[c + 1] == 6) + (down[c] == 7) + (down[c - 1] == 8) +
                    (mid[c - 1] == 1) + (up[c - 1] == 2) + (up[c] == 3) + (up[c + 1] == 4));
            }
            row_state[w - 1] = inflows_checked(w - 1, r);
        }
    }

    /// Takes the strip height; takes out of the inflow counts every inflow that crosses from
    /// one strip into another, so that each strip's walk needs nothing from the others.
    void uncount_strip_crossings(std::size_t strip_rows, std::size_t strips) {
        for (std::size_t s = 1; s < strips; ++s) {
            const std::size_t b = s * strip_rows; // first row of strip s
            for (std::size_t c = 0; c < w; ++c) {
                for (const std::size_t r : {b - 1, b}) {
                    const std::uint8_t k = dir[r * w + c];
                    if (k == d8::none || k > 8) {
                        continue;
                    }
                    const std::size_t tc =
                        c + static_cast<std::size_t>(std::ptrdiff_t{d8::dcol[k]});
                    const std::size_t tr =
                        r + static_cast<std::size_t>(std::ptrdiff_t{d8::drow[k]});
                    if (tc < w && (tr < b) != (r < b)) { // the inflow gathered above crosses b
                        --state[tr * w + tc];
                    }
                }
            }
        }
    }

    /// Takes the strip of rows [r0, r1) with its inflow counts; zeroes its acc and len, then
    /// walks its cells in topological order, giving acc, len and the longest upstream code of
    /// every cell from the inflows inside the strip. Gives in `leaving` the cells whose flow
    /// goes on into another strip.
    void walk_strip(std::size_t r0, std::size_t r1, std::vector<std::size_t> &leaving) {
        std::fill(acc.cells().begin() + static_cast<std::ptrdiff_t>(r0 * w),
                  acc.cells().begin() + static_cast<std::ptrdiff_t>(r1 * w), 0U);
        std::fill(len.cells().begin() + static_cast<std::ptrdiff_t>(r0 * w),
                  len.cells().begin() + static_cast<std::ptrdiff_t>(r1 * w), 0.0F);
        for (std::size_t start_r = r0; start_r < r1; ++start_r) {
            for (std::size_t start_c = 0; start_c < w; ++start_c) {
                const std::size_t start = start_r * w + start_c;
                if ((state[start] & count_mask) != 0) {
                    continue;
                }
                std::size_t i = start;
                std::size_t r = start_r;
                std::size_t c = start_c;
                while (true) {
                    state[i] = static_cast<std::uint8_t>(state[i] | visited);
                    std::size_t dc = 0;
                    std::size_t dr = 0;
                    const std::size_t d = downstream(c, r, dc, dr);
                    const bool in_strip = d != no_cell && dr >= r0 && dr < r1;
                    const std::uint8_t k = dirs[i];
                    if (k != d8::none) {
                        acc[i] += 1;
                        if (d != no_cell && dirs[d] != d8::none) {
                            if (in_strip) {
                                acc[d] += acc[i];
                                take_longer(d, len[i] + step[k], d8::opposite[k]);
                            } else {
                                leaving.push_back(i);
                            }
                        }
                    }
                    if (!in_strip || (state[d] & count_mask) == visited) {
                        break;
                    }
                    if ((--state[d] & count_mask) != 0) {
                        break;
                    }
                    i = d;
                    c = dc;
                    r = dr;
                }
            }
        }
    }

    /// A cell below a strip's edge and the count that arrived in it from the cells leaving
    /// their strips.
    struct Entry {
        std::size_t cell;
        std::uint32_t acc;
    };

    /// Takes the cells leaving each strip; passes the length candidate of each to its
    /// downstream cell (all read before any is taken) and gives the entries: the downstream
    /// cells, sorted, with the counts arriving in each summed.
    std::vector<Entry> entries_of(const std::vector<std::vector<std::size_t>> &from,
                                  detail::AccumulationWalkStats *stats) {
        std::vector<Entry> entries;
        std::vector<std::pair<float, std::uint8_t>> lengths; // read before any is taken
        for (const auto &cells : from) {
            for (const std::size_t i : cells) {
                const std::uint8_t k = dirs[i];
                std::size_t dc = 0;
                std::size_t dr = 0;
                entries.push_back({downstream(i % w, i / w, dc, dr), acc[i]});
                lengths.emplace_back(len[i] + step[k], d8::opposite[k]);
            }
        }
        if (stats != nullptr) {
            stats->leaving_cells = entries.size();
        }
        for (std::size_t e = 0; e < entries.size(); ++e) {
            take_longer(entries[e].cell, lengths[e].first, lengths[e].second);
        }
        std::sort(entries.begin(), entries.end(),
                  [](const Entry &a, const Entry &b) { return a.cell < b.cell; });
        std::size_t unique = 0; // entries into one cell summed
        for (const Entry &e : entries) {
            if (unique > 0 && entries[unique - 1].cell == e.cell) {
                entries[unique - 1].acc += e.acc;
            } else {
                entries[unique++] = e;
            }
        }
        entries.resize(unique);
        return entries;
    }

    static constexpr std::uint8_t unmarked = visited;
    static constexpr std::uint8_t max_count = 14; // only a cycle could go past 8

    /// Takes a cell; gives its count nibble.
    [[nodiscard]] unsigned count(std::size_t i) const { return state[i] & count_mask; }

    /// Takes the entries (every cell's count reading `visited` after the strip walks); gives
    /// each affected cell (an entry or a cell below one) the number of its affected upstream
    /// neighbours in its count nibble.
    void mark_affected(const std::vector<Entry> &entries) {
        for (const Entry &e : entries) {
            if (count(e.cell) != unmarked) {
                continue;
            }
            state[e.cell] = static_cast<std::uint8_t>(state[e.cell] & ~count_mask);
            std::size_t c = e.cell % w;
            std::size_t r = e.cell / w;
            std::size_t dc = 0;
            std::size_t dr = 0;
            for (std::size_t d = downstream(c, r, dc, dr); d != no_cell && dirs[d] != d8::none;
                 d = downstream(c, r, dc, dr)) {
                if (count(d) != unmarked) {
                    if (count(d) < max_count) {
                        ++state[d];
                    }
                    break;
                }
                state[d] = static_cast<std::uint8_t>((state[d] & ~count_mask) | 1U);
                c = dc;
                r = dr;
            }
        }
    }

    /// Takes the marked entries; walks the affected cells in topological order from the
    /// entries with no affected inflow, adding to each the sum of what arrived and carrying a
    /// longer length down as far as it wins. A cell where paths join keeps its partial sum in
    /// `waiting` until its last affected inflow arrives. Gives the number of cells walked.
    std::size_t walk_affected(const std::vector<Entry> &entries) {
        std::unordered_map<std::size_t, std::uint32_t> waiting;
        for (const Entry &e : entries) {
            if (count(e.cell) != 0) {
                waiting[e.cell] += e.acc;
            }
        }
        std::size_t walked = 0;
        for (const Entry &e : entries) {
            if (count(e.cell) != 0) {
                continue; // walked into from above, or still waiting for its inflows
            }
            std::size_t i = e.cell;
            std::uint32_t add = e.acc;
            std::size_t c = i % w;
            std::size_t r = i / w;
            while (true) {
                acc[i] += add;
                state[i] = static_cast<std::uint8_t>(state[i] | visited);
                ++walked;
                std::size_t dc = 0;
                std::size_t dr = 0;
                const std::size_t d = downstream(c, r, dc, dr);
                if (d == no_cell || dirs[d] == d8::none) {
                    break;
                }
                const std::uint8_t k = dirs[i];
                take_longer(d, len[i] + step[k], d8::opposite[k]);
                const auto n = count(d);
                if (n == unmarked || n == 0) {
                    break; // only with a cycle in the directions
                }
                --state[d];
                const auto it = waiting.find(d);
                if (n > 1) {
                    if (it != waiting.end()) {
                        it->second += add;
                    } else {
                        waiting.emplace(d, add);
                    }
                    break;
                }
                if (it != waiting.end()) {
                    add += it->second;
                    waiting.erase(it);
                }
                i = d;
                c = dc;
                r = dr;
            }
        }
        return walked;
    }

    /// What left the strips, added after their walks. Each leaving cell i passes acc[i] and
    /// the length candidate len[i] + step to its downstream cell d (an entry). The counts must
    /// then be added to every cell below d down to the path's end, crossing strips as often as
    /// the path does, and a longer length carried down as far as it wins. Paths from many
    /// entries merge, so instead of following each one to its end, the cells below the entries
    /// (the affected cells) are walked once in topological order (mark_affected, then
    /// walk_affected), so the cost is about the number of affected cells. With a cycle in the
    /// directions (which neither d8_directions nor conditioning makes) no cell of the cycle
    /// ever has all its inflows: every walk stops there and ends, but what the cells below the
    /// cycle hold may then differ from one thread count to another.
    void add_leaving_flow(const std::vector<std::vector<std::size_t>> &from,
                          detail::AccumulationWalkStats *stats) {
        const std::vector<Entry> entries = entries_of(from, stats);
        mark_affected(entries);
        const std::size_t walked = walk_affected(entries);
        if (stats != nullptr) {
            stats->affected_cells = walked;
        }
    }
};

} // namespace

void detail::accumulation_and_length_into(const Grid<std::uint8_t> &dirs,
                                          AccumulationAndLength &out, unsigned threads,
                                          detail::AccumulationWalkStats *stats) {
    // Sized here, zeroed by the strip walks below (each its own rows, on its own thread).
    reshape_like(out.accumulation, dirs);
    reshape_like(out.upstream_length_m, dirs);
    out.longest_upstream = Grid<std::uint8_t>(dirs.width(), dirs.height(), no_fill);
    out.longest_upstream.copy_georef_from(dirs);
    AccumulationWalk walk(dirs, out);
    const std::size_t h = walk.h;
    // Inflow counts gathered: each cell counts the neighbours whose code points at it, so row
    // blocks write only their own cells and run on the worker threads (same result for any
    // thread count).
    detail::for_row_blocks(h, threads, 256, [&](std::size_t, std::size_t r0, std::size_t r1) {
        walk.count_inflows(r0, r1);
    });
    // The walk runs on strips of rows, one a thread. A strip counts only the inflows from its
    // own rows, so its walk needs nothing from the others; a cell that drains into another
    // strip is recorded as leaving it, and what it carries is added after all strips are done.
    const std::size_t strip_rows =
        std::max<std::size_t>(1, (h + std::max(threads, 1U) - 1) / std::max(threads, 1U));
    const std::size_t strips = (h + strip_rows - 1) / strip_rows;
    if (stats != nullptr) {
        *stats = AccumulationWalkStats{strips, 0, 0};
    }
    walk.uncount_strip_crossings(strip_rows, strips);
    std::vector<std::vector<std::size_t>> leaving(strips);
    detail::for_row_blocks(h, threads, strip_rows,
                           [&](std::size_t s, std::size_t r0, std::size_t r1) {
                               walk.walk_strip(r0, r1, leaving[s]);
                           });
    if (strips > 1) {
        walk.add_leaving_flow(leaving, stats);
    }
    auto &state = walk.state;
    const std::size_t w = walk.w;
    detail::for_row_blocks(h, threads, 256, [&](std::size_t, std::size_t r0, std::size_t r1) {
        for (std::size_t i = r0 * w; i < r1 * w; ++i) {
            state[i] = static_cast<std::uint8_t>(state[i] >> 4);
        }
    });
}

} // namespace catchpeak::terrain
