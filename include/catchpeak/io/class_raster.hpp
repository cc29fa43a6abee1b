// SPDX-License-Identifier: MIT
#pragma once

#include "catchpeak/core/grid.hpp"
#include "catchpeak/io/feature.hpp"

#include <cstdint>
#include <filesystem>
#include <map>
#include <string>
#include <vector>

/// Rasters of class codes (land cover, hydrologic soil groups): which files are rasters, and
/// reading a window of one in the DEM's CRS.
namespace catchpeak::io {

/// How GDAL reads a file.
enum class DataKind {
    vector, ///< a vector dataset with at least one layer
    raster  ///< a raster with at least one band and no vector layer
};

/// Opens the file with GDAL's raster and vector drivers: a file with a vector layer is a
/// vector (a GeoPackage holding both counts as a vector), else a file with a band is a raster.
/// Throws InputError naming the file when it is missing or GDAL reads it as neither.
[[nodiscard]] DataKind data_kind(const std::filesystem::path &path);

/// A window of a raster of integer class codes, on a grid in the target CRS.
struct ClassRaster {
    std::string source; ///< the file, for messages
    /// 0 where there is no class (the band's nodata or mask, outside the raster); label k
    /// (k >= 1) holds the code codes[k - 1]. Transform and CRS: the target CRS, metres.
    Grid<std::uint32_t> labels;
    std::vector<std::int64_t> codes;        ///< the codes found in the window, ascending
    std::vector<std::uint64_t> cell_counts; ///< cells of each code in the window, same order
    /// Names the raster itself gives its codes: a text column of its attribute table, else its
    /// category names. Only codes that have a non-blank name are listed; empty when the raster
    /// names none.
    std::map<std::int64_t, std::string> names;
    std::string names_from;    ///< "its attribute table, column 'X'", "its category names" or ""
    double file_cell_x = 0.0;  ///< cell width in the file, in `file_unit`
    double file_cell_y = 0.0;  ///< cell height in the file, in `file_unit`
    std::string file_unit;     ///< linear or angular unit of the file's CRS ("metre", "degree")
    double cell_x_m = 0.0;     ///< cell width of `labels`, metres (target CRS)
    double cell_y_m = 0.0;     ///< cell height of `labels`, metres (target CRS)
    bool reprojected = false;  ///< warped from another CRS (nearest neighbour)
    std::string file_crs_name; ///< name of the file's CRS
    Extent extent;             ///< the whole raster's extent in the target CRS
};

/// Cells of margin read around the window on every side (of the grid read), so that the
/// polygons of cells on the window's edge reach past it.
inline constexpr int class_raster_margin_cells = 2;

/// Reads the cells of a single-band raster of class codes that cover `window` (in the target
/// CRS), plus class_raster_margin_cells on every side.
///
/// - Same CRS as the target and north up: the file's own cells are read, unchanged.
/// - Another CRS (or a rotated grid): the window is warped to the target CRS with GDAL's warper,
///   nearest neighbour (codes are never averaged), at the cell size GDAL suggests for the
///   whole raster (about the file's own cell size).
/// - Cells with the band's nodata value, masked cells and cells outside the raster get label
///   0 (not covered).
/// - `name_column`: a column of that name (case-insensitive) in the raster attribute table
///   holds the codes' names; else the table's name column (usage "Name"); else the band's
///   category names (code i is named by entry i).
///
/// Throws InputError naming the file for: a raster without CRS (a raster is never guessed to
/// be in the DEM's CRS), more than one band, a cell value that is not an integer, a code
/// beyond +-2^53, a window that holds more than 2^31 - 1 distinct codes.
[[nodiscard]] ClassRaster read_class_raster(const std::filesystem::path &path,
                                            const std::string &target_crs_wkt, const Extent &window,
                                            const std::string &name_column);

} // namespace catchpeak::io
