// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/catchments.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/terrain/flow_direction.hpp"
#include "internal.hpp"

#include <algorithm>

#include <limits>

namespace catchpeak::terrain {

Catchments delineate_catchments(const Grid<std::uint8_t> &dirs,
                                const std::vector<std::size_t> &outlets) {
    Catchments out;
    detail::delineate_catchments_into(dirs, outlets, out);
    return out;
}

void detail::delineate_catchments_into(const Grid<std::uint8_t> &dirs,
                                       const std::vector<std::size_t> &outlets, Catchments &out) {
    constexpr std::uint32_t unresolved = std::numeric_limits<std::uint32_t>::max();
    if (outlets.size() >= unresolved) {
        throw InternalError("delineate_catchments: too many outlets");
    }
    const std::size_t n = dirs.size();
    const std::size_t w = dirs.width();
    const std::size_t h = dirs.height();
    if (out.labels.width() != w || out.labels.height() != h) {
        out.labels = Grid<std::uint32_t>(w, h, no_fill);
    }
    out.labels.copy_georef_from(dirs);
    out.labels.nodata.reset();
    auto &labels = out.labels;
    for (std::size_t i = 0; i < n; ++i) {
        labels[i] = dirs[i] == d8::none ? 0 : unresolved;
    }
    const auto count = static_cast<std::uint32_t>(outlets.size());
    out.local_cells.assign(count, 0);
    for (std::uint32_t k = 0; k < count; ++k) {
        const std::size_t cell = outlets[k];
        if (cell >= n || labels[cell] != unresolved) {
            throw InternalError("delineate_catchments: outlet on nodata, outside or repeated");
        }
        labels[cell] = k + 1;
        out.local_cells[k] = 1;
    }
    // Follow each unresolved path downstream to the first resolved cell, then label the path.
    // The walk tracks the column and row, so that no division is needed for each step.
    std::vector<std::size_t> path;
    for (std::size_t start_r = 0; start_r < h; ++start_r) {
        for (std::size_t start_c = 0; start_c < w; ++start_c) {
            const std::size_t start = start_r * w + start_c;
            if (labels[start] != unresolved) {
                continue;
            }
            path.clear();
            std::size_t i = start;
            std::size_t r = start_r;
            std::size_t c = start_c;
            std::uint32_t label = 0;
            while (true) {
                path.push_back(i);
                const std::uint8_t k = dirs[i];
                if (k > 8) {
                    label = 0;
                    break;
                }
                // A step off column 0 or row 0 wraps to a huge value, caught by the bounds test.
                c += static_cast<std::size_t>(static_cast<std::ptrdiff_t>(d8::dcol[k]));
                r += static_cast<std::size_t>(static_cast<std::ptrdiff_t>(d8::drow[k]));
                if (c >= w || r >= h) {
                    label = 0;
                    break;
                }
                const std::size_t d = r * w + c;
                if (labels[d] != unresolved) {
                    label = labels[d]; // 0 on a cell without direction
                    break;
                }
                if (path.size() > n) {
                    throw InternalError("delineate_catchments: the directions contain a cycle");
                }
                i = d;
            }
            for (const std::size_t p : path) {
                labels[p] = label;
            }
            if (label != 0) {
                out.local_cells[label - 1] += path.size();
            }
        }
    }
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
