// SPDX-License-Identifier: MIT
#include "catchpeak/terrain/delineation.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/terrain/accumulation.hpp"
#include "catchpeak/terrain/catchments.hpp"
#include "catchpeak/terrain/flow_direction.hpp"
#include "catchpeak/terrain/slope.hpp"
#include "internal.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <mutex>
#include <unordered_map>

// Memory plan (bytes per cell, besides the caller's DEM of 4): conditioning holds a float copy
// (4), the directions (1) and a scratch grid (4: the banded fill's labels, then the flats'
// distances) = 9; the copy then serves as the upstream flow length (4) and the scratch as the
// accumulation (4), with an in-degree byte (1) during the accumulation pass = 10; after
// snapping, streams and flow paths the flow length is freed and the accumulation buffer becomes
// the labels (4) = 5.

namespace catchpeak::terrain {

namespace {

void check_inputs(const Grid<float> &dem, const TerrainSettings &s) {
    if (dem.empty()) {
        throw_input_error("DEM", "the DEM has no cells", "a raster with at least one cell");
    }
    if (!dem.transform.is_north_up()) {
        throw_input_error("DEM", "the DEM's geotransform has rotation terms",
                          "north-up rasters (no rotation)");
    }
    const double dx = dem.transform.cell_dx();
    const double dy = dem.transform.cell_dy();
    if (!(dx > 0.0) || !(dy > 0.0) || !std::isfinite(dx) || !std::isfinite(dy)) {
        throw_input_error("DEM", fmt::format("cell size {} x {} m", dx, dy),
                          "positive, finite cell sizes");
    }
    const auto check = [](double v, std::string_view name) {
        if (!std::isfinite(v) || v < 0.0) {
            throw_input_error("terrain settings", fmt::format("{} = {}", name, v),
                              "a finite value >= 0");
        }
    };
    check(s.snap_radius_m, s.snap_radius_key + " (m)");
    check(s.snap_stream_threshold_m2, "stream threshold of snapping (m2)");
    check(s.far_snap_warning_m, "far snap warning distance (m)");
    check(s.tiny_catchment_m2, "tiny catchment area (m2)");
    if (!std::isfinite(s.stream_threshold_m2)) {
        throw_input_error("terrain settings",
                          fmt::format("stream threshold = {} m2", s.stream_threshold_m2),
                          "a finite value (<= 0 for no streams)");
    }
}

} // namespace

std::vector<std::size_t> all_upstream_points(const TerrainResult &result, std::size_t index) {
    std::vector<std::size_t> out;
    if (index >= result.points.size()) {
        return out;
    }
    std::vector<std::size_t> todo = result.points[index].upstream_points;
    while (!todo.empty()) {
        const std::size_t p = todo.back();
        todo.pop_back();
        out.push_back(p);
        for (const std::size_t q : result.points[p].upstream_points) {
            todo.push_back(q);
        }
    }
    // Points sharing a cell with a nested point are nested too.
    std::vector<std::uint32_t> labels;
    for (const std::size_t p : out) {
        labels.push_back(result.points[p].label);
    }
    std::sort(labels.begin(), labels.end());
    for (std::size_t q = 0; q < result.points.size(); ++q) {
        if (std::binary_search(labels.begin(), labels.end(), result.points[q].label)) {
            out.push_back(q);
        }
    }
    std::sort(out.begin(), out.end());
    out.erase(std::unique(out.begin(), out.end()), out.end());
    return out;
}

namespace {

/// Takes the DEM, the design points and the settings; throws an input error when the run cannot
/// go on (bad settings or raster, a point off the DEM, no elevation data at all).
void check_run(const Grid<float> &dem, const std::vector<DesignPoint> &points,
               const TerrainSettings &settings, const std::string &where) {
    check_inputs(dem, settings);
    for (const DesignPoint &p : points) {
        check_design_point(dem, p, where); // before the long steps, not after them
    }
    const detail::ValidTest valid(dem);
    if (std::none_of(dem.cells().begin(), dem.cells().end(), valid)) {
        throw_input_error("DEM", "every cell is nodata", "a DEM with elevation data");
    }
}

/// The distinct outlet cells of the snapped design points (label k is outlet k - 1).
struct Outlets {
    std::vector<std::size_t> cells;
    std::vector<std::size_t> first_point; ///< the first design point snapped to each
};

/// Takes the accumulation grid and the design points; snaps each point, filling its entry of
/// `out` (given and snapped location, cell, accumulation, label, snapping warnings); gives the
/// outlets, one label per distinct cell in the order the points first reach them.
Outlets snap_points(const Grid<std::uint32_t> &accumulation, const std::vector<DesignPoint> &points,
                    const TerrainSettings &settings, const std::string &where,
                    std::vector<DesignPointTerrain> &out) {
    out.resize(points.size());
    Outlets outlets;
    std::unordered_map<std::size_t, std::uint32_t> label_of_cell;
    for (std::size_t p = 0; p < points.size(); ++p) {
        const SnappedPoint s = snap_point(accumulation, points[p],
                                          SnapSettings{settings.snap_rule, settings.snap_radius_m,
                                                       settings.snap_stream_threshold_m2},
                                          where);
        DesignPointTerrain &r = out[p];
        r.id = points[p].id;
        r.given_x = points[p].x;
        r.given_y = points[p].y;
        r.snapped_x = s.x;
        r.snapped_y = s.y;
        r.snap_distance_m = s.distance_m;
        r.cell = s.cell;
        r.accumulation = s.accumulation;
        r.accumulation_m2 = s.accumulation_m2;
        r.given_cell_area_m2 = s.given_accumulation_m2;
        r.min_area_within_radius_m2 = s.min_accumulation_m2;
        r.max_area_within_radius_m2 = s.max_accumulation_m2;
        r.no_stream_within_radius = s.no_stream_within_radius;
        const auto [it, inserted] =
            label_of_cell.try_emplace(s.cell, static_cast<std::uint32_t>(outlets.cells.size() + 1));
        if (inserted) {
            outlets.cells.push_back(s.cell);
            outlets.first_point.push_back(p);
        } else {
            r.warnings.push_back(fmt::format(
                "snapped to the same cell as design point '{}'; both get the same catchment",
                out[outlets.first_point[it->second - 1]].id));
        }
        r.label = it->second;
        if (r.snap_distance_m > settings.far_snap_warning_m) {
            r.warnings.push_back(fmt::format(
                "snapped {:.1f} m from the given location, more than {:.1f} m; check that it "
                "lies on the intended channel",
                r.snap_distance_m, settings.far_snap_warning_m));
        }
    }
    return outlets;
}

/// Takes the directions, the longest upstream codes, the DEM and the outlet cells; gives the
/// longest flow path of each outlet. Paths are independent (each reads the grids and writes its
/// own entry), so they run on up to `threads` threads.
std::vector<FlowPath> longest_flow_paths(const Grid<std::uint8_t> &dirs,
                                         const Grid<std::uint8_t> &longest_upstream,
                                         const Grid<float> &dem,
                                         const std::vector<std::size_t> &outlets,
                                         unsigned threads) {
    std::vector<FlowPath> paths(outlets.size());
    const std::size_t path_workers = std::max<std::size_t>(
        1, std::min<std::size_t>(threads, outlets.size() / 64)); // a thread pays from 64 paths
    detail::run_on_threads(path_workers, [&](std::size_t t) {
        for (std::size_t k = t; k < outlets.size(); k += path_workers) {
            paths[k] = longest_flow_path(dirs, longest_upstream, dem, outlets[k]);
        }
    });
    return paths;
}

/// Takes the directions and the catchment labels (0..n_labels); gives a flag per label: 1
/// when its local catchment touches the raster edge or a nodata cell (one without direction).
std::vector<char> labels_touching_edge(const Grid<std::uint8_t> &dirs,
                                       const Grid<std::uint32_t> &labels, std::size_t n_labels,
                                       unsigned threads) {
    const std::size_t w = dirs.width();
    const std::size_t h = dirs.height();
    std::vector<char> edge_local(n_labels + 1, 0);
    std::mutex merge_edges;
    detail::for_row_blocks(
        h, threads, (h + threads - 1) / threads, [&](std::size_t, std::size_t r0, std::size_t r1) {
            std::vector<char> touched(n_labels + 1, 0);
            for (std::size_t row = r0; row < r1; ++row) {
                for (std::size_t col = 0, i = row * w; col < w; ++col, ++i) {
                    if (dirs[i] == d8::none) {
                        for (std::uint8_t k = 1; k <= 8; ++k) {
                            const long long nc = static_cast<long long>(col) + d8::dcol[k];
                            const long long nr = static_cast<long long>(row) + d8::drow[k];
                            if (dirs.in_bounds(nc, nr)) {
                                touched[labels(static_cast<std::size_t>(nc),
                                               static_cast<std::size_t>(nr))] = 1;
                            }
                        }
                    } else if (row == 0 || col == 0 || row + 1 == h || col + 1 == w) {
                        touched[labels[i]] = 1;
                    }
                }
            }
            const std::lock_guard<std::mutex> lock(merge_edges);
            for (std::size_t k = 0; k < touched.size(); ++k) {
                edge_local[k] = static_cast<char>(edge_local[k] | touched[k]);
            }
        });
    return edge_local;
}

/// Totals per label over the nesting tree (the label's own cells and all upstream of it).
struct NestedTotals {
    std::vector<double> slope;
    std::vector<std::uint64_t> count;
    std::vector<char> edge;
};

/// Takes the catchments' nesting, the local slope sums and the local edge flags; gives their
/// totals over the nesting tree, formed leaves first (children in ascending label order, so
/// sums are formed the same way each run).
NestedTotals nested_totals(const Catchments &c, const SlopeSums &sums,
                           const std::vector<char> &edge_local, std::uint32_t max_label) {
    NestedTotals t{std::vector<double>(max_label + 1, 0.0),
                   std::vector<std::uint64_t>(max_label + 1, 0),
                   std::vector<char>(max_label + 1, 0)};
    std::vector<std::uint32_t> order;
    std::vector<std::size_t> pending(max_label + 1, 0);
    for (std::uint32_t k = 1; k <= max_label; ++k) {
        pending[k] = c.upstream_labels[k - 1].size();
        t.slope[k] = sums.sum_m_per_m[k];
        t.count[k] = sums.count[k];
        t.edge[k] = edge_local[k];
        if (pending[k] == 0) {
            order.push_back(k);
        }
    }
    for (std::size_t head = 0; head < order.size(); ++head) {
        const std::uint32_t k = order[head];
        const std::uint32_t d = c.downstream_label[k - 1];
        if (d == 0) {
            continue;
        }
        if (--pending[d] == 0) {
            for (const std::uint32_t up : c.upstream_labels[d - 1]) {
                t.slope[d] += t.slope[up];
                t.count[d] += t.count[up];
                t.edge[d] = static_cast<char>(t.edge[d] | t.edge[up]);
            }
            order.push_back(d);
        }
    }
    return t;
}

/// Takes the catchments, the flow paths (one per label, moved out or copied), the nested totals and
/// the cell area; fills each design point's areas, nesting (downstream and upstream points), flow
/// path, mean slope, edge flag and warnings.
void fill_point_results(std::vector<DesignPointTerrain> &points, const Catchments &c,
                        std::vector<FlowPath> &paths, const NestedTotals &totals, double cell_area,
                        const TerrainSettings &settings) {
    const std::size_t n_labels = paths.size();
    std::vector<std::size_t> first_point_of_label(n_labels + 1, points.size());
    std::vector<std::vector<std::size_t>> points_of_label(n_labels + 1);
    for (std::size_t p = 0; p < points.size(); ++p) {
        auto &f = first_point_of_label[points[p].label];
        f = std::min(f, p);
        points_of_label[points[p].label].push_back(p);
    }
    for (std::size_t p = 0; p < points.size(); ++p) {
        DesignPointTerrain &r = points[p];
        const std::uint32_t k = r.label;
        r.local_cells = c.local_cells[k - 1];
        r.total_cells = c.total_cells[k - 1];
        r.local_area_m2 = static_cast<double>(r.local_cells) * cell_area;
        r.area_m2 = static_cast<double>(r.total_cells) * cell_area;
        if (c.downstream_label[k - 1] != 0) {
            r.downstream_point = first_point_of_label[c.downstream_label[k - 1]];
        }
        for (const std::uint32_t up : c.upstream_labels[k - 1]) {
            r.upstream_points.insert(r.upstream_points.end(), points_of_label[up].begin(),
                                     points_of_label[up].end());
        }
        std::sort(r.upstream_points.begin(), r.upstream_points.end());
        // The last point of a label takes the path; earlier ones sharing the cell get a copy.
        if (points_of_label[k].back() == p) {
            r.longest_flow_path = std::move(paths[k - 1]);
        } else {
            r.longest_flow_path = paths[k - 1];
        }
        r.mean_slope_m_per_m =
            totals.count[k] > 0 ? totals.slope[k] / static_cast<double>(totals.count[k]) : 0.0;
        r.touches_dem_edge = totals.edge[k] != 0;
        if (r.area_m2 < settings.tiny_catchment_m2) {
            r.warnings.push_back(fmt::format(
                "the catchment is only {:.1f} m2, less than {:.1f} m2; the point may not lie on "
                "a channel",
                r.area_m2, settings.tiny_catchment_m2));
        }
        if (r.touches_dem_edge) {
            r.warnings.push_back("the catchment reaches the edge of the DEM or a nodata area; "
                                 "it may extend beyond the DEM and be too small");
        }
    }
}

} // namespace

TerrainResult run_terrain(const Grid<float> &dem, const std::vector<DesignPoint> &points,
                          const std::vector<BreachLine> &breach_lines,
                          const TerrainSettings &settings, const ProgressFn &progress,
                          const std::string &where) {
    const auto report = [&](std::string_view step, double fraction) {
        if (progress) {
            progress(step, fraction);
        }
    };
    check_run(dem, points, settings, where);
    const unsigned threads = thread_count(settings.threads);
    TerrainResult result;

    report("conditioning", 0.0);
    // Buffers are handed on from step to step (see the memory plan above): the filled DEM
    // becomes the flow length grid, the flat scratch grid the accumulation, then the labels.
    Grid<std::uint8_t> dirs;
    AccumulationAndLength al;
    detail::condition(dem, breach_lines, threads, al.upstream_length_m, dirs, al.accumulation);

    report("flow accumulation", 0.35);
    detail::accumulation_and_length_into(dirs, al, threads);

    report("snapping design points", 0.55);
    const Outlets outlets = snap_points(al.accumulation, points, settings, where, result.points);

    if (settings.stream_threshold_m2 > 0.0) {
        report("streams", 0.6);
        result.streams = extract_streams(dirs, al.accumulation, settings.stream_threshold_m2);
    }
    Catchments c;
    if (settings.keep_accumulation) {
        result.accumulation = std::move(al.accumulation);
    } else {
        c.labels = std::move(al.accumulation);
    }
    al.accumulation = Grid<std::uint32_t>();

    report("longest flow paths", 0.65);
    std::vector<FlowPath> paths =
        longest_flow_paths(dirs, al.longest_upstream, dem, outlets.cells, threads);
    al.upstream_length_m = Grid<float>();
    al.longest_upstream = Grid<std::uint8_t>();

    report("catchments", 0.75);
    // The outlets' accumulations bound the cells draining to them (nested ones counted more
    // than once): when they are a small part of the raster, searching upstream from the
    // outlets visits fewer cells than walking from every cell. Both give the same labels.
    std::uint64_t draining = 0;
    for (const std::size_t p : outlets.first_point) {
        draining += result.points[p].accumulation;
    }
    detail::delineate_catchments_into(dirs, outlets.cells, c,
                                      draining <= dirs.size() / 4 ? CatchmentSearch::from_outlets
                                                                  : CatchmentSearch::every_cell,
                                      threads);
    const std::vector<char> edge_local =
        labels_touching_edge(dirs, c.labels, outlets.cells.size(), threads);

    report("slopes", 0.85);
    const auto max_label = static_cast<std::uint32_t>(outlets.cells.size());
    // Only the catchments' own cells are needed (label 0 is outside every catchment).
    const SlopeSums sums = detail::slope_sums_by_label(dem, c.labels, max_label, threads, false);
    if (!settings.keep_directions) {
        dirs = Grid<std::uint8_t>();
    } else {
        result.directions = std::move(dirs);
    }
    const NestedTotals totals = nested_totals(c, sums, edge_local, max_label);

    report("results", 0.95);
    fill_point_results(result.points, c, paths, totals, dem.transform.cell_area(), settings);
    result.downstream_label = std::move(c.downstream_label);
    result.labels = std::move(c.labels);
    report("done", 1.0);
    return result;
}

} // namespace catchpeak::terrain
