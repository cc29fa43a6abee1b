// SPDX-License-Identifier: MIT
// Rasters of class codes made with GDAL by the tests, with category names or an attribute table
// when asked (GeoTIFF keeps them in the .aux.xml file beside it).
#pragma once

#include "io/gdal_test_data.hpp"

#include <gdal_rat.h>

#include <filesystem>
#include <optional>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace catchpeak::test {

struct ClassRasterSpec {
    int width = 4;
    int height = 4;
    std::vector<double> gt = {500000.0, 10.0, 0.0, 4000040.0, 0.0, -10.0};
    std::string crs_wkt;          ///< "" = none
    std::vector<double> codes;    ///< row-major; Float64 so that a test can put 1.5 in a cell
    std::optional<double> nodata; ///< the band's nodata value
    std::vector<std::string> categories; ///< category names, entry i names code i
    /// Attribute table rows (code, name) in a column `rat_column`; `rat_name_usage` marks the
    /// column as the table's name column.
    std::vector<std::pair<int, std::string>> rat;
    std::string rat_column = "class";
    bool rat_name_usage = false;
    int bands = 1;
};

/// Writes a GeoTIFF of codes and returns its path.
inline std::filesystem::path make_class_raster(const std::filesystem::path &path,
                                               const ClassRasterSpec &s) {
    gdal_init();
    GDALDriver *drv = GetGDALDriverManager()->GetDriverByName("GTiff");
    GDALDataset *ds =
        drv->Create(path.string().c_str(), s.width, s.height, s.bands, GDT_Float64, nullptr);
    if (ds == nullptr) {
        throw std::runtime_error("cannot create " + path.string());
    }
    double gt[6];
    for (int i = 0; i < 6; ++i) {
        gt[i] = s.gt[static_cast<std::size_t>(i)];
    }
    ds->SetGeoTransform(gt);
    if (!s.crs_wkt.empty()) {
        ds->SetProjection(s.crs_wkt.c_str());
    }
    std::vector<double> v = s.codes;
    if (v.size() != static_cast<std::size_t>(s.width * s.height)) {
        GDALClose(ds);
        throw std::runtime_error("test raster: wrong number of codes");
    }
    for (int b = 1; b <= s.bands; ++b) {
        GDALRasterBand *band = ds->GetRasterBand(b);
        if (s.nodata) {
            band->SetNoDataValue(*s.nodata);
        }
        if (band->RasterIO(GF_Write, 0, 0, s.width, s.height, v.data(), s.width, s.height,
                           GDT_Float64, 0, 0, nullptr) != CE_None) {
            GDALClose(ds);
            throw std::runtime_error("cannot fill test raster");
        }
    }
    GDALRasterBand *band = ds->GetRasterBand(1);
    if (!s.categories.empty()) {
        std::vector<char *> list;
        for (const auto &c : s.categories) {
            list.push_back(const_cast<char *>(c.c_str()));
        }
        list.push_back(nullptr);
        band->SetCategoryNames(list.data());
    }
    if (!s.rat.empty()) {
        GDALDefaultRasterAttributeTable rat;
        rat.CreateColumn("value", GFT_Integer, GFU_MinMax);
        rat.CreateColumn(s.rat_column.c_str(), GFT_String,
                         s.rat_name_usage ? GFU_Name : GFU_Generic);
        rat.SetRowCount(static_cast<int>(s.rat.size()));
        for (std::size_t i = 0; i < s.rat.size(); ++i) {
            rat.SetValue(static_cast<int>(i), 0, s.rat[i].first);
            rat.SetValue(static_cast<int>(i), 1, s.rat[i].second.c_str());
        }
        band->SetDefaultRAT(&rat);
    }
    GDALClose(ds);
    return path;
}

/// Codes of a width x height raster from a function of (col, row).
template <typename F> std::vector<double> codes_of(int width, int height, F &&code) {
    std::vector<double> v;
    for (int row = 0; row < height; ++row) {
        for (int col = 0; col < width; ++col) {
            v.push_back(static_cast<double>(code(col, row)));
        }
    }
    return v;
}

} // namespace catchpeak::test
