// SPDX-License-Identifier: MIT
// Private to io: move-only owners of GDAL/OGR handles and the GDAL error boundary.
// Nothing here appears in a public header; other modules see plain values only.
//
// Thread-safety: GDAL drivers are registered once (std::call_once). GDAL keeps its error
// handler stack per thread, so a GdalErrorScope collects only the errors of its own thread.
// A dataset, layer or transformation owned here must not be shared between threads.
#pragma once

#include <gdal_priv.h>
#include <ogr_feature.h>
#include <ogr_geometry.h>
#include <ogr_spatialref.h>
#include <ogrsf_frmts.h>

#include <filesystem>
#include <memory>
#include <string>
#include <vector>

namespace catchpeak::io::detail {

/// Registers GDAL's drivers, once per process, whatever the number of threads calling.
void ensure_gdal();

/// Owns a dataset; closes it on destruction. Move-only (std::unique_ptr).
using DatasetPtr = GDALDatasetUniquePtr;
/// Owns a feature.
using FeaturePtr = OGRFeatureUniquePtr;
/// Owns a geometry.
using GeometryPtr = OGRGeometryUniquePtr;

struct TransformDeleter {
    void operator()(OGRCoordinateTransformation *t) const noexcept {
        OGRCoordinateTransformation::DestroyCT(t);
    }
};
/// Owns a coordinate transformation.
using TransformPtr = std::unique_ptr<OGRCoordinateTransformation, TransformDeleter>;

struct SpatialRefDeleter {
    void operator()(OGRSpatialReference *s) const noexcept {
        if (s != nullptr) {
            s->Release();
        }
    }
};
/// Owns a spatial reference (GDAL reference-counts them; Release drops our reference).
using SpatialRefPtr = std::unique_ptr<OGRSpatialReference, SpatialRefDeleter>;

/// While alive, GDAL errors and warnings of this thread are collected here instead of being
/// printed. Not copyable or movable (it is a position on GDAL's per-thread handler stack).
class GdalErrorScope {
  public:
    GdalErrorScope();
    ~GdalErrorScope();
    GdalErrorScope(const GdalErrorScope &) = delete;
    GdalErrorScope &operator=(const GdalErrorScope &) = delete;
    GdalErrorScope(GdalErrorScope &&) = delete;
    GdalErrorScope &operator=(GdalErrorScope &&) = delete;

    /// The first failure message since construction or the last clear(), or "" if none.
    [[nodiscard]] const std::string &first_failure() const noexcept { return failure_; }
    /// Warnings collected so far.
    [[nodiscard]] const std::vector<std::string> &warnings() const noexcept { return warnings_; }
    void clear() noexcept;

    /// "<what>: <GDAL's message>" or just "<what>" when GDAL said nothing.
    [[nodiscard]] std::string describe(const std::string &what) const;

  private:
    static void handler(CPLErr cls, CPLErrorNum num, const char *msg);
    std::string failure_;
    std::vector<std::string> warnings_;
};

/// Opens a raster dataset read-only. Throws InputError naming the file when GDAL cannot read
/// it as a raster.
[[nodiscard]] DatasetPtr open_raster(const std::filesystem::path &path);
/// Opens a vector dataset read-only. Throws InputError naming the file when GDAL cannot read
/// it as a vector dataset.
[[nodiscard]] DatasetPtr open_vector(const std::filesystem::path &path);

/// A spatial reference from WKT (or any string SetFromUserInput accepts); null when `wkt` is
/// empty. Traditional GIS axis order (x = easting/longitude). Throws InternalError when the
/// text is not understood (our own WKT always is).
[[nodiscard]] SpatialRefPtr spatial_ref_from_wkt(const std::string &wkt);
/// False for a missing or empty spatial reference and for the placeholders a GeoPackage carries
/// when its layer was written without a CRS ("Undefined geographic SRS", srs_id 0, and
/// "Undefined Cartesian SRS", srs_id -1, of the OGC GeoPackage standard, table
/// gpkg_spatial_ref_sys): none of them says where the coordinates lie.
[[nodiscard]] bool has_crs(const OGRSpatialReference *srs);
/// WKT (WKT2_2018 where possible) of a spatial reference; "" for null.
[[nodiscard]] std::string to_wkt(const OGRSpatialReference *srs);

/// ISO WKB (little-endian, 2D) of a geometry.
[[nodiscard]] std::vector<unsigned char> to_iso_wkb(OGRGeometry &geometry);
/// A geometry from WKB. Throws InternalError when the bytes are not WKB.
[[nodiscard]] GeometryPtr from_wkb(const std::vector<unsigned char> &wkb);

/// "file" or "file, layer 'name'" for messages.
[[nodiscard]] std::string source_name(const std::filesystem::path &path, const std::string &layer,
                                      bool several_layers);

} // namespace catchpeak::io::detail
