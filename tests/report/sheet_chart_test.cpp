// SPDX-License-Identifier: MIT
#include "../../src/report/internal/sheet_chart.hpp"

#include <gtest/gtest.h>

namespace catchpeak::report {
namespace {

// Axis values are nice steps (through pow and log10) times small integers: equal to the
// decimal values within a few units in the last place.
constexpr double rel = 1e-12;

TEST(SheetChart, FlowAxisReachesAboveThePeakInNiceSteps) {
    // 12.3 / 4 = 3.075 -> steps of 2; 12.3 x 1.08 = 13.28 -> up to 14.
    const auto a = flow_axis(12.3);
    EXPECT_NEAR(a.step, 2.0, 2.0 * rel);
    EXPECT_NEAR(a.max, 14.0, 14.0 * rel);
    // 100 x 1.08 = 108, steps of 20 (100 / 4 = 25 -> 20): up to 120.
    EXPECT_NEAR(flow_axis(100.0).max, 120.0, 120.0 * rel);
    // No flow: one step.
    EXPECT_GT(flow_axis(0.0).max, 0.0);
}

TEST(SheetChart, RainAxisHasAboutTwoSteps) {
    // 1.3 / 2 = 0.65 -> steps of 0.5, up to 1.5.
    const auto a = rain_axis(1.3);
    EXPECT_NEAR(a.step, 0.5, 0.5 * rel);
    EXPECT_NEAR(a.max, 1.5, 1.5 * rel);
}

TEST(SheetChart, TimeAxisInMinutesOrHours) {
    // 25 steps of 5 min = 125 min: minutes; 125 / 8 = 15.6 -> ticks every 20 min.
    auto t = time_axis(300.0, 25);
    EXPECT_FALSE(t.hours);
    EXPECT_DOUBLE_EQ(t.end, 125.0);
    EXPECT_DOUBLE_EQ(t.bar_min, 5.0);
    EXPECT_NEAR(t.step, 20.0, 20.0 * rel);
    // 144 steps of 10 min = 24 h: hours; 24 / 8 = 3 -> ticks every 2 h.
    t = time_axis(600.0, 144);
    EXPECT_TRUE(t.hours);
    EXPECT_DOUBLE_EQ(t.unit_min, 60.0);
    EXPECT_DOUBLE_EQ(t.end, 24.0);
    EXPECT_NEAR(t.step, 2.0, 2.0 * rel);
}

Hydrograph sample_hydrograph() {
    Hydrograph hg;
    hg.step_s = 600.0;
    hg.q_m3_s = {0.0, 0.2, 0.6, 1.0, 0.7, 0.3, 0.1, 0.0};
    hg.rain_mm = {2.0, 5.0, 24.0, 4.0, 1.0, 0.0, 0.0, 0.0};
    hg.excess_mm = {0.0, 1.0, 15.0, 3.0, 0.5, 0.0, 0.0, 0.0};
    return hg;
}

TEST(SheetChart, ScalesAreInTheSheetsUnits) {
    const auto hg = sample_hydrograph();
    const auto si = chart_scales(hg, units::System::si);
    EXPECT_EQ(si.k_max, 3u);
    EXPECT_DOUBLE_EQ(si.q_max, 1.0);
    EXPECT_NEAR(si.rain.max, 30.0, 30.0 * rel); // 24 mm / 2 -> steps of 10, up to 30 mm
    EXPECT_DOUBLE_EQ(si.time.end, 80.0);        // 8 steps of 10 min
    // 1 m3/s = 35.31 cfs and 24 mm = 0.945 in (1 ft = 0.3048 m, 1 in = 25.4 mm exactly).
    const auto us = chart_scales(hg, units::System::us_customary);
    EXPECT_EQ(us.k_max, 3u);
    EXPECT_NEAR(us.q_max, 1.0 / (0.3048 * 0.3048 * 0.3048), 1e-9);
    EXPECT_NEAR(us.rain.max, 1.0, rel);         // 0.945 in / 2 -> steps of 0.5, up to 1 in
    EXPECT_NEAR(us.flow.max, 40.0, 40.0 * rel); // 35.3 x 1.08 = 38.1, steps of 10
}

TEST(SheetChart, ChartGoesUnderItsHeadingOnOnePage) {
    PageLayout page(PageSize::letter);
    page.new_page("Design point DP1");
    page.set_y(page.bottom() - 0.5 * style::chart_block_h_pt);
    draw_chart_block(page, "Hyetograph and hydrograph", sample_hydrograph(), "DP1",
                     units::System::si);
    ASSERT_EQ(page.page_count(), 2u);
    EXPECT_EQ(page.page_section(1), "Design point DP1 (continued)");
    // Heading, rain panel, gap, flow panel, time axis and key, one under the other.
    const double heading_h =
        page.measure(esc("Hyetograph and hydrograph"), style::Style::subheading, page.content_w());
    EXPECT_NEAR(page.y(),
                page.top() + heading_h + 2.0 * style::heading_pad_pt + style::rain_panel_dy_pt +
                    style::rain_panel_h_pt + style::panel_gap_pt + style::flow_panel_h_pt +
                    style::key_dy_pt + style::key_after_pt,
                1e-9); // sums of a few point lengths
    double x = 0.0, y = 0.0, w = 0.0, h = 0.0;
    cairo_recording_surface_ink_extents(page.page_surface(1), &x, &y, &w, &h);
    EXPECT_GE(y, page.top() - 0.25); // 0.25 pt: glyph ink beyond the heading's logical box
    EXPECT_LE(y + h, page.y());
    EXPECT_GE(x, page.left() - 0.25); // the rotated axis titles stay inside the margin
}

} // namespace
} // namespace catchpeak::report
