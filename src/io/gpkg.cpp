// SPDX-License-Identifier: MIT
#include "catchpeak/io/gpkg.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/core/files.hpp"
#include "gdal_handles.hpp"

#include <fmt/format.h>

namespace catchpeak::io {

namespace {

using detail::GdalErrorScope;

OGRwkbGeometryType ogr_type(GeometryType t) {
    switch (t) {
    case GeometryType::point:
        return wkbPoint;
    case GeometryType::line_string:
        return wkbLineString;
    case GeometryType::multi_line_string:
        return wkbMultiLineString;
    case GeometryType::polygon:
        return wkbPolygon;
    case GeometryType::multi_polygon:
        return wkbMultiPolygon;
    case GeometryType::any:
        return wkbUnknown;
    }
    return wkbUnknown;
}

OGRFieldType ogr_field(FieldType t) {
    switch (t) {
    case FieldType::text:
        return OFTString;
    case FieldType::integer:
        return OFTInteger64;
    case FieldType::real:
        return OFTReal;
    }
    return OFTString;
}

detail::GeometryPtr to_layer_type(detail::GeometryPtr g, GeometryType t) {
    const auto type = wkbFlatten(g->getGeometryType());
    if (t == GeometryType::multi_polygon && type == wkbPolygon) {
        return detail::GeometryPtr(OGRGeometryFactory::forceToMultiPolygon(g.release()));
    }
    if (t == GeometryType::multi_line_string && type == wkbLineString) {
        return detail::GeometryPtr(OGRGeometryFactory::forceToMultiLineString(g.release()));
    }
    return g;
}

void write_layer(GDALDataset &ds, const OutLayer &spec, const std::string &file) {
    GdalErrorScope errors;
    auto srs = detail::spatial_ref_from_wkt(spec.crs_wkt);
    const char *const options[] = {"SPATIAL_INDEX=YES", nullptr};
    OGRLayer *layer = ds.CreateLayer(spec.name.c_str(), srs.get(), ogr_type(spec.geometry),
                                     const_cast<char **>(options));
    if (layer == nullptr) {
        throw_input_error(file, errors.describe(fmt::format("cannot create layer '{}'", spec.name)),
                          "a writable folder");
    }
    for (const auto &f : spec.fields) {
        OGRFieldDefn defn(f.name.c_str(), ogr_field(f.type));
        if (layer->CreateField(&defn) != OGRERR_NONE) {
            throw_input_error(file,
                              errors.describe(fmt::format("cannot create field '{}' of layer '{}'",
                                                          f.name, spec.name)),
                              "a writable folder");
        }
    }
    if (layer->StartTransaction() != OGRERR_NONE) {
        throw_input_error(file, errors.describe("cannot start a transaction"), "a writable folder");
    }
    for (std::size_t n = 0; n < spec.features.size(); ++n) {
        const auto &in = spec.features[n];
        if (in.values.size() != spec.fields.size()) {
            throw InternalError(fmt::format("{}: layer '{}' feature {}: {} values for {} fields",
                                            file, spec.name, n, in.values.size(),
                                            spec.fields.size()));
        }
        OGRFeature feature(layer->GetLayerDefn());
        for (std::size_t i = 0; i < in.values.size(); ++i) {
            const int idx = static_cast<int>(i);
            const auto &v = in.values[i];
            const FieldType type = spec.fields[i].type;
            if (std::holds_alternative<std::monostate>(v)) {
                feature.SetFieldNull(idx);
            } else if (const auto *s = std::get_if<std::string>(&v); s && type == FieldType::text) {
                feature.SetField(idx, s->c_str());
            } else if (const auto *k = std::get_if<std::int64_t>(&v);
                       k && type == FieldType::integer) {
                feature.SetField(idx, static_cast<GIntBig>(*k));
            } else if (const auto *d = std::get_if<double>(&v); d && type == FieldType::real) {
                feature.SetField(idx, *d);
            } else {
                throw InternalError(fmt::format("{}: layer '{}' field '{}': value of wrong type",
                                                file, spec.name, spec.fields[i].name));
            }
        }
        if (!in.wkb.empty()) {
            auto g = to_layer_type(detail::from_wkb(in.wkb), spec.geometry);
            feature.SetGeometryDirectly(g.release());
        }
        if (layer->CreateFeature(&feature) != OGRERR_NONE) {
            throw_input_error(
                file,
                errors.describe(fmt::format("cannot write feature {} of layer '{}'", n, spec.name)),
                "a writable folder");
        }
    }
    if (layer->CommitTransaction() != OGRERR_NONE) {
        throw_input_error(file, errors.describe("cannot commit layer '" + spec.name + "'"),
                          "a writable folder");
    }
}

} // namespace

void write_gpkg(const std::filesystem::path &path, const std::vector<OutLayer> &layers) {
    detail::ensure_gdal();
    const std::string file = path.string();
    GDALDriver *driver = GetGDALDriverManager()->GetDriverByName("GPKG");
    if (driver == nullptr) {
        throw InternalError("GDAL has no GPKG driver");
    }
    PendingFile pending(path);
    {
        GdalErrorScope errors;
        detail::DatasetPtr ds(
            driver->Create(pending.temp_path().string().c_str(), 0, 0, 0, GDT_Unknown, nullptr));
        if (!ds) {
            throw_input_error(file, errors.describe("cannot be created"), "a writable folder");
        }
        for (const auto &layer : layers) {
            write_layer(*ds, layer, file);
        }
        ds.reset(); // closes and flushes the file
        if (!errors.first_failure().empty()) {
            throw_input_error(file, errors.describe("cannot be written"), "a writable folder");
        }
    }
    pending.commit();
}

} // namespace catchpeak::io
