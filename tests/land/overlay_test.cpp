// SPDX-License-Identifier: MIT
#include "catchpeak/core/csv.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/land/overlay.hpp"
#include "support/calc_lines.hpp"
#include "support/input_error.hpp"
#include "support/wkb.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <string>
#include <vector>

using catchpeak::InputError;
using catchpeak::LineKind;
using catchpeak::parse_csv;
using catchpeak::io::VectorLayer;
using namespace catchpeak::land;
using catchpeak::test::feature;
using catchpeak::test::rect;
using catchpeak::test::rect_wkb;

namespace {

// Exact areas: every test geometry has corners on whole metres, so areas, parts and weighted
// sums are exact in double precision up to the rounding of a few additions; the tolerance
// below is that rounding (relative 1e-12), not an approximation.
constexpr double rounding = 1e-12;

/// Small tables of our own, so that the expected values below follow from them by hand.
LandTables test_tables() {
    LandTables t;
    t.c = RunoffCoefficientTable::from_csv(
        parse_csv("# name: test C\n"
                  "class,soil_group,slope_min_percent,slope_max_percent,c\n"
                  "roof,any,,,0.9\n"
                  "grass,A,,5,0.1\n"
                  "grass,A,5,,0.2\n"
                  "grass,B,,,0.15\n"
                  "grass,C,,,0.2\n"
                  "grass,D,,,0.3\n"
                  "wood,any,,,0.15\n",
                  "c_test.csv"));
    t.cn = CurveNumberTable::from_csv(parse_csv("# name: test CN\n"
                                                "class,A,B,C,D\n"
                                                "roof,98,98,98,98\n"
                                                "grass,40,60,70,80\n"
                                                "wood,30,55,70,77\n",
                                                "cn_test.csv"));
    t.impervious = ImperviousShareTable::from_csv(parse_csv("class,impervious_percent\n"
                                                            "roof,100\n"
                                                            "grass,0\n"
                                                            "wood,0\n",
                                                            "imp_test.csv"));
    return t;
}

VectorLayer land_layer(std::vector<catchpeak::io::VectorFeature> f) {
    return {"land.gpkg", "", std::move(f)};
}
VectorLayer soil_layer(std::vector<catchpeak::io::VectorFeature> f) {
    return {"soils.gpkg", "", std::move(f)};
}

const catchpeak::report::LandPart *find_part(const CatchmentLand &r, const std::string &cls,
                                             const std::string &group) {
    for (const auto &p : r.weighting.parts) {
        if (p.land_class == cls && p.soil_group == group) {
            return &p;
        }
    }
    return nullptr;
}

double parts_sum(const CatchmentLand &r) {
    double s = 0.0;
    for (const auto &p : r.weighting.parts) {
        s += p.area_m2;
    }
    return s;
}

bool has_warning_containing(const catchpeak::CalcLines &lines, const std::string &text) {
    for (const auto &l : lines.lines()) {
        if (l.kind == LineKind::warning &&
            catchpeak::test::text(l).numbers.find(text) != std::string::npos) {
            return true;
        }
    }
    return false;
}

} // namespace

TEST(LandOverlay, SquareSplitByTwoLayersGivesExactParts) {
    // Catchment 100 m x 100 m. Land cover: roof on x < 40, grass on x > 40 (both reach beyond
    // the catchment). Soils: B on y < 30, C on y > 30.
    const LandOverlay overlay(
        land_layer({feature(1, rect_wkb(-50, -50, 40, 150), "class", "roof"),
                    feature(2, rect_wkb(40, -50, 150, 150), "class", "grass")}),
        soil_layer({feature(10, rect_wkb(-50, -50, 150, 30), "hsg", "B"),
                    feature(11, rect_wkb(-50, 30, 150, 150), "hsg", "C")}),
        test_tables(), OverlaySettings{});
    const auto r = overlay.weight(rect_wkb(0, 0, 100, 100), "DP1");
    EXPECT_DOUBLE_EQ(r.area_m2, 10000.0);
    ASSERT_EQ(r.weighting.parts.size(), 4u);
    // Parts by hand: roof B 40 x 30, roof C 40 x 70, grass B 60 x 30, grass C 60 x 70.
    EXPECT_NEAR(find_part(r, "roof", "B")->area_m2, 1200.0, 1200.0 * rounding);
    EXPECT_NEAR(find_part(r, "roof", "C")->area_m2, 2800.0, 2800.0 * rounding);
    EXPECT_NEAR(find_part(r, "grass", "B")->area_m2, 1800.0, 1800.0 * rounding);
    EXPECT_NEAR(find_part(r, "grass", "C")->area_m2, 4200.0, 4200.0 * rounding);
    // Sorted by class, then soil group.
    EXPECT_EQ(r.weighting.parts[0].land_class, "grass");
    EXPECT_EQ(r.weighting.parts[0].soil_group, "B");
    // Computed by hand from the test tables:
    // CN = (1200 x 98 + 2800 x 98 + 1800 x 60 + 4200 x 70) / 10000 = 79.4
    EXPECT_NEAR(r.weighting.cn_weighted, 79.4, 79.4 * rounding);
    // C = (4000 x 0.9 + 1800 x 0.15 + 4200 x 0.2) / 10000 = 0.471
    EXPECT_NEAR(r.weighting.c_weighted, 0.471, 0.471 * rounding);
    // Impervious = 4000 / 10000
    EXPECT_NEAR(r.weighting.impervious_share, 0.4, 0.4 * rounding);
    EXPECT_EQ(r.weighting.cn_table, "cn_test.csv (test CN)");
    EXPECT_EQ(r.weighting.c_table, "c_test.csv (test C)");
    EXPECT_EQ(r.uncovered_land_cover_m2, 0.0);
    EXPECT_EQ(r.uncovered_soils_m2, 0.0);
    EXPECT_EQ(r.lines.warning_count(), 0u);
}

TEST(LandOverlay, PolygonTouchingASoilBoundaryGetsNoSliver) {
    // Roof 20..50 x 20..80 lies inside the catchment and ends exactly on the soil boundary
    // x = 50: all of its 1800 m2 is on soil A, nothing on soil B.
    const LandOverlay overlay(land_layer({feature(1, rect_wkb(0, 0, 100, 100), "class", "grass"),
                                          feature(2, rect_wkb(20, 20, 50, 80), "class", "roof")}),
                              soil_layer({feature(1, rect_wkb(0, 0, 50, 100), "hsg", "A"),
                                          feature(2, rect_wkb(50, 0, 100, 100), "hsg", "B")}),
                              test_tables(), OverlaySettings{});
    // The test layers overlap (roof on grass): refused, naming both.
    const auto msg = catchpeak::test::input_error_of(
        [&] { (void)overlay.weight(rect_wkb(0, 0, 100, 100), "DP"); });
    EXPECT_NE(msg.find("features 1 and 2 (1800 m2)"), std::string::npos) << msg;
    const LandOverlay clean(land_layer({feature(1, rect_wkb(0, 0, 20, 100), "class", "grass"),
                                        feature(2, rect_wkb(20, 0, 50, 100), "class", "roof"),
                                        feature(3, rect_wkb(50, 0, 100, 100), "class", "grass")}),
                            soil_layer({feature(1, rect_wkb(-10, -10, 50, 110), "hsg", "A"),
                                        feature(2, rect_wkb(50, -10, 110, 110), "hsg", "B")}),
                            test_tables(), OverlaySettings{});
    // Catchment 10..90 x 10..90: roof lies across it, touching soil B only along x = 50.
    const auto r = clean.weight(rect_wkb(10, 10, 90, 90), "DP", 0.01);
    ASSERT_EQ(r.weighting.parts.size(), 3u);
    EXPECT_EQ(find_part(r, "roof", "B"), nullptr);
    EXPECT_NEAR(find_part(r, "roof", "A")->area_m2, 2400.0, 2400.0 * rounding);  // 30 x 80
    EXPECT_NEAR(find_part(r, "grass", "A")->area_m2, 800.0, 800.0 * rounding);   // 10 x 80
    EXPECT_NEAR(find_part(r, "grass", "B")->area_m2, 3200.0, 3200.0 * rounding); // 40 x 80
    // A land polygon inside the catchment touching the soil boundary.
    const LandOverlay inner(land_layer({feature(1, rect_wkb(0, 0, 30, 100), "class", "grass"),
                                        feature(2, rect_wkb(30, 30, 50, 70), "class", "roof"),
                                        feature(3, rect_wkb(30, 0, 50, 30), "class", "grass"),
                                        feature(4, rect_wkb(30, 70, 50, 100), "class", "grass"),
                                        feature(5, rect_wkb(50, 0, 100, 100), "class", "grass")}),
                            soil_layer({feature(1, rect_wkb(-10, -10, 50, 110), "hsg", "A"),
                                        feature(2, rect_wkb(50, -10, 110, 110), "hsg", "B")}),
                            test_tables(), OverlaySettings{});
    const auto q = inner.weight(rect_wkb(0, 0, 100, 100), "DP", 0.01);
    EXPECT_EQ(find_part(q, "roof", "B"), nullptr);
    EXPECT_NEAR(find_part(q, "roof", "A")->area_m2, 800.0, 800.0 * rounding); // 20 x 40
    EXPECT_NEAR(find_part(q, "grass", "A")->area_m2, 4200.0, 4200.0 * rounding);
    EXPECT_NEAR(find_part(q, "grass", "B")->area_m2, 5000.0, 5000.0 * rounding);
}

TEST(LandOverlay, TriangleAgainstTwoClasses) {
    // Catchment: the triangle (0,0), (100,0), (0,100), area 5000 m2. Land cover split at
    // x = 50: the part x < 50 has area 50 x 100 - 50 x 50 / 2 = 3750 m2, the rest 1250 m2.
    const LandOverlay overlay(
        land_layer({feature(1, rect_wkb(-10, -10, 50, 110), "class", "wood"),
                    feature(2, rect_wkb(50, -10, 110, 110), "class", "roof")}),
        soil_layer({feature(1, rect_wkb(-10, -10, 110, 110), "hsg", "C")}), test_tables(),
        OverlaySettings{});
    const auto r =
        overlay.weight(catchpeak::test::polygon_wkb({{{0, 0}, {100, 0}, {0, 100}}}), "T");
    EXPECT_DOUBLE_EQ(r.area_m2, 5000.0);
    EXPECT_NEAR(find_part(r, "wood", "C")->area_m2, 3750.0, 3750.0 * rounding);
    EXPECT_NEAR(find_part(r, "roof", "C")->area_m2, 1250.0, 1250.0 * rounding);
    // CN = (3750 x 70 + 1250 x 98) / 5000 = 77.0, by hand.
    EXPECT_NEAR(r.weighting.cn_weighted, 77.0, 77.0 * rounding);
}

TEST(LandOverlay, LinesShowThePartsAndTheWeightedSums) {
    const LandOverlay overlay(land_layer({feature(1, rect_wkb(0, 0, 100, 50), "class", "roof"),
                                          feature(2, rect_wkb(0, 50, 100, 100), "class", "grass")}),
                              soil_layer({feature(1, rect_wkb(0, 0, 100, 100), "hsg", "C/D")}),
                              test_tables(), OverlaySettings{});
    const auto r = overlay.weight(rect_wkb(0, 0, 100, 100), "DP2");
    int part_lines = 0;
    const catchpeak::CalcLine *cn_line = nullptr;
    bool dual_note = false;
    bool table_note = false;
    for (const auto &l : r.lines.lines()) {
        if (l.key == "land.part") {
            ++part_lines;
            EXPECT_EQ(catchpeak::test::text(l).unit, "ha");
        }
        if (l.key == "land.cn_composite") {
            cn_line = &l;
        }
        if (l.key == "land.dual_groups_undrained") {
            dual_note = catchpeak::test::text(l).numbers.find("C/D -> D") != std::string::npos;
        }
        if (l.key == "land.cn_table") {
            table_note = catchpeak::test::text(l).numbers == "cn_test.csv (test CN)";
        }
    }
    EXPECT_EQ(part_lines, 2);
    ASSERT_NE(cn_line, nullptr);
    // Undrained: C/D is D. CN = (5000 x 98 + 5000 x 80) / 10000 = 89, by hand.
    EXPECT_NEAR(cn_line->value(), 89.0, 89.0 * rounding);
    EXPECT_EQ(catchpeak::test::text(*cn_line).numbers,
              "CN = (0.5000 x 80.00 + 0.5000 x 98.00) / 1.000");
    EXPECT_NE(catchpeak::test::text(*cn_line).source.find("TR-55"), std::string::npos);
    EXPECT_TRUE(dual_note);
    EXPECT_TRUE(table_note);
}

TEST(LandOverlay, DualGroupsFollowTheDrainedSetting) {
    OverlaySettings s;
    s.drained = true;
    const LandOverlay overlay(land_layer({feature(1, rect_wkb(0, 0, 10, 10), "class", "grass")}),
                              soil_layer({feature(1, rect_wkb(0, 0, 10, 10), "hsg", "a/d")}),
                              test_tables(), s);
    const auto r = overlay.weight(rect_wkb(0, 0, 10, 10), "DP", 0.01);
    ASSERT_EQ(r.weighting.parts.size(), 1u);
    EXPECT_EQ(r.weighting.parts[0].soil_group, "A");
    EXPECT_DOUBLE_EQ(r.weighting.cn_weighted, 40.0); // test table: grass, A
    // Slope 1 % lies in the band below 5 %: C = 0.1 (test table).
    EXPECT_DOUBLE_EQ(r.weighting.c_weighted, 0.1);
    const auto steep = overlay.weight(rect_wkb(0, 0, 10, 10), "DP", 0.08);
    EXPECT_DOUBLE_EQ(steep.weighting.c_weighted, 0.2);
    // No slope for a class with slope bands: refused, naming the class.
    const auto msg = catchpeak::test::input_error_of(
        [&] { (void)overlay.weight(rect_wkb(0, 0, 10, 10), "DP"); });
    EXPECT_NE(msg.find("'grass'"), std::string::npos) << msg;
}

TEST(LandOverlay, PartsAddUpToTheCatchmentForIrregularLayers) {
    // Jittered quadrilateral grids (fixed seed) for both layers and an irregular catchment:
    // the parts must add up to the catchment's GEOS area.
    std::mt19937 rng(12345);
    std::uniform_real_distribution<double> jitter(-0.3, 0.3);
    const auto grid = [&](int n, double cell, const std::vector<std::string> &values,
                          const std::string &field) {
        std::vector<std::vector<std::pair<double, double>>> pts(
            static_cast<std::size_t>(n + 1),
            std::vector<std::pair<double, double>>(static_cast<std::size_t>(n + 1)));
        for (int i = 0; i <= n; ++i) {
            for (int j = 0; j <= n; ++j) {
                const bool edge = i == 0 || j == 0 || i == n || j == n;
                pts[static_cast<std::size_t>(i)][static_cast<std::size_t>(j)] = {
                    (i + (edge ? 0.0 : jitter(rng))) * cell - 10.0,
                    (j + (edge ? 0.0 : jitter(rng))) * cell - 10.0};
            }
        }
        std::vector<catchpeak::io::VectorFeature> fs;
        for (int i = 0; i < n; ++i) {
            for (int j = 0; j < n; ++j) {
                const auto ui = static_cast<std::size_t>(i);
                const auto uj = static_cast<std::size_t>(j);
                fs.push_back(feature(
                    i * n + j,
                    catchpeak::test::polygon_wkb(
                        {{pts[ui][uj], pts[ui + 1][uj], pts[ui + 1][uj + 1], pts[ui][uj + 1]}}),
                    field, values[static_cast<std::size_t>(i * 7 + j * 3) % values.size()]));
            }
        }
        return fs;
    };
    const double size = 220.0;
    const auto land = land_layer(grid(22, size / 22, {"roof", "grass", "wood"}, "class"));
    const auto soils = soil_layer(grid(5, size / 5, {"A", "B", "C", "D", "B/D"}, "hsg"));
    const auto catchment = catchpeak::test::polygon_wkb(
        {{{5, 7}, {150, 3}, {190, 80}, {120, 160}, {60, 120}, {20, 185}, {2, 90}}});
    const LandOverlay overlay(land, soils, test_tables(), OverlaySettings{});
    const auto r = overlay.weight(catchment, "irregular", 0.03);
    // Shoelace area of the catchment, computed by hand from its corners: 22844.5 m2.
    EXPECT_NEAR(r.area_m2, 22844.5, 22844.5 * rounding);
    EXPECT_NEAR(parts_sum(r), r.area_m2, r.area_m2 * 1e-9); // rounding of ~100 intersections
    EXPECT_GE(r.weighting.parts.size(), 6u);
    EXPECT_EQ(r.lines.warning_count(), 0u);
    // The exact coverage check (catchment cut by the land-cover layer first, then by soils)
    // gives the same parts, to the rounding of the intersections.
    OverlaySettings exact;
    exact.exact_coverage_check = true;
    const auto e = LandOverlay(land, soils, test_tables(), exact).weight(catchment, "e", 0.03);
    ASSERT_EQ(e.weighting.parts.size(), r.weighting.parts.size());
    for (std::size_t i = 0; i < e.weighting.parts.size(); ++i) {
        EXPECT_EQ(e.weighting.parts[i].land_class, r.weighting.parts[i].land_class);
        EXPECT_EQ(e.weighting.parts[i].soil_group, r.weighting.parts[i].soil_group);
        EXPECT_NEAR(e.weighting.parts[i].area_m2, r.weighting.parts[i].area_m2, r.area_m2 * 1e-9);
    }
}

TEST(LandOverlay, NestedCatchmentsAreWeightedLocalAndTotal) {
    const LandOverlay overlay(land_layer({feature(1, rect_wkb(0, 0, 70, 100), "class", "grass"),
                                          feature(2, rect_wkb(70, 0, 200, 100), "class", "roof")}),
                              soil_layer({feature(1, rect_wkb(0, 0, 200, 40), "hsg", "A"),
                                          feature(2, rect_wkb(0, 40, 200, 100), "hsg", "D")}),
                              test_tables(), OverlaySettings{});
    const auto upstream = overlay.weight(rect_wkb(0, 0, 100, 100), "DP1", 0.02);
    const auto local = overlay.weight(rect_wkb(100, 0, 200, 100), "DP2 local", 0.02);
    const auto total = overlay.weight(
        catchpeak::test::multipolygon_wkb({rect(0, 0, 100, 100), rect(100, 0, 200, 100)}),
        "DP2 total", 0.02);
    EXPECT_DOUBLE_EQ(total.area_m2, 20000.0);
    // Every part of the total is the sum of that part in the two pieces.
    for (const auto &p : total.weighting.parts) {
        double expected = 0.0;
        for (const auto *piece : {&upstream, &local}) {
            if (const auto *q = find_part(*piece, p.land_class, p.soil_group)) {
                expected += q->area_m2;
            }
        }
        EXPECT_NEAR(p.area_m2, expected, expected * rounding) << p.land_class << p.soil_group;
    }
    // By hand: total CN = (2800 x 40 + 4200 x 80 + 13000 x 98) / 20000 = 86.1
    EXPECT_NEAR(total.weighting.cn_weighted, 86.1, 86.1 * rounding);
}

TEST(LandOverlay, UncoveredPartIsRefusedByDefault) {
    const LandOverlay overlay(land_layer({feature(1, rect_wkb(0, 0, 90, 100), "class", "roof")}),
                              soil_layer({feature(1, rect_wkb(0, 0, 100, 100), "hsg", "B")}),
                              test_tables(), OverlaySettings{});
    const auto msg = catchpeak::test::input_error_of(
        [&] { (void)overlay.weight(rect_wkb(0, 0, 100, 100), "DP4"); });
    EXPECT_NE(msg.find("land.gpkg"), std::string::npos) << msg;
    EXPECT_NE(msg.find("1000 m2 (10.00 % of catchment 'DP4')"), std::string::npos) << msg;
}

TEST(LandOverlay, UncoveredPartTakesTheDefaultClassWithAWarning) {
    OverlaySettings s;
    s.uncovered = Uncovered::use_default;
    s.default_class = "wood";
    s.default_soil_group = "D";
    const LandOverlay overlay(land_layer({feature(1, rect_wkb(0, 0, 90, 100), "class", "roof")}),
                              soil_layer({feature(1, rect_wkb(0, 0, 100, 80), "hsg", "B")}),
                              test_tables(), s);
    const auto r = overlay.weight(rect_wkb(0, 0, 100, 100), "DP4");
    EXPECT_NEAR(r.uncovered_land_cover_m2, 1000.0, 1000.0 * rounding);
    EXPECT_NEAR(r.uncovered_soils_m2, 2000.0, 2000.0 * rounding);
    // By hand: roof B 90 x 80, roof D 90 x 20, wood B 10 x 80, wood D 10 x 20.
    EXPECT_NEAR(find_part(r, "roof", "B")->area_m2, 7200.0, 7200.0 * rounding);
    EXPECT_NEAR(find_part(r, "roof", "D")->area_m2, 1800.0, 1800.0 * rounding);
    EXPECT_NEAR(find_part(r, "wood", "B")->area_m2, 800.0, 800.0 * rounding);
    EXPECT_NEAR(find_part(r, "wood", "D")->area_m2, 200.0, 200.0 * rounding);
    EXPECT_NEAR(parts_sum(r), 10000.0, 10000.0 * rounding);
    EXPECT_EQ(r.lines.warning_count(), 2u);
    EXPECT_TRUE(has_warning_containing(r.lines, "1000 m2 (10.00 % of catchment 'DP4')"));
    EXPECT_TRUE(has_warning_containing(r.lines, "class 'wood'"));
    EXPECT_TRUE(has_warning_containing(r.lines, "2000 m2 (20.00 % of catchment 'DP4')"));
}

TEST(LandOverlay, OverlappingPolygonsAreReportedWithTheirIds) {
    const LandOverlay overlay(
        land_layer({feature(7, rect_wkb(0, 0, 60, 100), "class", "roof"),
                    feature(8, rect_wkb(50, 0, 100, 100), "class", "grass"),
                    // overlaps feature 8 outside the catchment only: not this catchment's concern
                    feature(9, rect_wkb(100, 0, 200, 100), "class", "grass"),
                    feature(10, rect_wkb(90, 50, 150, 60), "class", "wood")}),
        soil_layer({feature(1, rect_wkb(0, 0, 200, 100), "hsg", "B")}), test_tables(),
        OverlaySettings{});
    const auto msg = catchpeak::test::input_error_of(
        [&] { (void)overlay.weight(rect_wkb(0, 0, 90, 100), "DP5"); });
    EXPECT_NE(msg.find("features 7 and 8 (1000 m2)"), std::string::npos) << msg;
    EXPECT_NE(msg.find("land.gpkg"), std::string::npos) << msg;
    EXPECT_EQ(msg.find("feature 9"), std::string::npos) << msg;
    // A gap of the same area as the overlap hides it from the area balance; the exact
    // coverage check still finds it.
    OverlaySettings exact;
    exact.exact_coverage_check = true;
    const LandOverlay hidden(land_layer({feature(1, rect_wkb(0, 0, 60, 100), "class", "roof"),
                                         feature(2, rect_wkb(50, 0, 90, 100), "class", "grass")}),
                             soil_layer({feature(1, rect_wkb(0, 0, 100, 100), "hsg", "B")}),
                             test_tables(), exact);
    const auto msg2 = catchpeak::test::input_error_of(
        [&] { (void)hidden.weight(rect_wkb(0, 0, 100, 100), "DP6"); });
    EXPECT_NE(msg2.find("features 1 and 2"), std::string::npos) << msg2;
}

TEST(LandOverlay, InvalidGeometriesAreMadeValidWithAWarning) {
    OverlaySettings s;
    s.uncovered = Uncovered::use_default;
    s.default_class = "grass";
    // A bow tie: two triangles meeting at (50, 50), 2500 m2 each.
    const LandOverlay overlay(
        land_layer(
            {feature(3, catchpeak::test::polygon_wkb({{{0, 0}, {100, 100}, {100, 0}, {0, 100}}}),
                     "class", "roof")}),
        soil_layer({feature(1, rect_wkb(0, 0, 100, 100), "hsg", "C")}), test_tables(), s);
    ASSERT_EQ(overlay.layer_warnings().warning_count(), 1u);
    EXPECT_NE(catchpeak::test::text(overlay.layer_warnings().lines()[0]).numbers.find("feature 3"),
              std::string::npos);
    const auto r = overlay.weight(rect_wkb(0, 0, 100, 100), "DP7", 0.01);
    EXPECT_NEAR(find_part(r, "roof", "C")->area_m2, 5000.0, 5000.0 * rounding);
    EXPECT_NEAR(find_part(r, "grass", "C")->area_m2, 5000.0, 5000.0 * rounding);
    EXPECT_TRUE(has_warning_containing(r.lines, "feature 3 was invalid"));
    // A polygon that collapses to a line has no area left: it is kept out, with a warning.
    const LandOverlay collapsed(
        land_layer({feature(1, rect_wkb(0, 0, 100, 100), "class", "grass"),
                    feature(2, catchpeak::test::polygon_wkb({{{0, 0}, {50, 50}, {100, 100}}}),
                            "class", "roof")}),
        soil_layer({feature(1, rect_wkb(0, 0, 100, 100), "hsg", "C")}), test_tables(),
        OverlaySettings{});
    EXPECT_EQ(collapsed.layer_warnings().warning_count(), 1u);
    const auto c = collapsed.weight(rect_wkb(0, 0, 100, 100), "DP7b", 0.01);
    ASSERT_EQ(c.weighting.parts.size(), 1u);
    EXPECT_EQ(c.weighting.parts[0].land_class, "grass");
    // An invalid catchment is made valid too, with a warning.
    const auto bowtie = overlay.weight(
        catchpeak::test::polygon_wkb({{{0, 0}, {100, 100}, {100, 0}, {0, 100}}}), "DP8", 0.01);
    EXPECT_NEAR(bowtie.area_m2, 5000.0, 5000.0 * rounding);
    EXPECT_TRUE(has_warning_containing(bowtie.lines, "catchment 'DP8'"));
}

TEST(LandOverlay, ClassMissingFromATableIsBadInput) {
    const LandOverlay overlay(
        land_layer({feature(4, rect_wkb(0, 0, 100, 100), "class", "glacier")}),
        soil_layer({feature(1, rect_wkb(0, 0, 100, 100), "hsg", "B")}), test_tables(),
        OverlaySettings{});
    const auto msg = catchpeak::test::input_error_of(
        [&] { (void)overlay.weight(rect_wkb(0, 0, 100, 100), "DP9"); });
    EXPECT_NE(msg.find("'glacier'"), std::string::npos) << msg;
    EXPECT_NE(msg.find("c_test.csv"), std::string::npos) << msg;
    EXPECT_NE(msg.find("feature 4"), std::string::npos) << msg;
    // Without a C table, the CN table is the one that misses it.
    auto tables = test_tables();
    tables.c.reset();
    const LandOverlay no_c(land_layer({feature(4, rect_wkb(0, 0, 100, 100), "class", "glacier")}),
                           soil_layer({feature(1, rect_wkb(0, 0, 100, 100), "hsg", "B")}),
                           std::move(tables), OverlaySettings{});
    const auto msg2 = catchpeak::test::input_error_of(
        [&] { (void)no_c.weight(rect_wkb(0, 0, 100, 100), "DP9"); });
    EXPECT_NE(msg2.find("cn_test.csv"), std::string::npos) << msg2;
}

TEST(LandOverlay, OmittedTableGivesNoValue) {
    auto tables = test_tables();
    tables.c.reset();
    const LandOverlay overlay(land_layer({feature(1, rect_wkb(0, 0, 10, 10), "class", "roof")}),
                              soil_layer({feature(1, rect_wkb(0, 0, 10, 10), "hsg", "A")}),
                              std::move(tables), OverlaySettings{});
    const auto r = overlay.weight(rect_wkb(0, 0, 10, 10), "DP");
    EXPECT_TRUE(std::isnan(r.weighting.c_weighted));
    EXPECT_TRUE(r.weighting.c_table.empty());
    EXPECT_DOUBLE_EQ(r.weighting.cn_weighted, 98.0);
}

TEST(LandOverlay, BadLayersAreRefusedWithTheFeatureId) {
    const auto tables = test_tables();
    auto msg = catchpeak::test::input_error_of([&] {
        LandOverlay o(land_layer({feature(5, rect_wkb(0, 0, 1, 1), "landuse", "roof")}),
                      soil_layer({}), tables, OverlaySettings{});
    });
    EXPECT_NE(msg.find("land.gpkg: feature 5"), std::string::npos) << msg;
    EXPECT_NE(msg.find("no field 'class'"), std::string::npos) << msg;
    EXPECT_NE(msg.find("landuse"), std::string::npos) << msg;
    msg = catchpeak::test::input_error_of([&] {
        LandOverlay o(land_layer({}), soil_layer({feature(6, rect_wkb(0, 0, 1, 1), "hsg", "E")}),
                      tables, OverlaySettings{});
    });
    EXPECT_NE(msg.find("soils.gpkg: feature 6"), std::string::npos) << msg;
    msg = catchpeak::test::input_error_of([&] {
        LandOverlay o(land_layer({feature(2, {1, 2, 3}, "class", "roof")}), soil_layer({}), tables,
                      OverlaySettings{});
    });
    EXPECT_NE(msg.find("land.gpkg: feature 2: the geometry cannot be read"), std::string::npos)
        << msg;
    OverlaySettings s;
    s.uncovered = Uncovered::use_default;
    msg = catchpeak::test::input_error_of(
        [&] { LandOverlay o(land_layer({}), soil_layer({}), tables, s); });
    EXPECT_NE(msg.find("no default class"), std::string::npos) << msg;
}

TEST(LandOverlay, UsCustomarySheetShowsAcres) {
    OverlaySettings s;
    s.units = catchpeak::units::System::us_customary;
    const double side_m = std::sqrt(catchpeak::units::m2_per_acre); // a square of one acre
    const LandOverlay overlay(
        land_layer({feature(1, rect_wkb(0, 0, side_m, side_m), "class", "roof")}),
        soil_layer({feature(1, rect_wkb(0, 0, side_m, side_m), "hsg", "A")}), test_tables(), s);
    const auto r = overlay.weight(rect_wkb(0, 0, side_m, side_m), "DP");
    const auto &first = r.lines.lines().front();
    EXPECT_EQ(catchpeak::test::text(first).unit, "ac");
    EXPECT_NEAR(first.value(), 1.0, 1e-12); // 1 acre = 4046.8564224 m2 exactly; sqrt rounding
}
