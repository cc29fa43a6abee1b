// SPDX-License-Identifier: MIT
// catchpeak::app::delineate on a real terrain model: the sample DEM that Debian's package
// python-matplotlib-data ships (mpl-data/sample_data/*_dem.npz, a 16-bit elevation grid in
// geographic coordinates stored as NumPy arrays). The set-up wraps it in a GDAL VRT, checks that
// catchpeak refuses it as geographic, reprojects it to its UTM zone with gdalwarp (GDALWarp),
// and then checks properties that must hold on any terrain:
// - every cell drains to an outlet, and the outlets' accumulations add up to the cell count;
// - at each design point, accumulation = cells of its catchment, and the GEOS/OGR area of its
//   polygon = cell count x cell area;
// - nested design points are consistent (inner polygon inside the outer one, areas ordered,
//   local area = total minus the nested catchment).
// No value of this DEM is compared with a number catchpeak printed before.
#include "catchpeak/app/delineate.hpp"
#include "catchpeak/core/files.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/io/raster.hpp"
#include "catchpeak/terrain/accumulation.hpp"
#include "catchpeak/terrain/conditioning.hpp"
#include "catchpeak/terrain/flow_direction.hpp"
#include "io/gdal_test_data.hpp"
#include "support/test_env.hpp"

#include <cpl_vsi.h>
#include <fmt/format.h>
#include <gdal_utils.h>
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <cstring>
#include <fstream>
#include <optional>

namespace fs = std::filesystem;
namespace t = catchpeak::test;
namespace terrain = catchpeak::terrain;

namespace {

const fs::path sample_dir = "/usr/share/matplotlib/mpl-data/sample_data";

std::optional<fs::path> find_sample_dem() {
    std::error_code ec;
    if (!fs::is_directory(sample_dir, ec)) {
        return std::nullopt;
    }
    for (const auto &e : fs::directory_iterator(sample_dir)) {
        const auto name = e.path().filename().string();
        if (name.size() > 8 && name.substr(name.size() - 8) == "_dem.npz") {
            return e.path();
        }
    }
    return std::nullopt;
}

/// A member of a .npz (a zip of .npy files), read through GDAL's /vsizip/.
struct NpyMember {
    std::string descr; // e.g. "<i2", "<f8"
    std::vector<std::size_t> shape;
    std::size_t data_offset = 0; // bytes from the start of the member
    std::vector<unsigned char> bytes;
};

NpyMember read_npy(const fs::path &npz, const std::string &member) {
    // Braces: the archive's extension is .npz, not .zip.
    const std::string name = "/vsizip/{" + npz.string() + "}/" + member;
    VSILFILE *f = VSIFOpenL(name.c_str(), "rb");
    if (f == nullptr) {
        throw std::runtime_error("cannot open " + name);
    }
    NpyMember m;
    unsigned char buf[65536];
    std::size_t got = 0;
    while ((got = VSIFReadL(buf, 1, sizeof buf, f)) > 0) {
        m.bytes.insert(m.bytes.end(), buf, buf + got);
    }
    VSIFCloseL(f);
    if (m.bytes.size() < 10 || std::memcmp(m.bytes.data(), "\x93NUMPY", 6) != 0) {
        throw std::runtime_error(name + " is not a .npy array");
    }
    std::size_t header_len = 0;
    std::size_t start = 0;
    if (m.bytes[6] == 1) {
        header_len = m.bytes[8] | (static_cast<std::size_t>(m.bytes[9]) << 8);
        start = 10;
    } else {
        header_len = m.bytes[8] | (static_cast<std::size_t>(m.bytes[9]) << 8) |
                     (static_cast<std::size_t>(m.bytes[10]) << 16) |
                     (static_cast<std::size_t>(m.bytes[11]) << 24);
        start = 12;
    }
    const std::string header(m.bytes.begin() + static_cast<std::ptrdiff_t>(start),
                             m.bytes.begin() + static_cast<std::ptrdiff_t>(start + header_len));
    m.data_offset = start + header_len;
    // The header is a Python dict literal, e.g.
    // {'descr': '<i2', 'fortran_order': False, 'shape': (344, 403), }
    if (const auto d = header.find("'descr':"); d != std::string::npos) {
        const auto q1 = header.find('\'', d + 8);
        const auto q2 = header.find('\'', q1 + 1);
        m.descr = header.substr(q1 + 1, q2 - q1 - 1);
    }
    if (header.find("'fortran_order': True") != std::string::npos) {
        throw std::runtime_error(name + ": Fortran order not handled");
    }
    if (const auto sh = header.find("'shape':"); sh != std::string::npos) {
        const auto open = header.find('(', sh);
        const auto close = header.find(')', open);
        std::size_t value = 0;
        bool in_number = false;
        for (std::size_t i = open + 1; i <= close; ++i) {
            const char ch = header[i];
            if (ch >= '0' && ch <= '9') {
                value = value * 10 + static_cast<std::size_t>(ch - '0');
                in_number = true;
            } else if (in_number) {
                m.shape.push_back(value);
                value = 0;
                in_number = false;
            }
        }
    }
    return m;
}

double npy_scalar(const fs::path &npz, const std::string &member) {
    const auto m = read_npy(npz, member);
    if (m.descr != "<f8" || m.bytes.size() < m.data_offset + 8) {
        throw std::runtime_error(member + ": expected a float64 scalar, found " + m.descr);
    }
    double v = 0.0;
    std::memcpy(&v, m.bytes.data() + m.data_offset, 8);
    return v;
}

struct RealDem {
    fs::path npz;
    fs::path vrt; // geographic, as shipped
    fs::path utm; // reprojected
    int epsg = 0;
};

RealDem prepare(const fs::path &npz, const fs::path &dir) {
    t::gdal_init();
    RealDem d;
    d.npz = npz;
    const auto elev = read_npy(npz, "elevation.npy");
    if (elev.descr != "<i2" || elev.shape.size() != 2) {
        throw std::runtime_error("elevation.npy: expected a 2-D int16 array, found " + elev.descr);
    }
    const std::size_t rows = elev.shape[0];
    const std::size_t cols = elev.shape[1];
    const double xmin = npy_scalar(npz, "xmin.npy");
    const double ymax = npy_scalar(npz, "ymax.npy");
    const double dx = npy_scalar(npz, "dx.npy");
    const double dy = npy_scalar(npz, "dy.npy");
    // Row 0 is taken to be the northern edge (the array is shown that way by default).
    d.vrt = dir / "sample_dem.vrt";
    {
        std::ofstream vrt(d.vrt);
        vrt << "<VRTDataset rasterXSize=\"" << cols << "\" rasterYSize=\"" << rows << "\">\n"
            << "  <SRS>EPSG:4326</SRS>\n"
            << "  <GeoTransform>" << fmt::format("{:.17g}", xmin) << ", "
            << fmt::format("{:.17g}", dx) << ", 0, " << fmt::format("{:.17g}", ymax) << ", 0, "
            << fmt::format("{:.17g}", -dy) << "</GeoTransform>\n"
            << "  <VRTRasterBand dataType=\"Int16\" band=\"1\" subClass=\"VRTRawRasterBand\">\n"
            << "    <SourceFilename relativeToVRT=\"0\">/vsizip/{" << npz.string()
            << "}/elevation.npy</SourceFilename>\n"
            << "    <ImageOffset>" << elev.data_offset << "</ImageOffset>\n"
            << "    <PixelOffset>2</PixelOffset>\n"
            << "    <LineOffset>" << 2 * cols << "</LineOffset>\n"
            << "    <ByteOrder>LSB</ByteOrder>\n"
            << "  </VRTRasterBand>\n</VRTDataset>\n";
    }
    const double lon = xmin + dx * static_cast<double>(cols) / 2.0;
    const double lat = ymax - dy * static_cast<double>(rows) / 2.0;
    const int zone = static_cast<int>(std::floor((lon + 180.0) / 6.0)) + 1;
    d.epsg = (lat >= 0 ? 32600 : 32700) + zone;
    d.utm = dir / "sample_dem_utm.tif";
    GDALDatasetUniquePtr src(GDALDataset::Open(d.vrt.string().c_str(), GDAL_OF_RASTER));
    if (!src) {
        throw std::runtime_error("cannot open " + d.vrt.string());
    }
    const std::string srs = "EPSG:" + std::to_string(d.epsg);
    const char *argv[] = {"-t_srs",     srs.c_str(), "-r",  "bilinear", "-ot",  "Float32",
                          "-dstnodata", "-9999",     "-of", "GTiff",    nullptr};
    GDALWarpAppOptions *o = GDALWarpAppOptionsNew(const_cast<char **>(argv), nullptr);
    GDALDatasetH srcs[] = {GDALDataset::ToHandle(src.get())};
    int usage_error = 0;
    GDALDatasetH out = GDALWarp(d.utm.string().c_str(), nullptr, 1, srcs, o, &usage_error);
    GDALWarpAppOptionsFree(o);
    if (out == nullptr) {
        throw std::runtime_error("gdalwarp failed");
    }
    GDALClose(out);
    return d;
}

} // namespace

namespace {

class RealTerrain : public ::testing::Test {
  protected:
    static void SetUpTestSuite() {
        const auto npz = find_sample_dem();
        if (!npz) {
            return; // each test skips, naming the package
        }
        dir = t::scratch_dir("real_dem");
        try {
            dem = prepare(*npz, dir);
        } catch (const std::exception &e) {
            setup_error = e.what();
        }
    }
    void SetUp() override {
        ASSERT_TRUE(setup_error.empty()) << "preparing the sample DEM failed: " << setup_error;
        if (dem.utm.empty()) {
            GTEST_SKIP() << "package python-matplotlib-data (listed in .ci/packages.txt) is not "
                            "installed: no sample DEM in "
                         << sample_dir;
        }
    }
    static inline fs::path dir;
    static inline RealDem dem;
    static inline std::string setup_error;
};

/// Index of the cell containing (x, y).
std::size_t cell_of(const catchpeak::Grid<float> &g, double x, double y) {
    const auto c = static_cast<std::size_t>((x - g.transform.origin_x) / g.transform.pixel_width);
    const auto r = static_cast<std::size_t>((y - g.transform.origin_y) / g.transform.pixel_height);
    return g.index(c, r);
}

std::unique_ptr<OGRGeometry> catchment(const fs::path &gpkg, const std::string &id) {
    GDALDatasetUniquePtr ds(GDALDataset::Open(gpkg.string().c_str(), GDAL_OF_VECTOR));
    if (!ds) {
        throw std::runtime_error("cannot open " + gpkg.string());
    }
    for (auto &f : *ds->GetLayerByName("catchments")) {
        if (std::string(f->GetFieldAsString("id")) == id) {
            return std::unique_ptr<OGRGeometry>(f->StealGeometry());
        }
    }
    throw std::runtime_error("no catchment " + id);
}

double area_of(const OGRGeometry &g) {
    const auto type = wkbFlatten(g.getGeometryType());
    if (type == wkbMultiPolygon) {
        return g.toMultiPolygon()->get_Area();
    }
    if (type == wkbPolygon) {
        return g.toPolygon()->get_Area();
    }
    return g.toGeometryCollection()->get_Area();
}

} // namespace

TEST_F(RealTerrain, GeographicOriginalIsRefusedWithTheWayToReproject) {
    try {
        (void)catchpeak::io::read_dem(dem.vrt);
        FAIL() << "a geographic DEM was accepted";
    } catch (const catchpeak::InputError &e) {
        EXPECT_NE(std::string(e.what()).find("gdalwarp -t_srs EPSG:"), std::string::npos)
            << e.what();
    }
}

TEST_F(RealTerrain, EveryCellDrainsAndOutletsAccountForEveryCell) {
    const auto d = catchpeak::io::read_dem(dem.utm);
    const auto &g = d.elevation_m;
    ASSERT_GT(d.valid_cells, 10000u);
    const auto dirs = terrain::conditioned_directions(g, {});
    const auto acc = terrain::flow_accumulation(dirs);
    // Follow every valid cell downstream: it must reach an outlet (a cell draining off the
    // raster or onto nodata) without a cycle. state: 0 unknown, 1 on the current path, 2 drains.
    std::vector<std::uint8_t> state(g.size(), 0);
    std::uint64_t outlet_sum = 0;
    std::size_t outlets = 0;
    for (std::size_t i = 0; i < g.size(); ++i) {
        if (!g.is_valid(i)) {
            continue;
        }
        ASSERT_NE(dirs[i], terrain::d8::none) << "valid cell " << i << " has no direction";
        const std::size_t next = terrain::downstream_cell(dirs, i);
        if (next == terrain::no_cell || !g.is_valid(next)) {
            outlet_sum += acc[i];
            ++outlets;
        }
        std::vector<std::size_t> path;
        std::size_t cur = i;
        while (cur != terrain::no_cell && g.is_valid(cur) && state[cur] == 0) {
            state[cur] = 1;
            path.push_back(cur);
            cur = terrain::downstream_cell(dirs, cur);
        }
        ASSERT_TRUE(cur == terrain::no_cell || !g.is_valid(cur) || state[cur] == 2)
            << "cycle through cell " << cur;
        for (auto p : path) {
            state[p] = 2;
        }
    }
    EXPECT_GT(outlets, 0u);
    // Each valid cell is counted at exactly one outlet.
    EXPECT_EQ(outlet_sum, d.valid_cells);
}

TEST_F(RealTerrain, NestedDesignPointsOnTheMainStemAreConsistent) {
    const auto d = catchpeak::io::read_dem(dem.utm);
    const auto &g = d.elevation_m;
    const auto dirs = terrain::conditioned_directions(g, {});
    const auto acc = terrain::flow_accumulation(dirs);
    // The outlet with the largest accumulation, then up its main stem (the upstream neighbour
    // of largest accumulation) to cells draining about 1/2 and 1/5 of it.
    std::size_t outlet = 0;
    for (std::size_t i = 0; i < g.size(); ++i) {
        if (g.is_valid(i) && acc[i] > acc[outlet]) {
            outlet = i;
        }
    }
    std::vector<std::size_t> picks{outlet};
    std::size_t cur = outlet;
    for (const double share : {0.5, 0.2}) {
        while (acc[cur] > share * acc[outlet]) {
            std::size_t best = terrain::no_cell;
            const auto c = static_cast<long long>(cur % g.width());
            const auto r = static_cast<long long>(cur / g.width());
            for (std::uint8_t k = 1; k <= 8; ++k) {
                const long long nc = c + terrain::d8::dcol[k];
                const long long nr = r + terrain::d8::drow[k];
                if (!g.in_bounds(nc, nr)) {
                    continue;
                }
                const auto n = g.index(static_cast<std::size_t>(nc), static_cast<std::size_t>(nr));
                if (terrain::downstream_cell(dirs, n) == cur &&
                    (best == terrain::no_cell || acc[n] > acc[best])) {
                    best = n;
                }
            }
            ASSERT_NE(best, terrain::no_cell);
            cur = best;
        }
        picks.push_back(cur);
    }
    std::vector<t::PointSpec> pts;
    const std::vector<std::string> ids{"outlet", "middle", "upper"};
    for (std::size_t k = 0; k < picks.size(); ++k) {
        const auto [x, y] = g.transform.cell_centre(picks[k] % g.width(), picks[k] / g.width());
        pts.push_back({x, y, ids[k]});
        ASSERT_EQ(cell_of(g, x, y), picks[k]);
    }
    t::make_points(dir / "points.gpkg", pts, "EPSG:" + std::to_string(dem.epsg));

    catchpeak::app::DelineateOptions o;
    o.dem = dem.utm;
    o.points = dir / "points.gpkg";
    o.id_field = "id";
    o.snap_radius_m = 0.0; // each point stays on its cell
    o.out_dir = dir / "out";
    const auto summary = catchpeak::app::delineate(o, nullptr);
    ASSERT_EQ(summary.design_points, 3u);
    std::ifstream in(summary.json);
    const auto json = nlohmann::json::parse(in);
    std::map<std::string, nlohmann::json> by;
    for (const auto &p : json.at("design_points")) {
        by[p.at("id").get<std::string>()] = p;
    }
    const double cell_area = g.transform.cell_area();
    for (std::size_t k = 0; k < ids.size(); ++k) {
        const auto &p = by.at(ids[k]);
        // Snapped onto the chosen cell: its accumulation is that cell's.
        EXPECT_EQ(p.at("accumulation_cells").get<std::uint64_t>(), acc[picks[k]]) << ids[k];
        // Every cell of the catchment drains through the outlet, and only those.
        EXPECT_EQ(p.at("accumulation_cells").get<std::uint64_t>(),
                  p.at("total_cells").get<std::uint64_t>())
            << ids[k];
        const auto poly = catchment(summary.gpkg, ids[k]);
        EXPECT_TRUE(poly->IsValid()) << ids[k];
        // GEOS/OGR area = cell count x cell area; tolerance: rounding (relative 1e-9).
        const double expected = p.at("total_cells").get<double>() * cell_area;
        EXPECT_NEAR(area_of(*poly), expected, expected * 1e-9) << ids[k];
    }
    // Nesting: upper inside middle inside outlet.
    EXPECT_EQ(by.at("outlet").at("upstream_design_points"), nlohmann::json::array({"middle"}));
    EXPECT_EQ(by.at("middle").at("upstream_design_points"), nlohmann::json::array({"upper"}));
    EXPECT_EQ(by.at("outlet").at("all_upstream_design_points"),
              nlohmann::json::array({"middle", "upper"}));
    EXPECT_EQ(by.at("upper").at("downstream_design_point"), "middle");
    for (const auto &[inner, outer] :
         {std::pair<std::string, std::string>{"upper", "middle"}, {"middle", "outlet"}}) {
        const double a_in = by.at(inner).at("area_m2").get<double>();
        const double a_out = by.at(outer).at("area_m2").get<double>();
        EXPECT_LT(a_in, a_out);
        // Local area of the outer point = its total minus the nested total (cell counts).
        EXPECT_DOUBLE_EQ(by.at(outer).at("local_area_m2").get<double>(), a_out - a_in);
        const auto pin = catchment(summary.gpkg, inner);
        const auto pout = catchment(summary.gpkg, outer);
        std::unique_ptr<OGRGeometry> outside(pin->Difference(pout.get()));
        // The inner polygon lies inside the outer one: nothing of it is left outside.
        // Tolerance 1e-6 m2: floating-point slivers of GEOS's overlay on shared cell edges.
        EXPECT_NEAR(outside ? area_of(*outside) : 0.0, 0.0, 1e-6) << inner << " in " << outer;
    }
}

TEST_F(RealTerrain, ResultsAreByteIdenticalWhateverTheThreadCount) {
    const auto d = catchpeak::io::read_dem(dem.utm);
    const auto [x, y] =
        d.elevation_m.transform.cell_centre(d.elevation_m.width() / 2, d.elevation_m.height() / 2);
    t::make_points(dir / "centre.gpkg", {{x, y, "centre"}}, "EPSG:" + std::to_string(dem.epsg));
    std::vector<std::string> texts;
    // 2 and 3 threads: the fill, flats, accumulation and catchment walks run in 2 or 3 bands.
    for (const unsigned threads : {1u, 2u, 3u}) {
        catchpeak::app::DelineateOptions o;
        o.dem = dem.utm;
        o.points = dir / "centre.gpkg";
        o.id_field = "id";
        o.snap_radius_m = 200.0;
        o.out_dir = dir / ("threads_" + std::to_string(threads));
        o.threads = threads;
        const auto summary = catchpeak::app::delineate(o, nullptr);
        texts.push_back(catchpeak::read_text_file(summary.json));
    }
    EXPECT_FALSE(texts[0].empty());
    EXPECT_EQ(texts[0], texts[1]);
    EXPECT_EQ(texts[0], texts[2]);
    // The directions themselves, cell by cell.
    const auto one = terrain::conditioned_directions(d.elevation_m, {}, 1);
    for (const unsigned threads : {2u, 3u}) {
        EXPECT_EQ(terrain::conditioned_directions(d.elevation_m, {}, threads).cells(), one.cells())
            << threads << " threads";
    }
}
