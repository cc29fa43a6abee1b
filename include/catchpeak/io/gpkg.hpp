// SPDX-License-Identifier: MIT
#pragma once

#include <cstdint>
#include <filesystem>
#include <string>
#include <variant>
#include <vector>

namespace catchpeak::io {

enum class FieldType { text, integer, real };

enum class GeometryType { point, line_string, multi_line_string, polygon, multi_polygon, any };

struct FieldDef {
    std::string name;
    FieldType type = FieldType::text;
};

/// A field value; std::monostate is a null.
using FieldValue = std::variant<std::monostate, std::string, std::int64_t, double>;

struct OutFeature {
    std::vector<unsigned char> wkb; ///< ISO WKB in the layer's CRS (empty = no geometry)
    std::vector<FieldValue> values; ///< one per field, in the order of OutLayer::fields
};

struct OutLayer {
    std::string name;
    GeometryType geometry = GeometryType::any;
    std::string crs_wkt; ///< "" = no CRS
    std::vector<FieldDef> fields;
    std::vector<OutFeature> features;
};

/// Writes a GeoPackage holding `layers`, in order. A Polygon is written to a MultiPolygon
/// layer as a one-part MultiPolygon (and a LineString to a MultiLineString layer likewise), so
/// a layer holds one geometry type. Written under a temporary name in the same folder and
/// renamed when complete (replacing an older file); on failure nothing is left.
/// Throws InputError naming the file when it cannot be written, InternalError when a value does
/// not match its field type or a feature has the wrong number of values.
void write_gpkg(const std::filesystem::path &path, const std::vector<OutLayer> &layers);

} // namespace catchpeak::io
