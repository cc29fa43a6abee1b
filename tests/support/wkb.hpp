// SPDX-License-Identifier: MIT
// Builds ISO WKB (little-endian, 2D) polygons and multipolygons for tests and benchmarks, and
// in-memory vector layers of them, without any library.
#pragma once

#include "catchpeak/io/feature.hpp"

#include <cstdint>
#include <cstring>
#include <string>
#include <utility>
#include <vector>

namespace catchpeak::test {

using Ring = std::vector<std::pair<double, double>>; ///< closed or not; closed on output
using PolygonRings = std::vector<Ring>;              ///< outer ring, then holes

namespace detail {
inline void put_u8(std::vector<unsigned char> &out, unsigned char v) { out.push_back(v); }
inline void put_u32(std::vector<unsigned char> &out, std::uint32_t v) {
    for (int i = 0; i < 4; ++i) {
        out.push_back(static_cast<unsigned char>((v >> (8 * i)) & 0xFFu));
    }
}
inline void put_f64(std::vector<unsigned char> &out, double v) {
    std::uint64_t bits = 0;
    std::memcpy(&bits, &v, sizeof bits);
    for (int i = 0; i < 8; ++i) {
        out.push_back(static_cast<unsigned char>((bits >> (8 * i)) & 0xFFu));
    }
}
inline void put_polygon(std::vector<unsigned char> &out, const PolygonRings &rings) {
    put_u8(out, 1);  // little-endian
    put_u32(out, 3); // polygon
    put_u32(out, static_cast<std::uint32_t>(rings.size()));
    for (const auto &ring : rings) {
        const bool closed = !ring.empty() && ring.front() == ring.back();
        put_u32(out, static_cast<std::uint32_t>(ring.size() + (closed ? 0 : 1)));
        for (const auto &[x, y] : ring) {
            put_f64(out, x);
            put_f64(out, y);
        }
        if (!closed && !ring.empty()) {
            put_f64(out, ring.front().first);
            put_f64(out, ring.front().second);
        }
    }
}
} // namespace detail

inline std::vector<unsigned char> polygon_wkb(const PolygonRings &rings) {
    std::vector<unsigned char> out;
    detail::put_polygon(out, rings);
    return out;
}

inline std::vector<unsigned char> multipolygon_wkb(const std::vector<PolygonRings> &polys) {
    std::vector<unsigned char> out;
    detail::put_u8(out, 1);
    detail::put_u32(out, 6); // multipolygon
    detail::put_u32(out, static_cast<std::uint32_t>(polys.size()));
    for (const auto &p : polys) {
        detail::put_polygon(out, p);
    }
    return out;
}

/// Axis-parallel rectangle [x0, x1] x [y0, y1], counter-clockwise.
inline PolygonRings rect(double x0, double y0, double x1, double y1) {
    return {{{x0, y0}, {x1, y0}, {x1, y1}, {x0, y1}}};
}

inline std::vector<unsigned char> rect_wkb(double x0, double y0, double x1, double y1) {
    return polygon_wkb(rect(x0, y0, x1, y1));
}

/// A feature with one attribute.
inline io::VectorFeature feature(std::int64_t fid, std::vector<unsigned char> wkb,
                                 const std::string &field, const std::string &value) {
    io::VectorFeature f;
    f.fid = fid;
    f.wkb = std::move(wkb);
    f.attributes[field] = value;
    return f;
}

} // namespace catchpeak::test
