// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/grid.hpp"
#include "catchpeak/terrain/conditioning.hpp"
#include "catchpeak/terrain/flow_path.hpp"
#include "catchpeak/terrain/snap.hpp"
#include "catchpeak/terrain/streams.hpp"

#include <cstddef>
#include <cstdint>
#include <functional>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

/// The whole terrain chain in one call: condition -> D8 -> accumulation -> snap design points
/// -> catchments of all points -> longest flow paths -> slopes -> streams.
namespace catchpeak::terrain {

struct TerrainSettings {
    double snap_radius_m = 30.0; ///< search radius for snapping
    SnapRule snap_rule = SnapRule::nearest_stream;
    double snap_stream_threshold_m2 = 1.0e4; ///< nearest_stream: stream cells drain this
    /// How the caller names the snap radius in messages ("[settings] snap_radius_m").
    std::string snap_radius_key = "snap radius";
    double far_snap_warning_m = 20.0;   ///< warn when a point moves further than this
    double tiny_catchment_m2 = 1000.0;  ///< warn when a total catchment is smaller
    double stream_threshold_m2 = 1.0e5; ///< streams: accumulation area >= this; <= 0: none
    unsigned threads = 0;               ///< 0 = all cores
    bool keep_directions = false;       ///< return the D8 grid in the result
    bool keep_accumulation = false;     ///< return the accumulation grid in the result
};

/// Progress: step name and fraction of the whole chain done (0..1). Never required.
using ProgressFn = std::function<void(std::string_view step, double fraction)>;

/// Results for one design point (SI, CRS metres).
struct DesignPointTerrain {
    std::string id;
    double given_x = 0.0, given_y = 0.0;
    double snapped_x = 0.0, snapped_y = 0.0;
    double snap_distance_m = 0.0;
    std::size_t cell = 0;           ///< snapped cell index
    std::uint32_t accumulation = 0; ///< cells draining through the snapped cell
    double accumulation_m2 = 0.0;
    /// Accumulation areas (cells x cell area) of the cell under the given point and the
    /// smallest and largest of the cells within the snap radius (terrain::snap_point).
    double given_cell_area_m2 = 0.0;
    double min_area_within_radius_m2 = 0.0;
    double max_area_within_radius_m2 = 0.0;
    /// The rule was nearest_stream and no stream cell lay within the radius (the caller warns:
    /// it names the settings).
    bool no_stream_within_radius = false;
    /// Value of this point's local catchment in TerrainResult::labels. Points snapped to the
    /// same cell share a label (the later ones get a warning).
    std::uint32_t label = 0;
    std::uint64_t total_cells = 0;
    std::uint64_t local_cells = 0;
    double area_m2 = 0.0;       ///< total catchment
    double local_area_m2 = 0.0; ///< own part (equals area_m2 when no point lies upstream)
    /// Index (into TerrainResult::points) of the next design point downstream, if any.
    std::optional<std::size_t> downstream_point;
    /// Indices of the design points directly upstream (the next ones up each branch of the
    /// nesting tree), ascending; points sharing this point's cell are not listed. All nested
    /// points: follow upstream_points recursively (see all_upstream_points).
    std::vector<std::size_t> upstream_points;
    /// Raster edge or nodata cells lie in the total catchment: it may extend beyond the DEM.
    bool touches_dem_edge = false;
    FlowPath longest_flow_path;      ///< of the total catchment
    double mean_slope_m_per_m = 0.0; ///< Horn (1981) slope averaged over the total catchment
    std::vector<std::string> warnings;
};

struct TerrainResult {
    std::vector<DesignPointTerrain> points; ///< in the order given
    /// Local catchment labels (0 = none); label k -> points with DesignPointTerrain::label == k.
    /// Georeferenced like the DEM. A point's total catchment = the labels of the point and of
    /// its upstream_points.
    Grid<std::uint32_t> labels;
    /// Per label k (index k-1): the label downstream (0 = none). The nesting tree.
    std::vector<std::uint32_t> downstream_label;
    std::vector<Stream> streams;
    Grid<std::uint8_t> directions;    ///< only when settings.keep_directions
    Grid<std::uint32_t> accumulation; ///< only when settings.keep_accumulation
};

/// Runs the chain. Throws InputError for an empty or all-nodata DEM, a rotated transform, a
/// design point outside the DEM or on nodata, or bad settings. `where` names the design points
/// source in messages. Memory: the DEM stays the caller's (4 bytes a cell); the chain adds at
/// most about 10 bytes a cell plus queues (conditioned copy, directions and a flat scratch grid
/// while conditioning; then accumulation and flow length; then the labels).
[[nodiscard]] TerrainResult
run_terrain(const Grid<float> &dem, const std::vector<DesignPoint> &points,
            const std::vector<BreachLine> &breach_lines, const TerrainSettings &settings,
            const ProgressFn &progress = {}, const std::string &where = "design points");

/// Indices of all design points nested upstream of point `index` (recursively), ascending.
[[nodiscard]] std::vector<std::size_t> all_upstream_points(const TerrainResult &result,
                                                           std::size_t index);

} // namespace catchpeak::terrain
