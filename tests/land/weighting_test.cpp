// SPDX-License-Identifier: MIT
// land::weight_parts: the weighting of parts with areas. Every expected value below is computed
// by hand in the test from the small tables of our own (test_tables), not taken from a run.
#include "catchpeak/core/csv.hpp"
#include "catchpeak/core/error.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/land/overlay.hpp"
#include "catchpeak/land/weighting.hpp"
#include "support/calc_lines.hpp"
#include "support/input_error.hpp"
#include "support/wkb.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <set>
#include <string>
#include <vector>

using catchpeak::LineKind;
using catchpeak::parse_csv;
using namespace catchpeak::land;
using catchpeak::test::line_keyed;
using catchpeak::test::line_labelled;
namespace units = catchpeak::units;

namespace {

// The weighted values are sums of a few products divided by a sum: exact up to the rounding of
// those operations, relative 1e-12 (not an approximation).
constexpr double rounding = 1e-12;

LandTables test_tables() {
    LandTables t;
    t.c = RunoffCoefficientTable::from_csv(
        parse_csv("# name: test C\n"
                  "class,soil_group,slope_min_percent,slope_max_percent,c\n"
                  "roof,any,,,0.9\n"
                  "lawn,A,,5,0.1\n"
                  "lawn,A,5,,0.2\n"
                  "lawn,B,,,0.15\n"
                  "lawn,C,,,0.2\n"
                  "lawn,D,,,0.3\n",
                  "c_test.csv"));
    t.cn = CurveNumberTable::from_csv(parse_csv("# name: test CN\n"
                                                "class,A,B,C,D\n"
                                                "roof,98,98,98,98\n"
                                                "lawn,40,60,70,80\n",
                                                "cn_test.csv"));
    t.impervious = ImperviousShareTable::from_csv(parse_csv("class,impervious_percent\n"
                                                            "roof,100\n"
                                                            "lawn,0\n",
                                                            "imp_test.csv"));
    return t;
}

PartsContext context(double area_m2) {
    PartsContext c;
    c.label = "IN-1";
    c.catchment_area_m2 = area_m2;
    c.parts_source = "project input (land.csv)";
    c.area_check_source = "project input (catchments.csv)";
    c.slope_percent = 2.0;
    c.slope_text = "slope of the longest flow path";
    c.slope_source = "project input";
    c.units = units::System::us_customary;
    return c;
}

} // namespace

// 0.8 ac of roof on soil C and 1.2 ac of lawn on soil B (the example of an inlet catchment):
// by hand, C = (0.8 x 0.9 + 1.2 x 0.15) / 2.0 = (0.72 + 0.18) / 2.0 = 0.45;
// CN = (0.8 x 98 + 1.2 x 60) / 2.0 = (78.4 + 72) / 2.0 = 75.2;
// impervious share = (0.8 x 1 + 1.2 x 0) / 2.0 = 0.4.
TEST(WeightParts, RoofAndLawnByHand) {
    const double ac = units::m2_per_acre;
    const auto r = weight_parts({{"roof", SoilGroup::c, 0.8 * ac, "land.csv, line 2"},
                                 {"lawn", SoilGroup::b, 1.2 * ac, "land.csv, line 3"}},
                                test_tables(), context(2.0 * ac));
    const auto &w = r.weighting;
    EXPECT_NEAR(w.c_weighted, 0.45, 0.45 * rounding);
    EXPECT_NEAR(w.cn_weighted, 75.2, 75.2 * rounding);
    EXPECT_NEAR(w.impervious_share, 0.4, 0.4 * rounding);
    // Parts sorted by class then group: lawn before roof.
    ASSERT_EQ(w.parts.size(), 2u);
    EXPECT_EQ(w.parts[0].land_class, "lawn");
    EXPECT_EQ(w.parts[0].soil_group, "B");
    EXPECT_EQ(w.parts[0].c, 0.15);
    EXPECT_EQ(w.parts[1].cn, 98.0);
    EXPECT_EQ(w.c_table, "c_test.csv (test C)");
    // The lines: the parts in acres (US sheet), then the weighted values with their terms.
    const auto &cl = line_keyed(r.lines, "land.c_weighted");
    EXPECT_EQ(catchpeak::test::text(cl).label, "Runoff coefficient, area-weighted");
    EXPECT_EQ(catchpeak::test::text(cl).symbols, "C = sum(Ai Ci) / sum(Ai)");
    EXPECT_EQ(catchpeak::test::text(cl).numbers, "C = (1.200 x 0.1500 + 0.8000 x 0.9000) / 2.000");
    const auto &cnl = line_keyed(r.lines, "land.cn_composite");
    EXPECT_EQ(catchpeak::test::text(cnl).label, "Curve number, composite (area-weighted)");
    EXPECT_EQ(catchpeak::test::text(cnl).numbers, "CN = (1.200 x 60.00 + 0.8000 x 98.00) / 2.000");
    const auto *part = line_labelled(r.lines, "Part 2: roof, soil group C");
    ASSERT_NE(part, nullptr);
    EXPECT_EQ(catchpeak::test::text(*part).unit, "ac");
    EXPECT_NEAR(part->value(), 0.8, 0.8 * rounding);
    EXPECT_EQ(catchpeak::test::text(*part).source, "project input (land.csv)");
    // No area line asked for, and the parts add up: no warning.
    EXPECT_EQ(r.lines.warning_count(), 0u);
    EXPECT_FALSE(r.lines.has("land.slope")); // no band used
}

// Two parts of one class and group add into one part; a lawn on soil A uses the slope band.
// By hand: lawn A at 2 % slope has C = 0.1 (band below 5 %); the parts 1000 + 3000 m2 of lawn A
// make one part of 4000 m2; with 4000 m2 of roof: C = (4000 x 0.1 + 4000 x 0.9) / 8000 = 0.5.
TEST(WeightParts, SamePartsAddAndSlopeBandsUseTheGivenSlope) {
    auto ctx = context(8000.0);
    ctx.units = units::System::si;
    const auto r = weight_parts({{"lawn", SoilGroup::a, 1000.0, "a"},
                                 {"roof", SoilGroup::d, 4000.0, "b"},
                                 {"lawn", SoilGroup::a, 3000.0, "c"}},
                                test_tables(), ctx);
    ASSERT_EQ(r.weighting.parts.size(), 2u);
    EXPECT_EQ(r.weighting.parts[0].area_m2, 4000.0);
    EXPECT_NEAR(r.weighting.c_weighted, 0.5, 0.5 * rounding);
    const auto &slope = line_keyed(r.lines, "land.slope");
    EXPECT_EQ(catchpeak::test::text(slope).label, "Slope for the C slope bands");
    EXPECT_EQ(slope.value(), 2.0);
    EXPECT_EQ(catchpeak::test::text(slope).numbers, "slope of the longest flow path");
}

// Parts that do not add up to the catchment: a warning line with both sums; the weighting
// divides by the parts' sum. By hand: 0.3 ha roof + 0.69 ha lawn B = 0.99 ha; C = (0.3 x 0.9 +
// 0.69 x 0.15) / 0.99 = (0.27 + 0.1035) / 0.99 = 0.377272...
TEST(WeightParts, PartsThatDoNotAddUpGiveAWarningLine) {
    auto ctx = context(10000.0);
    ctx.units = units::System::si;
    const auto r =
        weight_parts({{"roof", SoilGroup::b, 3000.0, "a"}, {"lawn", SoilGroup::b, 6900.0, "b"}},
                     test_tables(), ctx);
    EXPECT_NEAR(r.weighting.c_weighted, 0.3735 / 0.99, 0.38 * rounding);
    ASSERT_EQ(r.lines.warning_count(), 1u);
    const auto &w = line_keyed(r.lines, "land.area_check");
    EXPECT_EQ(catchpeak::test::text(w).label, "Parts do not add up to the catchment");
    EXPECT_EQ(w.kind, LineKind::warning);
    EXPECT_NE(catchpeak::test::text(w).numbers.find(
                  "the parts add up to 0.9900 ha, the catchment is 1.000 ha"),
              std::string::npos)
        << catchpeak::test::text(w).numbers;
    EXPECT_EQ(catchpeak::test::text(w).source, "project input (catchments.csv)");
}

// Without a C table, C is NaN and no C lines are written; the CN is still weighted.
TEST(WeightParts, ATableNotGivenLeavesItsValueOut) {
    auto tables = test_tables();
    tables.c.reset();
    const auto r = weight_parts({{"roof", SoilGroup::b, 100.0, "a"}}, tables, context(100.0));
    EXPECT_TRUE(std::isnan(r.weighting.c_weighted));
    EXPECT_EQ(r.weighting.cn_weighted, 98.0);
    EXPECT_FALSE(r.lines.has("land.c_weighted"));
    EXPECT_FALSE(r.lines.has("land.c_table"));
    EXPECT_TRUE(r.lines.has("land.cn_composite"));
}

TEST(WeightParts, AClassMissingFromATableNamesTheTableThePartAndTheCatchment) {
    const std::string msg = catchpeak::test::input_error_of([] {
        (void)weight_parts({{"gravel", SoilGroup::b, 100.0, "land.csv, line 7"}}, test_tables(),
                           context(100.0));
    });
    EXPECT_NE(msg.find("c_test.csv (test C)"), std::string::npos) << msg;
    EXPECT_NE(msg.find("'gravel' (land.csv, line 7, in catchment 'IN-1')"), std::string::npos)
        << msg;
}

TEST(WeightParts, NoPartsOrANonPositiveAreaIsRefused) {
    EXPECT_THROW((void)weight_parts({}, test_tables(), context(100.0)), catchpeak::InputError);
    const std::string msg = catchpeak::test::input_error_of([] {
        (void)weight_parts({{"roof", SoilGroup::b, 0.0, "land.csv, line 3"}}, test_tables(),
                           context(100.0));
    });
    EXPECT_NE(msg.find("land.csv, line 3"), std::string::npos) << msg;
}

// The overlay of polygons and the weighting of the same parts given as areas give the same
// weighting and the same part and weighted lines: one implementation behind both. The
// catchment is a 100 x 100 m square: roof on its west 40 m (soil C), lawn on the rest (soil B).
TEST(WeightParts, TheOverlayGivesTheSameWeightingAsItsPartsGivenAsAreas) {
    using catchpeak::test::feature;
    using catchpeak::test::rect_wkb;
    OverlaySettings s;
    s.units = units::System::us_customary;
    const LandOverlay overlay({"land.gpkg",
                               "",
                               {feature(1, rect_wkb(-10, -10, 40, 110), "class", "roof"),
                                feature(2, rect_wkb(40, -10, 110, 110), "class", "lawn")}},
                              {"soils.gpkg",
                               "",
                               {feature(1, rect_wkb(-10, -10, 40, 110), "hsg", "C"),
                                feature(2, rect_wkb(40, -10, 110, 110), "hsg", "B")}},
                              test_tables(), s);
    const auto by_overlay = overlay.weight(rect_wkb(0, 0, 100, 100), "IN-1", 0.02);
    const auto by_areas =
        weight_parts({{"roof", SoilGroup::c, 4000.0, "a"}, {"lawn", SoilGroup::b, 6000.0, "b"}},
                     test_tables(), context(10000.0));
    EXPECT_EQ(by_overlay.weighting.c_weighted, by_areas.weighting.c_weighted);
    EXPECT_EQ(by_overlay.weighting.cn_weighted, by_areas.weighting.cn_weighted);
    EXPECT_EQ(by_overlay.weighting.impervious_share, by_areas.weighting.impervious_share);
    ASSERT_EQ(by_overlay.weighting.parts.size(), by_areas.weighting.parts.size());
    for (std::size_t i = 0; i < by_areas.weighting.parts.size(); ++i) {
        EXPECT_EQ(by_overlay.weighting.parts[i].land_class, by_areas.weighting.parts[i].land_class);
        EXPECT_EQ(by_overlay.weighting.parts[i].area_m2, by_areas.weighting.parts[i].area_m2);
    }
    // Every part and weighted line of the areas appears with the same text in the overlay's.
    std::size_t compared = 0;
    for (const auto &l : by_areas.lines.lines()) {
        if (l.kind != LineKind::calculation) {
            continue;
        }
        const auto *o = line_labelled(by_overlay.lines, catchpeak::test::text(l).label);
        ASSERT_NE(o, nullptr) << catchpeak::test::text(l).label;
        EXPECT_EQ(catchpeak::test::text(*o).symbols, catchpeak::test::text(l).symbols);
        EXPECT_EQ(catchpeak::test::text(*o).numbers, catchpeak::test::text(l).numbers);
        EXPECT_EQ(o->value(), l.value());
        EXPECT_EQ(catchpeak::test::text(*o).unit, catchpeak::test::text(l).unit);
        ++compared;
    }
    EXPECT_EQ(compared, 5u); // two parts, C, CN, impervious share
}

// Issue 17: a land part of 1 m2 (0.0002471 ac) was listed as a part of a 12.68-ac catchment.
// Parts below the minimum area are added to the largest part, in a line that says so. By hand:
// 12.68 ac = 51 314.2 m2; roof 20 000 m2 on C, lawn on B the rest less 1 m2, lawn on D 1 m2
// (below 10 m2): merged into lawn B, so C = (20 000 x 0.9 + 31 314.2 x 0.15) / 51 314.2.
TEST(WeightParts, PartsBelowTheMinimumAreaJoinTheLargestPart) {
    const double total_m2 = 12.68 * units::m2_per_acre;
    const double roof_m2 = 20000.0;
    const double lawn_m2 = total_m2 - roof_m2 - 1.0;
    auto ctx = context(total_m2);
    ctx.min_part_area_m2 = 10.0;
    const auto r = weight_parts({{"roof", SoilGroup::c, roof_m2, "land.gpkg, feature 1"},
                                 {"lawn", SoilGroup::b, lawn_m2, "land.gpkg, feature 2"},
                                 {"lawn", SoilGroup::d, 1.0, "land.gpkg, feature 3"}},
                                test_tables(), ctx);
    const auto &w = r.weighting;
    ASSERT_EQ(w.parts.size(), 2u);
    EXPECT_EQ(w.parts[0].land_class, "lawn");
    EXPECT_EQ(w.parts[0].soil_group, "B");
    EXPECT_NEAR(w.parts[0].area_m2, lawn_m2 + 1.0, (lawn_m2 + 1.0) * rounding);
    const double c = (roof_m2 * 0.9 + (lawn_m2 + 1.0) * 0.15) / total_m2;
    EXPECT_NEAR(w.c_weighted, c, c * rounding);
    const auto t = catchpeak::test::text(line_keyed(r.lines, "land.parts_merged"));
    EXPECT_NE(t.numbers.find("lawn, soil group D: 0.0002471 ac added to lawn, soil group B"),
              std::string::npos)
        << t.numbers;
    EXPECT_NE(t.numbers.find("parts below 0.002471 ac"), std::string::npos) << t.numbers;
    EXPECT_NE(t.source.find("min_land_part_m2"), std::string::npos) << t.source;
    // Without a minimum the 1 m2 part stays a part, and no line says anything was merged.
    ctx.min_part_area_m2 = 0.0;
    const auto kept = weight_parts({{"roof", SoilGroup::c, roof_m2, "a"},
                                    {"lawn", SoilGroup::b, lawn_m2, "b"},
                                    {"lawn", SoilGroup::d, 1.0, "c"}},
                                   test_tables(), ctx);
    EXPECT_EQ(kept.weighting.parts.size(), 3u);
    EXPECT_FALSE(kept.lines.has("land.parts_merged"));
}

// Every line a weighting writes, on both sheets, renders without a template error
// (report::text_of throws std::logic_error on a placeholder the line does not fill) and leaves
// no brace in its text. Together the cases below write every kind of line of the module: the
// parts given as areas (a slope band, dual groups both ways, parts that do not add up, a source
// with placeholders) and an overlay (invalid polygons made valid, both layers short of the
// catchment).
TEST(WeightParts, EveryLineRendersInBothUnitSystems) {
    using catchpeak::test::polygon_wkb;
    const std::set<std::string> every_key{"land.c_table",
                                          "land.cn_table",
                                          "land.impervious_table",
                                          "land.dual_groups_drained",
                                          "land.dual_groups_undrained",
                                          "land.slope",
                                          "land.area_check",
                                          "land.parts_merged",
                                          "land.part",
                                          "land.c_weighted",
                                          "land.cn_composite",
                                          "land.impervious_weighted",
                                          "land.polygon_area",
                                          "land.layers_overlaid",
                                          "land.feature_made_valid",
                                          "land.catchment_made_valid",
                                          "land.overlaid_feature_made_valid",
                                          "land.soils_uncovered",
                                          "land.land_cover_uncovered"};
    for (const auto system : {units::System::si, units::System::us_customary}) {
        std::vector<catchpeak::CalcLines> all;
        for (const bool drained : {false, true}) {
            auto ctx = context(10000.0);
            ctx.units = system;
            ctx.dual_groups = {{"B/D", "B"}, {"C/D", "C"}};
            ctx.drained = drained;
            ctx.parts_source = LineSource{
                catchpeak::Ref::project_input,
                " ({file}, lines {first} to {last})",
                {catchpeak::word("file", "land.csv"),
                 catchpeak::qty("first", 2.0, catchpeak::Unit::none, catchpeak::Shown::integer()),
                 catchpeak::qty("last", 3.0, catchpeak::Unit::none, catchpeak::Shown::integer())}};
            ctx.min_part_area_m2 = 10.0;
            all.push_back(weight_parts({{"lawn", SoilGroup::a, 3000.0, "a"},
                                        {"roof", SoilGroup::d, 6900.0, "b"},
                                        {"lawn", SoilGroup::c, 0.5, "c"}},
                                       test_tables(), ctx)
                              .lines);
        }
        OverlaySettings s;
        s.units = system;
        s.uncovered = Uncovered::use_default;
        s.default_class = "lawn";
        // Bow ties (two triangles meeting at their centre) are invalid and made valid.
        const LandOverlay overlay(
            {"land.gpkg",
             "",
             {catchpeak::test::feature(3, polygon_wkb({{{0, 0}, {50, 50}, {50, 0}, {0, 50}}}),
                                       "class", "roof")}},
            {"soils.gpkg",
             "",
             {catchpeak::test::feature(1, catchpeak::test::rect_wkb(-10, -10, 110, 60), "hsg",
                                       "C/D")}},
            test_tables(), s);
        all.push_back(overlay.layer_warnings());
        all.push_back(
            overlay.weight(polygon_wkb({{{0, 0}, {100, 100}, {100, 0}, {0, 100}}}), "DP1", 0.01)
                .lines);
        std::set<std::string> keys;
        for (const auto &lines : all) {
            for (const auto &l : lines.lines()) {
                keys.insert(l.key);
                catchpeak::LineText t;
                ASSERT_NO_THROW(t = catchpeak::test::text(l)) << l.key;
                for (const std::string *part : {&t.label, &t.symbols, &t.numbers, &t.source}) {
                    EXPECT_EQ(part->find_first_of("{}"), std::string::npos)
                        << l.key << ": " << *part;
                }
                EXPECT_FALSE(t.label.empty()) << l.key;
            }
        }
        EXPECT_EQ(keys, every_key);
    }
}
