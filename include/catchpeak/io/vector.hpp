// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/io/feature.hpp"

#include <cstdint>
#include <filesystem>
#include <string>
#include <utility>
#include <vector>

namespace catchpeak::io {

/// Reads a whole vector layer that GDAL reads (GeoPackage, shapefile, GeoJSON, ...).
///
/// - `layer_name` names the layer; when empty the file must hold exactly one layer (a file
///   with several is refused, listing them).
/// - Geometries come as ISO WKB, 2D, in `target_crs_wkt`: a layer in another CRS is
///   reprojected with OGRCoordinateTransformation. A layer without a CRS is taken to be in the
///   target CRS already (common for CSV or shapefiles without .prj); a note in `notes` says
///   so. With an empty target, geometries stay in the layer's CRS.
/// - Attributes come as text (null fields are left out of the map).
/// Throws InputError naming the file (and layer) when it cannot be read or reprojected.
[[nodiscard]] VectorLayer read_vector_layer(const std::filesystem::path &path,
                                            const std::string &target_crs_wkt,
                                            const std::string &layer_name = {},
                                            std::vector<std::string> *notes = nullptr);

/// A design point: where the engineer put it, in the target CRS (metres).
struct DesignPoint {
    std::string id;
    double x = 0.0;
    double y = 0.0;
    std::int64_t fid = -1; ///< feature id in the file, for messages
};

struct DesignPointLayer {
    std::string source;  ///< file (and layer), for messages
    std::string crs_wkt; ///< CRS of x, y
    std::vector<DesignPoint> points;
    std::vector<std::string> notes;
};

/// Reads design points: Point geometries (a MultiPoint of exactly one point is accepted) with
/// an id in `id_field`. InputError naming file, field and feature for: a missing field (the
/// message lists the fields present), an empty layer, a missing (null or blank) or duplicate
/// id, an empty or non-point geometry.
[[nodiscard]] DesignPointLayer read_design_points(const std::filesystem::path &path,
                                                  const std::string &id_field,
                                                  const std::string &target_crs_wkt);

/// A polyline in the target CRS: vertices (x, y) in metres.
struct Polyline {
    std::int64_t fid = -1;
    std::vector<std::pair<double, double>> vertices;
};

struct LineLayer {
    std::string source;
    std::string crs_wkt;
    std::vector<Polyline> lines; ///< a MultiLineString gives one Polyline per part
    std::vector<std::string> notes;
};

/// Reads lines (e.g. breach lines across road embankments): LineString or MultiLineString
/// geometries. InputError naming file and feature for other geometry types.
[[nodiscard]] LineLayer read_lines(const std::filesystem::path &path,
                                   const std::string &target_crs_wkt);

/// A polygon with its class (land cover class, hydrologic soil group, ...).
struct ClassPolygon {
    std::int64_t fid = -1;
    std::string class_value;
    std::vector<unsigned char> wkb; ///< Polygon or MultiPolygon, ISO WKB, valid (OGC)
};

struct PolygonLayer {
    std::string source;
    std::string crs_wkt;
    std::vector<ClassPolygon> polygons;
    std::vector<std::string> notes; ///< includes every geometry that was made valid
};

/// Reads polygons with their class in `class_field`. Invalid geometries are repaired with
/// OGR's MakeValid (GEOS) and each repair is listed in `notes`; what MakeValid returns besides
/// polygons (lines, points of a collapsed ring) is dropped. InputError naming file, field and
/// feature for: a missing field (listing the fields present), an empty layer, a missing class,
/// a non-polygon geometry, a geometry that cannot be made valid.
[[nodiscard]] PolygonLayer read_polygons(const std::filesystem::path &path,
                                         const std::string &class_field,
                                         const std::string &target_crs_wkt);

} // namespace catchpeak::io
