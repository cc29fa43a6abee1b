// SPDX-License-Identifier: MIT
#include "catchpeak/io/polygonize.hpp"

#include "catchpeak/core/error.hpp"
#include "gdal_handles.hpp"

#include <gdal_alg.h>

#include <fmt/format.h>

#include <algorithm>
#include <limits>
#include <map>
#include <memory>
#include <vector>

namespace catchpeak::io {

namespace {

using detail::GdalErrorScope;

double area_of(const OGRGeometry &g) {
    const auto type = wkbFlatten(g.getGeometryType());
    if (type == wkbPolygon) {
        return g.toPolygon()->get_Area();
    }
    if (type == wkbMultiPolygon) {
        return g.toMultiPolygon()->get_Area();
    }
    if (type == wkbGeometryCollection) {
        return g.toGeometryCollection()->get_Area();
    }
    return 0.0;
}

/// Polygon, or MultiPolygon when there are several parts; valid.
detail::GeometryPtr finish(std::unique_ptr<OGRMultiPolygon> multi) {
    detail::GeometryPtr g;
    if (multi->getNumGeometries() == 1) {
        g.reset(multi->getGeometryRef(0)->clone());
    } else {
        g.reset(multi.release());
    }
    if (!g->IsValid()) {
        GdalErrorScope errors;
        detail::GeometryPtr fixed(g->MakeValid());
        if (!fixed) {
            throw InternalError(errors.describe("cannot make a polygon valid"));
        }
        g = std::move(fixed);
    }
    return g;
}

/// Cells per label (0 excluded). Throws InternalError for labels >= 2^31 (GDALPolygonize writes
/// them to a 32-bit signed field).
std::map<std::uint32_t, std::uint64_t> label_counts(const Grid<std::uint32_t> &labels) {
    std::map<std::uint32_t, std::uint64_t> counts;
    for (std::size_t i = 0; i < labels.size(); ++i) {
        if (labels[i] != 0) {
            if (labels[i] > static_cast<std::uint32_t>(std::numeric_limits<std::int32_t>::max())) {
                throw InternalError(fmt::format("label {} too large to polygonize", labels[i]));
            }
            ++counts[labels[i]];
        }
    }
    return counts;
}

/// GDALPolygonize of the labels (0 = none): an in-memory dataset whose only layer holds one
/// polygon per patch of 4-connected cells, with the label in field 0. The labels are handed to
/// GDAL in place (an in-memory band over the grid's own cells, which GDALPolygonize only reads);
/// the mask takes a byte a cell.
detail::DatasetPtr polygonize_to_layer(const Grid<std::uint32_t> &labels) {
    GdalErrorScope errors;
    GDALDriver *mem = GetGDALDriverManager()->GetDriverByName("MEM");
    const int w = static_cast<int>(labels.width());
    const int h = static_cast<int>(labels.height());
    detail::DatasetPtr raster(mem->Create("", w, h, 0, GDT_UInt32, nullptr));
    if (!raster) {
        throw InternalError(errors.describe("cannot create an in-memory raster"));
    }
    const auto &t = labels.transform;
    double gt[6] = {t.origin_x, t.pixel_width,  t.row_rotation,
                    t.origin_y, t.col_rotation, t.pixel_height};
    raster->SetGeoTransform(gt);
    // Mask: 1 on labelled cells. Both bands are GDAL views of memory held here.
    std::vector<std::uint8_t> inside(labels.size());
    for (std::size_t i = 0; i < labels.size(); ++i) {
        inside[i] = labels[i] != 0 ? 1 : 0;
    }
    const auto view = [](const void *data) { return fmt::format("DATAPOINTER={}", data); };
    const std::string label_view = view(labels.cells().data());
    const std::string mask_view = view(inside.data());
    const char *label_options[] = {label_view.c_str(), nullptr};
    const char *mask_options[] = {mask_view.c_str(), nullptr};
    if (raster->AddBand(GDT_UInt32, const_cast<char **>(label_options)) != CE_None ||
        raster->AddBand(GDT_Byte, const_cast<char **>(mask_options)) != CE_None) {
        throw InternalError(errors.describe("cannot add bands to an in-memory raster"));
    }
    GDALRasterBand *band = raster->GetRasterBand(1);
    GDALRasterBand *mask = raster->GetRasterBand(2);

    GDALDriver *memv = GetGDALDriverManager()->GetDriverByName("Memory");
    detail::DatasetPtr vec(memv->Create("", 0, 0, 0, GDT_Unknown, nullptr));
    OGRLayer *layer = vec->CreateLayer("labels", nullptr, wkbPolygon, nullptr);
    OGRFieldDefn field("label", OFTInteger);
    if (layer == nullptr || layer->CreateField(&field) != OGRERR_NONE) {
        throw InternalError(errors.describe("cannot create an in-memory layer"));
    }
    // No "8CONNECTED" option: 4-connectedness (see the header).
    if (GDALPolygonize(GDALRasterBand::ToHandle(band), GDALRasterBand::ToHandle(mask),
                       OGRLayer::ToHandle(layer), 0, nullptr, nullptr, nullptr) != CE_None) {
        throw InternalError(errors.describe("GDALPolygonize failed"));
    }

    return vec;
}

} // namespace

std::vector<LabelPolygon> polygonize_labels(const Grid<std::uint32_t> &labels) {
    detail::ensure_gdal();
    if (labels.empty()) {
        return {};
    }
    auto counts = label_counts(labels);
    if (counts.empty()) {
        return {};
    }
    auto vec = polygonize_to_layer(labels);
    OGRLayer *layer = vec->GetLayer(0);
    std::map<std::uint32_t, std::unique_ptr<OGRMultiPolygon>> parts;
    layer->ResetReading();
    for (auto &f : *layer) {
        const auto label = static_cast<std::uint32_t>(f->GetFieldAsInteger(0));
        auto &multi = parts[label];
        if (!multi) {
            multi = std::make_unique<OGRMultiPolygon>();
        }
        OGRGeometry *g = f->GetGeometryRef();
        if (g != nullptr && wkbFlatten(g->getGeometryType()) == wkbPolygon) {
            multi->addGeometry(g);
        }
    }

    std::vector<LabelPolygon> out;
    out.reserve(counts.size());
    for (auto &[label, multi] : parts) {
        if (counts.count(label) == 0) {
            throw InternalError(fmt::format("polygonize returned unknown label {}", label));
        }
        auto g = finish(std::move(multi));
        LabelPolygon lp;
        lp.label = label;
        lp.cell_count = counts[label];
        lp.area_m2 = area_of(*g);
        lp.wkb = detail::to_iso_wkb(*g);
        out.push_back(std::move(lp));
    }
    if (out.size() != counts.size()) {
        throw InternalError("polygonize lost a label");
    }
    return out;
}

std::vector<LabelPatch> polygonize_patches(const Grid<std::uint32_t> &labels) {
    detail::ensure_gdal();
    if (labels.empty() || label_counts(labels).empty()) {
        return {};
    }
    auto vec = polygonize_to_layer(labels);
    OGRLayer *layer = vec->GetLayer(0);
    std::vector<LabelPatch> out;
    GdalErrorScope errors;
    layer->ResetReading();
    for (auto &f : *layer) {
        const auto label = static_cast<std::uint32_t>(f->GetFieldAsInteger(0));
        OGRGeometry *g = f->GetGeometryRef();
        if (g == nullptr || wkbFlatten(g->getGeometryType()) != wkbPolygon) {
            continue;
        }
        if (g->IsValid()) {
            out.push_back({label, detail::to_iso_wkb(*g)});
            continue;
        }
        detail::GeometryPtr fixed(g->MakeValid());
        if (!fixed) {
            throw InternalError(errors.describe("cannot make a polygon valid"));
        }
        const auto type = wkbFlatten(fixed->getGeometryType());
        if (type == wkbPolygon) {
            out.push_back({label, detail::to_iso_wkb(*fixed)});
        } else if (type == wkbMultiPolygon || type == wkbGeometryCollection) {
            for (auto *part : *fixed->toGeometryCollection()) {
                if (wkbFlatten(part->getGeometryType()) == wkbPolygon) {
                    out.push_back({label, detail::to_iso_wkb(*part)});
                }
            }
        }
    }
    std::stable_sort(out.begin(), out.end(),
                     [](const LabelPatch &a, const LabelPatch &b) { return a.label < b.label; });
    return out;
}

std::vector<unsigned char>
union_polygons(const std::vector<const std::vector<unsigned char> *> &parts) {
    detail::ensure_gdal();
    auto multi = std::make_unique<OGRMultiPolygon>();
    for (const auto *wkb : parts) {
        auto g = detail::from_wkb(*wkb);
        const auto type = wkbFlatten(g->getGeometryType());
        if (type == wkbPolygon) {
            multi->addGeometry(g.get());
        } else if (type == wkbMultiPolygon) {
            for (const auto *p : *g->toMultiPolygon()) {
                multi->addGeometry(p);
            }
        }
    }
    if (multi->IsEmpty()) {
        return detail::to_iso_wkb(*multi);
    }
    GdalErrorScope errors;
    detail::GeometryPtr u(multi->UnionCascaded());
    if (!u) {
        throw InternalError(errors.describe("cannot form the union of polygons"));
    }
    if (!u->IsValid()) {
        detail::GeometryPtr fixed(u->MakeValid());
        if (!fixed) {
            throw InternalError(errors.describe("cannot make a union of polygons valid"));
        }
        u = std::move(fixed);
    }
    return detail::to_iso_wkb(*u);
}

double polygon_area(const std::vector<unsigned char> &wkb) {
    detail::ensure_gdal();
    return area_of(*detail::from_wkb(wkb));
}

} // namespace catchpeak::io
