// SPDX-License-Identifier: MIT
#include "catchpeak/hydro/unit_hydrograph.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/core/units.hpp"
#include "support/calc_lines.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <string>

namespace {

using catchpeak::InputError;
using catchpeak::rain::Hyetograph;
using catchpeak::units::System;
namespace u = catchpeak::units;
namespace h = catchpeak::hydro;

// An invented triangular dimensionless hydrograph: peak 1 at t/tp = 1, zero at 0 and 2.
// Its area is 1, so the volume checks below are exact up to the sampling.
h::DimensionlessUnitHydrograph triangle() {
    h::DimensionlessUnitHydrograph t;
    t.t_over_tp = {0.0, 1.0, 2.0};
    t.q_over_qp = {0.0, 1.0, 0.0};
    t.origin.source = "invented";
    t.origin.status = "for a test";
    return t;
}

TEST(ExcessHyetograph, CumulativeRunoffOfCumulativeRainfall) {
    Hyetograph rain;
    rain.step_s = 600.0;
    rain.depth_mm = {5.0, 5.0, 20.0, 30.0, 10.0, 0.0, 5.0};
    const auto e = h::excess_hyetograph(rain, 80.0);
    ASSERT_EQ(e.steps(), rain.steps());
    EXPECT_DOUBLE_EQ(e.step_s, 600.0);
    // CN 80: Ia = 12.7 mm, so the first two steps (10 mm in all) give no excess.
    EXPECT_DOUBLE_EQ(e.depth_mm[0], 0.0);
    EXPECT_DOUBLE_EQ(e.depth_mm[1], 0.0);
    EXPECT_GT(e.depth_mm[2], 0.0);
    EXPECT_DOUBLE_EQ(e.depth_mm[5], 0.0); // no rain, no excess
    EXPECT_NEAR(e.total_mm(), h::cn_runoff_depth_mm(rain.total_mm(), 80.0), 1e-9);
    for (double d : e.depth_mm) {
        EXPECT_GE(d, 0.0);
    }
}

TEST(UnitHydrograph, AggregatesFineStepsToD) {
    // tc = 60 min: 0.133 tc = 478.8 s; 60 s steps are aggregated 7 at a time: D = 420 s.
    Hyetograph e;
    e.step_s = 60.0;
    e.depth_mm.assign(30, 1.0);
    const auto r = h::unit_hydrograph_from_excess(triangle(), e, 1e6, 60.0, System::si);
    EXPECT_DOUBLE_EQ(r.value.step_s, 420.0);
    EXPECT_NEAR(r.value.runoff_mm, 30.0, 1e-12);
    // tp = D/2 + 0.6 tc, in h.
    EXPECT_NEAR(r.value.tp_h, 420.0 / 7200.0 + 0.6, 1e-12);
    EXPECT_NEAR(catchpeak::test::line_keyed(r.lines, "uh.unit_time_to_peak").value(), r.value.tp_h,
                1e-12);
}

TEST(UnitHydrograph, VolumeOfATriangleSampledAtItsCorners) {
    // Fraction 0.14: 0.14 tc = 504 s, so D = 8 x 60 s = 480 s and tp = 240 + 2160 s = 5 D: the
    // samples hit the triangle's corners and the trapezoid sum is its exact area, 1 x tp.
    // Volume = qp tp with qp = 0.208 A Q / tp, i.e. 0.208 x 3.6 x Q A (Q A in m3 per 1000).
    Hyetograph e;
    e.step_s = 60.0;
    e.depth_mm.assign(30, 1.0);
    h::UnitHydrographSettings s;
    s.step_fraction_of_tc = 0.14;
    const auto r = h::unit_hydrograph_from_excess(triangle(), e, 1e6, 60.0, System::si, s);
    EXPECT_DOUBLE_EQ(r.value.step_s, 480.0);
    const double expected = 0.208 * 3.6 * 30.0 / 1000.0 * 1e6;
    EXPECT_NEAR(r.value.volume_m3, expected, 1e-9 * expected);
    EXPECT_NEAR(catchpeak::test::line_keyed(r.lines, "uh.volume_si").value(), r.value.volume_m3,
                1e-6);
}

TEST(UnitHydrograph, SplitsCoarseStepsEvenly) {
    // tc = 60 min, one-hour steps: m = ceil(3600 / 478.8) = 8, D = 450 s.
    Hyetograph e;
    e.step_s = 3600.0;
    e.depth_mm = {10.0, 20.0};
    const auto r = h::unit_hydrograph_from_excess(triangle(), e, 1e6, 60.0, System::si);
    EXPECT_DOUBLE_EQ(r.value.step_s, 450.0);
    EXPECT_NEAR(r.value.runoff_mm, 30.0, 1e-12);
    EXPECT_NE(catchpeak::test::text(catchpeak::test::line_keyed(r.lines, "uh.duration_split"))
                  .label.find("split"),
              std::string::npos);
    EXPECT_FALSE(r.lines.has("uh.duration_aggregated"));
}

TEST(UnitHydrograph, IsLinearInTheExcess) {
    Hyetograph e;
    e.step_s = 300.0;
    e.depth_mm = {1.0, 4.0, 2.0};
    Hyetograph twice = e;
    for (double &d : twice.depth_mm) {
        d *= 2.0;
    }
    const auto a = h::unit_hydrograph_from_excess(triangle(), e, 5e6, 45.0, System::us_customary);
    const auto b =
        h::unit_hydrograph_from_excess(triangle(), twice, 5e6, 45.0, System::us_customary);
    ASSERT_EQ(a.value.flow_m3_s.size(), b.value.flow_m3_s.size());
    for (std::size_t i = 0; i < a.value.flow_m3_s.size(); ++i) {
        EXPECT_NEAR(b.value.flow_m3_s[i], 2.0 * a.value.flow_m3_s[i], 1e-12);
    }
    EXPECT_DOUBLE_EQ(a.value.time_to_peak_s, b.value.time_to_peak_s);
    const auto peak = std::max_element(a.value.flow_m3_s.begin(), a.value.flow_m3_s.end());
    EXPECT_DOUBLE_EQ(*peak, a.value.peak_m3_s);
}

TEST(UnitHydrograph, WarnsWhenDIsTooLongForTp) {
    Hyetograph e;
    e.step_s = 60.0;
    e.depth_mm = {5.0};
    h::UnitHydrographSettings s;
    s.step_fraction_of_tc = 0.5; // D = 30 min > 0.25 tp = 0.2125 h
    const auto r = h::unit_hydrograph_from_excess(triangle(), e, 1e6, 60.0, System::si, s);
    EXPECT_EQ(r.lines.warning_count(), 1u);
    const auto ok = h::unit_hydrograph_from_excess(triangle(), e, 1e6, 60.0, System::si);
    EXPECT_EQ(ok.lines.warning_count(), 0u);
}

TEST(UnitHydrograph, FromRainfallStartsWithANoteAndUsesTheExcess) {
    Hyetograph rain;
    rain.step_s = 600.0;
    rain.depth_mm = {5.0, 10.0, 40.0, 15.0, 5.0};
    const auto r = h::unit_hydrograph_from_rainfall(triangle(), rain, 75.0, 2e6, 50.0, System::si);
    EXPECT_EQ(r.lines.lines().front().kind, catchpeak::LineKind::note);
    EXPECT_NEAR(r.value.runoff_mm, h::cn_runoff_depth_mm(75.0, 75.0), 1e-9);
}

TEST(UnitHydrograph, ExcessOfPartsIsWeightedStepByStep) {
    // Two invented parts, 1/4 of the area CN 98 and 3/4 CN 70: each step's excess is the
    // area-weighted excess of the parts, each from its own CN (TR-55 eq. 2-1 on the mass
    // curve), so the whole excess is the area-weighted runoff of the total depth.
    Hyetograph rain;
    rain.step_s = 600.0;
    rain.depth_mm = {5.0, 5.0, 20.0, 30.0, 10.0, 0.0, 5.0};
    const std::vector<h::CnPart> parts = {{2.5e4, 98.0}, {7.5e4, 70.0}};
    const auto e = h::weighted_excess_hyetograph(rain, parts);
    const auto e98 = h::excess_hyetograph(rain, 98.0);
    const auto e70 = h::excess_hyetograph(rain, 70.0);
    ASSERT_EQ(e.steps(), rain.steps());
    for (std::size_t k = 0; k < e.steps(); ++k) {
        EXPECT_NEAR(e.depth_mm[k], 0.25 * e98.depth_mm[k] + 0.75 * e70.depth_mm[k], 1e-12) << k;
    }
    // Total rainfall 75 mm; by hand in mm (S = 25400/CN - 254, Q = (P - 0.2 S)^2 / (P + 0.8 S)).
    auto q = [](double p, double cn) {
        const double s = 25400.0 / cn - 254.0;
        return p > 0.2 * s ? (p - 0.2 * s) * (p - 0.2 * s) / (p + 0.8 * s) : 0.0;
    };
    double sum = 0.0;
    for (double d : e.depth_mm) {
        sum += d;
    }
    EXPECT_NEAR(sum, 0.25 * q(75.0, 98.0) + 0.75 * q(75.0, 70.0), 1e-9);
    const auto hg = h::unit_hydrograph_from_parts(triangle(), rain, parts, 1.0e6, 60.0, System::si);
    EXPECT_TRUE(hg.lines.has("uh.rainfall_excess_parts"));
    EXPECT_FALSE(hg.lines.has("uh.rainfall_excess"));
    EXPECT_NEAR(hg.value.runoff_mm, sum, 1e-9);
}

TEST(UnitHydrograph, RefusesBadInput) {
    Hyetograph e;
    e.step_s = 60.0;
    EXPECT_THROW((void)h::unit_hydrograph_from_excess(triangle(), e, 1e6, 60.0, System::si),
                 InputError); // no steps
    e.depth_mm = {-1.0};
    EXPECT_THROW((void)h::unit_hydrograph_from_excess(triangle(), e, 1e6, 60.0, System::si),
                 InputError);
    e.depth_mm = {1.0};
    EXPECT_THROW((void)h::unit_hydrograph_from_excess(triangle(), e, 0.0, 60.0, System::si),
                 InputError);
    EXPECT_THROW((void)h::unit_hydrograph_from_excess(triangle(), e, 1e6, -2.0, System::si),
                 InputError);
    EXPECT_THROW((void)h::unit_hydrograph_from_excess(h::DimensionlessUnitHydrograph{}, e, 1e6,
                                                      60.0, System::si),
                 InputError);
    e.step_s = 0.0;
    EXPECT_THROW((void)h::unit_hydrograph_from_excess(triangle(), e, 1e6, 60.0, System::si),
                 InputError);
}

} // namespace
