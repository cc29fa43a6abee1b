// SPDX-License-Identifier: MIT
#pragma once

#include <utility>
#include <vector>

namespace catchpeak::io {

/// A ring: closed sequence of (x, y).
using Ring = std::vector<std::pair<double, double>>;
/// A polygon: outer ring first, then holes.
using PolygonRings = std::vector<Ring>;

/// The rings of an ISO WKB Polygon or MultiPolygon (either byte order; Z and M are dropped).
/// Empty WKB gives no polygon. Throws InternalError for WKB that is not a polygon type or is
/// cut short: the polygons come from our own polygonizer, so this is a bug, not bad input.
[[nodiscard]] std::vector<PolygonRings> wkb_polygon_rings(const std::vector<unsigned char> &wkb);

} // namespace catchpeak::io
