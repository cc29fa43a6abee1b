// SPDX-License-Identifier: MIT
#pragma once

#include <utility>
#include <vector>

/// ISO WKB in and out, through OGR: the rings of catchment polygons for the map and the
/// extent, and the points and lines of the delineation layers.
namespace catchpeak::io {

/// A ring: closed sequence of (x, y).
using Ring = std::vector<std::pair<double, double>>;
/// A polygon: outer ring first, then holes.
using PolygonRings = std::vector<Ring>;

/// The rings of an ISO WKB Polygon or MultiPolygon (either byte order; Z and M are dropped).
/// Empty WKB gives no polygon. Throws InternalError for WKB that is not a polygon type or is
/// cut short: the polygons come from our own polygonizer, so this is a bug, not bad input.
[[nodiscard]] std::vector<PolygonRings> wkb_polygon_rings(const std::vector<unsigned char> &wkb);

/// ISO WKB (little-endian, 2D) of a point.
[[nodiscard]] std::vector<unsigned char> point_wkb(double x, double y);
/// ISO WKB (little-endian, 2D) of a line string through the vertices, in order.
[[nodiscard]] std::vector<unsigned char> line_wkb(const std::vector<std::pair<double, double>> &xy);

} // namespace catchpeak::io
