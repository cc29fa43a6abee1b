// SPDX-License-Identifier: MIT
#include "../../src/report/internal/sheet_map.hpp"

#include "report/sample_results.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>

namespace catchpeak::report {
namespace {

// Projections are a few products and sums of metres and points; they agree to far below a
// thousandth of a point.
constexpr double pt_tol = 1e-9;

/// A rectangular catchment from (x0, y0) to (x1, y1), metres, with the design point inside.
MapData box_map(double x0, double y0, double x1, double y1) {
    MapData m;
    m.catchment.push_back({{{x0, y0}, {x1, y0}, {x1, y1}, {x0, y1}, {x0, y0}}});
    m.longest_flow_path = {{x0 + 10.0, y0 + 10.0}, {x1 - 10.0, y1 - 10.0}};
    m.given_xy = {x0 + 20.0, y0 + 20.0};
    m.snapped_xy = {x0 + 21.0, y0 + 20.0};
    return m;
}

TEST(SheetMap, FrameOfTheSameShapeShowsTheCatchmentPaddedByEightPercentASide) {
    // 400 m x 200 m in a 300 pt x 150 pt frame: the same shape, so the padded extent, 1.08 x
    // 400 m = 432 m, spans the width: 300/432 pt per metre.
    const auto f = fit_map_frame(box_map(1000.0, 2000.0, 1400.0, 2200.0), 50.0, 80.0, 300.0, 150.0);
    ASSERT_TRUE(f.has_value());
    EXPECT_NEAR(f->scale, 300.0 / 432.0, 1e-12);
    EXPECT_NEAR(f->px(1000.0), 50.0 + 16.0 * 300.0 / 432.0, pt_tol); // 16 m of padding
    EXPECT_NEAR(f->px(1400.0), 50.0 + 300.0 - 16.0 * 300.0 / 432.0, pt_tol);
    // North up: the northern edge (y = 2200) is 8 m below the top of the frame.
    EXPECT_NEAR(f->py(2200.0), 80.0 + 8.0 * 300.0 / 432.0, pt_tol);
    EXPECT_NEAR(f->py(2000.0), 80.0 + 150.0 - 8.0 * 300.0 / 432.0, pt_tol);
    // The catchment's centre is the frame's centre.
    EXPECT_NEAR(f->px(1200.0), 50.0 + 150.0, pt_tol);
    EXPECT_NEAR(f->py(2100.0), 80.0 + 75.0, pt_tol);
}

TEST(SheetMap, WiderFrameKeepsOneScaleForBothAxes) {
    // 400 m x 200 m in a 400 pt x 100 pt frame: the height governs, 1.08 x 200 m = 216 m over
    // 100 pt, and the world is widened to 864 m.
    const auto f = fit_map_frame(box_map(0.0, 0.0, 400.0, 200.0), 0.0, 0.0, 400.0, 100.0);
    ASSERT_TRUE(f.has_value());
    EXPECT_NEAR(f->scale, 100.0 / 216.0, 1e-12);
    EXPECT_NEAR(f->world.max_x - f->world.min_x, 864.0, 1e-9);
    EXPECT_NEAR((f->px(400.0) - f->px(0.0)) / 400.0, (f->py(0.0) - f->py(200.0)) / 200.0, 1e-12);
    EXPECT_NEAR(f->py(200.0), 8.0 * 100.0 / 216.0, pt_tol);
}

TEST(SheetMap, MapWithoutAreaFallsBackToTheHillshadeExtent) {
    MapData m;
    m.given_xy = {500.0, 500.0};
    m.snapped_xy = {500.0, 500.0};
    m.hillshade_min_x = 0.0;
    m.hillshade_min_y = 0.0;
    m.hillshade_max_x = 1000.0;
    m.hillshade_max_y = 1000.0;
    const auto f = fit_map_frame(m, 0.0, 0.0, 100.0, 100.0);
    ASSERT_TRUE(f.has_value());
    EXPECT_NEAR(f->world.max_x - f->world.min_x, 1080.0, 1e-9);
    EXPECT_NEAR(f->px(500.0), 50.0, pt_tol);
}

TEST(SheetMap, MapWithNothingToShowGivesNoFrame) {
    MapData m;
    const double nan = std::numeric_limits<double>::quiet_NaN();
    m.given_xy = {nan, nan};
    m.snapped_xy = {nan, nan};
    m.hillshade_min_x = m.hillshade_min_y = m.hillshade_max_x = m.hillshade_max_y = nan;
    EXPECT_FALSE(fit_map_frame(m, 0.0, 0.0, 100.0, 100.0).has_value());
}

TEST(SheetMap, ScaleBarIsAboutAQuarterOfTheFrameInANiceLength) {
    // 2160 m / 4 = 540 m -> 500 m.
    auto b = scale_bar_for(2160.0, units::System::si);
    EXPECT_DOUBLE_EQ(b.length_m, 500.0);
    EXPECT_EQ(b.label, "500 m");
    // 8000 m / 4 = 2000 m -> 2 km.
    b = scale_bar_for(8000.0, units::System::si);
    EXPECT_DOUBLE_EQ(b.length_m, 2000.0);
    EXPECT_EQ(b.label, "2 km");
    // 3000 m = 9842.5 ft (1 ft = 0.3048 m exactly); a quarter, 2460.6 ft -> 2000 ft.
    b = scale_bar_for(3000.0, units::System::us_customary);
    EXPECT_NEAR(b.length_m, 2000.0 * 0.3048, 1e-9);
    EXPECT_EQ(b.label, "2000 ft");
    // 40 km = 24.85 mi (1 mi = 5280 ft); a quarter, 6.21 mi -> 5 mi.
    b = scale_bar_for(40000.0, units::System::us_customary);
    EXPECT_NEAR(b.length_m, 5.0 * 5280.0 * 0.3048, 1e-9);
    EXPECT_EQ(b.label, "5 mi");
}

TEST(SheetMap, GridStepIsANiceNumberOfTheCrsUnit) {
    // US survey foot: 1200/3937 m exactly (NIST SP 811). A frame 4000 ftUS wide: steps of
    // 1000 ftUS.
    constexpr double ft_us = 1200.0 / 3937.0;
    MapFrame f;
    f.world.min_x = 0.0;
    f.world.max_x = 4000.0 * ft_us;
    EXPECT_NEAR(grid_step_m(f, ft_us), 1000.0 * ft_us, 1e-9);
    EXPECT_NEAR(grid_step_m(f, 1.0), 200.0, 1e-9); // 1219 m / 4 = 305 m -> 200 m
}

TEST(SheetMap, UnitNamesInThePlural) {
    EXPECT_EQ(plural_unit("metre"), "metres");
    EXPECT_EQ(plural_unit("US survey foot"), "US survey feet");
    EXPECT_EQ(plural_unit("foot"), "feet");
    EXPECT_EQ(plural_unit(""), "metres");
}

TEST(SheetMap, BlockTakesItsHeightOrStartsANewPage) {
    PageLayout page(PageSize::a4);
    page.new_page("Design point DP1");
    const auto m = test::sample_map(612000.0, 3804000.0, 200.0, true);
    const double y0 = page.y();
    draw_map_block(page, m, "DP1", units::System::si);
    EXPECT_DOUBLE_EQ(page.y(), y0 + style::map_block_h_pt + style::map_gap_after_pt);
    double x = 0.0, y = 0.0, w = 0.0, h = 0.0;
    cairo_recording_surface_ink_extents(page.page_surface(0), &x, &y, &w, &h);
    EXPECT_GE(y, y0 - 1.0); // 1 pt: stroke width of the frame's edge
    EXPECT_LE(y + h, page.y() + 1.0);
    EXPECT_GT(w, 0.8 * page.content_w()); // map and legend across the width
    // Too little room left: the block goes to the next page.
    page.set_y(page.bottom() - 0.5 * style::map_block_h_pt);
    draw_map_block(page, m, "DP1", units::System::si);
    EXPECT_EQ(page.page_count(), 2u);
    EXPECT_DOUBLE_EQ(page.y(), page.top() + style::map_block_h_pt + style::map_gap_after_pt);
}

} // namespace
} // namespace catchpeak::report
