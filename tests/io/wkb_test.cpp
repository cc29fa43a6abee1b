// SPDX-License-Identifier: MIT
// WKB through OGR: polygon rings as the bytes hold them (holes, multipolygons, either byte
// order, Z dropped), and points and lines written as ISO WKB. The expected bytes follow the
// layout of the OGC Simple Features WKB encoding (byte order, type, counts, IEEE doubles),
// built here by hand (support/wkb.hpp) rather than by the code under test.
#include "catchpeak/io/wkb.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/io/polygonize.hpp"
#include "support/wkb.hpp"

#include <gtest/gtest.h>

#include <cstdint>
#include <cstring>

namespace io = catchpeak::io;
namespace t = catchpeak::test;

namespace {

/// A ring closed as WKB holds it (first vertex repeated at the end).
io::Ring closed(io::Ring r) {
    r.push_back(r.front());
    return r;
}

void put_u32_big(std::vector<unsigned char> &b, std::uint32_t v) {
    for (int i = 3; i >= 0; --i) {
        b.push_back(static_cast<unsigned char>((v >> (8 * i)) & 0xffU));
    }
}
void put_f64_big(std::vector<unsigned char> &b, double v) {
    std::uint64_t u = 0;
    std::memcpy(&u, &v, sizeof u);
    for (int i = 7; i >= 0; --i) {
        b.push_back(static_cast<unsigned char>((u >> (8 * i)) & 0xffU));
    }
}
void put_u32_little(std::vector<unsigned char> &b, std::uint32_t v) {
    for (int i = 0; i < 4; ++i) {
        b.push_back(static_cast<unsigned char>((v >> (8 * i)) & 0xffU));
    }
}
void put_f64_little(std::vector<unsigned char> &b, double v) {
    std::uint64_t u = 0;
    std::memcpy(&u, &v, sizeof u);
    for (int i = 0; i < 8; ++i) {
        b.push_back(static_cast<unsigned char>((u >> (8 * i)) & 0xffU));
    }
}

// A 100 m x 60 m catchment at projected coordinates with a 20 m x 10 m hole (an island of
// another label): area 6000 - 200 = 5800 m2, by hand.
const io::Ring outer = {
    {700000.0, 5000000.0}, {700100.0, 5000000.0}, {700100.0, 5000060.0}, {700000.0, 5000060.0}};
const io::Ring hole = {
    {700040.0, 5000020.0}, {700040.0, 5000030.0}, {700060.0, 5000030.0}, {700060.0, 5000020.0}};

} // namespace

TEST(WkbRings, PolygonWithAHoleGivesItsRingsAsStored) {
    const auto wkb = t::polygon_wkb({outer, hole});
    const auto polys = io::wkb_polygon_rings(wkb);
    ASSERT_EQ(polys.size(), 1U);
    ASSERT_EQ(polys[0].size(), 2U);
    EXPECT_EQ(polys[0][0], closed(outer));
    EXPECT_EQ(polys[0][1], closed(hole));
    // Areas by hand (see above); the coordinates are exact in binary, so the shoelace sum is
    // exact too.
    EXPECT_DOUBLE_EQ(io::polygon_area(wkb), 5800.0);
}

TEST(WkbRings, MultipolygonGivesEveryPolygonInOrder) {
    const io::Ring second = {{700200.0, 5000000.0}, {700230.0, 5000000.0}, {700230.0, 5000010.0}};
    const auto wkb = t::multipolygon_wkb({{outer, hole}, {second}});
    const auto polys = io::wkb_polygon_rings(wkb);
    ASSERT_EQ(polys.size(), 2U);
    ASSERT_EQ(polys[0].size(), 2U);
    EXPECT_EQ(polys[0][0], closed(outer));
    EXPECT_EQ(polys[0][1], closed(hole));
    ASSERT_EQ(polys[1].size(), 1U);
    EXPECT_EQ(polys[1][0], closed(second));
    // 5800 m2 and a right triangle of 30 m x 10 m: 150 m2, by hand.
    EXPECT_DOUBLE_EQ(io::polygon_area(wkb), 5950.0);
}

TEST(WkbRings, BigEndianWkbGivesTheSameRings) {
    std::vector<unsigned char> b{0}; // big-endian (XDR)
    put_u32_big(b, 3);               // Polygon
    put_u32_big(b, 1);
    const auto ring = closed(outer);
    put_u32_big(b, static_cast<std::uint32_t>(ring.size()));
    for (const auto &[x, y] : ring) {
        put_f64_big(b, x);
        put_f64_big(b, y);
    }
    const auto polys = io::wkb_polygon_rings(b);
    ASSERT_EQ(polys.size(), 1U);
    ASSERT_EQ(polys[0].size(), 1U);
    EXPECT_EQ(polys[0][0], ring);
}

TEST(WkbRings, ZIsDropped) {
    std::vector<unsigned char> b{1};
    put_u32_little(b, 1003); // ISO Polygon Z
    put_u32_little(b, 1);
    const auto ring = closed(outer);
    put_u32_little(b, static_cast<std::uint32_t>(ring.size()));
    for (const auto &[x, y] : ring) {
        put_f64_little(b, x);
        put_f64_little(b, y);
        put_f64_little(b, 123.5);
    }
    const auto polys = io::wkb_polygon_rings(b);
    ASSERT_EQ(polys.size(), 1U);
    EXPECT_EQ(polys[0][0], ring);
}

TEST(WkbRings, EmptyWkbHasNoPolygonAndOthersAreRefused) {
    EXPECT_TRUE(io::wkb_polygon_rings({}).empty());
    // Not a polygon type: a bug of ours (the polygons come from our polygonizer).
    EXPECT_THROW((void)io::wkb_polygon_rings(io::point_wkb(1.0, 2.0)), catchpeak::InternalError);
    // Cut short.
    const auto whole = t::polygon_wkb({outer});
    ASSERT_GT(whole.size(), 5u);
    const std::vector<unsigned char> cut(whole.begin(), whole.end() - 5);
    EXPECT_THROW((void)io::wkb_polygon_rings(cut), catchpeak::InternalError);
}

TEST(WkbWriters, PointAndLineAreIsoWkbLittleEndian) {
    std::vector<unsigned char> point{1};
    put_u32_little(point, 1); // Point
    put_f64_little(point, 700012.5);
    put_f64_little(point, 5000007.25);
    EXPECT_EQ(io::point_wkb(700012.5, 5000007.25), point);

    const std::vector<std::pair<double, double>> xy = {{1.0, 2.0}, {3.5, -4.0}, {5.0, 6.0}};
    std::vector<unsigned char> line{1};
    put_u32_little(line, 2); // LineString
    put_u32_little(line, 3);
    for (const auto &[x, y] : xy) {
        put_f64_little(line, x);
        put_f64_little(line, y);
    }
    EXPECT_EQ(io::line_wkb(xy), line);
}
