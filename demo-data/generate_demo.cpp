// SPDX-License-Identifier: MIT
// Writes the invented demo scenario of catchpeak: the Wrenfield Hollow valley, where Sorrel
// Creek crosses under Hatchmere Road through a culvert, with the new Larkspur Rise subdivision
// (Kestrel Way, Thistle Lane) upstream and the Millbrook Commons commercial lot. Every place
// and street name is invented; the terrain is a formula, not a survey.
//
// Usage: catchpeak_demo_data OUTPUT_FOLDER
// Deterministic: the same program writes the same data (the GeoPackage timestamps are fixed).
#include <cpl_conv.h>
#include <gdal.h>
#include <gdal_alg.h>
#include <ogr_api.h>
#include <ogr_srs_api.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <memory>
#include <stdexcept>
#include <string>
#include <vector>

namespace fs = std::filesystem;

namespace {

// The DEM: 2000 x 1500 cells of 1 m, in local coordinates x east 0..2000 m, y north 0..1500 m,
// placed at an invented offset in a UTM zone.
constexpr int width = 2000;
constexpr int height = 1500;
constexpr double cell_m = 1.0;
constexpr double x0 = 412000.0;
constexpr double y0 = 3650000.0;
constexpr int epsg = 32615;
constexpr double pi = 3.14159265358979323846;

// Sorrel Creek: meanders about y = 600 m and falls eastward.
double creek_y(double x) { return 600.0 + 40.0 * std::sin(2.0 * pi * x / 900.0); }

// Hatchmere Road: north-south along x = 1500 m on an embankment over the creek.
constexpr double road_x = 1500.0;
constexpr double road_half_top_m = 4.0;

bool in_subdivision(double x, double y) { return x > 300 && x < 900 && y > 700 && y < 1200; }
bool in_commercial(double x, double y) { return x > 1000 && x < 1300 && y > 250 && y < 450; }
bool on_kestrel_way(double x, double y) { return std::abs(x - 600.0) < 5.0 && y > 585 && y < 1200; }
bool on_thistle_lane(double x, double y) {
    return std::abs(y - 1000.0) < 5.0 && x > 300 && x < 900;
}

/// Natural ground: down-valley slope 1.2 %, side slopes 4.5 % (north) and 3.5 % (south), gentle
/// undulation, and the creek channel.
double natural_ground(double x, double y) {
    const double d = y - creek_y(x);
    const double side = d > 0 ? 0.045 * d : -0.035 * d;
    const double undulation = 1.5 * std::sin(x / 170.0) * std::cos(y / 230.0);
    const double channel = -1.2 * std::exp(-(d / 4.0) * (d / 4.0));
    // The valley is closed inside the DEM: near the west, north and south edges the ground
    // falls towards the edge, so the divides (the valley head some 150 m inside the west edge,
    // the ridges some 100 m inside the north and south edges) close the catchment of the
    // culvert inside the DEM.
    // The drop falls off exponentially inwards, so that it is steep at the edge itself (a
    // drop flat at the edge would let the valley's own fall carry water in from the edge).
    auto edge_drop = [](double dist_m) { return 20.0 * std::exp(-dist_m / 40.0); };
    const double rim = -edge_drop(x) - edge_drop(y) - edge_drop(static_cast<double>(height) - y);
    return 130.0 - 0.012 * x + side + undulation + channel + rim;
}

double ground(double x, double y) {
    double z = natural_ground(x, y);
    if (in_subdivision(x, y)) {
        // Graded lots: the undulation is smoothed out, the valley's eastward fall is taken out,
        // and the lots fall 3 % across towards Kestrel Way (x = 600 m), so that the street
        // gutters collect them. The outer 60 m of the subdivision are fill slopes falling
        // outwards to natural ground.
        z -= 1.5 * std::sin(x / 170.0) * std::cos(y / 230.0) * 0.8;
        // Measured from the centre of the gutter cell column, so that the gutter is one cell wide
        // (a two-cell flat bottom would carry the two sides in parallel, never joined).
        const double across = std::abs(x - 600.5);
        const double taper = std::clamp((300.0 - across) / 60.0, 0.0, 1.0);
        z += (0.012 * (x - 600.5) + 0.03 * across) * taper;
        if (on_kestrel_way(x, y) || on_thistle_lane(x, y)) {
            z -= 0.15; // street below the lots: curb and gutter
        }
        if (y > 1195.0) {
            z += 1.0; // back-lot berm: the hillside above is led around the subdivision
        }
        if (y < 705.0 && !on_kestrel_way(x, y)) {
            z += 1.0; // berm along the lower edge: the lots drain to Kestrel Way, not downhill
        }
    } else if (on_kestrel_way(x, y)) {
        z -= 0.15; // the street and its outfall channel down to the creek bank
    }
    if (in_commercial(x, y)) {
        // A pad falling 1 % north towards the creek, cut into the slope.
        z = natural_ground(1150.0, 450.0) + 0.01 * (450.0 - y);
    }
    // The road embankment: 8 m top, 2:1 side slopes, top at least 4.5 m above the creek bed.
    const double top =
        std::max(natural_ground(road_x, y) + 0.3, natural_ground(road_x, creek_y(road_x)) + 4.5);
    const double emb = top - 0.5 * std::max(0.0, std::abs(x - road_x) - road_half_top_m);
    return std::max(z, emb);
}

const std::vector<std::string> land_classes = {
    "pasture_good",       "woods_good",          "meadow",
    "residential_1_4_ac", "street_paved_curbed", "commercial"};

int land_class(double x, double y) {
    // Streets take the 10 m cells they touch (land cover is mapped on a 10 m grid).
    const bool street = (std::abs(x - 600.0) < 6.0 && y > 640 && y < 1200) ||
                        (std::abs(y - 1000.0) < 6.0 && x > 300 && x < 900);
    if (std::abs(x - road_x) < 10.0 || street) {
        return 4;
    }
    if (in_commercial(x, y)) {
        return 5;
    }
    if (in_subdivision(x, y)) {
        return 3;
    }
    if (std::abs(y - creek_y(x)) < 25.0) {
        return 2;
    }
    if (y > 1250.0 || x < 250.0) {
        return 1;
    }
    return 0;
}

const std::vector<std::string> soil_groups = {"A", "B", "C", "D"};

int soil_group(double x, double y) {
    if (std::abs(y - creek_y(x)) < 150.0) {
        return 1; // B: alluvium along the creek
    }
    if (y > 1300.0 && x < 700.0) {
        return 1; // B: loamy hilltop (CN 30 of group A woods and meadow is refused by the SCS
                  // runoff check)
    }
    if (y < 400.0 && x > 1400.0) {
        return 3; // D: clay
    }
    return 2; // C
}

void check(bool ok, const std::string &what) {
    if (!ok) {
        throw std::runtime_error(what + ": " + CPLGetLastErrorMsg());
    }
}

struct DatasetCloser {
    void operator()(void *ds) const { GDALClose(static_cast<GDALDatasetH>(ds)); }
};
using Dataset = std::unique_ptr<void, DatasetCloser>;

struct SrsDeleter {
    void operator()(void *s) const {
        OSRDestroySpatialReference(static_cast<OGRSpatialReferenceH>(s));
    }
};
using Srs = std::unique_ptr<void, SrsDeleter>;

Srs make_srs() {
    Srs srs(OSRNewSpatialReference(nullptr));
    check(OSRImportFromEPSG(static_cast<OGRSpatialReferenceH>(srs.get()), epsg) == OGRERR_NONE,
          "EPSG code");
    OSRSetAxisMappingStrategy(static_cast<OGRSpatialReferenceH>(srs.get()),
                              OAMS_TRADITIONAL_GIS_ORDER);
    return srs;
}

void write_dem(const fs::path &file) {
    GDALDriverH drv = GDALGetDriverByName("GTiff");
    check(drv != nullptr, "GTiff driver");
    const char *options[] = {"COMPRESS=DEFLATE", "PREDICTOR=3", "TILED=YES", nullptr};
    Dataset ds(GDALCreate(drv, file.string().c_str(), width, height, 1, GDT_Float32,
                          const_cast<char **>(options)));
    check(ds != nullptr, "creating " + file.string());
    double gt[6] = {x0, cell_m, 0.0, y0 + height * cell_m, 0.0, -cell_m};
    GDALSetGeoTransform(ds.get(), gt);
    Srs srs = make_srs();
    GDALSetSpatialRef(ds.get(), static_cast<OGRSpatialReferenceH>(srs.get()));
    GDALRasterBandH band = GDALGetRasterBand(ds.get(), 1);
    GDALSetRasterNoDataValue(band, -9999.0);
    std::vector<float> row(width);
    for (int r = 0; r < height; ++r) {
        const double y = (height - r - 0.5) * cell_m;
        for (int c = 0; c < width; ++c) {
            row[static_cast<std::size_t>(c)] = static_cast<float>(ground((c + 0.5) * cell_m, y));
        }
        check(GDALRasterIO(band, GF_Write, 0, r, width, 1, row.data(), width, 1, GDT_Float32, 0,
                           0) == CE_None,
              "writing the DEM");
    }
}

/// Polygons of a class map (cells of `cell` m) as a GeoPackage layer with a text field.
void write_zones(const fs::path &file, const std::string &layer, const std::string &field,
                 double cell, const std::vector<std::string> &names,
                 int (*classify)(double, double)) {
    const int w = static_cast<int>(width * cell_m / cell);
    const int h = static_cast<int>(height * cell_m / cell);
    Dataset mem(GDALCreate(GDALGetDriverByName("MEM"), "", w, h, 1, GDT_Int32, nullptr));
    check(mem != nullptr, "in-memory raster");
    double gt[6] = {x0, cell, 0.0, y0 + height * cell_m, 0.0, -cell};
    GDALSetGeoTransform(mem.get(), gt);
    std::vector<std::int32_t> codes(static_cast<std::size_t>(w) * static_cast<std::size_t>(h));
    for (int r = 0; r < h; ++r) {
        for (int c = 0; c < w; ++c) {
            codes[static_cast<std::size_t>(r) * static_cast<std::size_t>(w) +
                  static_cast<std::size_t>(c)] = classify((c + 0.5) * cell, (h - r - 0.5) * cell);
        }
    }
    GDALRasterBandH band = GDALGetRasterBand(mem.get(), 1);
    check(GDALRasterIO(band, GF_Write, 0, 0, w, h, codes.data(), w, h, GDT_Int32, 0, 0) == CE_None,
          "class raster");

    Dataset gpkg(GDALCreate(GDALGetDriverByName("GPKG"), file.string().c_str(), 0, 0, 0,
                            GDT_Unknown, nullptr));
    check(gpkg != nullptr, "creating " + file.string());
    Srs srs = make_srs();
    OGRLayerH lyr =
        GDALDatasetCreateLayer(gpkg.get(), layer.c_str(),
                               static_cast<OGRSpatialReferenceH>(srs.get()), wkbPolygon, nullptr);
    check(lyr != nullptr, "layer " + layer);
    OGRFieldDefnH code_field = OGR_Fld_Create("code", OFTInteger);
    OGR_L_CreateField(lyr, code_field, TRUE);
    OGR_Fld_Destroy(code_field);
    OGRFieldDefnH name_field = OGR_Fld_Create(field.c_str(), OFTString);
    OGR_L_CreateField(lyr, name_field, TRUE);
    OGR_Fld_Destroy(name_field);
    check(GDALPolygonize(band, nullptr, lyr, 0, nullptr, nullptr, nullptr) == CE_None,
          "polygonize");
    // Name every polygon's class.
    GDALDatasetStartTransaction(gpkg.get(), FALSE);
    OGR_L_ResetReading(lyr);
    while (OGRFeatureH f = OGR_L_GetNextFeature(lyr)) {
        const int code = OGR_F_GetFieldAsInteger(f, 0);
        OGR_F_SetFieldString(f, 1, names.at(static_cast<std::size_t>(code)).c_str());
        check(OGR_L_SetFeature(lyr, f) == OGRERR_NONE, "naming a polygon");
        OGR_F_Destroy(f);
    }
    GDALDatasetCommitTransaction(gpkg.get());
}

struct NamedPoint {
    std::string id;
    std::string kind;
    std::string description;
    double x;
    double y;
};

void write_points(const fs::path &file, const std::vector<NamedPoint> &points) {
    Dataset gpkg(GDALCreate(GDALGetDriverByName("GPKG"), file.string().c_str(), 0, 0, 0,
                            GDT_Unknown, nullptr));
    check(gpkg != nullptr, "creating " + file.string());
    Srs srs = make_srs();
    OGRLayerH lyr =
        GDALDatasetCreateLayer(gpkg.get(), "design_points",
                               static_cast<OGRSpatialReferenceH>(srs.get()), wkbPoint, nullptr);
    check(lyr != nullptr, "design point layer");
    for (const char *name : {"id", "kind", "description"}) {
        OGRFieldDefnH fd = OGR_Fld_Create(name, OFTString);
        OGR_L_CreateField(lyr, fd, TRUE);
        OGR_Fld_Destroy(fd);
    }
    for (const auto &p : points) {
        OGRFeatureH f = OGR_F_Create(OGR_L_GetLayerDefn(lyr));
        OGR_F_SetFieldString(f, 0, p.id.c_str());
        OGR_F_SetFieldString(f, 1, p.kind.c_str());
        OGR_F_SetFieldString(f, 2, p.description.c_str());
        OGRGeometryH g = OGR_G_CreateGeometry(wkbPoint);
        OGR_G_SetPoint_2D(g, 0, x0 + p.x, y0 + p.y);
        OGR_F_SetGeometryDirectly(f, g);
        check(OGR_L_CreateFeature(lyr, f) == OGRERR_NONE, "design point " + p.id);
        OGR_F_Destroy(f);
    }
}

void write_breach_line(const fs::path &file) {
    Dataset gpkg(GDALCreate(GDALGetDriverByName("GPKG"), file.string().c_str(), 0, 0, 0,
                            GDT_Unknown, nullptr));
    check(gpkg != nullptr, "creating " + file.string());
    Srs srs = make_srs();
    OGRLayerH lyr = GDALDatasetCreateLayer(gpkg.get(), "breach_lines",
                                           static_cast<OGRSpatialReferenceH>(srs.get()),
                                           wkbLineString, nullptr);
    check(lyr != nullptr, "breach line layer");
    OGRFieldDefnH fd = OGR_Fld_Create("structure", OFTString);
    OGR_L_CreateField(lyr, fd, TRUE);
    OGR_Fld_Destroy(fd);
    OGRFeatureH f = OGR_F_Create(OGR_L_GetLayerDefn(lyr));
    OGR_F_SetFieldString(f, 0, "Hatchmere Road culvert");
    OGRGeometryH g = OGR_G_CreateGeometry(wkbLineString);
    // Along the barrel, from beyond the upstream toe of the embankment (13 m from the road's
    // centre line) to beyond the downstream toe: the culvert's inverts are read at its ends.
    for (double x = road_x - 15.0; x <= road_x + 15.0; x += 5.0) {
        OGR_G_AddPoint_2D(g, x0 + x, y0 + creek_y(x));
    }
    OGR_F_SetGeometryDirectly(f, g);
    check(OGR_L_CreateFeature(lyr, f) == OGRERR_NONE, "breach line");
    OGR_F_Destroy(f);
}

/// Intensity of the invented IDF relation i = a / (t + b)^c, mm/h, t in min.
double idf_mm_per_h(double rp, double t_min) {
    const double a = 1100.0 * (1.0 + 0.22 * std::log(rp / 2.0));
    return a / std::pow(t_min + 12.0, 0.78);
}

void write_text(const fs::path &file, const std::string &text) {
    std::ofstream out(file, std::ios::binary | std::ios::trunc);
    out << text;
    check(static_cast<bool>(out), "writing " + file.string());
}

std::string fixed(double v, int decimals) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
    return buf;
}

void write_rainfall(const fs::path &dir) {
    const std::vector<double> rps = {2, 5, 10, 25, 50, 100};
    std::string idf = "# Invented IDF table of the Wrenfield Hollow demo (not a real gauge).\n"
                      "# name: Wrenfield Hollow IDF (invented)\n"
                      "# unit: mm/h\n"
                      "# source: invented for the catchpeak demo\n"
                      "duration_min";
    for (double rp : rps) {
        idf += "," + fixed(rp, 0);
    }
    idf += "\n";
    for (double d : {5.0, 10.0, 15.0, 30.0, 60.0, 120.0, 360.0, 720.0, 1440.0}) {
        idf += fixed(d, 0);
        for (double rp : rps) {
            idf += "," + fixed(idf_mm_per_h(rp, d), 1);
        }
        idf += "\n";
    }
    write_text(dir / "idf.csv", idf);
}

/// The subdivision's inlet catchments as drawn by hand from the site plan (a catchment table).
/// The culvert under Hatchmere Road, to be sized by the run: no diameter, no inverts (read from
/// the DEM at the ends of the breach line), the road crest at the embankment's low point over the
/// creek, level for some 210 m (where natural ground lies less than 4.2 m above the creek bed),
/// and the creek below as the outlet channel.
void write_culvert_table(const fs::path &dir) {
    const double crest_m = natural_ground(road_x, creek_y(road_x)) + 4.5;
    write_text(dir / "culverts.csv",
               "id,shape,barrels,diameter_in,inlet,manning_n,length_ft,hw_d_max,crest_ft,"
               "crest_length_ft,channel_bottom_ft,channel_side_slope,channel_n,channel_slope\n"
               "CV-1,circular,1,,concrete_groove_headwall,0.012,90,1.5," +
                   fixed(crest_m / 0.3048, 2) + ",690,6,2,0.035,0.012\n");
}

void write_inlet_table(const fs::path &dir) {
    write_text(dir / "inlet-catchments.csv",
               "# Larkspur Rise inlet catchments, drawn by hand from the site plan (invented).\n"
               "id,area_ha,length_m,relief_m,c,cn,x,y\n"
               "IN-1,1.35,190,8.2,0.45,80," +
                   fixed(x0 + 600, 1) + "," + fixed(y0 + 1050, 1) +
                   "\n"
                   "IN-2,1.10,160,6.9,0.45,80," +
                   fixed(x0 + 600, 1) + "," + fixed(y0 + 900, 1) +
                   "\n"
                   "IN-3,0.95,150,6.3,0.47,81," +
                   fixed(x0 + 600, 1) + "," + fixed(y0 + 760, 1) +
                   "\n"
                   "OUT-1,4.60,560,24.5,0.44,79," +
                   fixed(x0 + 600, 1) + "," + fixed(y0 + 590, 1) +
                   "\n"
                   "COM-1,6.00,310,3.4,0.82,94," +
                   fixed(x0 + 1150, 1) + "," + fixed(y0 + 455, 1) + "\n");
}

} // namespace

int main(int argc, char **argv) {
    if (argc != 2) {
        std::fprintf(stderr, "usage: catchpeak_demo_data OUTPUT_FOLDER\n");
        return 2;
    }
    try {
        const fs::path dir = argv[1];
        fs::create_directories(dir);
        GDALAllRegister();
        CPLSetConfigOption("OGR_CURRENT_DATE", "2026-01-01T00:00:00Z");
        for (const char *f : {"dem.tif", "design_points.gpkg", "land_cover.gpkg", "soils.gpkg",
                              "breach_lines.gpkg", "dem.tif.aux.xml"}) {
            fs::remove(dir / f);
        }
        std::fprintf(stderr, "demo: DEM %d x %d cells\n", width, height);
        write_dem(dir / "dem.tif");
        std::fprintf(stderr, "demo: land cover, soils, design points, breach line\n");
        write_zones(dir / "land_cover.gpkg", "land_cover", "class", 10.0, land_classes, land_class);
        write_zones(dir / "soils.gpkg", "soils", "hsg", 50.0, soil_groups, soil_group);
        const double cy = creek_y(road_x - 12.0);
        write_points(dir / "design_points.gpkg",
                     {{"CV-1", "culvert", "Sorrel Creek under Hatchmere Road", road_x - 12.0, cy},
                      {"IN-1", "curb inlet", "Kestrel Way at Thistle Lane", 600.0, 1050.0},
                      {"IN-2", "curb inlet", "Kestrel Way, mid block", 600.0, 900.0},
                      {"IN-3", "curb inlet", "Kestrel Way, low end", 600.0, 760.0},
                      {"OUT-1", "outfall", "Larkspur Rise outfall to Sorrel Creek", 600.0, 590.0},
                      {"COM-1", "outlet", "Millbrook Commons lot outlet", 1150.0, 455.0}});
        write_breach_line(dir / "breach_lines.gpkg");
        write_rainfall(dir);
        write_inlet_table(dir);
        write_culvert_table(dir);
        std::fprintf(stderr, "demo: written to %s\n", dir.string().c_str());
    } catch (const std::exception &e) {
        std::fprintf(stderr, "catchpeak_demo_data: %s\n", e.what());
        return 1;
    }
    return 0;
}
