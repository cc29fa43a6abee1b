// SPDX-License-Identifier: MIT
#include "catchpeak/io/vector.hpp"

#include "catchpeak/core/csv.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/files.hpp"
#include "catchpeak/core/units.hpp"
#include "gdal_handles.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <map>
#include <optional>
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
    std::optional<Reprojection> reprojection;
};

/// The layer `layer_name` of the file (its only layer when the name is empty); throws naming
/// the layers when there is none of that name or several and no name.
OGRLayer *pick_layer(GDALDataset &ds, const std::string &file, const std::string &layer_name) {
    const int count = ds.GetLayerCount();
    if (count == 0) {
        throw_input_error(file, "holds no vector layer", "a file with one vector layer");
    }
    OGRLayer *layer = nullptr;
    if (!layer_name.empty()) {
        layer = ds.GetLayerByName(layer_name.c_str());
    } else if (count == 1) {
        layer = ds.GetLayer(0);
    }
    if (layer == nullptr) {
        std::string names;
        for (int i = 0; i < count; ++i) {
            names += fmt::format("{}'{}'", i == 0 ? "" : ", ", ds.GetLayer(i)->GetName());
        }
        throw_input_error(file,
                          layer_name.empty()
                              ? fmt::format("holds {} layers ({}); catchpeak does not guess which "
                                            "one to use",
                                            count, names)
                              : fmt::format("has no layer '{}' (layers: {})", layer_name, names),
                          "a file with one layer");
    }
    return layer;
}

std::string name_of(const OGRSpatialReference &srs) {
    return srs.GetName() != nullptr ? srs.GetName() : "unnamed CRS";
}

/// Whether GDAL's CRS of the layer is the WGS 84 it gives a GeoJSON file without a "crs" member
/// (RFC 7946: GeoJSON is WGS 84 longitude/latitude), rather than one the file declares.
bool crs_implied_by_geojson(GDALDataset &ds, const std::filesystem::path &path) {
    const std::string driver = ds.GetDriver() != nullptr ? ds.GetDriver()->GetDescription() : "";
    if (driver.rfind("GeoJSON", 0) != 0) {
        return false;
    }
    return read_text_file(path).find("\"crs\"") == std::string::npos;
}

/// How the user declares the CRS of a layer's coordinates, for messages.
std::string how_to_declare(const DeclaredCrs &declared) {
    const std::string file_way = "a \"crs\" member in the GeoJSON file naming the CRS of its "
                                 "coordinates (e.g. \"urn:ogc:def:crs:EPSG::32617\"), or the "
                                 "layer saved as a GeoPackage with its CRS";
    return declared.key.empty() ? file_way
                                : fmt::format("the CRS of the coordinates declared with {} (e.g. "
                                              "\"EPSG:32617\"); or {}",
                                              declared.key, file_way);
}

/// The CRS the user declared; throws at `declared.where` when GDAL does not know it.
detail::SpatialRefPtr declared_crs(const DeclaredCrs &declared) {
    detail::SpatialRefPtr srs(new OGRSpatialReference());
    srs->SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
    GdalErrorScope errors;
    if (srs->SetFromUserInput(declared.text.c_str()) != OGRERR_NONE) {
        throw_input_error(declared.where,
                          errors.describe(fmt::format("'{}' is not a coordinate reference system "
                                                      "GDAL knows",
                                                      declared.text)),
                          "a CRS as \"EPSG:<code>\" (e.g. \"EPSG:32617\"), WKT or a PROJ string");
    }
    return srs;
}

/// The CRS of the layer's coordinates: the one the user declared (refused when the file
/// declares another), else the layer's own; null when neither says.
detail::SpatialRefPtr coordinates_crs(OpenLayer &l, const std::filesystem::path &path,
                                      const DeclaredCrs &declared) {
    const OGRSpatialReference *own =
        detail::has_crs(l.layer->GetSpatialRef()) ? l.layer->GetSpatialRef() : nullptr;
    detail::SpatialRefPtr file_srs;
    if (own != nullptr) {
        file_srs.reset(own->Clone());
        file_srs->SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
    }
    if (declared.text.empty()) {
        return file_srs;
    }
    auto srs = declared_crs(declared);
    if (file_srs && !file_srs->IsSame(srs.get()) && !crs_implied_by_geojson(*l.ds, path)) {
        throw_input_error(
            declared.where,
            fmt::format("declares the coordinates of '{}' to be in {}, but the file "
                        "declares {}",
                        l.source, name_of(*srs), name_of(*file_srs)),
            fmt::format("one of the two: remove {} when the file's CRS is right", declared.key));
    }
    return srs;
}

/// Throws when the layer's CRS is geographic but its coordinates are not longitude and latitude
/// (a GeoJSON file in a projected CRS without a "crs" member), saying how to declare its CRS.
void require_longitude_latitude(OpenLayer &l, const std::filesystem::path &path,
                                const OGRSpatialReference &srs, const DeclaredCrs &declared) {
    OGREnvelope env;
    if (!srs.IsGeographic() || l.layer->GetExtent(&env, TRUE) != OGRERR_NONE) {
        return;
    }
    // Longitudes may run from -180 to 360 (some files count 0 to 360 degrees east).
    if (env.MinX >= -180.0 && env.MaxX <= 360.0 && env.MinY >= -90.0 && env.MaxY <= 90.0) {
        return;
    }
    const std::string coords =
        fmt::format("x {} to {}, y {} to {}", env.MinX, env.MaxX, env.MinY, env.MaxY);
    const bool geojson = declared.text.empty() && crs_implied_by_geojson(*l.ds, path);
    throw_input_error(
        l.source,
        geojson ? fmt::format("a GeoJSON file without a \"crs\" member is in WGS 84 longitude "
                              "and latitude (RFC 7946), but its coordinates ({}) are not "
                              "longitudes and latitudes",
                              coords)
                : fmt::format("its CRS ({}) is geographic, but its coordinates ({}) are not "
                              "longitudes and latitudes",
                              name_of(srs), coords),
        how_to_declare(declared));
}

OpenLayer open_layer(const std::filesystem::path &path, const std::string &target_crs_wkt,
                     const std::string &layer_name, const DeclaredCrs &declared = {}) {
    OpenLayer out;
    out.ds = detail::open_vector(path);
    out.layer = pick_layer(*out.ds, path.string(), layer_name);
    out.source = detail::source_name(path, out.layer->GetName(), out.ds->GetLayerCount() > 1);

    const detail::SpatialRefPtr source_srs = coordinates_crs(out, path, declared);
    if (source_srs) {
        require_longitude_latitude(out, path, *source_srs, declared);
    }
    auto target = detail::spatial_ref_from_wkt(target_crs_wkt);
    if (!target) {
        out.crs_wkt = detail::to_wkt(source_srs.get());
        return out;
    }
    out.crs_wkt = target_crs_wkt;
    if (!source_srs) {
        out.notes.push_back(fmt::format("{}: the layer has no coordinate reference system; its "
                                        "coordinates are taken to be in the DEM's CRS ({})",
                                        out.source, name_of(*target)));
        return out;
    }
    if (source_srs->IsSame(target.get())) {
        return out;
    }
    GdalErrorScope errors;
    out.to_target.reset(OGRCreateCoordinateTransformation(source_srs.get(), target.get()));
    if (!out.to_target) {
        throw_input_error(out.source,
                          errors.describe(fmt::format("cannot be reprojected from {} to the "
                                                      "DEM's CRS",
                                                      name_of(*source_srs))),
                          "a layer in a CRS that PROJ can transform to the DEM's CRS");
    }
    out.reprojection = Reprojection{name_of(*source_srs), name_of(*target),
                                    declared.text.empty() ? std::string() : declared.key};
    out.notes.push_back(fmt::format("{}: reprojected from {} to {}", out.source,
                                    name_of(*source_srs), name_of(*target)));
    return out;
}

/// Widens `extent` to hold `g`.
void grow(std::optional<Extent> &extent, const OGRGeometry &g) {
    if (g.IsEmpty()) {
        return;
    }
    OGREnvelope env;
    g.getEnvelope(&env);
    if (!extent) {
        extent = Extent{env.MinX, env.MinY, env.MaxX, env.MaxY};
        return;
    }
    extent->min_x = std::min(extent->min_x, env.MinX);
    extent->min_y = std::min(extent->min_y, env.MinY);
    extent->max_x = std::max(extent->max_x, env.MaxX);
    extent->max_y = std::max(extent->max_y, env.MaxY);
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

std::string crs_name(const std::string &wkt) {
    const auto srs = detail::spatial_ref_from_wkt(wkt);
    return srs ? name_of(*srs) : std::string();
}

VectorLayer read_vector_layer(const std::filesystem::path &path, const std::string &target_crs_wkt,
                              const std::string &layer_name, std::vector<std::string> *notes,
                              const DeclaredCrs &declared, LayerFacts *facts) {
    auto l = open_layer(path, target_crs_wkt, layer_name, declared);
    VectorLayer out;
    out.source = l.source;
    out.crs_wkt = l.crs_wkt;
    LayerFacts found;
    found.reprojection = l.reprojection;
    OGRFeatureDefn *defn = l.layer->GetLayerDefn();
    l.layer->ResetReading();
    for (auto &f : *l.layer) {
        VectorFeature vf;
        vf.fid = f->GetFID();
        if (auto g = geometry_of(l, *f)) {
            grow(found.extent, *g);
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
    if (facts != nullptr) {
        *facts = std::move(found);
    }
    return out;
}

namespace {

/// The field of expected catchment areas of a design point layer, its index (-1: none) and
/// m2 per its unit; throws when the layer has both.
struct ExpectedAreaField {
    std::string name;
    int index = -1;
    double m2_per_unit = 1.0;
};

ExpectedAreaField expected_area_field(const OpenLayer &l) {
    ExpectedAreaField out;
    for (const auto &[name, m2] :
         {std::pair<std::string, double>{"expected_area_ha", units::m2_per_ha},
          {"expected_area_ac", units::m2_per_acre}}) {
        const int index = l.layer->GetLayerDefn()->GetFieldIndex(name.c_str());
        if (index < 0) {
            continue;
        }
        if (out.index >= 0) {
            throw_input_error(l.source, "has both fields 'expected_area_ha' and 'expected_area_ac'",
                              "one field of expected catchment areas, in ha or in ac");
        }
        out = {name, index, m2};
    }
    return out;
}

/// The expected area of one feature, m2; none when the field is empty.
std::optional<double> expected_area_of(OGRFeature &f, const ExpectedAreaField &field,
                                       const std::string &where) {
    if (field.index < 0) {
        return std::nullopt;
    }
    const std::string text = text_of(f, field.index);
    if (text.empty()) {
        return std::nullopt;
    }
    double v = std::nan("");
    try {
        v = parse_number(text, field.name);
    } catch (const InputError &) {
    }
    if (!(std::isfinite(v) && v > 0.0)) {
        throw_input_error(where, fmt::format("field '{}' holds '{}'", field.name, text),
                          "an area > 0 (or nothing, for no expected area)");
    }
    return v * field.m2_per_unit;
}

} // namespace

DesignPointLayer read_design_points(const std::filesystem::path &path, const std::string &id_field,
                                    const std::string &target_crs_wkt,
                                    const DeclaredCrs &declared) {
    auto l = open_layer(path, target_crs_wkt, {}, declared);
    const int id_index = require_field(l, id_field, "design point ids");
    DesignPointLayer out;
    out.source = l.source;
    out.crs_wkt = l.crs_wkt;
    out.notes = l.notes;
    out.reprojection = l.reprojection;
    const ExpectedAreaField expected = expected_area_field(l);
    out.expected_area_field = expected.name;
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
        grow(out.extent, *p);
        out.points.push_back(
            DesignPoint{id, p->getX(), p->getY(), fid, expected_area_of(*f, expected, dp_where)});
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
    out.reprojection = l.reprojection;
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
        grow(out.extent, *g);
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
    out.reprojection = l.reprojection;
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
        grow(out.extent, *g);
        out.polygons.push_back(ClassPolygon{fid, cls, detail::to_iso_wkb(*g)});
    }
    if (out.polygons.empty()) {
        throw_input_error(l.source, "holds no polygon (the layer is empty)",
                          "at least one polygon feature");
    }
    return out;
}

} // namespace catchpeak::io
