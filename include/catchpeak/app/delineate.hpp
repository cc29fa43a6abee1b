// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/io/gpkg.hpp"
#include "catchpeak/io/raster.hpp"
#include "catchpeak/io/vector.hpp"
#include "catchpeak/terrain/delineation.hpp"

#include <cstddef>
#include <filesystem>
#include <optional>
#include <ostream>
#include <string>
#include <vector>

namespace catchpeak::app {

/// What `catchpeak delineate` is asked to do.
struct DelineateOptions {
    std::filesystem::path dem;    ///< DEM raster (projected CRS in m or ft)
    std::filesystem::path points; ///< design points (vector layer)
    io::DeclaredCrs points_crs;   ///< the CRS of their coordinates when the file does not say
    std::string id_field;         ///< field of the design point ids
    double snap_radius_m = 0.0;   ///< search radius for snapping
    SnapRule snap_rule = SnapRule::nearest_stream;
    double snap_stream_threshold_m2 = 1.0e4; ///< nearest_stream: stream cells drain this area
    /// The name of the snap radius in messages: the option, or the key of a project.
    std::string snap_radius_key = "--snap-radius";
    /// Warn when the snapped catchment is more than this many times the catchment of the cell
    /// under the point, or the catchments within the radius differ more (our choice: 4).
    double snap_area_factor = 4.0;
    std::filesystem::path out_dir;
    std::optional<std::filesystem::path> breach_lines; ///< lines lowered into the DEM
    double stream_threshold_m2 = 1.0e5; ///< streams drain at least this area; 0 = no streams
    unsigned threads = 0;               ///< 0 = all cores (results do not depend on it)
};

/// What was written.
struct DelineateSummary {
    std::filesystem::path json; ///< out_dir/catchments.json
    std::filesystem::path gpkg; ///< out_dir/catchments.gpkg
    std::size_t design_points = 0;
    std::vector<std::string> notes;    ///< conversions and assumptions (units, CRS)
    std::vector<std::string> warnings; ///< "<id>: <warning>" for every design point warning
};

/// The catchments of every design point, in memory: what `delineate` writes and what `run`
/// weights and computes.
struct Delineation {
    io::Dem dem;               ///< the DEM as read (metres)
    std::string points_source; ///< the design point file (and layer), for messages
    /// The design points as read (in the order of result.points), with their expected areas.
    std::vector<io::DesignPoint> given_points;
    std::string expected_area_field; ///< the layer's field of expected areas; "" if none
    terrain::TerrainResult result;   ///< points, labels, flow paths, streams, warnings
    /// Per design point (in the order of result.points), ISO WKB: the total catchment (own
    /// part and every nested catchment upstream) and the local part alone.
    std::vector<std::vector<unsigned char>> total_wkb;
    std::vector<std::vector<unsigned char>> local_wkb;
    std::vector<std::vector<std::size_t>> all_upstream; ///< every design point upstream
    /// Layers of catchments.gpkg: catchments, local_catchments, flow_paths, design_points,
    /// streams.
    std::vector<io::OutLayer> layers;
    std::vector<std::string> notes; ///< conversions and assumptions (units, CRS)
    /// The design points' and the breach lines' reprojections to the DEM's CRS, when they were.
    std::optional<io::Reprojection> points_reprojection;
    std::optional<io::Reprojection> breach_lines_reprojection;
    /// The breach lines as read, in the DEM's CRS (culvert inverts are read at their ends).
    std::vector<terrain::BreachLine> breach_lines;
};

/// The snap rule named by `delineate --snap`; throws InputError naming the option, with a
/// suggestion, for any other text.
[[nodiscard]] SnapRule snap_rule_option(const std::string &text);

/// The checks of one design point's snap that fail; `run` and `delineate` word them.
struct SnapChecks {
    bool no_stream = false; ///< nearest_stream found no stream cell within the radius
    bool grew = false;   ///< the snapped catchment exceeds factor x that of the given point's cell
    bool spread = false; ///< the largest catchment within the radius exceeds factor x the snapped
};

[[nodiscard]] SnapChecks snap_checks(const terrain::DesignPointTerrain &point, double area_factor);

/// "design points ('DP-1', 'DP-2', and 7 more)", for messages.
[[nodiscard]] std::string design_points_named(const io::DesignPointLayer &points);

/// The extent of a DEM (its cells' outer edges), in its CRS.
[[nodiscard]] io::Extent dem_extent(const Grid<float> &dem);

/// Throws InputError at `where` when a layer's extent (in the DEM's CRS) does not overlap the
/// DEM's, naming both: such a layer is almost always in another CRS than its file declares.
/// A layer without extent (no geometry) passes.
void require_over_dem(const std::optional<io::Extent> &layer, const io::Extent &dem,
                      const std::string &where, const std::string &what);

/// Reads the DEM, the design points and the breach lines, runs the terrain analysis, and
/// polygonizes the local and total catchments. Checks the options as `delineate` does.
/// Progress goes to `progress` (null = silent). Throws InputError for bad input.
[[nodiscard]] Delineation delineate_catchments(const DelineateOptions &options,
                                               std::ostream *progress);

/// Delineates the catchment above every design point and writes out_dir/catchments.json and
/// out_dir/catchments.gpkg (layers catchments, local_catchments, flow_paths, design_points,
/// streams). Both are written under temporary names and renamed when both are complete.
/// The design points (and breach lines) are reprojected to the DEM's CRS when theirs differs.
/// Progress of each step goes to `progress` in the style of GDAL's command-line tools
/// ("step: 0...10...20...30...40...50...60...70...80...90...100 - done."); null = silent.
/// Throws InputError (bad input: exit 2) naming the file and what is wrong.
DelineateSummary delineate(const DelineateOptions &options, std::ostream *progress);

} // namespace catchpeak::app
