// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/grid.hpp"

#include <cstdint>
#include <vector>

namespace catchpeak::io {

/// The outline of the cells carrying one label.
struct LabelPolygon {
    std::uint32_t label = 0;
    std::vector<unsigned char> wkb; ///< Polygon or MultiPolygon, ISO WKB, valid, grid CRS
    std::uint64_t cell_count = 0;   ///< cells carrying the label
    double area_m2 = 0.0;           ///< area of the polygon (equals cell_count x cell area)
};

/// Turns a label grid (0 = no label) into one (multi)polygon per label, ascending by label,
/// with GDALPolygonize on an in-memory copy.
///
/// Connectedness: 4 (cells sharing an edge form one polygon). Cells of a label that touch only
/// at a corner, as D8 lets a catchment do, become separate parts of one MultiPolygon (parts
/// may touch at a vertex, which OGC allows). Any invalid result is repaired with MakeValid.
/// Polygon edges follow cell edges, so the area equals cell count x cell area exactly up to
/// floating-point rounding. Throws InternalError for labels >= 2^31 (GDALPolygonize writes
/// them to a 32-bit signed field).
[[nodiscard]] std::vector<LabelPolygon> polygonize_labels(const Grid<std::uint32_t> &labels);

/// One patch of 4-connected cells of a label, as a polygon.
struct LabelPatch {
    std::uint32_t label = 0;
    std::vector<unsigned char> wkb; ///< Polygon (with its holes), ISO WKB, valid, grid CRS
};

/// The labels of a grid (0 = no label) as one polygon per patch of 4-connected cells, ascending
/// by label (GDALPolygonize, as polygonize_labels, without merging the patches of a label: a
/// spatial index then sees small pieces). A patch whose polygon is invalid (a hole touching its
/// shell) is repaired with MakeValid and may give several polygons.
[[nodiscard]] std::vector<LabelPatch> polygonize_patches(const Grid<std::uint32_t> &labels);

/// The union of polygons given as WKB (GEOS through OGR), made valid; ISO WKB. Used to build a
/// total catchment from the local catchments it contains. An empty list gives an empty
/// MultiPolygon.
[[nodiscard]] std::vector<unsigned char>
union_polygons(const std::vector<const std::vector<unsigned char> *> &parts);

/// Area of a polygonal WKB geometry, in square CRS units (GEOS/OGR).
[[nodiscard]] double polygon_area(const std::vector<unsigned char> &wkb);

} // namespace catchpeak::io
