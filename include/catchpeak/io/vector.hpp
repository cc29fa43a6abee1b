// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/io/feature.hpp"

#include <cstdint>
#include <filesystem>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace catchpeak::io {

/// The CRS of a layer's coordinates as the user declares it, for a file that does not declare
/// it right: a GeoJSON file without a "crs" member in a projected CRS (RFC 7946 says WGS 84
/// longitude/latitude, and GDAL reads it so), a shapefile without its .prj.
struct DeclaredCrs {
    std::string text;  ///< any text GDAL reads as a CRS ("EPSG:32617", WKT, PROJ); "" = none
    std::string key;   ///< the key that declares it, e.g. "[inputs] design_points_crs"
    std::string where; ///< where it was given, for messages ("project.toml:7: [inputs] ...")
};

/// The name of a CRS given as WKT ("WGS 84 / UTM zone 33N"); "" for an empty text.
[[nodiscard]] std::string crs_name(const std::string &wkt);

/// Reads a whole vector layer that GDAL reads (GeoPackage, shapefile, GeoJSON, ...).
///
/// - `layer_name` names the layer; when empty the file must hold exactly one layer (a file
///   with several is refused, listing them).
/// - Geometries come as ISO WKB, 2D, in `target_crs_wkt`: a layer in another CRS is
///   reprojected with OGRCoordinateTransformation. A layer without a CRS is taken to be in the
///   target CRS already (common for CSV or shapefiles without .prj); a note in `notes` says
///   so. With an empty target, geometries stay in the layer's CRS. A reprojection is noted in
///   `notes` and in `facts` (with the extent of the geometries read), when given.
/// - `declared`: the CRS of the coordinates when the user declares it; it replaces the WGS 84 of
///   a GeoJSON file without a "crs" member and the missing CRS of a file; a file that declares
///   another CRS of its own is refused.
/// - Attributes come as text (null fields are left out of the map).
/// Throws InputError naming the file (and layer) when it cannot be read or reprojected, and when
/// its CRS is geographic (longitude/latitude) but its coordinates are not (a GeoJSON file in a
/// projected CRS without a "crs" member), saying how to declare the CRS.
[[nodiscard]] VectorLayer
read_vector_layer(const std::filesystem::path &path, const std::string &target_crs_wkt,
                  const std::string &layer_name = {}, std::vector<std::string> *notes = nullptr,
                  const DeclaredCrs &declared = {}, LayerFacts *facts = nullptr);

/// A design point: where the engineer put it, in the target CRS (metres).
struct DesignPoint {
    std::string id;
    double x = 0.0;
    double y = 0.0;
    std::int64_t fid = -1; ///< feature id in the file, for messages
    /// The catchment area the engineer expects (field expected_area_ha or expected_area_ac),
    /// m2; unset when the layer has no such field or the feature leaves it empty.
    std::optional<double> expected_area_m2;
};

struct DesignPointLayer {
    std::string source;  ///< file (and layer), for messages
    std::string crs_wkt; ///< CRS of x, y
    std::vector<DesignPoint> points;
    std::vector<std::string> notes;
    std::optional<Extent> extent;             ///< of the points (target CRS)
    std::optional<Reprojection> reprojection; ///< set when reprojected to the target CRS
    std::string expected_area_field; ///< "expected_area_ha" or "expected_area_ac"; "" if none
};

/// Reads design points: Point geometries (a MultiPoint of exactly one point is accepted) with
/// an id in `id_field`. InputError naming file, field and feature for: a missing field (the
/// message lists the fields present), an empty layer, a missing (null or blank) or duplicate
/// id, an empty or non-point geometry; both fields expected_area_ha and expected_area_ac, or a
/// value in them that is not a number > 0; and as read_vector_layer for the CRS (`declared`).
[[nodiscard]] DesignPointLayer read_design_points(const std::filesystem::path &path,
                                                  const std::string &id_field,
                                                  const std::string &target_crs_wkt,
                                                  const DeclaredCrs &declared = {});

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
    std::optional<Extent> extent;             ///< of the lines (target CRS)
    std::optional<Reprojection> reprojection; ///< set when reprojected to the target CRS
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
    std::vector<std::string> notes;           ///< includes every geometry that was made valid
    std::optional<Extent> extent;             ///< of the polygons (target CRS)
    std::optional<Reprojection> reprojection; ///< set when reprojected to the target CRS
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
