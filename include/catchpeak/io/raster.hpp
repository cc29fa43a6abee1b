// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/grid.hpp"

#include <cstdint>
#include <filesystem>
#include <string>
#include <vector>

namespace catchpeak::io {

/// A DEM read into memory, in metres.
struct Dem {
    /// Elevations in metres. Nodata cells are NaN (and `nodata` is NaN). The transform and the
    /// CRS are in metres: a CRS in feet is replaced by the same CRS with metre units (false
    /// easting/northing converted), and the cell size and origin are converted with it.
    Grid<float> elevation_m;
    std::string source;             ///< the file, for messages
    std::string horizontal_unit;    ///< linear unit of the file's CRS, e.g. "metre"
    double horizontal_unit_m = 1.0; ///< metres per horizontal unit of the file
    std::string vertical_unit;      ///< unit of the file's elevations
    double vertical_unit_m = 1.0;   ///< metres per vertical unit of the file
    std::size_t valid_cells = 0;    ///< cells with data
    std::vector<std::string> notes; ///< what was assumed or converted, for the report
};

/// Reads a DEM: any single-band raster GDAL reads (GeoTIFF, VRT mosaic, ASCII grid, ...).
///
/// Accepted: a projected CRS whose linear unit is the metre, the international foot or the US
/// survey foot; elevations in the band's unit when the file states one (m, ft, US survey ft),
/// otherwise in the CRS's linear unit (a note says so). Feet are converted to metres, both the
/// elevations and the cell size/coordinates. Nodata (the band's nodata value, or NaN) is kept.
///
/// Refused with InputError naming the file: unreadable or not a raster; more than one band
/// (extract one with `gdal_translate -b N`); no CRS (assign one with
/// `gdal_edit.py -a_srs EPSG:<code>`); a geographic CRS (reproject with
/// `gdalwarp -t_srs EPSG:<utm zone> in.tif out.tif`); another linear or vertical unit; a
/// rotated geotransform; no cell with data.
[[nodiscard]] Dem read_dem(const std::filesystem::path &path);

/// Writes a grid as a single-band GeoTIFF (deflate-compressed) with its transform, CRS and
/// nodata. Written under a temporary name in the same folder and renamed when complete.
/// Throws InputError naming the file when it cannot be written.
void write_geotiff(const Grid<float> &grid, const std::filesystem::path &path);
void write_geotiff(const Grid<std::uint8_t> &grid, const std::filesystem::path &path);
void write_geotiff(const Grid<std::uint32_t> &grid, const std::filesystem::path &path);

} // namespace catchpeak::io
