// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/catchments.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/terrain/flow_direction.hpp"
#include "internal.hpp"

#include <algorithm>
#include <array>
#include <atomic>
#include <bit>
#include <limits>
#include <mutex>

namespace catchpeak::terrain {

namespace {

/// Labels by following each unlabelled cell's path downstream to the first labelled cell:
/// every cell is visited a bounded number of times. Start cells are taken in blocks of rows on
/// up to `threads` threads. Two walks may cross the same unlabelled cells at the same time;
/// both then write the same label (the one where the path first meets a labelled cell), so the
/// labels do not depend on the thread count. The labels are accessed as relaxed atomics for
/// that reason (plain moves on common processors). The cells of each label are counted
/// afterwards.
void label_by_walks(const Grid<std::uint8_t> &dirs, const std::vector<std::size_t> &outlets,
                    Catchments &out, unsigned threads) {
    constexpr std::uint32_t unresolved = std::numeric_limits<std::uint32_t>::max();
    const std::size_t n = dirs.size();
    const std::size_t w = dirs.width();
    const std::size_t h = dirs.height();
    const std::uint8_t *const dir = dirs.cells().data();
    std::uint32_t *const labels = out.labels.cells().data();
    detail::for_row_blocks(h, threads, 256, [&](std::size_t, std::size_t r0, std::size_t r1) {
        for (std::size_t i = r0 * w; i < r1 * w; ++i) {
            labels[i] = dir[i] == d8::none ? 0 : unresolved;
        }
    });
    const auto count = static_cast<std::uint32_t>(outlets.size());
    for (std::uint32_t k = 0; k < count; ++k) {
        if (labels[outlets[k]] != unresolved) {
            throw InternalError("delineate_catchments: outlet on nodata, outside or repeated");
        }
        labels[outlets[k]] = k + 1;
    }
    const auto load = [&](std::size_t i) {
        return std::atomic_ref<std::uint32_t>(labels[i]).load(std::memory_order_relaxed);
    };
    const auto store = [&](std::size_t i, std::uint32_t v) {
        std::atomic_ref<std::uint32_t>(labels[i]).store(v, std::memory_order_relaxed);
    };
    // Follow each unresolved path downstream to the first resolved cell, then label the path.
    // The walk tracks the column and row, so that no division is needed for each step.
    constexpr std::size_t block_rows = 64;
    const std::size_t blocks = (h + block_rows - 1) / block_rows;
    const std::size_t workers = std::max<std::size_t>(1, std::min<std::size_t>(threads, blocks));
    detail::run_on_threads(workers, [&](std::size_t t) {
        std::vector<std::size_t> path;
        for (std::size_t b = t; b < blocks; b += workers) {
            for (std::size_t start_r = b * block_rows; start_r < std::min(h, (b + 1) * block_rows);
                 ++start_r) {
                for (std::size_t start_c = 0; start_c < w; ++start_c) {
                    const std::size_t start = start_r * w + start_c;
                    if (load(start) != unresolved) {
                        continue;
                    }
                    path.clear();
                    std::size_t i = start;
                    std::size_t r = start_r;
                    std::size_t c = start_c;
                    std::uint32_t label = 0;
                    while (true) {
                        path.push_back(i);
                        const std::uint8_t k = dir[i];
                        if (k > 8) {
                            label = 0;
                            break;
                        }
                        // A step off column 0 or row 0 wraps to a huge value, caught by the
                        // bounds test.
                        c += static_cast<std::size_t>(static_cast<std::ptrdiff_t>(d8::dcol[k]));
                        r += static_cast<std::size_t>(static_cast<std::ptrdiff_t>(d8::drow[k]));
                        if (c >= w || r >= h) {
                            label = 0;
                            break;
                        }
                        const std::size_t d = r * w + c;
                        const std::uint32_t ld = load(d);
                        if (ld != unresolved) {
                            label = ld; // 0 on a cell without direction
                            break;
                        }
                        if (path.size() > n) {
                            throw InternalError(
                                "delineate_catchments: the directions contain a cycle");
                        }
                        i = d;
                    }
                    for (const std::size_t p : path) {
                        store(p, label);
                    }
                }
            }
        }
    });
    // Cells of each label (integer counts: the merge order does not matter).
    std::mutex merge;
    detail::for_row_blocks(h, threads, (h + workers - 1) / workers,
                           [&](std::size_t, std::size_t r0, std::size_t r1) {
                               std::vector<std::uint64_t> cells(count + std::size_t{1}, 0);
                               for (std::size_t i = r0 * w; i < r1 * w; ++i) {
                                   ++cells[labels[i]];
                               }
                               const std::lock_guard<std::mutex> lock(merge);
                               for (std::uint32_t k = 0; k < count; ++k) {
                                   out.local_cells[k] += cells[k + 1];
                               }
                           });
}

/// Labels by searching upstream from each outlet: only the cells that drain to an outlet are
/// visited (the others keep 0), at a higher cost per cell than the walks.
void label_by_search(const Grid<std::uint8_t> &dirs, const std::vector<std::size_t> &outlets,
                     Catchments &out) {
    const std::size_t w = dirs.width();
    const std::size_t h = dirs.height();
    auto &labels = out.labels;
    std::fill(labels.cells().begin(), labels.cells().end(), 0U);
    const auto count = static_cast<std::uint32_t>(outlets.size());
    for (std::uint32_t k = 0; k < count; ++k) {
        if (labels[outlets[k]] != 0) {
            throw InternalError("delineate_catchments: outlet on nodata, outside or repeated");
        }
        labels[outlets[k]] = k + 1;
    }
    // Each outlet's local catchment is searched upstream: the cells whose code points at a
    // labelled cell, up to the cells of other outlets (labelled first, so never entered). Only
    // cells that drain to an outlet are visited; the others keep 0. The search tracks column
    // and row, so that no division is needed for each cell.
    std::array<std::ptrdiff_t, 9> offset{};
    for (std::uint8_t k = 1; k <= 8; ++k) {
        offset[k] =
            static_cast<std::ptrdiff_t>(d8::drow[k]) * static_cast<std::ptrdiff_t>(w) + d8::dcol[k];
    }
    struct Cell {
        std::size_t c;
        std::size_t r;
    };
    std::vector<Cell> todo;
    for (std::uint32_t k = 0; k < count; ++k) {
        const std::uint32_t label = k + 1;
        std::size_t cells = 0;
        todo.assign(1, Cell{outlets[k] % w, outlets[k] / w});
        while (!todo.empty()) {
            const Cell cell = todo.back();
            todo.pop_back();
            ++cells;
            const std::size_t i = cell.r * w + cell.c;
            if (cell.c > 0 && cell.r > 0 && cell.c + 1 < w && cell.r + 1 < h) {
                // Inflows as a bit mask without a branch per neighbour, then its set bits.
                unsigned in = 0;
                for (std::uint8_t q = 1; q <= 8; ++q) {
                    const std::size_t nb =
                        static_cast<std::size_t>(static_cast<std::ptrdiff_t>(i) + offset[q]);
                    in |= static_cast<unsigned>(dirs[nb] == d8::opposite[q]) << q;
                }
                while (in != 0) {
                    const auto q = static_cast<std::uint8_t>(std::countr_zero(in));
                    in &= in - 1;
                    const std::size_t nb =
                        static_cast<std::size_t>(static_cast<std::ptrdiff_t>(i) + offset[q]);
                    if (labels[nb] != 0) {
                        continue; // another outlet (or a cycle)
                    }
                    labels[nb] = label;
                    todo.push_back(
                        {cell.c + static_cast<std::size_t>(std::ptrdiff_t{d8::dcol[q]}),
                         cell.r + static_cast<std::size_t>(std::ptrdiff_t{d8::drow[q]})});
                }
                continue;
            }
            for (std::uint8_t q = 1; q <= 8; ++q) {
                // A step off column 0 or row 0 wraps to a huge value, caught by the bounds test.
                const std::size_t nc =
                    cell.c + static_cast<std::size_t>(std::ptrdiff_t{d8::dcol[q]});
                const std::size_t nr =
                    cell.r + static_cast<std::size_t>(std::ptrdiff_t{d8::drow[q]});
                if (nc < w && nr < h && dirs[nr * w + nc] == d8::opposite[q] &&
                    labels[nr * w + nc] == 0) {
                    labels[nr * w + nc] = label;
                    todo.push_back({nc, nr});
                }
            }
        }
        out.local_cells[k] = cells;
    }
}

} // namespace

Catchments delineate_catchments(const Grid<std::uint8_t> &dirs,
                                const std::vector<std::size_t> &outlets, CatchmentSearch how,
                                unsigned threads) {
    Catchments out;
    detail::delineate_catchments_into(dirs, outlets, out, how, threads);
    return out;
}

void detail::delineate_catchments_into(const Grid<std::uint8_t> &dirs,
                                       const std::vector<std::size_t> &outlets, Catchments &out,
                                       CatchmentSearch how, unsigned threads) {
    if (outlets.size() >= std::numeric_limits<std::uint32_t>::max() - 1) {
        throw InternalError("delineate_catchments: too many outlets");
    }
    const std::size_t n = dirs.size();
    const std::size_t w = dirs.width();
    const std::size_t h = dirs.height();
    for (const std::size_t cell : outlets) {
        if (cell >= n || dirs[cell] == d8::none) {
            throw InternalError("delineate_catchments: outlet on nodata, outside or repeated");
        }
    }
    if (out.labels.width() != w || out.labels.height() != h) {
        out.labels = Grid<std::uint32_t>(w, h, no_fill);
    }
    out.labels.copy_georef_from(dirs);
    out.labels.nodata.reset();
    const auto count = static_cast<std::uint32_t>(outlets.size());
    out.local_cells.assign(count, 0);
    if (how == CatchmentSearch::from_outlets) {
        label_by_search(dirs, outlets, out);
    } else {
        label_by_walks(dirs, outlets, out, thread_count(threads));
    }
    const auto &labels = out.labels;
    out.downstream_label.assign(count, 0);
    out.total_cells.assign(count, 0);
    out.upstream_labels.assign(count, {});
    for (std::uint32_t k = 0; k < count; ++k) {
        const std::size_t d = downstream_cell(dirs, outlets[k]);
        if (d != no_cell && dirs[d] != d8::none) {
            out.downstream_label[k] = labels[d];
        }
        if (out.downstream_label[k] != 0) {
            out.upstream_labels[out.downstream_label[k] - 1].push_back(k + 1);
        }
    }
    // Totals in topological order of the tree (leaves first).
    std::vector<std::uint32_t> pending(count, 0);
    for (std::uint32_t k = 0; k < count; ++k) {
        pending[k] = static_cast<std::uint32_t>(out.upstream_labels[k].size());
        out.total_cells[k] = out.local_cells[k];
    }
    for (std::uint32_t k = 0; k < count; ++k) {
        if (pending[k] != 0) {
            continue;
        }
        std::uint32_t j = k;
        while (true) {
            pending[j] = std::numeric_limits<std::uint32_t>::max();
            const std::uint32_t down = out.downstream_label[j];
            if (down == 0) {
                break;
            }
            out.total_cells[down - 1] += out.total_cells[j];
            if (--pending[down - 1] != 0) {
                break;
            }
            j = down - 1;
        }
    }
}

std::vector<std::uint32_t> total_catchment_labels(const Catchments &c, std::uint32_t label) {
    std::vector<std::uint32_t> out;
    if (label == 0 || label > c.upstream_labels.size()) {
        return out;
    }
    out.push_back(label);
    for (std::size_t head = 0; head < out.size(); ++head) {
        for (const std::uint32_t up : c.upstream_labels[out[head] - 1]) {
            out.push_back(up);
        }
    }
    return out;
}

} // namespace catchpeak::terrain
