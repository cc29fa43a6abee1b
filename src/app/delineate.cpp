// SPDX-License-Identifier: MIT
#include "catchpeak/app/delineate.hpp"

#include "catchpeak/core/calc_line.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/files.hpp"
#include "catchpeak/core/spelling.hpp"
#include "catchpeak/core/threads.hpp"
#include "catchpeak/io/gpkg.hpp"
#include "catchpeak/io/polygonize.hpp"
#include "catchpeak/io/raster.hpp"
#include "catchpeak/io/vector.hpp"
#include "catchpeak/io/wkb.hpp"
#include "catchpeak/terrain/delineation.hpp"
#include "catchpeak/terrain/flow_direction.hpp"
#include "progress_bar.hpp"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <atomic>
#include <cmath>
#include <map>

namespace catchpeak::app {

namespace {

using Json = nlohmann::ordered_json;

void check_options(const DelineateOptions &o) {
    if (!std::isfinite(o.snap_radius_m) || o.snap_radius_m < 0.0) {
        throw_input_error(o.snap_radius_key, fmt::format("{} m", o.snap_radius_m),
                          "a distance in metres >= 0");
    }
    if (!std::isfinite(o.snap_area_factor) || o.snap_area_factor <= 1.0) {
        throw_input_error("--snap-area-factor", fmt::format("{}", o.snap_area_factor),
                          "a factor > 1");
    }
    if (!std::isfinite(o.snap_stream_threshold_m2) || o.snap_stream_threshold_m2 < 0.0) {
        throw_input_error("--snap-stream-threshold",
                          fmt::format("{} m2", o.snap_stream_threshold_m2), "an area in m2 >= 0");
    }
    if (!std::isfinite(o.stream_threshold_m2) || o.stream_threshold_m2 < 0.0) {
        throw_input_error("--stream-threshold", fmt::format("{} m2", o.stream_threshold_m2),
                          "an area in m2 >= 0 (0: no streams)");
    }
    if (o.id_field.empty()) {
        throw_input_error("--id-field", "is empty", "the name of the design point id field");
    }
    if (o.out_dir.empty()) {
        throw_input_error("--out", "is empty", "a folder to write to");
    }
}

/// What `delineate` writes into its output folder.
const std::vector<std::string> delineate_file_names = {"catchments.json", "catchments.gpkg"};

void prepare_out_dir(const std::filesystem::path &dir) {
    std::error_code ec;
    if (std::filesystem::exists(dir, ec) && !std::filesystem::is_directory(dir, ec)) {
        throw_input_error(dir.string(), "exists and is not a folder", "a folder to write to");
    }
    std::filesystem::create_directories(dir, ec);
    if (ec) {
        throw_input_error(dir.string(), "cannot be created: " + ec.message(),
                          "a folder that can be written");
    }
}

std::string crs_name_of(const std::string &wkt) {
    // The WKT's first quoted string is the CRS name.
    const auto a = wkt.find('"');
    if (a == std::string::npos) {
        return {};
    }
    const auto b = wkt.find('"', a + 1);
    return b == std::string::npos ? std::string{} : wkt.substr(a + 1, b - a - 1);
}

/// Takes the options; reads the DEM into out.dem (its notes into out.notes) and throws when the
/// snap radius is more than half the DEM's extent.
void read_dem_into(const DelineateOptions &options, Delineation &out) {
    out.dem = io::read_dem(options.dem);
    const io::Dem &dem = out.dem;
    out.notes.insert(out.notes.end(), dem.notes.begin(), dem.notes.end());
    const auto &grid = dem.elevation_m;
    const double extent_x_m = static_cast<double>(grid.width()) * grid.transform.cell_dx();
    const double extent_y_m = static_cast<double>(grid.height()) * grid.transform.cell_dy();
    const double max_radius_m = 0.5 * std::min(extent_x_m, extent_y_m);
    if (options.snap_radius_m > max_radius_m) {
        throw_input_error(options.snap_radius_key,
                          fmt::format("{} m is more than half the DEM's extent ({:.1f} m x "
                                      "{:.1f} m in {})",
                                      options.snap_radius_m, extent_x_m, extent_y_m,
                                      options.dem.string()),
                          fmt::format("0 to {:.1f} m; a few cells is usual", max_radius_m));
    }
}

/// Takes the options and the delineation with its DEM; gives the breach lines read (in the
/// DEM's CRS, over the DEM), their notes and reprojection added to `out`; none when the options
/// name no file.
std::vector<terrain::BreachLine> read_breach_lines(const DelineateOptions &options,
                                                   const io::Extent &dem_box,
                                                   detail::ProgressBar &bar, Delineation &out) {
    std::vector<terrain::BreachLine> breach;
    if (options.breach_lines) {
        bar.start("reading breach lines");
        const io::LineLayer lines =
            io::read_lines(*options.breach_lines, out.dem.elevation_m.crs_wkt);
        out.notes.insert(out.notes.end(), lines.notes.begin(), lines.notes.end());
        out.breach_lines_reprojection = lines.reprojection;
        require_over_dem(lines.extent, dem_box, lines.source, "breach lines");
        for (const auto &l : lines.lines) {
            breach.push_back(terrain::BreachLine{fmt::format("{}: feature {}", lines.source, l.fid),
                                                 l.vertices});
        }
    }
    return breach;
}

/// The labels of the catchments' nesting tree grouped by height (the longest chain of labels
/// upstream), leaves first, with the labels just upstream of each.
struct NestingLevels {
    std::vector<std::vector<std::uint32_t>> upstream_of;
    std::vector<std::vector<std::uint32_t>> by_height;
};

/// Takes the label downstream of each label (0: none); gives the labels by height in the
/// nesting tree, throwing when the nesting has a cycle.
NestingLevels nesting_levels(const std::vector<std::uint32_t> &downstream_label) {
    const std::size_t n_labels = downstream_label.size();
    NestingLevels out;
    out.upstream_of.resize(n_labels + 1);
    std::vector<std::size_t> waiting(n_labels + 1, 0);
    for (std::uint32_t k = 1; k <= n_labels; ++k) {
        if (const std::uint32_t d = downstream_label[k - 1]; d != 0) {
            out.upstream_of[d].push_back(k);
            ++waiting[d];
        }
    }
    std::vector<std::uint32_t> order;
    for (std::uint32_t k = 1; k <= n_labels; ++k) {
        if (waiting[k] == 0) {
            order.push_back(k);
        }
    }
    std::vector<std::uint32_t> height(n_labels + 1, 0);
    for (std::size_t head = 0; head < order.size(); ++head) {
        const std::uint32_t k = order[head];
        if (const std::uint32_t d = downstream_label[k - 1]; d != 0) {
            height[d] = std::max(height[d], height[k] + 1);
            if (--waiting[d] == 0) {
                order.push_back(d);
            }
        }
    }
    if (order.size() != n_labels) {
        throw InternalError("delineate: the nesting of the catchments has a cycle");
    }
    for (const std::uint32_t k : order) {
        out.by_height.resize(std::max<std::size_t>(out.by_height.size(), height[k] + 1));
        out.by_height[height[k]].push_back(k);
    }
    return out;
}

/// Local polygon of each label that has one.
using PolygonOfLabel = std::map<std::uint32_t, const io::LabelPolygon *>;

/// Takes the labels' nesting and their local polygons; gives the total catchment of each label
/// (index = label), leaves of the nesting tree first: a label's total is the union of its own
/// local polygon and the totals of the labels just upstream. Each piece is merged once per
/// level of nesting, not again for every design point below it. Labels of one height do not
/// depend on each other: each height is merged on all threads, labels handed out one at a
/// time.
std::vector<std::vector<unsigned char>>
total_polygons(const std::vector<std::uint32_t> &downstream_label,
               const PolygonOfLabel &polygon_of_label, unsigned workers, detail::ProgressBar &bar) {
    const std::size_t n_labels = downstream_label.size();
    const NestingLevels nesting = nesting_levels(downstream_label);
    std::vector<std::vector<unsigned char>> total_of_label(n_labels + 1);
    const auto merge = [&](std::uint32_t k) {
        std::vector<const std::vector<unsigned char> *> parts;
        if (auto it = polygon_of_label.find(k); it != polygon_of_label.end()) {
            parts.push_back(&it->second->wkb);
        }
        for (const std::uint32_t up : nesting.upstream_of[k]) {
            parts.push_back(&total_of_label[up]);
        }
        total_of_label[k] = parts.size() == 1 ? *parts.front() : io::union_polygons(parts);
    };
    std::size_t merged = 0;
    for (const auto &level : nesting.by_height) {
        std::atomic<std::size_t> next{0};
        run_on_threads(std::min<std::size_t>(workers, level.size()), [&](std::size_t) {
            for (std::size_t j = next++; j < level.size(); j = next++) {
                merge(level[j]);
            }
        });
        merged += level.size();
        bar.update(static_cast<double>(merged) / static_cast<double>(n_labels));
    }
    return total_of_label;
}

/// Takes the DEM's CRS; gives the empty layers of catchments.gpkg: catchments,
/// local_catchments, flow_paths, design_points, streams.
std::vector<io::OutLayer> empty_layers(const std::string &crs) {
    using io::FieldType;
    return {io::OutLayer{"catchments",
                         io::GeometryType::multi_polygon,
                         crs,
                         {{"id", FieldType::text},
                          {"area_m2", FieldType::real},
                          {"local_area_m2", FieldType::real},
                          {"accumulation_cells", FieldType::integer},
                          {"longest_flow_path_m", FieldType::real},
                          {"slope_10_85_m_per_m", FieldType::real},
                          {"mean_slope_m_per_m", FieldType::real},
                          {"upstream_design_points", FieldType::text},
                          {"touches_dem_edge", FieldType::integer}},
                         {}},
            io::OutLayer{"local_catchments",
                         io::GeometryType::multi_polygon,
                         crs,
                         {{"id", FieldType::text},
                          {"local_area_m2", FieldType::real},
                          {"local_cells", FieldType::integer},
                          {"downstream_design_point", FieldType::text}},
                         {}},
            io::OutLayer{"flow_paths",
                         io::GeometryType::line_string,
                         crs,
                         {{"id", FieldType::text},
                          {"length_m", FieldType::real},
                          {"elevation_top_m", FieldType::real},
                          {"elevation_outlet_m", FieldType::real},
                          {"slope_m_per_m", FieldType::real},
                          {"slope_10_85_m_per_m", FieldType::real}},
                         {}},
            io::OutLayer{"design_points",
                         io::GeometryType::point,
                         crs,
                         {{"id", FieldType::text},
                          {"given_x_m", FieldType::real},
                          {"given_y_m", FieldType::real},
                          {"snapped_x_m", FieldType::real},
                          {"snapped_y_m", FieldType::real},
                          {"snap_distance_m", FieldType::real},
                          {"accumulation_cells", FieldType::integer},
                          {"warnings", FieldType::text}},
                         {}},
            io::OutLayer{"streams",
                         io::GeometryType::line_string,
                         crs,
                         {{"strahler_order", FieldType::integer},
                          {"length_m", FieldType::real},
                          {"accumulation_end_cells", FieldType::integer},
                          {"accumulation_end_m2", FieldType::real}},
                         {}}};
}

/// Takes the terrain result, the total and local polygons by label, every design point
/// upstream of each and the DEM's CRS; gives the layers of catchments.gpkg with their features
/// (one a design point in each of the first four, one a stream of two vertices or more in the
/// last).
std::vector<io::OutLayer> layers_of(const terrain::TerrainResult &result,
                                    const std::vector<std::vector<unsigned char>> &total_of_label,
                                    const PolygonOfLabel &polygon_of_label,
                                    const std::vector<std::vector<std::size_t>> &all_up,
                                    const std::string &crs) {
    using io::FieldValue;
    std::vector<io::OutLayer> layers = empty_layers(crs);
    io::OutLayer &catchments = layers[0];
    io::OutLayer &locals = layers[1];
    io::OutLayer &paths = layers[2];
    io::OutLayer &dps = layers[3];
    io::OutLayer &streams = layers[4];
    const auto join_ids = [&](const std::vector<std::size_t> &idx) {
        std::string s;
        for (auto k : idx) {
            s += (s.empty() ? "" : ", ") + result.points[k].id;
        }
        return s;
    };
    for (std::size_t i = 0; i < result.points.size(); ++i) {
        const auto &p = result.points[i];
        const auto &fp = p.longest_flow_path;
        catchments.features.push_back(
            {total_of_label[p.label],
             {p.id, p.area_m2, p.local_area_m2, static_cast<std::int64_t>(p.accumulation),
              fp.length_m, fp.slope_10_85_m_per_m, p.mean_slope_m_per_m, join_ids(all_up[i]),
              std::int64_t{p.touches_dem_edge ? 1 : 0}}});
        const auto it = polygon_of_label.find(p.label);
        locals.features.push_back(
            {it != polygon_of_label.end() ? it->second->wkb : std::vector<unsigned char>{},
             {p.id, p.local_area_m2, static_cast<std::int64_t>(p.local_cells),
              p.downstream_point ? FieldValue(result.points[*p.downstream_point].id)
                                 : FieldValue(std::monostate{})}});
        paths.features.push_back({fp.vertices_xy.size() >= 2 ? io::line_wkb(fp.vertices_xy)
                                                             : std::vector<unsigned char>{},
                                  {p.id, fp.length_m, fp.elevation_top_m, fp.elevation_outlet_m,
                                   fp.slope_m_per_m, fp.slope_10_85_m_per_m}});
        std::string warnings;
        for (const auto &w : p.warnings) {
            warnings += (warnings.empty() ? "" : "; ") + w;
        }
        dps.features.push_back(
            {io::point_wkb(p.snapped_x, p.snapped_y),
             {p.id, p.given_x, p.given_y, p.snapped_x, p.snapped_y, p.snap_distance_m,
              static_cast<std::int64_t>(p.accumulation), warnings}});
    }
    for (const auto &s : result.streams) {
        if (s.vertices_xy.size() < 2) {
            continue;
        }
        streams.features.push_back(
            {io::line_wkb(s.vertices_xy),
             {std::int64_t{s.strahler_order}, s.length_m,
              static_cast<std::int64_t>(s.accumulation_end), s.accumulation_end_m2}});
    }
    return layers;
}

} // namespace

Delineation delineate_catchments(const DelineateOptions &options, std::ostream *progress) {
    check_options(options);
    detail::ProgressBar bar(progress);
    Delineation out;

    bar.start("reading DEM");
    read_dem_into(options, out);
    const auto &grid = out.dem.elevation_m;

    bar.start("reading design points");
    const io::DesignPointLayer points =
        io::read_design_points(options.points, options.id_field, grid.crs_wkt, options.points_crs);
    out.notes.insert(out.notes.end(), points.notes.begin(), points.notes.end());
    out.points_reprojection = points.reprojection;
    const io::Extent dem_box = dem_extent(grid);
    require_over_dem(points.extent, dem_box, points.source, design_points_named(points));
    std::vector<terrain::DesignPoint> tpoints;
    tpoints.reserve(points.points.size());
    for (const auto &p : points.points) {
        tpoints.push_back(terrain::DesignPoint{p.id, p.x, p.y});
    }
    out.breach_lines = read_breach_lines(options, dem_box, bar, out);
    const std::vector<terrain::BreachLine> &breach = out.breach_lines;

    terrain::TerrainSettings settings;
    settings.snap_radius_m = options.snap_radius_m;
    settings.snap_rule = options.snap_rule;
    settings.snap_stream_threshold_m2 = options.snap_stream_threshold_m2;
    settings.snap_radius_key = options.snap_radius_key;
    settings.stream_threshold_m2 = options.stream_threshold_m2;
    settings.threads = options.threads;
    std::string current_step;
    out.result = terrain::run_terrain(
        grid, tpoints, breach, settings,
        [&](std::string_view step, double) {
            if (step != "done" && step != current_step) {
                current_step = std::string(step);
                bar.start(step);
            }
        },
        points.source);
    out.points_source = points.source;
    out.given_points = points.points;
    out.expected_area_field = points.expected_area_field;
    const terrain::TerrainResult &result = out.result;

    bar.start("polygonizing catchments");
    const auto local_polygons = io::polygonize_labels(result.labels);
    PolygonOfLabel polygon_of_label;
    for (const auto &p : local_polygons) {
        polygon_of_label[p.label] = &p;
    }
    std::vector<std::vector<unsigned char>> total_of_label = total_polygons(
        result.downstream_label, polygon_of_label, terrain::thread_count(options.threads), bar);
    const std::size_t n = result.points.size();
    std::vector<std::vector<std::size_t>> all_up(n);
    for (std::size_t i = 0; i < n; ++i) {
        all_up[i] = terrain::all_upstream_points(result, i);
    }
    out.layers = layers_of(result, total_of_label, polygon_of_label, all_up, grid.crs_wkt);

    out.total_wkb.resize(n);
    for (std::size_t i = 0; i < n; ++i) {
        out.total_wkb[i] = total_of_label[result.points[i].label];
    }
    total_of_label.clear();
    out.local_wkb.resize(n);
    for (std::size_t i = 0; i < n; ++i) {
        out.local_wkb[i] = out.layers[1].features[i].wkb;
    }
    out.all_upstream = std::move(all_up);
    bar.finish();
    return out;
}

SnapRule snap_rule_option(const std::string &text) {
    if (const auto rule = find_option(snap_rule_options, text)) {
        return *rule;
    }
    const std::vector<std::string> keys = option_keys(snap_rule_options);
    const std::string hint = closest_match(text, keys);
    throw_input_error("--snap",
                      fmt::format("'{}' is not known{}", text,
                                  hint.empty() ? "" : fmt::format(" (did you mean '{}'?)", hint)),
                      fmt::format("one of {}", fmt::join(keys, ", ")));
}

SnapChecks snap_checks(const terrain::DesignPointTerrain &p, double area_factor) {
    SnapChecks c;
    c.no_stream = p.no_stream_within_radius;
    c.grew = p.accumulation_m2 > area_factor * p.given_cell_area_m2;
    // A much larger route within the radius than the one taken. (The smallest within the radius
    // is not compared: beside any channel some cell drains almost nothing.)
    c.spread = p.max_area_within_radius_m2 > area_factor * p.accumulation_m2;
    return c;
}

std::string design_points_named(const io::DesignPointLayer &points) {
    constexpr std::size_t listed = 5;
    std::vector<std::string> ids;
    for (std::size_t i = 0; i < points.points.size() && i < listed; ++i) {
        ids.push_back(fmt::format("'{}'", points.points[i].id));
    }
    if (points.points.size() > listed) {
        ids.push_back(fmt::format("and {} more", points.points.size() - listed));
    }
    return fmt::format("design points ({})", fmt::join(ids, ", "));
}

io::Extent dem_extent(const Grid<float> &dem) {
    const auto &t = dem.transform;
    return {t.origin_x, t.origin_y - static_cast<double>(dem.height()) * t.cell_dy(),
            t.origin_x + static_cast<double>(dem.width()) * t.cell_dx(), t.origin_y};
}

void require_over_dem(const std::optional<io::Extent> &layer, const io::Extent &dem,
                      const std::string &where, const std::string &what) {
    if (!layer || layer->overlaps(dem)) {
        return;
    }
    const auto box = [](const io::Extent &e) {
        return fmt::format("x {:.3f} to {:.3f}, y {:.3f} to {:.3f}", e.min_x, e.max_x, e.min_y,
                           e.max_y);
    };
    throw_input_error(where,
                      fmt::format("the extent of the {} ({}, in the DEM's CRS) does not overlap "
                                  "the DEM's extent ({})",
                                  what, box(*layer), box(dem)),
                      "a layer over the DEM; one that lies elsewhere is usually in another CRS "
                      "than its file declares (declare the right one, or reproject it)");
}

namespace {

/// The warnings of one design point's snap, for `delineate` (areas in m2 and ha).
std::vector<std::string> snap_warnings(const DelineateOptions &o,
                                       const terrain::DesignPointTerrain &p) {
    const auto area = [](double m2) { return fmt::format("{:.1f} m2 ({} ha)", m2, sig(m2 / 1e4)); };
    const SnapChecks c = snap_checks(p, o.snap_area_factor);
    std::vector<std::string> out;
    if (c.no_stream) {
        out.push_back(fmt::format(
            "no cell draining at least {} (--snap-stream-threshold) lies within {} m ({}); the "
            "point stays on the cell under it, whose catchment is {}: check that it lies on the "
            "intended channel",
            area(o.snap_stream_threshold_m2), o.snap_radius_m, o.snap_radius_key,
            area(p.accumulation_m2)));
    }
    if (c.grew) {
        const std::string dir =
            terrain::compass_direction(p.snapped_x - p.given_x, p.snapped_y - p.given_y);
        out.push_back(fmt::format(
            "the snap moved the point {:.1f} m{} to a catchment of {}, more than {} times the {} "
            "of the cell under the given point (--snap-area-factor): check that the snapped cell "
            "lies on the intended channel (--snap, --snap-radius)",
            p.snap_distance_m, dir.empty() ? "" : " to the " + dir, area(p.accumulation_m2),
            sig(o.snap_area_factor), area(p.given_cell_area_m2)));
    }
    if (c.spread) {
        out.push_back(fmt::format(
            "a cell within {} m ({}) drains {}, more than {} times the {} of the snapped cell "
            "(--snap-area-factor; the smallest within the radius drains {}): the catchment "
            "depends on where within the radius the point lies",
            o.snap_radius_m, o.snap_radius_key, area(p.max_area_within_radius_m2),
            sig(o.snap_area_factor), area(p.accumulation_m2), area(p.min_area_within_radius_m2)));
    }
    return out;
}

/// One design point of catchments.json; its warnings are added to `all_warnings` too.
Json point_json(const DelineateOptions &options, const Delineation &d, std::size_t i,
                std::vector<std::string> &all_warnings) {
    const auto &result = d.result;
    const auto &all_up = d.all_upstream;
    const auto &p = result.points[i];
    const auto &fp = p.longest_flow_path;
    Json j;
    j["id"] = p.id;
    j["given_x_m"] = p.given_x;
    j["given_y_m"] = p.given_y;
    j["snapped_x_m"] = p.snapped_x;
    j["snapped_y_m"] = p.snapped_y;
    j["snap_distance_m"] = p.snap_distance_m;
    j["accumulation_cells"] = p.accumulation;
    j["accumulation_m2"] = p.accumulation_m2;
    j["total_cells"] = p.total_cells;
    j["area_m2"] = p.area_m2;
    j["local_cells"] = p.local_cells;
    j["local_area_m2"] = p.local_area_m2;
    j["longest_flow_path_m"] = fp.length_m;
    j["elevation_top_m"] = fp.elevation_top_m;
    j["elevation_outlet_m"] = fp.elevation_outlet_m;
    j["slope_flow_path_m_per_m"] = fp.slope_m_per_m;
    j["elevation_10_m"] = fp.elevation_10_m;
    j["elevation_85_m"] = fp.elevation_85_m;
    j["slope_10_85_m_per_m"] = fp.slope_10_85_m_per_m;
    j["mean_slope_m_per_m"] = p.mean_slope_m_per_m;
    j["touches_dem_edge"] = p.touches_dem_edge;
    j["downstream_design_point"] =
        p.downstream_point ? Json(result.points[*p.downstream_point].id) : Json(nullptr);
    Json up = Json::array();
    for (auto k : p.upstream_points) {
        up.push_back(result.points[k].id);
    }
    j["upstream_design_points"] = up;
    Json all = Json::array();
    for (auto k : all_up[i]) {
        all.push_back(result.points[k].id);
    }
    j["all_upstream_design_points"] = all;
    j["given_cell_area_m2"] = p.given_cell_area_m2;
    j["min_area_within_radius_m2"] = p.min_area_within_radius_m2;
    j["max_area_within_radius_m2"] = p.max_area_within_radius_m2;
    j["no_stream_within_radius"] = p.no_stream_within_radius;
    // The layer's expected area, for the engineer to compare (a project run checks it).
    const auto &expected = d.given_points[i].expected_area_m2;
    j["expected_area_m2"] = expected ? Json(*expected) : Json(nullptr);
    std::vector<std::string> warnings = p.warnings;
    for (auto &w : snap_warnings(options, p)) {
        warnings.push_back(std::move(w));
    }
    j["warnings"] = warnings;
    for (const auto &w : warnings) {
        all_warnings.push_back(fmt::format("design point '{}': {}", p.id, w));
    }
    return j;
}

} // namespace

DelineateSummary delineate(const DelineateOptions &options, std::ostream *progress) {
    DelineateSummary summary;
    // Temporary files a delineation killed while writing left behind.
    for (const auto &f : remove_stale_temporaries(options.out_dir, delineate_file_names)) {
        summary.notes.push_back(
            fmt::format("removed {}, a temporary file left by an interrupted run", f.string()));
    }
    Delineation d = delineate_catchments(options, progress);
    detail::ProgressBar bar(progress);
    summary.notes.insert(summary.notes.end(), d.notes.begin(), d.notes.end());
    const auto &grid = d.dem.elevation_m;
    const auto &dem = d.dem;
    const std::size_t n = d.result.points.size();
    // catchments.json
    Json doc;
    doc["dem_file"] = options.dem.string();
    doc["dem_crs"] = crs_name_of(grid.crs_wkt);
    doc["dem_horizontal_unit"] = dem.horizontal_unit;
    doc["dem_vertical_unit"] = dem.vertical_unit;
    doc["cell_size_x_m"] = grid.transform.cell_dx();
    doc["cell_size_y_m"] = grid.transform.cell_dy();
    doc["dem_width_cells"] = grid.width();
    doc["dem_height_cells"] = grid.height();
    doc["design_points_file"] = options.points.string();
    doc["id_field"] = options.id_field;
    doc["breach_lines_file"] =
        options.breach_lines ? Json(options.breach_lines->string()) : Json(nullptr);
    doc["snap_radius_m"] = options.snap_radius_m;
    doc["snap_rule"] = option_key(snap_rule_options, options.snap_rule);
    doc["snap_stream_threshold_m2"] = options.snap_stream_threshold_m2;
    doc["snap_area_factor"] = options.snap_area_factor;
    doc["stream_threshold_m2"] = options.stream_threshold_m2;
    doc["notes"] = summary.notes;
    Json list = Json::array();
    for (std::size_t i = 0; i < n; ++i) {
        list.push_back(point_json(options, d, i, summary.warnings));
    }
    doc["design_points"] = std::move(list);
    const std::string json_text = doc.dump(2) + "\n";

    bar.start("writing results");
    prepare_out_dir(options.out_dir);
    summary.json = options.out_dir / delineate_file_names[0];
    summary.gpkg = options.out_dir / delineate_file_names[1];
    PendingFiles files;
    io::write_gpkg(files.add(summary.gpkg), d.layers);
    bar.update(0.9);
    write_text_file_atomic(files.add(summary.json), json_text);
    files.commit();
    bar.finish();
    summary.design_points = n;
    return summary;
}

} // namespace catchpeak::app
