// SPDX-License-Identifier: MIT
#include "catchpeak/io/vector.hpp"

#include "catchpeak/core/csv.hpp"
#include "catchpeak/core/error.hpp"
#include "gdal_handles.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <map>
#include <set>

namespace catchpeak::io {

namespace {

using detail::GdalErrorScope;

/// A layer opened for reading, with the transformation to the target CRS (if any).
struct OpenLayer {
    detail::DatasetPtr ds;
    OGRLayer *layer = nullptr;
    std::string source;
    std::string crs_wkt;
    detail::TransformPtr to_target;
    std::vector<std::string> notes;
};

OpenLayer open_layer(const std::filesystem::path &path, const std::string &target_crs_wkt,
                     const std::string &layer_name) {
    OpenLayer out;
    out.ds = detail::open_vector(path);
    const std::string file = path.string();
    const int count = out.ds->GetLayerCount();
    if (count == 0) {
        throw_input_error(file, "holds no vector layer", "a file with one vector layer");
    }
    if (!layer_name.empty()) {
        out.layer = out.ds->GetLayerByName(layer_name.c_str());
    } else if (count == 1) {
        out.layer = out.ds->GetLayer(0);
    }
    if (out.layer == nullptr) {
        std::string names;
        for (int i = 0; i < count; ++i) {
            names += fmt::format("{}'{}'", i == 0 ? "" : ", ", out.ds->GetLayer(i)->GetName());
        }
        throw_input_error(file,
                          layer_name.empty()
                              ? fmt::format("holds {} layers ({}); catchpeak does not guess which "
                                            "one to use",
                                            count, names)
                              : fmt::format("has no layer '{}' (layers: {})", layer_name, names),
                          "a file with one layer");
    }
    out.source = detail::source_name(path, out.layer->GetName(), count > 1);

    const OGRSpatialReference *layer_srs =
        detail::has_crs(out.layer->GetSpatialRef()) ? out.layer->GetSpatialRef() : nullptr;
    auto target = detail::spatial_ref_from_wkt(target_crs_wkt);
    if (!target) {
        out.crs_wkt = detail::to_wkt(layer_srs);
        return out;
    }
    out.crs_wkt = target_crs_wkt;
    if (layer_srs == nullptr) {
        out.notes.push_back(fmt::format("{}: the layer has no coordinate reference system; its "
                                        "coordinates are taken to be in the DEM's CRS ({})",
                                        out.source,
                                        target->GetName() != nullptr ? target->GetName() : "?"));
        return out;
    }
    detail::SpatialRefPtr source_srs(layer_srs->Clone());
    source_srs->SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
    if (source_srs->IsSame(target.get())) {
        return out;
    }
    GdalErrorScope errors;
    out.to_target.reset(OGRCreateCoordinateTransformation(source_srs.get(), target.get()));
    if (!out.to_target) {
        throw_input_error(out.source,
                          errors.describe(fmt::format(
                              "cannot be reprojected from {} to the DEM's CRS",
                              source_srs->GetName() != nullptr ? source_srs->GetName() : "?")),
                          "a layer in a CRS that PROJ can transform to the DEM's CRS");
    }
    out.notes.push_back(
        fmt::format("{}: reprojected from {} to {}", out.source,
                    source_srs->GetName() != nullptr ? source_srs->GetName() : "its CRS",
                    target->GetName() != nullptr ? target->GetName() : "the DEM's CRS"));
    return out;
}

/// The feature's geometry in the target CRS (null when the feature has none).
detail::GeometryPtr geometry_of(const OpenLayer &l, OGRFeature &f) {
    OGRGeometry *g = f.StealGeometry();
    detail::GeometryPtr geom(g);
    if (geom && l.to_target) {
        GdalErrorScope errors;
        if (geom->transform(l.to_target.get()) != OGRERR_NONE) {
            throw_input_error(fmt::format("{}: feature {}", l.source, f.GetFID()),
                              errors.describe("cannot be reprojected to the DEM's CRS"),
                              "coordinates inside the area of use of both CRSs");
        }
    }
    return geom;
}

/// "LineString", "MultiPolygon", ... (OGC names, without GDAL's spaces).
std::string type_name(OGRwkbGeometryType type) {
    std::string name = OGRGeometryTypeToName(type);
    std::erase(name, ' ');
    return name;
}

std::string field_list(OGRLayer &layer) {
    OGRFeatureDefn *defn = layer.GetLayerDefn();
    std::string names;
    for (int i = 0; i < defn->GetFieldCount(); ++i) {
        names += fmt::format("{}'{}'", i == 0 ? "" : ", ", defn->GetFieldDefn(i)->GetNameRef());
    }
    return names.empty() ? "none" : names;
}

int require_field(const OpenLayer &l, const std::string &field, const char *purpose) {
    const int index = l.layer->GetLayerDefn()->GetFieldIndex(field.c_str());
    if (index < 0) {
        throw_input_error(l.source, fmt::format("has no field '{}'", field),
                          fmt::format("a field holding the {}; fields present: {}", purpose,
                                      field_list(*l.layer)));
    }
    return index;
}

std::string text_of(OGRFeature &f, int index) {
    if (!f.IsFieldSetAndNotNull(index)) {
        return {};
    }
    return std::string(trim(f.GetFieldAsString(index)));
}

std::string feature_where(const std::string &source, std::int64_t fid) {
    return fmt::format("{}: feature {}", source, fid);
}

} // namespace

VectorLayer read_vector_layer(const std::filesystem::path &path, const std::string &target_crs_wkt,
                              const std::string &layer_name, std::vector<std::string> *notes) {
    auto l = open_layer(path, target_crs_wkt, layer_name);
    VectorLayer out;
    out.source = l.source;
    out.crs_wkt = l.crs_wkt;
    OGRFeatureDefn *defn = l.layer->GetLayerDefn();
    l.layer->ResetReading();
    for (auto &f : *l.layer) {
        VectorFeature vf;
        vf.fid = f->GetFID();
        if (auto g = geometry_of(l, *f)) {
            vf.wkb = detail::to_iso_wkb(*g);
        }
        for (int i = 0; i < defn->GetFieldCount(); ++i) {
            if (f->IsFieldSetAndNotNull(i)) {
                vf.attributes.emplace(defn->GetFieldDefn(i)->GetNameRef(), f->GetFieldAsString(i));
            }
        }
        out.features.push_back(std::move(vf));
    }
    if (notes != nullptr) {
        notes->insert(notes->end(), l.notes.begin(), l.notes.end());
    }
    return out;
}

DesignPointLayer read_design_points(const std::filesystem::path &path, const std::string &id_field,
                                    const std::string &target_crs_wkt) {
    auto l = open_layer(path, target_crs_wkt, {});
    const int id_index = require_field(l, id_field, "design point ids");
    DesignPointLayer out;
    out.source = l.source;
    out.crs_wkt = l.crs_wkt;
    out.notes = l.notes;
    std::map<std::string, std::int64_t> seen;
    l.layer->ResetReading();
    for (auto &f : *l.layer) {
        const std::int64_t fid = f->GetFID();
        const std::string where = feature_where(l.source, fid);
        const std::string id = text_of(*f, id_index);
        if (id.empty()) {
            throw_input_error(where, fmt::format("field '{}' is empty", id_field),
                              "a unique, non-empty id for every design point");
        }
        if (auto it = seen.find(id); it != seen.end()) {
            throw_input_error(where,
                              fmt::format("design point id '{}' (field '{}') is also used by "
                                          "feature {}",
                                          id, id_field, it->second),
                              "a unique id for every design point");
        }
        seen.emplace(id, fid);
        auto g = geometry_of(l, *f);
        const std::string dp_where = fmt::format("{} (design point '{}')", where, id);
        if (!g || g->IsEmpty()) {
            throw_input_error(dp_where, "has no geometry", "a point");
        }
        const OGRPoint *p = nullptr;
        const auto type = wkbFlatten(g->getGeometryType());
        if (type == wkbPoint) {
            p = g->toPoint();
        } else if (type == wkbMultiPoint && g->toMultiPoint()->getNumGeometries() == 1) {
            p = g->toMultiPoint()->getGeometryRef(0);
        } else {
            throw_input_error(dp_where, fmt::format("has a {} geometry", type_name(type)),
                              "Point geometries (or a MultiPoint of one point)");
        }
        out.points.push_back(DesignPoint{id, p->getX(), p->getY(), fid});
    }
    if (out.points.empty()) {
        throw_input_error(l.source, "holds no design point (the layer is empty)",
                          "at least one point feature");
    }
    return out;
}

LineLayer read_lines(const std::filesystem::path &path, const std::string &target_crs_wkt) {
    auto l = open_layer(path, target_crs_wkt, {});
    LineLayer out;
    out.source = l.source;
    out.crs_wkt = l.crs_wkt;
    out.notes = l.notes;
    l.layer->ResetReading();
    for (auto &f : *l.layer) {
        const std::int64_t fid = f->GetFID();
        auto g = geometry_of(l, *f);
        if (!g || g->IsEmpty()) {
            out.notes.push_back(
                fmt::format("{}: has no geometry and is ignored", feature_where(l.source, fid)));
            continue;
        }
        const auto add = [&](const OGRLineString &ls) {
            Polyline pl;
            pl.fid = fid;
            for (const auto &pt : ls) {
                pl.vertices.emplace_back(pt.getX(), pt.getY());
            }
            out.lines.push_back(std::move(pl));
        };
        const auto type = wkbFlatten(g->getGeometryType());
        if (type == wkbLineString) {
            add(*g->toLineString());
        } else if (type == wkbMultiLineString) {
            for (const auto *part : *g->toMultiLineString()) {
                add(*part);
            }
        } else {
            throw_input_error(feature_where(l.source, fid),
                              fmt::format("has a {} geometry", type_name(type)),
                              "LineString or MultiLineString geometries");
        }
    }
    return out;
}

namespace {

/// Keeps the polygonal part of a geometry (MakeValid may return a collection with lines and
/// points where a ring collapsed). Null when nothing polygonal is left.
detail::GeometryPtr polygonal_part(detail::GeometryPtr g) {
    const auto type = wkbFlatten(g->getGeometryType());
    if (type == wkbPolygon || type == wkbMultiPolygon) {
        return g;
    }
    if (type != wkbGeometryCollection) {
        return nullptr;
    }
    auto multi = std::make_unique<OGRMultiPolygon>();
    for (const auto *part : *g->toGeometryCollection()) {
        const auto pt = wkbFlatten(part->getGeometryType());
        if (pt == wkbPolygon) {
            multi->addGeometry(part);
        } else if (pt == wkbMultiPolygon) {
            for (const auto *poly : *part->toMultiPolygon()) {
                multi->addGeometry(poly);
            }
        }
    }
    if (multi->IsEmpty()) {
        return nullptr;
    }
    return detail::GeometryPtr(multi.release());
}

} // namespace

PolygonLayer read_polygons(const std::filesystem::path &path, const std::string &class_field,
                           const std::string &target_crs_wkt) {
    auto l = open_layer(path, target_crs_wkt, {});
    const int class_index = require_field(l, class_field, "class");
    PolygonLayer out;
    out.source = l.source;
    out.crs_wkt = l.crs_wkt;
    out.notes = l.notes;
    l.layer->ResetReading();
    for (auto &f : *l.layer) {
        const std::int64_t fid = f->GetFID();
        const std::string where = feature_where(l.source, fid);
        const std::string cls = text_of(*f, class_index);
        if (cls.empty()) {
            throw_input_error(where, fmt::format("field '{}' is empty", class_field),
                              "a class for every polygon");
        }
        auto g = geometry_of(l, *f);
        if (!g || g->IsEmpty()) {
            throw_input_error(where, "has no geometry", "Polygon or MultiPolygon geometries");
        }
        const auto type = wkbFlatten(g->getGeometryType());
        if (type != wkbPolygon && type != wkbMultiPolygon) {
            throw_input_error(where, fmt::format("has a {} geometry", type_name(type)),
                              "Polygon or MultiPolygon geometries");
        }
        g->flattenTo2D();
        GdalErrorScope errors;
        if (!g->IsValid()) {
            errors.clear();
            detail::GeometryPtr fixed(g->MakeValid());
            if (fixed) {
                fixed = polygonal_part(std::move(fixed));
            }
            if (!fixed) {
                throw_input_error(where,
                                  errors.describe("has an invalid geometry that could not be "
                                                  "repaired"),
                                  "valid (OGC) polygons");
            }
            out.notes.push_back(fmt::format("{}: invalid polygon (class '{}') repaired with "
                                            "MakeValid",
                                            where, cls));
            g = std::move(fixed);
        }
        out.polygons.push_back(ClassPolygon{fid, cls, detail::to_iso_wkb(*g)});
    }
    if (out.polygons.empty()) {
        throw_input_error(l.source, "holds no polygon (the layer is empty)",
                          "at least one polygon feature");
    }
    return out;
}

} // namespace catchpeak::io
