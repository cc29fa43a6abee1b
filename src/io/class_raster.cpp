// SPDX-License-Identifier: MIT
#include "catchpeak/io/class_raster.hpp"

#include "catchpeak/core/csv.hpp"
#include "catchpeak/core/error.hpp"
#include "gdal_handles.hpp"

#include <gdal_alg.h>
#include <gdal_rat.h>
#include <gdal_utils.h>

#include <fmt/format.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <limits>
#include <utility>

namespace catchpeak::io {

namespace {

using detail::GdalErrorScope;

constexpr const char *accepted_raster =
    "a single-band raster of integer class codes with its CRS (GeoTIFF or any raster GDAL reads)";

/// Codes beyond this magnitude are not exact in a double (2^53).
constexpr double max_exact_code = 9007199254740992.0;

/// The cells of the window as read: values and validity, row-major, with their transform.
struct Cells {
    std::size_t width = 0;
    std::size_t height = 0;
    GeoTransform transform;
    std::vector<double> values;
    std::vector<std::uint8_t> valid;
};

/// The file's own cells over the window plus the margin (same CRS, north up).
Cells read_window(GDALDataset &ds, const double gt[6], const Extent &w, const std::string &file) {
    const auto cols = static_cast<long long>(ds.GetRasterXSize());
    const auto rows = static_cast<long long>(ds.GetRasterYSize());
    const long long m = class_raster_margin_cells;
    const double dx = gt[1];
    const double dy = -gt[5];
    const long long c0 =
        std::clamp(static_cast<long long>(std::floor((w.min_x - gt[0]) / dx)) - m, 0LL, cols);
    const long long c1 =
        std::clamp(static_cast<long long>(std::ceil((w.max_x - gt[0]) / dx)) + m, 0LL, cols);
    const long long r0 =
        std::clamp(static_cast<long long>(std::floor((gt[3] - w.max_y) / dy)) - m, 0LL, rows);
    const long long r1 =
        std::clamp(static_cast<long long>(std::ceil((gt[3] - w.min_y) / dy)) + m, 0LL, rows);
    Cells out;
    out.transform = GeoTransform{gt[0] + static_cast<double>(c0) * dx, gt[1], 0.0,
                                 gt[3] - static_cast<double>(r0) * dy, 0.0,   gt[5]};
    if (c1 <= c0 || r1 <= r0) {
        return out; // the raster does not reach the window: nothing is covered
    }
    out.width = static_cast<std::size_t>(c1 - c0);
    out.height = static_cast<std::size_t>(r1 - r0);
    out.values.resize(out.width * out.height);
    out.valid.resize(out.width * out.height);
    GDALRasterBand *band = ds.GetRasterBand(1);
    GdalErrorScope errors;
    const int wi = static_cast<int>(out.width);
    const int hi = static_cast<int>(out.height);
    if (band->RasterIO(GF_Read, static_cast<int>(c0), static_cast<int>(r0), wi, hi,
                       out.values.data(), wi, hi, GDT_Float64, 0, 0, nullptr) != CE_None ||
        band->GetMaskBand()->RasterIO(GF_Read, static_cast<int>(c0), static_cast<int>(r0), wi, hi,
                                      out.valid.data(), wi, hi, GDT_Byte, 0, 0,
                                      nullptr) != CE_None) {
        throw_input_error(file, errors.describe("cannot read its cells"), accepted_raster);
    }
    return out;
}

/// The window plus the margin warped to the target CRS by nearest neighbour, at the cell size
/// GDAL suggests for the whole raster.
Cells warp_window(GDALDataset &ds, const std::string &target_wkt, const Extent &w,
                  const std::string &file) {
    GdalErrorScope errors;
    const std::string dst = "DST_SRS=" + target_wkt;
    const char *const to_options[] = {dst.c_str(), nullptr};
    void *transformer = GDALCreateGenImgProjTransformer2(GDALDataset::ToHandle(&ds), nullptr,
                                                         const_cast<char **>(to_options));
    double sgt[6] = {0, 1, 0, 0, 0, -1};
    int px = 0;
    int lines = 0;
    const bool suggested =
        transformer != nullptr &&
        GDALSuggestedWarpOutput(GDALDataset::ToHandle(&ds), GDALGenImgProjTransform, transformer,
                                sgt, &px, &lines) == CE_None;
    if (transformer != nullptr) {
        GDALDestroyGenImgProjTransformer(transformer);
    }
    if (!suggested || !(sgt[1] > 0.0)) {
        throw_input_error(file, errors.describe("cannot be reprojected to the DEM's CRS"),
                          "a raster in a CRS that PROJ can transform to the DEM's CRS");
    }
    const double res = sgt[1];
    const double m = class_raster_margin_cells * res;
    const double min_x = w.min_x - m;
    const double max_y = w.max_y + m;
    const auto width = static_cast<std::size_t>(std::ceil((w.max_x + m - min_x) / res));
    const auto height = static_cast<std::size_t>(std::ceil((max_y - (w.min_y - m)) / res));
    const double max_x = min_x + static_cast<double>(width) * res;
    const double min_y = max_y - static_cast<double>(height) * res;

    // gdalwarp's options: nearest neighbour, exact transformation of every cell (-et 0), an
    // alpha band that marks the cells without a source value (nodata, masked, outside).
    const std::vector<std::string> args = {"-of",
                                           "MEM",
                                           "-t_srs",
                                           target_wkt,
                                           "-r",
                                           "near",
                                           "-et",
                                           "0",
                                           "-ot",
                                           "Float64",
                                           "-dstalpha",
                                           "-tr",
                                           fmt::format("{:.17g}", res),
                                           fmt::format("{:.17g}", res),
                                           "-te",
                                           fmt::format("{:.17g}", min_x),
                                           fmt::format("{:.17g}", min_y),
                                           fmt::format("{:.17g}", max_x),
                                           fmt::format("{:.17g}", max_y)};
    std::vector<char *> argv;
    for (const auto &a : args) {
        argv.push_back(const_cast<char *>(a.c_str()));
    }
    argv.push_back(nullptr);
    std::unique_ptr<GDALWarpAppOptions, decltype(&GDALWarpAppOptionsFree)> options(
        GDALWarpAppOptionsNew(argv.data(), nullptr), &GDALWarpAppOptionsFree);
    if (!options) {
        throw InternalError(errors.describe("cannot set up the warper"));
    }
    GDALDatasetH source = GDALDataset::ToHandle(&ds);
    int usage_error = 0;
    detail::DatasetPtr warped(
        GDALDataset::FromHandle(GDALWarp("", nullptr, 1, &source, options.get(), &usage_error)));
    if (!warped || warped->GetRasterCount() != 2) {
        throw_input_error(file, errors.describe("cannot be reprojected to the DEM's CRS"),
                          "a raster in a CRS that PROJ can transform to the DEM's CRS");
    }
    Cells out;
    out.width = width;
    out.height = height;
    out.transform = GeoTransform{min_x, res, 0.0, max_y, 0.0, -res};
    out.values.resize(width * height);
    out.valid.resize(width * height);
    const int wi = static_cast<int>(width);
    const int hi = static_cast<int>(height);
    if (warped->GetRasterBand(1)->RasterIO(GF_Read, 0, 0, wi, hi, out.values.data(), wi, hi,
                                           GDT_Float64, 0, 0, nullptr) != CE_None ||
        warped->GetRasterBand(2)->RasterIO(GF_Read, 0, 0, wi, hi, out.valid.data(), wi, hi,
                                           GDT_Byte, 0, 0, nullptr) != CE_None) {
        throw InternalError(errors.describe("cannot read a warped raster"));
    }
    return out;
}

/// The names the raster gives the codes found: a column of its attribute table, else its
/// category names.
void read_names(GDALRasterBand &band, const std::string &name_column, ClassRaster &out) {
    if (GDALRasterAttributeTable *rat = band.GetDefaultRAT(); rat != nullptr) {
        int col = -1;
        for (int i = 0; i < rat->GetColumnCount() && col < 0; ++i) {
            if (!name_column.empty() &&
                ascii_lower(rat->GetNameOfCol(i)) == ascii_lower(name_column)) {
                col = i;
            }
        }
        for (int i = 0; i < rat->GetColumnCount() && col < 0; ++i) {
            if (rat->GetUsageOfCol(i) == GFU_Name) {
                col = i;
            }
        }
        if (col >= 0) {
            out.names_from =
                fmt::format("its attribute table, column '{}'", rat->GetNameOfCol(col));
            for (const auto code : out.codes) {
                const int row = rat->GetRowOfValue(static_cast<double>(code));
                if (row >= 0) {
                    std::string name(trim(rat->GetValueAsString(row, col)));
                    if (!name.empty()) {
                        out.names.emplace(code, std::move(name));
                    }
                }
            }
            return;
        }
    }
    char **categories = band.GetCategoryNames();
    const int count = CSLCount(categories);
    bool any = false;
    for (int i = 0; i < count; ++i) {
        any = any || !trim(categories[i]).empty();
    }
    if (!any) {
        return;
    }
    out.names_from = "its category names";
    for (const auto code : out.codes) {
        if (code >= 0 && code < count) {
            std::string name(trim(categories[code]));
            if (!name.empty()) {
                out.names.emplace(code, std::move(name));
            }
        }
    }
}

} // namespace

DataKind data_kind(const std::filesystem::path &path) {
    detail::ensure_gdal();
    const std::string file = path.string();
    const char *accepted = "a polygon layer (GeoPackage, shapefile, ...) or a single-band raster "
                           "of class codes (GeoTIFF, ...) that GDAL reads";
    std::error_code ec;
    if (!std::filesystem::exists(path, ec)) {
        throw_input_error(file, "file not found", accepted);
    }
    GdalErrorScope errors;
    detail::DatasetPtr ds(GDALDataset::Open(
        file.c_str(), GDAL_OF_RASTER | GDAL_OF_VECTOR | GDAL_OF_READONLY | GDAL_OF_VERBOSE_ERROR,
        nullptr, nullptr, nullptr));
    if (!ds) {
        throw_input_error(file, errors.describe("cannot be read as a vector layer or a raster"),
                          accepted);
    }
    if (ds->GetLayerCount() > 0) {
        return DataKind::vector;
    }
    if (ds->GetRasterCount() > 0) {
        return DataKind::raster;
    }
    throw_input_error(file, "holds neither a vector layer nor a raster band", accepted);
}

namespace {

/// The extent of the whole raster in the target CRS (unbounded when the transformation fails:
/// the warp says why, later).
Extent extent_in(GDALDataset &ds, const double gt[6], const OGRSpatialReference &own,
                 const OGRSpatialReference &target) {
    const double w = ds.GetRasterXSize();
    const double h = ds.GetRasterYSize();
    Extent e{std::numeric_limits<double>::infinity(), std::numeric_limits<double>::infinity(),
             -std::numeric_limits<double>::infinity(), -std::numeric_limits<double>::infinity()};
    for (const auto &[c, r] : {std::pair{0.0, 0.0}, {w, 0.0}, {0.0, h}, {w, h}}) {
        const double x = gt[0] + c * gt[1] + r * gt[2];
        const double y = gt[3] + c * gt[4] + r * gt[5];
        e = {std::min(e.min_x, x), std::min(e.min_y, y), std::max(e.max_x, x),
             std::max(e.max_y, y)};
    }
    if (own.IsSame(&target)) {
        return e;
    }
    GdalErrorScope errors;
    detail::TransformPtr t(OGRCreateCoordinateTransformation(&own, &target));
    Extent out;
    if (t && t->TransformBounds(e.min_x, e.min_y, e.max_x, e.max_y, &out.min_x, &out.min_y,
                                &out.max_x, &out.max_y, 21) != 0) {
        return out;
    }
    constexpr double inf = std::numeric_limits<double>::infinity();
    return {-inf, -inf, inf, inf};
}

} // namespace

ClassRaster read_class_raster(const std::filesystem::path &path, const std::string &target_crs_wkt,
                              const Extent &window, const std::string &name_column) {
    auto ds = detail::open_raster(path);
    const std::string file = path.string();
    ClassRaster out;
    out.source = file;
    if (ds->GetRasterCount() != 1) {
        throw_input_error(file,
                          fmt::format("has {} bands; catchpeak does not guess which one holds the "
                                      "class codes",
                                      ds->GetRasterCount()),
                          std::string(accepted_raster) +
                              "; extract the band with 'gdal_translate -b <band> in.tif out.tif'");
    }
    const OGRSpatialReference *srs = ds->GetSpatialRef();
    if (srs == nullptr || srs->IsEmpty()) {
        throw_input_error(file, "the raster has no coordinate reference system (CRS)",
                          std::string(accepted_raster) +
                              "; assign the right one with 'gdal_edit.py -a_srs EPSG:<code> " +
                              file + "'; it is reprojected to the DEM's CRS when it differs");
    }
    double gt[6] = {0, 1, 0, 0, 0, 1};
    if (ds->GetGeoTransform(gt) != CE_None || gt[1] == 0.0 || gt[5] == 0.0) {
        throw_input_error(file, "has no georeferencing (no geotransform)", accepted_raster);
    }
    auto target = detail::spatial_ref_from_wkt(target_crs_wkt);
    if (!target) {
        throw InternalError("read_class_raster: no target CRS");
    }
    detail::SpatialRefPtr own(srs->Clone());
    own->SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
    const bool north_up = gt[2] == 0.0 && gt[4] == 0.0 && gt[1] > 0.0 && gt[5] < 0.0;
    out.reprojected = !(north_up && own->IsSame(target.get()));
    out.file_crs_name = own->GetName() != nullptr ? own->GetName() : "unnamed";
    const char *unit = nullptr;
    if (own->IsGeographic()) {
        own->GetAngularUnits(&unit);
    } else {
        own->GetLinearUnits(&unit);
    }
    out.file_unit = unit != nullptr ? unit : "";
    out.file_cell_x = std::hypot(gt[1], gt[4]);
    out.file_cell_y = std::hypot(gt[2], gt[5]);

    out.extent = extent_in(*ds, gt, *own, *target);

    const Cells cells = out.reprojected ? warp_window(*ds, target_crs_wkt, window, file)
                                        : read_window(*ds, gt, window, file);
    out.cell_x_m = cells.transform.cell_dx();
    out.cell_y_m = cells.transform.cell_dy();

    // Codes: integers; the distinct ones, ascending, get labels 1, 2, ...
    std::map<std::int64_t, std::uint64_t> counts;
    for (std::size_t i = 0; i < cells.values.size(); ++i) {
        const double v = cells.values[i];
        if (cells.valid[i] == 0 || std::isnan(v)) {
            continue;
        }
        if (v != std::floor(v) || std::abs(v) > max_exact_code) {
            const auto [x, y] = cells.transform.cell_centre(i % cells.width, i / cells.width);
            throw_input_error(file,
                              fmt::format("the cell at ({:.3f}, {:.3f}) holds {}, which is not an "
                                          "integer class code",
                                          x, y, v),
                              accepted_raster);
        }
        ++counts[static_cast<std::int64_t>(v)];
    }
    if (counts.size() >= static_cast<std::size_t>(std::numeric_limits<std::int32_t>::max())) {
        throw_input_error(file, fmt::format("holds {} distinct codes", counts.size()),
                          accepted_raster);
    }
    std::map<std::int64_t, std::uint32_t> label_of;
    for (const auto &[code, n] : counts) {
        out.codes.push_back(code);
        out.cell_counts.push_back(n);
        label_of[code] = static_cast<std::uint32_t>(out.codes.size());
    }
    out.labels = Grid<std::uint32_t>(cells.width, cells.height, 0);
    out.labels.transform = cells.transform;
    out.labels.crs_wkt = target_crs_wkt;
    out.labels.nodata = 0;
    for (std::size_t i = 0; i < cells.values.size(); ++i) {
        if (cells.valid[i] != 0 && !std::isnan(cells.values[i])) {
            out.labels[i] = label_of[static_cast<std::int64_t>(cells.values[i])];
        }
    }
    read_names(*ds->GetRasterBand(1), name_column, out);
    return out;
}

} // namespace catchpeak::io
