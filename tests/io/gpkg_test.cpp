// SPDX-License-Identifier: MIT
#include "catchpeak/io/gpkg.hpp"

#include "catchpeak/core/error.hpp"
#include "gdal_test_data.hpp"
#include "support/test_env.hpp"

#include <gtest/gtest.h>

namespace io = catchpeak::io;
namespace t = catchpeak::test;
namespace fs = std::filesystem;

namespace {

std::vector<unsigned char> wkb_of(const char *wkt) {
    OGRGeometry *g = nullptr;
    OGRGeometryFactory::createFromWkt(wkt, nullptr, &g);
    std::vector<unsigned char> out(g->WkbSize());
    g->exportToWkb(wkbNDR, out.data(), wkbVariantIso);
    OGRGeometryFactory::destroyGeometry(g);
    return out;
}

std::vector<io::OutLayer> two_layers() {
    const std::string crs = t::crs_wkt("EPSG:32633");
    io::OutLayer points{"design_points",
                        io::GeometryType::point,
                        crs,
                        {{"id", io::FieldType::text},
                         {"cells", io::FieldType::integer},
                         {"snap_distance_m", io::FieldType::real}},
                        {}};
    points.features.push_back({wkb_of("POINT (500010 4000020)"),
                               {std::string("DP-1"), std::int64_t{9000000000}, 12.125}});
    points.features.push_back({wkb_of("POINT (500030 4000040)"),
                               {std::string("DP-2"), std::monostate{}, std::monostate{}}});
    io::OutLayer areas{"catchments",
                       io::GeometryType::multi_polygon,
                       crs,
                       {{"id", io::FieldType::text}, {"area_m2", io::FieldType::real}},
                       {}};
    areas.features.push_back(
        {wkb_of("POLYGON ((0 0, 10 0, 10 10, 0 10, 0 0))"), {std::string("DP-1"), 100.0}});
    return {points, areas};
}

} // namespace

TEST(WriteGpkg, LayersFieldsValuesAndCrsReadBack) {
    const auto dir = t::scratch_dir("gpkg_ok");
    const auto p = dir / "out.gpkg";
    io::write_gpkg(p, two_layers());
    EXPECT_TRUE(t::pending_files(dir).empty());

    t::gdal_init();
    GDALDatasetUniquePtr ds(GDALDataset::Open(p.string().c_str(), GDAL_OF_VECTOR));
    ASSERT_TRUE(ds);
    ASSERT_EQ(ds->GetLayerCount(), 2);
    OGRLayer *pts = ds->GetLayerByName("design_points");
    ASSERT_NE(pts, nullptr);
    EXPECT_EQ(wkbFlatten(pts->GetGeomType()), wkbPoint);
    OGRSpatialReference utm;
    utm.importFromEPSG(32633);
    ASSERT_NE(pts->GetSpatialRef(), nullptr);
    EXPECT_TRUE(pts->GetSpatialRef()->IsSame(&utm));
    auto *defn = pts->GetLayerDefn();
    EXPECT_EQ(defn->GetFieldDefn(defn->GetFieldIndex("cells"))->GetType(), OFTInteger64);
    EXPECT_EQ(defn->GetFieldDefn(defn->GetFieldIndex("snap_distance_m"))->GetType(), OFTReal);
    EXPECT_EQ(pts->GetFeatureCount(), 2);
    OGRFeatureUniquePtr f(pts->GetNextFeature());
    EXPECT_STREQ(f->GetFieldAsString("id"), "DP-1");
    EXPECT_EQ(f->GetFieldAsInteger64("cells"), 9000000000);
    EXPECT_DOUBLE_EQ(f->GetFieldAsDouble("snap_distance_m"), 12.125);
    EXPECT_DOUBLE_EQ(f->GetGeometryRef()->toPoint()->getX(), 500010.0);
    OGRFeatureUniquePtr f2(pts->GetNextFeature());
    EXPECT_TRUE(f2->IsFieldNull(defn->GetFieldIndex("cells")));

    OGRLayer *areas = ds->GetLayerByName("catchments");
    ASSERT_NE(areas, nullptr);
    EXPECT_EQ(wkbFlatten(areas->GetGeomType()), wkbMultiPolygon);
    OGRFeatureUniquePtr a(areas->GetNextFeature());
    ASSERT_EQ(wkbFlatten(a->GetGeometryRef()->getGeometryType()), wkbMultiPolygon);
    EXPECT_DOUBLE_EQ(a->GetGeometryRef()->toMultiPolygon()->get_Area(), 100.0);
}

TEST(WriteGpkg, ReplacesAnOlderFile) {
    const auto dir = t::scratch_dir("gpkg_replace");
    const auto p = dir / "out.gpkg";
    auto layers = two_layers();
    io::write_gpkg(p, layers);
    layers.pop_back();
    io::write_gpkg(p, layers);
    GDALDatasetUniquePtr ds(GDALDataset::Open(p.string().c_str(), GDAL_OF_VECTOR));
    ASSERT_TRUE(ds);
    EXPECT_EQ(ds->GetLayerCount(), 1);
}

TEST(WriteGpkg, FailureLeavesNothingBehind) {
    const auto dir = t::scratch_dir("gpkg_fail");
    auto layers = two_layers();
    layers[1].features[0].values.pop_back(); // one value short: a bug, caught
    EXPECT_THROW(io::write_gpkg(dir / "out.gpkg", layers), catchpeak::InternalError);
    EXPECT_FALSE(fs::exists(dir / "out.gpkg"));
    EXPECT_TRUE(t::pending_files(dir).empty());
    EXPECT_THROW(io::write_gpkg(dir / "missing_folder" / "out.gpkg", two_layers()),
                 catchpeak::InputError);
}
