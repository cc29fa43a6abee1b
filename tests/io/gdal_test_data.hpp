// SPDX-License-Identifier: MIT
// Small rasters and vector files made with GDAL by the tests themselves, in their scratch
// folders. Nothing here reads a file of unknown origin.
#pragma once

#include <gdal_priv.h>
#include <ogr_spatialref.h>
#include <ogrsf_frmts.h>

#include <filesystem>
#include <stdexcept>
#include <string>
#include <vector>

namespace catchpeak::test {

inline void gdal_init() { GDALAllRegister(); }

/// WKT of a CRS given as "EPSG:nnnn" (or anything SetFromUserInput reads).
inline std::string crs_wkt(const std::string &user_input) {
    gdal_init();
    OGRSpatialReference srs;
    if (srs.SetFromUserInput(user_input.c_str()) != OGRERR_NONE) {
        throw std::runtime_error("bad CRS " + user_input);
    }
    char *text = nullptr;
    srs.exportToWkt(&text);
    std::string out(text);
    CPLFree(text);
    return out;
}

/// WGS 84 / UTM zone 33N with its linear unit changed to `unit_name` (`metres_per_unit`).
inline std::string utm_in_unit(const char *unit_name, double metres_per_unit) {
    gdal_init();
    OGRSpatialReference srs;
    srs.SetProjCS("test UTM 33N in another unit");
    srs.SetWellKnownGeogCS("WGS84");
    srs.SetUTM(33, TRUE);
    srs.SetLinearUnitsAndUpdateParameters(unit_name, metres_per_unit);
    char *text = nullptr;
    srs.exportToWkt(&text);
    std::string out(text);
    CPLFree(text);
    return out;
}

struct RasterSpec {
    int width = 4;
    int height = 3;
    int bands = 1;
    std::vector<double> gt = {500000.0, 10.0, 0.0, 4000000.0, 0.0, -10.0};
    std::string crs_wkt;       // "" = none
    std::vector<float> values; // row-major, band 1 (others copy it); empty = all 100
    bool has_nodata = false;
    double nodata = -9999.0;
    std::string unit; // band unit type ("" = none)
    std::string driver = "GTiff";
};

/// Writes a raster with GDAL and returns its path.
inline std::filesystem::path make_raster(const std::filesystem::path &path, const RasterSpec &s) {
    gdal_init();
    GDALDriver *mem = GetGDALDriverManager()->GetDriverByName("MEM");
    GDALDataset *ds = mem->Create("", s.width, s.height, s.bands, GDT_Float32, nullptr);
    double gt[6];
    for (int i = 0; i < 6; ++i) {
        gt[i] = s.gt[static_cast<std::size_t>(i)];
    }
    ds->SetGeoTransform(gt);
    if (!s.crs_wkt.empty()) {
        ds->SetProjection(s.crs_wkt.c_str());
    }
    std::vector<float> v = s.values;
    if (v.empty()) {
        v.assign(static_cast<std::size_t>(s.width * s.height), 100.0f);
    }
    for (int b = 1; b <= s.bands; ++b) {
        GDALRasterBand *band = ds->GetRasterBand(b);
        if (s.has_nodata) {
            band->SetNoDataValue(s.nodata);
        }
        if (!s.unit.empty()) {
            band->SetUnitType(s.unit.c_str());
        }
        if (band->RasterIO(GF_Write, 0, 0, s.width, s.height, v.data(), s.width, s.height,
                           GDT_Float32, 0, 0, nullptr) != CE_None) {
            throw std::runtime_error("cannot fill test raster");
        }
    }
    GDALDriver *drv = GetGDALDriverManager()->GetDriverByName(s.driver.c_str());
    GDALDataset *out = drv->CreateCopy(path.string().c_str(), ds, FALSE, nullptr, nullptr, nullptr);
    if (out == nullptr) {
        GDALClose(ds);
        throw std::runtime_error("cannot write test raster " + path.string());
    }
    GDALClose(out);
    GDALClose(ds);
    return path;
}

/// A point feature for make_points.
struct PointSpec {
    double x = 0.0;
    double y = 0.0;
    std::string id; // "" = null field
};

/// Writes a layer of points with a string field "id" (GeoPackage unless `driver` says
/// otherwise). `geometry_wkt` entries, if given, replace the point geometries (to test
/// non-point geometries).
inline std::filesystem::path make_points(const std::filesystem::path &path,
                                         const std::vector<PointSpec> &points,
                                         const std::string &crs, const std::string &field = "id",
                                         const std::string &driver = "GPKG",
                                         const std::vector<std::string> &geometry_wkt = {}) {
    gdal_init();
    GDALDriver *drv = GetGDALDriverManager()->GetDriverByName(driver.c_str());
    GDALDataset *ds = drv->Create(path.string().c_str(), 0, 0, 0, GDT_Unknown, nullptr);
    if (ds == nullptr) {
        throw std::runtime_error("cannot create " + path.string());
    }
    OGRSpatialReference *srs = nullptr;
    if (!crs.empty()) {
        srs = new OGRSpatialReference();
        srs->SetFromUserInput(crs.c_str());
    }
    OGRLayer *layer =
        ds->CreateLayer("points", srs, geometry_wkt.empty() ? wkbPoint : wkbUnknown, nullptr);
    if (srs != nullptr) {
        srs->Release();
    }
    OGRFieldDefn fd(field.c_str(), OFTString);
    layer->CreateField(&fd);
    OGRFieldDefn nd("name", OFTString);
    layer->CreateField(&nd);
    for (std::size_t i = 0; i < points.size(); ++i) {
        OGRFeature f(layer->GetLayerDefn());
        if (!points[i].id.empty()) {
            f.SetField(field.c_str(), points[i].id.c_str());
        }
        f.SetField("name", "a point");
        if (i < geometry_wkt.size()) {
            OGRGeometry *g = nullptr;
            OGRGeometryFactory::createFromWkt(geometry_wkt[i].c_str(), nullptr, &g);
            f.SetGeometryDirectly(g);
        } else {
            OGRPoint p(points[i].x, points[i].y);
            f.SetGeometry(&p);
        }
        if (layer->CreateFeature(&f) != OGRERR_NONE) {
            throw std::runtime_error("cannot write a test feature");
        }
    }
    GDALClose(ds);
    return path;
}

/// A row of make_layer: geometry as WKT ("" = none) and text values of the fields in order
/// ("" = null).
struct RowSpec {
    std::string wkt;
    std::vector<std::string> values;
};

/// Writes a layer with text fields `fields` and the given rows. Returns the path.
inline std::filesystem::path make_layer(const std::filesystem::path &path,
                                        const std::string &layer_name,
                                        const std::vector<std::string> &fields,
                                        const std::vector<RowSpec> &rows, const std::string &crs,
                                        const std::string &driver = "GPKG",
                                        GDALDataset *existing = nullptr) {
    gdal_init();
    GDALDataset *ds = existing;
    if (ds == nullptr) {
        GDALDriver *drv = GetGDALDriverManager()->GetDriverByName(driver.c_str());
        ds = drv->Create(path.string().c_str(), 0, 0, 0, GDT_Unknown, nullptr);
    }
    if (ds == nullptr) {
        throw std::runtime_error("cannot create " + path.string());
    }
    OGRSpatialReference *srs = nullptr;
    if (!crs.empty()) {
        srs = new OGRSpatialReference();
        srs->SetFromUserInput(crs.c_str());
    }
    OGRLayer *layer = ds->CreateLayer(layer_name.c_str(), srs, wkbUnknown, nullptr);
    if (srs != nullptr) {
        srs->Release();
    }
    for (const auto &name : fields) {
        OGRFieldDefn fd(name.c_str(), OFTString);
        layer->CreateField(&fd);
    }
    for (const auto &row : rows) {
        OGRFeature f(layer->GetLayerDefn());
        for (std::size_t i = 0; i < row.values.size(); ++i) {
            if (!row.values[i].empty()) {
                f.SetField(static_cast<int>(i), row.values[i].c_str());
            }
        }
        if (!row.wkt.empty()) {
            OGRGeometry *g = nullptr;
            OGRGeometryFactory::createFromWkt(row.wkt.c_str(), nullptr, &g);
            f.SetGeometryDirectly(g);
        }
        if (layer->CreateFeature(&f) != OGRERR_NONE) {
            throw std::runtime_error("cannot write a test feature");
        }
    }
    if (existing == nullptr) {
        GDALClose(ds);
    }
    return path;
}

} // namespace catchpeak::test
