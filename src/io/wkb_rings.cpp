// SPDX-License-Identifier: MIT
#include "catchpeak/io/wkb_rings.hpp"

#include "catchpeak/core/error.hpp"

#include <cstdint>
#include <cstring>
#include <string>

namespace catchpeak::io {

namespace {

class Reader {
  public:
    explicit Reader(const std::vector<unsigned char> &b) : b_(b) {}

    void byte_order() { little_ = take(1)[0] == 1; }
    std::uint32_t u32() {
        const unsigned char *p = take(4);
        std::uint32_t v = 0;
        for (int i = 0; i < 4; ++i) {
            const auto byte = static_cast<std::uint32_t>(p[little_ ? i : 3 - i]);
            v |= byte << (8 * i);
        }
        return v;
    }
    double f64() {
        const unsigned char *p = take(8);
        std::uint64_t u = 0;
        for (int i = 0; i < 8; ++i) {
            const auto byte = static_cast<std::uint64_t>(p[little_ ? i : 7 - i]);
            u |= byte << (8 * i);
        }
        double v = 0.0;
        std::memcpy(&v, &u, sizeof v);
        return v;
    }

  private:
    const unsigned char *take(std::size_t n) {
        if (pos_ + n > b_.size()) {
            throw InternalError("WKB polygon is cut short");
        }
        const unsigned char *p = b_.data() + pos_;
        pos_ += n;
        return p;
    }
    const std::vector<unsigned char> &b_;
    std::size_t pos_ = 0;
    bool little_ = true;
};

/// Number of ordinates per vertex and the base geometry type of an ISO (or EWKB-flagged) type.
std::pair<std::uint32_t, std::uint32_t> split_type(std::uint32_t t) {
    std::uint32_t dims = 2;
    if ((t & 0x80000000u) != 0u) {
        ++dims;
    }
    if ((t & 0x40000000u) != 0u) {
        ++dims;
    }
    t &= 0x0fffffffu;
    const std::uint32_t base = t % 1000;
    const std::uint32_t thousands = t / 1000; // 1 Z, 2 M, 3 ZM
    dims += thousands == 3 ? 2u : (thousands > 0 ? 1u : 0u);
    return {base, dims};
}

PolygonRings read_polygon_body(Reader &r, std::uint32_t dims) {
    PolygonRings rings(r.u32());
    for (auto &ring : rings) {
        ring.resize(r.u32());
        for (auto &xy : ring) {
            xy.first = r.f64();
            xy.second = r.f64();
            for (std::uint32_t k = 2; k < dims; ++k) {
                (void)r.f64();
            }
        }
    }
    return rings;
}

} // namespace

std::vector<PolygonRings> wkb_polygon_rings(const std::vector<unsigned char> &wkb) {
    std::vector<PolygonRings> out;
    if (wkb.empty()) {
        return out;
    }
    Reader r(wkb);
    r.byte_order();
    const auto [base, dims] = split_type(r.u32());
    if (base == 3) {
        out.push_back(read_polygon_body(r, dims));
    } else if (base == 6) {
        const std::uint32_t n = r.u32();
        for (std::uint32_t i = 0; i < n; ++i) {
            r.byte_order();
            const auto [pbase, pdims] = split_type(r.u32());
            if (pbase != 3) {
                throw InternalError("WKB multipolygon holds a geometry of type " +
                                    std::to_string(pbase));
            }
            out.push_back(read_polygon_body(r, pdims));
        }
    } else {
        throw InternalError("WKB is of type " + std::to_string(base) +
                            ", not a polygon or multipolygon");
    }
    return out;
}

} // namespace catchpeak::io
