// SPDX-License-Identifier: MIT
#include "gdal_handles.hpp"

#include "catchpeak/core/error.hpp"

#include <cpl_error.h>
#include <fmt/format.h>

#include <mutex>

namespace catchpeak::io::detail {

void ensure_gdal() {
    static std::once_flag once;
    std::call_once(once, [] { GDALAllRegister(); });
}

GdalErrorScope::GdalErrorScope() { CPLPushErrorHandlerEx(&GdalErrorScope::handler, this); }

GdalErrorScope::~GdalErrorScope() { CPLPopErrorHandler(); }

void GdalErrorScope::clear() noexcept {
    failure_.clear();
    warnings_.clear();
}

std::string GdalErrorScope::describe(const std::string &what) const {
    return failure_.empty() ? what : what + ": " + failure_;
}

void GdalErrorScope::handler(CPLErr cls, CPLErrorNum /*num*/, const char *msg) {
    auto *self = static_cast<GdalErrorScope *>(CPLGetErrorHandlerUserData());
    if (self == nullptr) {
        return;
    }
    const std::string text = msg != nullptr ? msg : "";
    if (cls == CE_Failure || cls == CE_Fatal) {
        if (self->failure_.empty()) {
            self->failure_ = text;
        }
    } else if (cls == CE_Warning) {
        self->warnings_.push_back(text);
    }
}

namespace {

DatasetPtr open_any(const std::filesystem::path &path, unsigned int kind, const char *what,
                    const char *accepted) {
    ensure_gdal();
    const std::string name = path.string();
    std::error_code ec;
    if (!std::filesystem::exists(path, ec) && name.rfind("/vsi", 0) != 0) {
        throw_input_error(name, "file not found", accepted);
    }
    GdalErrorScope errors;
    auto *ds = GDALDataset::Open(name.c_str(), kind | GDAL_OF_READONLY | GDAL_OF_VERBOSE_ERROR,
                                 nullptr, nullptr, nullptr);
    if (ds == nullptr) {
        throw_input_error(name, errors.describe(fmt::format("cannot be read as {}", what)),
                          accepted);
    }
    return DatasetPtr(ds);
}

} // namespace

DatasetPtr open_raster(const std::filesystem::path &path) {
    return open_any(path, GDAL_OF_RASTER, "a raster",
                    "a single-band raster that GDAL reads (GeoTIFF, VRT, ASCII grid, ...)");
}

DatasetPtr open_vector(const std::filesystem::path &path) {
    return open_any(path, GDAL_OF_VECTOR, "a vector dataset",
                    "a vector file that GDAL reads (GeoPackage, shapefile, GeoJSON, ...)");
}

SpatialRefPtr spatial_ref_from_wkt(const std::string &wkt) {
    if (wkt.empty()) {
        return nullptr;
    }
    ensure_gdal();
    SpatialRefPtr srs(new OGRSpatialReference());
    srs->SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
    GdalErrorScope errors;
    if (srs->SetFromUserInput(wkt.c_str()) != OGRERR_NONE) {
        throw InternalError(errors.describe("cannot interpret a coordinate reference system"));
    }
    return srs;
}

bool has_crs(const OGRSpatialReference *srs) {
    if (srs == nullptr || srs->IsEmpty()) {
        return false;
    }
    const char *name = srs->GetName();
    const std::string_view n = name != nullptr ? name : "";
    return n != "Undefined geographic SRS" && n != "Undefined Cartesian SRS";
}

std::string to_wkt(const OGRSpatialReference *srs) {
    if (srs == nullptr) {
        return {};
    }
    GdalErrorScope errors;
    const char *const options[] = {"FORMAT=WKT2_2018", nullptr};
    char *text = nullptr;
    if (srs->exportToWkt(&text, options) != OGRERR_NONE || text == nullptr) {
        CPLFree(text);
        text = nullptr;
        if (srs->exportToWkt(&text) != OGRERR_NONE || text == nullptr) {
            CPLFree(text);
            throw InternalError(errors.describe("cannot write a coordinate reference system"));
        }
    }
    std::string out(text);
    CPLFree(text);
    return out;
}

std::vector<unsigned char> to_iso_wkb(OGRGeometry &geometry) {
    geometry.flattenTo2D();
    std::vector<unsigned char> wkb(geometry.WkbSize());
    if (geometry.exportToWkb(wkbNDR, wkb.data(), wkbVariantIso) != OGRERR_NONE) {
        throw InternalError("cannot write a geometry as WKB");
    }
    return wkb;
}

GeometryPtr from_wkb(const std::vector<unsigned char> &wkb) {
    OGRGeometry *g = nullptr;
    GdalErrorScope errors;
    if (OGRGeometryFactory::createFromWkb(wkb.data(), nullptr, &g, wkb.size()) != OGRERR_NONE ||
        g == nullptr) {
        throw InternalError(errors.describe("cannot read a WKB geometry"));
    }
    return GeometryPtr(g);
}

std::string source_name(const std::filesystem::path &path, const std::string &layer,
                        bool several_layers) {
    if (!several_layers || layer.empty()) {
        return path.string();
    }
    return fmt::format("{}, layer '{}'", path.string(), layer);
}

} // namespace catchpeak::io::detail
