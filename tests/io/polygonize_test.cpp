// SPDX-License-Identifier: MIT
#include "catchpeak/io/polygonize.hpp"

#include <gtest/gtest.h>
#include <ogr_geometry.h>

#include <map>
#include <memory>
#include <random>

namespace io = catchpeak::io;
using catchpeak::Grid;

namespace {

std::unique_ptr<OGRGeometry> geometry(const std::vector<unsigned char> &wkb) {
    OGRGeometry *g = nullptr;
    EXPECT_EQ(OGRGeometryFactory::createFromWkb(wkb.data(), nullptr, &g, wkb.size()), OGRERR_NONE);
    return std::unique_ptr<OGRGeometry>(g);
}

Grid<std::uint32_t> grid_from(const std::vector<std::vector<std::uint32_t>> &rows, double cell_m) {
    Grid<std::uint32_t> g(rows.front().size(), rows.size(), 0);
    for (std::size_t r = 0; r < rows.size(); ++r) {
        for (std::size_t c = 0; c < rows[r].size(); ++c) {
            g(c, r) = rows[r][c];
        }
    }
    g.transform = {700000.0, cell_m, 0.0, 5000000.0, 0.0, -cell_m};
    return g;
}

// Area from GEOS/OGR must equal cell count x cell area. Tolerance: floating-point rounding of
// the shoelace sum at coordinates of ~1e6 m (relative 1e-9).
void expect_area_matches_cells(const io::LabelPolygon &p, double cell_area_m2) {
    const double expected = static_cast<double>(p.cell_count) * cell_area_m2;
    EXPECT_NEAR(p.area_m2, expected, expected * 1e-9) << "label " << p.label;
    auto g = geometry(p.wkb);
    EXPECT_TRUE(g->IsValid()) << "label " << p.label;
    EXPECT_NEAR(io::polygon_area(p.wkb), expected, expected * 1e-9) << "label " << p.label;
}

} // namespace

TEST(PolygonizeLabels, SmallGridAreasPartsAndPlace) {
    const auto labels = grid_from(
        {
            {1, 1, 1, 0, 3},
            {1, 1, 1, 3, 0}, // label 3 touches itself only at a corner
            {2, 0, 0, 0, 0},
            {2, 2, 2, 0, 4},
        },
        10.0);
    const auto polys = io::polygonize_labels(labels);
    ASSERT_EQ(polys.size(), 4u);
    std::map<std::uint32_t, const io::LabelPolygon *> by;
    for (const auto &p : polys) {
        by[p.label] = &p;
        expect_area_matches_cells(p, 100.0);
    }
    EXPECT_EQ(by.at(1)->cell_count, 6u);
    EXPECT_EQ(by.at(2)->cell_count, 4u);
    EXPECT_EQ(by.at(3)->cell_count, 2u);
    // 4-connectedness: the two corner-touching cells of label 3 are two parts of one
    // MultiPolygon.
    auto g3 = geometry(by.at(3)->wkb);
    ASSERT_EQ(wkbFlatten(g3->getGeometryType()), wkbMultiPolygon);
    EXPECT_EQ(g3->toMultiPolygon()->getNumGeometries(), 2);
    // Label 1 covers columns 0-2, rows 0-1: x 700000..700030, y 4999980..5000000.
    OGREnvelope env;
    geometry(by.at(1)->wkb)->getEnvelope(&env);
    EXPECT_DOUBLE_EQ(env.MinX, 700000.0);
    EXPECT_DOUBLE_EQ(env.MaxX, 700030.0);
    EXPECT_DOUBLE_EQ(env.MinY, 4999980.0);
    EXPECT_DOUBLE_EQ(env.MaxY, 5000000.0);
}

TEST(PolygonizeLabels, RandomBlobsWithHolesKeepTheirArea) {
    // Labels grown from random seeds (fixed seed: the same grid on every machine), with
    // unlabelled holes; cell 2.5 m x 2.5 m.
    std::mt19937 rng(12345);
    Grid<std::uint32_t> g(80, 60, 0);
    g.transform = {300000.0, 2.5, 0.0, 4100000.0, 0.0, -2.5};
    for (std::size_t r = 0; r < g.height(); ++r) {
        for (std::size_t c = 0; c < g.width(); ++c) {
            const auto v = static_cast<std::size_t>(rng() % 9); // 0 = hole
            g(c, r) = (c / 10 + r / 15 + v) % 7 == 0
                          ? 0
                          : 1 + static_cast<std::uint32_t>((c / 16 + 5 * (r / 12)) % 11);
        }
    }
    const auto polys = io::polygonize_labels(g);
    std::uint64_t cells = 0;
    for (const auto &p : polys) {
        expect_area_matches_cells(p, 6.25);
        cells += p.cell_count;
    }
    std::uint64_t labelled = 0;
    for (auto v : g.cells()) {
        labelled += v != 0 ? 1 : 0;
    }
    EXPECT_EQ(cells, labelled);
}

TEST(UnionPolygons, AdjacentLabelsMergeIntoOnePolygon) {
    const auto labels = grid_from({{1, 1, 2}, {1, 2, 2}}, 5.0);
    const auto polys = io::polygonize_labels(labels);
    ASSERT_EQ(polys.size(), 2u);
    const auto u = io::union_polygons({&polys[0].wkb, &polys[1].wkb});
    auto g = geometry(u);
    EXPECT_EQ(wkbFlatten(g->getGeometryType()), wkbPolygon);
    EXPECT_TRUE(g->IsValid());
    // 6 cells of 25 m2 (computed from the grid); tolerance: floating-point rounding.
    EXPECT_NEAR(io::polygon_area(u), 150.0, 1e-6);
}

TEST(PolygonizeLabels, EmptyGridGivesNothing) {
    Grid<std::uint32_t> g(3, 3, 0);
    EXPECT_TRUE(io::polygonize_labels(g).empty());
}

TEST(PolygonizePatches, OnePolygonPerPatchOfFourConnectedCells) {
    // Label 1 in two patches that touch at a corner, label 2 in one patch:
    //   1 2
    //   2 1
    Grid<std::uint32_t> g(2, 2, 0);
    g.transform = {0.0, 1.0, 0.0, 2.0, 0.0, -1.0};
    g(0, 0) = 1;
    g(1, 1) = 1;
    g(1, 0) = 2;
    g(0, 1) = 2;
    const auto patches = io::polygonize_patches(g);
    ASSERT_EQ(patches.size(), 4u);
    double area = 0.0;
    for (const auto &p : patches) {
        EXPECT_NEAR(io::polygon_area(p.wkb), 1.0, 1e-12); // one cell each, exact
        area += io::polygon_area(p.wkb);
    }
    EXPECT_EQ(patches[0].label, 1u);
    EXPECT_EQ(patches[1].label, 1u);
    EXPECT_EQ(patches[2].label, 2u);
    EXPECT_NEAR(area, 4.0, 1e-12);
}

TEST(PolygonizePatches, PatchAreasOfEveryLabelAddUpToItsCells) {
    // A random grid of 3 labels and holes (0): the patches of a label cover its cells exactly
    // (cell edges; 1e-9 relative for the rounding of the areas).
    std::mt19937 rng(7);
    std::uniform_int_distribution<std::uint32_t> pick(0, 3);
    Grid<std::uint32_t> g(40, 30, 0);
    g.transform = {1000.0, 2.0, 0.0, 5000.0, 0.0, -2.0};
    std::map<std::uint32_t, double> cells_m2;
    for (std::size_t i = 0; i < g.size(); ++i) {
        g[i] = pick(rng);
        if (g[i] != 0) {
            cells_m2[g[i]] += 4.0;
        }
    }
    std::map<std::uint32_t, double> patches_m2;
    std::uint32_t last = 0;
    for (const auto &p : io::polygonize_patches(g)) {
        EXPECT_GE(p.label, last); // ascending by label
        last = p.label;
        patches_m2[p.label] += io::polygon_area(p.wkb);
    }
    ASSERT_EQ(patches_m2.size(), cells_m2.size());
    for (const auto &[label, m2] : cells_m2) {
        EXPECT_NEAR(patches_m2[label], m2, m2 * 1e-9) << "label " << label;
    }
}
