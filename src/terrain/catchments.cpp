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
    if (out.labels.width() != dirs.width() || out.labels.height() != dirs.height()) {
        out.labels = Grid<std::uint32_t>(dirs.width(), dirs.height(), unresolved);
    } else {
        std::fill(out.labels.cells().begin(), out.labels.cells().end(), unresolved);
    }
    out.labels.copy_georef_from(dirs);
    out.labels.nodata.reset();
    auto &labels = out.labels;
    for (std::size_t i = 0; i < n; ++i) {
        if (dirs[i] == d8::none) {
            labels[i] = 0;
        }
    }
    const auto count = static_cast<std::uint32_t>(outlets.size());
    for (std::uint32_t k = 0; k < count; ++k) {
        const std::size_t cell = outlets[k];
        if (cell >= n || labels[cell] != unresolved) {
            throw InternalError("delineate_catchments: outlet on nodata, outside or repeated");
        }
        labels[cell] = k + 1;
    }
    // Follow each unresolved path downstream to the first resolved cell, then label the path.
    std::vector<std::size_t> path;
    for (std::size_t start = 0; start < n; ++start) {
        if (labels[start] != unresolved) {
            continue;
        }
        path.clear();
        std::size_t i = start;
        std::uint32_t label = 0;
        while (true) {
            path.push_back(i);
            const std::size_t d = downstream_cell(dirs, i);
            if (d == no_cell || dirs[d] == d8::none) {
                label = 0;
                break;
            }
            if (labels[d] != unresolved) {
                label = labels[d];
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
    }
    out.downstream_label.assign(count, 0);
    out.local_cells.assign(count, 0);
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
    for (std::size_t i = 0; i < n; ++i) {
        if (labels[i] != 0) {
            ++out.local_cells[labels[i] - 1];
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
