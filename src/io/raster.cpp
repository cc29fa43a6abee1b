// SPDX-License-Identifier: MIT
#include "catchpeak/io/raster.hpp"

#include "catchpeak/core/csv.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/files.hpp"
#include "gdal_handles.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <limits>
#include <optional>

namespace catchpeak::io {

namespace {

using detail::GdalErrorScope;

constexpr double international_foot_m = 0.3048;      // exact by definition (1959)
constexpr double us_survey_foot_m = 1200.0 / 3937.0; // exact by definition (1893)

bool same_factor(double a, double b) { return std::abs(a - b) <= 1e-9 * b; }

/// Metres per unit of an elevation unit name as GDAL files state them; nullopt if unknown.
std::optional<std::pair<std::string, double>> vertical_unit_of(const std::string &name) {
    const std::string n = ascii_lower(name);
    if (n == "m" || n == "metre" || n == "meter" || n == "metres" || n == "meters") {
        return std::pair<std::string, double>{"metre", 1.0};
    }
    if (n == "ft" || n == "foot" || n == "feet" || n == "international foot" ||
        n == "foot (international)") {
        return std::pair<std::string, double>{"international foot", international_foot_m};
    }
    if (n == "us survey foot" || n == "ftus" || n == "us_survey_foot" || n == "us-ft" ||
        n == "foot_us" || n == "us survey feet") {
        return std::pair<std::string, double>{"US survey foot", us_survey_foot_m};
    }
    return std::nullopt;
}

constexpr const char *accepted_crs =
    "a projected CRS in metres, international feet or US survey feet";

/// Takes the opened raster; throws unless it has exactly one band.
void check_single_band(GDALDataset &ds, const std::string &file) {
    const int bands = ds.GetRasterCount();
    if (bands == 0) {
        throw_input_error(file, "has no raster band", "a single-band elevation raster");
    }
    if (bands > 1) {
        throw_input_error(file,
                          fmt::format("has {} bands; catchpeak does not guess which one holds the "
                                      "elevations",
                                      bands),
                          "a single-band raster; extract the elevation band with "
                          "'gdal_translate -b <band> in.tif dem.tif'");
    }
}

/// Takes the opened raster; gives its geotransform in the file's units, throwing when there is
/// none, when it is rotated or when a cell size is zero.
GeoTransform geotransform_of(GDALDataset &ds, const std::string &file) {
    double gt[6] = {0, 1, 0, 0, 0, 1};
    if (ds.GetGeoTransform(gt) != CE_None) {
        throw_input_error(file, "has no georeferencing (no geotransform)",
                          "a georeferenced raster");
    }
    GeoTransform transform{gt[0], gt[1], gt[2], gt[3], gt[4], gt[5]};
    if (!transform.is_north_up()) {
        throw_input_error(
            file, fmt::format("has a rotated geotransform (rotation terms {}, {})", gt[2], gt[4]),
            "a north-up raster; resample it with 'gdalwarp in.tif out.tif'");
    }
    if (gt[1] == 0.0 || gt[5] == 0.0) {
        throw_input_error(file, "has a zero cell size", "a georeferenced raster");
    }
    return transform;
}

/// Takes the raster's CRS (possibly none); throws unless it is projected with an accepted
/// linear unit; gives that unit in dem.horizontal_unit and dem.horizontal_unit_m.
void take_horizontal_unit(const OGRSpatialReference *srs, const std::string &file, Dem &dem) {
    if (!detail::has_crs(srs)) {
        throw_input_error(file, "has no coordinate reference system (CRS)",
                          std::string(accepted_crs) +
                              "; assign the right one with 'gdal_edit.py -a_srs EPSG:<code> " +
                              file + "'");
    }
    if (srs->IsGeographic() || srs->IsGeocentric()) {
        const char *name = srs->GetName();
        throw_input_error(
            file,
            fmt::format("has a geographic CRS ({}), whose cells are degrees, not lengths",
                        name != nullptr ? name : "unnamed"),
            std::string(accepted_crs) +
                "; reproject it first, e.g. 'gdalwarp -t_srs EPSG:<utm zone> -r bilinear "
                "in.tif out.tif' (EPSG:326NN for UTM zone NN north, 327NN south)");
    }
    const char *unit_name_c = nullptr;
    const double unit_m = srs->GetLinearUnits(&unit_name_c);
    const std::string unit_name = unit_name_c != nullptr ? unit_name_c : "";
    if (same_factor(unit_m, 1.0)) {
        dem.horizontal_unit = "metre";
        dem.horizontal_unit_m = 1.0;
    } else if (same_factor(unit_m, international_foot_m)) {
        dem.horizontal_unit = "international foot";
        dem.horizontal_unit_m = international_foot_m;
    } else if (same_factor(unit_m, us_survey_foot_m)) {
        dem.horizontal_unit = "US survey foot";
        dem.horizontal_unit_m = us_survey_foot_m;
    } else {
        throw_input_error(file,
                          fmt::format("the CRS's linear unit is '{}' ({} m)", unit_name, unit_m),
                          accepted_crs);
    }
}

/// Takes the checked CRS, the DEM with its horizontal unit and the file's geotransform; gives
/// the CRS as WKT in metres. A CRS in feet is replaced by the same CRS with metre units, the
/// geotransform converted with it and a note added to the DEM.
std::string metric_crs_wkt(const OGRSpatialReference *srs, const std::string &file, Dem &dem,
                           GeoTransform &transform) {
    if (dem.horizontal_unit_m == 1.0) {
        return detail::to_wkt(srs);
    }
    detail::SpatialRefPtr metric(srs->Clone());
    GdalErrorScope errors;
    if (metric->IsCompound()) {
        metric->StripVertical();
    }
    if (metric->SetLinearUnitsAndUpdateParameters(SRS_UL_METER, 1.0) != OGRERR_NONE) {
        throw_input_error(
            file, errors.describe("cannot convert the CRS's " + dem.horizontal_unit + " to metres"),
            accepted_crs);
    }
    const double f = dem.horizontal_unit_m;
    const GeoTransform &t = transform;
    transform = GeoTransform{t.origin_x * f,    t.pixel_width * f, 0.0, t.origin_y * f, 0.0,
                             t.pixel_height * f};
    dem.notes.push_back(fmt::format(
        "{}: coordinates and cell size converted from {} to metres (1 {} = {} m); outputs "
        "use the same CRS with metre units",
        file, dem.horizontal_unit, dem.horizontal_unit, fmt::format("{:.12g}", f)));
    return detail::to_wkt(metric.get());
}

/// Takes the elevation band and the DEM with its horizontal unit; gives the elevations' unit in
/// dem.vertical_unit and dem.vertical_unit_m (the CRS's when the band states none, with a
/// note), throwing on an unknown unit.
void take_vertical_unit(GDALRasterBand &band, const std::string &file, Dem &dem) {
    const std::string band_unit = band.GetUnitType() != nullptr ? band.GetUnitType() : "";
    if (band_unit.empty()) {
        dem.vertical_unit = dem.horizontal_unit;
        dem.vertical_unit_m = dem.horizontal_unit_m;
        dem.notes.push_back(fmt::format("{}: the band states no elevation unit; taken to be the "
                                        "CRS's unit ({})",
                                        file, dem.vertical_unit));
    } else if (auto v = vertical_unit_of(band_unit)) {
        dem.vertical_unit = v->first;
        dem.vertical_unit_m = v->second;
    } else {
        throw_input_error(file, fmt::format("the elevation unit is '{}'", band_unit),
                          "elevations in m, ft or US survey ft (band unit type)");
    }
    if (dem.vertical_unit_m != 1.0) {
        dem.notes.push_back(
            fmt::format("{}: elevations converted from {} to metres", file, dem.vertical_unit));
    }
}

/// How the band's stored values become elevations in metres.
struct BandValues {
    int has_nodata = 0;
    double nodata = 0.0;
    int has_scale = 0;
    double scale = 1.0;
    int has_offset = 0;
    double offset = 0.0;
    double to_m = 1.0; ///< metres per unit of the elevations
};

/// Takes the band and the metres per vertical unit; gives its nodata value, scale and offset.
BandValues band_values_of(GDALRasterBand &band, double to_m) {
    BandValues v;
    v.nodata = band.GetNoDataValue(&v.has_nodata);
    v.scale = band.GetScale(&v.has_scale);
    v.offset = band.GetOffset(&v.has_offset);
    v.to_m = to_m;
    return v;
}

/// Reads the band into a grid of its size in strips of whole blocks (rows of tiles), about
/// 8 MiB of doubles each: few, large reads.
class StripReader {
  public:
    /// Takes the band, its file name (for messages) and its size.
    StripReader(GDALRasterBand &band, const std::string &file, std::size_t width,
                std::size_t height)
        : band_(band), file_(file), width_(width) {
        int block_cols = 0;
        int block_rows = 0;
        band.GetBlockSize(&block_cols, &block_rows);
        const std::size_t block_h = static_cast<std::size_t>(std::max(1, block_rows));
        const std::size_t wanted_rows = std::max<std::size_t>(
            1, (std::size_t{8} << 20) / (std::max<std::size_t>(1, width) * sizeof(double)));
        rows_ = std::min(height, block_h * std::max<std::size_t>(1, wanted_rows / block_h));
    }
    /// Rows in a strip.
    [[nodiscard]] std::size_t rows() const { return rows_; }
    /// Takes the first row and the row count; reads them into `into` as `type`, throwing on a
    /// read error.
    void read(std::size_t r0, std::size_t rows, void *into, GDALDataType type) {
        if (band_.RasterIO(GF_Read, 0, static_cast<int>(r0), static_cast<int>(width_),
                           static_cast<int>(rows), into, static_cast<int>(width_),
                           static_cast<int>(rows), type, 0, 0, nullptr) != CE_None) {
            throw_input_error(
                file_,
                errors_.describe(fmt::format("cannot read rows {} to {}", r0, r0 + rows - 1)),
                "a readable raster");
        }
        // Drop the strip's blocks from GDAL's block cache (up to 5 % of the memory by default):
        // they are in the grid now, and a large DEM would otherwise be held twice.
        band_.FlushCache(false);
    }

  private:
    GDALRasterBand &band_;
    const std::string &file_;
    std::size_t width_;
    std::size_t rows_ = 1;
    GdalErrorScope errors_;
};

/// Takes the band, how its values become metres and the grid of its size; fills the grid with
/// elevations in metres (NaN on nodata) and gives the number of valid cells.
std::size_t read_elevations(GDALRasterBand &band, const std::string &file, const BandValues &b,
                            Grid<float> &grid) {
    const std::size_t width = grid.width();
    const std::size_t height = grid.height();
    StripReader reader(band, file, width, height);
    const std::size_t strip_rows = reader.rows();
    std::size_t valid = 0;
    const bool as_stored = band.GetRasterDataType() == GDT_Float32 &&
                           (b.has_scale == 0 || b.scale == 1.0) &&
                           (b.has_offset == 0 || b.offset == 0.0) && b.to_m == 1.0;
    if (as_stored) {
        // Float32 elevations in metres: read straight into the grid, then mark nodata. Adding
        // 0 turns -0 into +0, as the conversion below does.
        for (std::size_t r0 = 0; r0 < height; r0 += strip_rows) {
            const std::size_t rows = std::min(strip_rows, height - r0);
            float *const cells = grid.cells().data() + r0 * width;
            reader.read(r0, rows, cells, GDT_Float32);
            for (std::size_t k = 0; k < rows * width; ++k) {
                const float v = cells[k];
                if (std::isnan(v) || (b.has_nodata != 0 && static_cast<double>(v) == b.nodata)) {
                    cells[k] = std::numeric_limits<float>::quiet_NaN();
                } else {
                    cells[k] = v + 0.0F;
                    ++valid;
                }
            }
        }
        return valid;
    }
    std::vector<double> strip(strip_rows * width);
    for (std::size_t r0 = 0; r0 < height; r0 += strip_rows) {
        const std::size_t rows = std::min(strip_rows, height - r0);
        reader.read(r0, rows, strip.data(), GDT_Float64);
        float *const cells = grid.cells().data() + r0 * width;
        for (std::size_t k = 0; k < rows * width; ++k) {
            const double v = strip[k];
            if (std::isnan(v) || (b.has_nodata != 0 && v == b.nodata)) {
                cells[k] = std::numeric_limits<float>::quiet_NaN();
                continue;
            }
            const double z =
                (b.has_scale != 0 ? v * b.scale : v) + (b.has_offset != 0 ? b.offset : 0.0);
            cells[k] = static_cast<float>(z * b.to_m);
            ++valid;
        }
    }
    return valid;
}

} // namespace

Dem read_dem(const std::filesystem::path &path) {
    auto ds = detail::open_raster(path);
    const std::string file = path.string();
    Dem dem;
    dem.source = file;
    check_single_band(*ds, file);
    GeoTransform transform = geotransform_of(*ds, file);
    const OGRSpatialReference *srs = ds->GetSpatialRef();
    take_horizontal_unit(srs, file, dem);
    const std::string crs_wkt = metric_crs_wkt(srs, file, dem, transform);
    GDALRasterBand *band = ds->GetRasterBand(1);
    take_vertical_unit(*band, file, dem);
    const BandValues values = band_values_of(*band, dem.vertical_unit_m);

    const auto width = static_cast<std::size_t>(ds->GetRasterXSize());
    const auto height = static_cast<std::size_t>(ds->GetRasterYSize());
    Grid<float> grid(width, height, no_fill); // every cell is written below
    grid.transform = transform;
    grid.crs_wkt = crs_wkt;
    grid.nodata = std::numeric_limits<float>::quiet_NaN();
    const std::size_t valid = read_elevations(*band, file, values, grid);
    if (valid == 0) {
        throw_input_error(file,
                          fmt::format("every cell is nodata ({} x {} cells{})", width, height,
                                      values.has_nodata != 0
                                          ? fmt::format(", nodata value {}", values.nodata)
                                          : std::string()),
                          "a DEM with elevations");
    }
    dem.valid_cells = valid;
    dem.elevation_m = std::move(grid);
    return dem;
}

namespace {

template <typename T> GDALDataType gdal_type();
template <> GDALDataType gdal_type<float>() { return GDT_Float32; }
template <> GDALDataType gdal_type<std::uint8_t>() { return GDT_Byte; }
template <> GDALDataType gdal_type<std::uint32_t>() { return GDT_UInt32; }

template <typename T> void write_tiff(const Grid<T> &grid, const std::filesystem::path &path) {
    detail::ensure_gdal();
    const std::string file = path.string();
    if (grid.empty()) {
        throw InternalError(file + ": cannot write an empty grid");
    }
    GDALDriver *driver = GetGDALDriverManager()->GetDriverByName("GTiff");
    if (driver == nullptr) {
        throw InternalError("GDAL has no GTiff driver");
    }
    PendingFile pending(path);
    GdalErrorScope errors;
    {
        const char *const options[] = {"COMPRESS=DEFLATE", "TILED=YES", nullptr};
        detail::DatasetPtr ds(driver->Create(
            pending.temp_path().string().c_str(), static_cast<int>(grid.width()),
            static_cast<int>(grid.height()), 1, gdal_type<T>(), const_cast<char **>(options)));
        if (!ds) {
            throw_input_error(file, errors.describe("cannot be created"), "a writable folder");
        }
        const auto &t = grid.transform;
        double gt[6] = {t.origin_x, t.pixel_width,  t.row_rotation,
                        t.origin_y, t.col_rotation, t.pixel_height};
        ds->SetGeoTransform(gt);
        if (!grid.crs_wkt.empty()) {
            auto srs = detail::spatial_ref_from_wkt(grid.crs_wkt);
            ds->SetSpatialRef(srs.get());
        }
        GDALRasterBand *band = ds->GetRasterBand(1);
        if (grid.nodata) {
            band->SetNoDataValue(static_cast<double>(*grid.nodata));
        }
        if (band->RasterIO(GF_Write, 0, 0, static_cast<int>(grid.width()),
                           static_cast<int>(grid.height()), const_cast<T *>(grid.cells().data()),
                           static_cast<int>(grid.width()), static_cast<int>(grid.height()),
                           gdal_type<T>(), 0, 0, nullptr) != CE_None) {
            throw_input_error(file, errors.describe("cannot be written"), "a writable folder");
        }
        ds.reset(); // closes the file, flushing it
        if (!errors.first_failure().empty()) {
            throw_input_error(file, errors.describe("cannot be written"), "a writable folder");
        }
    }
    pending.commit();
}

} // namespace

void write_geotiff(const Grid<float> &grid, const std::filesystem::path &path) {
    write_tiff(grid, path);
}
void write_geotiff(const Grid<std::uint8_t> &grid, const std::filesystem::path &path) {
    write_tiff(grid, path);
}
void write_geotiff(const Grid<std::uint32_t> &grid, const std::filesystem::path &path) {
    write_tiff(grid, path);
}

} // namespace catchpeak::io
