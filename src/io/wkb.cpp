// SPDX-License-Identifier: MIT
// WKB through OGR: polygon rings decoded, points and lines encoded. The one WKB codec of io
// (land reads WKB into GEOS geometries with GEOS's reader).
#include "catchpeak/io/wkb.hpp"

#include "catchpeak/core/error.hpp"
#include "gdal_handles.hpp"

#include <fmt/format.h>

namespace catchpeak::io {

namespace {

Ring ring_of(const OGRLinearRing &r) {
    Ring ring;
    ring.reserve(static_cast<std::size_t>(r.getNumPoints()));
    for (int i = 0; i < r.getNumPoints(); ++i) {
        ring.emplace_back(r.getX(i), r.getY(i));
    }
    return ring;
}

PolygonRings rings_of(const OGRPolygon &p) {
    PolygonRings rings;
    if (const OGRLinearRing *outer = p.getExteriorRing()) {
        rings.push_back(ring_of(*outer));
    }
    for (int i = 0; i < p.getNumInteriorRings(); ++i) {
        rings.push_back(ring_of(*p.getInteriorRing(i)));
    }
    return rings;
}

} // namespace

std::vector<PolygonRings> wkb_polygon_rings(const std::vector<unsigned char> &wkb) {
    std::vector<PolygonRings> out;
    if (wkb.empty()) {
        return out;
    }
    const detail::GeometryPtr g = detail::from_wkb(wkb);
    switch (wkbFlatten(g->getGeometryType())) {
    case wkbPolygon:
        out.push_back(rings_of(*g->toPolygon()));
        break;
    case wkbMultiPolygon:
        for (const OGRPolygon *p : *g->toMultiPolygon()) {
            out.push_back(rings_of(*p));
        }
        break;
    default:
        throw InternalError(
            fmt::format("WKB holds a {}, not a polygon or multipolygon", g->getGeometryName()));
    }
    return out;
}

std::vector<unsigned char> point_wkb(double x, double y) {
    OGRPoint p(x, y);
    return detail::to_iso_wkb(p);
}

std::vector<unsigned char> line_wkb(const std::vector<std::pair<double, double>> &xy) {
    OGRLineString line;
    line.setNumPoints(static_cast<int>(xy.size()), FALSE);
    for (std::size_t i = 0; i < xy.size(); ++i) {
        line.setPoint(static_cast<int>(i), xy[i].first, xy[i].second);
    }
    return detail::to_iso_wkb(line);
}

} // namespace catchpeak::io
