// SPDX-License-Identifier: MIT
#include "catchpeak/hydro/curve_number.hpp"
#include "support/calc_lines.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/core/units.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <string>

namespace {

using catchpeak::InputError;
using catchpeak::units::System;
namespace u = catchpeak::units;
namespace h = catchpeak::hydro;

TEST(CnRunoff, NoRunoffBelowInitialAbstraction) {
    // CN 50: S = 10 in, Ia = 2 in; P = 1.5 in gives no runoff (TR-55 eq. 2-1).
    const auto r = h::cn_runoff(u::in_to_mm(1.5), 50.0, System::us_customary);
    EXPECT_DOUBLE_EQ(r.value.runoff_mm, 0.0);
    EXPECT_NEAR(u::mm_to_in(r.value.ia_mm), 2.0, 1e-12);
    EXPECT_EQ(catchpeak::test::text(catchpeak::test::line_keyed(r.lines, "cn.runoff_none")).symbols,
              "Q = 0 for P <= Ia");
    EXPECT_FALSE(r.lines.has("cn.runoff"));
}

TEST(CnRunoff, Cn100RunsOffEverything) {
    const auto r = h::cn_runoff(40.0, 100.0, System::si);
    EXPECT_NEAR(r.value.runoff_mm, 40.0, 1e-12);
}

TEST(CnRunoff, SiSheetShowsTheMillimetreForm) {
    const auto r = h::cn_runoff(100.0, 80.0, System::si);
    const auto &l = catchpeak::test::line_keyed(r.lines, "cn.retention_si");
    EXPECT_EQ(catchpeak::test::text(l).symbols, "S = 25400/CN - 254");
    EXPECT_NEAR(l.value(), 25400.0 / 80.0 - 254.0, 1e-12);
    EXPECT_EQ(catchpeak::test::text(l).unit, "mm");
    // By hand: S = 63.5 mm, Ia = 12.7 mm, Q = 87.3^2 / 150.8.
    EXPECT_NEAR(r.value.runoff_mm, 87.3 * 87.3 / 150.8, 1e-9);
    EXPECT_NEAR(h::cn_runoff_depth_mm(100.0, 80.0), r.value.runoff_mm, 1e-12);
}

TEST(CnRunoff, HawkinsRatioConvertsTheCurveNumber) {
    // S0.05 = 1.33 S0.20^1.15 (in), formula from memory (Hawkins et al. 2002).
    const auto r = h::cn_runoff(u::in_to_mm(2.0), 75.0, System::us_customary, h::IaRatio::r005);
    const double s20 = 1000.0 / 75.0 - 10.0;
    const double s05 = 1.33 * std::pow(s20, 1.15);
    EXPECT_NEAR(u::mm_to_in(r.value.s_mm), s05, 1e-9);
    EXPECT_NEAR(u::mm_to_in(r.value.ia_mm), 0.05 * s05, 1e-9);
    EXPECT_NEAR(r.value.cn_used, 1000.0 / (10.0 + s05), 1e-9);
    const double ia = 0.05 * s05;
    EXPECT_NEAR(u::mm_to_in(r.value.runoff_mm), (2.0 - ia) * (2.0 - ia) / (2.0 - ia + s05), 1e-9);
    // The SI form of the conversion gives the same depth (1.33 x 25.4^-0.15 is exact algebra).
    const auto si = h::cn_runoff(u::in_to_mm(2.0), 75.0, System::si, h::IaRatio::r005);
    EXPECT_NEAR(si.value.runoff_mm, r.value.runoff_mm, 1e-9 * r.value.runoff_mm);
    EXPECT_NEAR(h::cn_runoff_depth_mm(u::in_to_mm(2.0), 75.0, h::IaRatio::r005), r.value.runoff_mm,
                1e-9);
    // For small storms the lower Ia gives more runoff than Ia = 0.2 S.
    EXPECT_GT(r.value.runoff_mm,
              h::cn_runoff(u::in_to_mm(2.0), 75.0, System::us_customary).value.runoff_mm);
}

TEST(CnRunoff, RefusesBadInput) {
    try {
        (void)h::cn_runoff(50.0, 29.5, System::si);
        FAIL() << "no InputError";
    } catch (const InputError &e) {
        const std::string m = e.what();
        EXPECT_NE(m.find("curve number"), std::string::npos) << m;
        EXPECT_NE(m.find("30 <= CN <= 100"), std::string::npos) << m;
    }
    // CN 30 is in TR-55 Table 2-2c (meadow, soil group A): accepted.
    EXPECT_NO_THROW((void)h::cn_runoff(50.0, 30.0, System::si));
    EXPECT_THROW((void)h::cn_runoff(50.0, 100.5, System::si), InputError);
    EXPECT_THROW((void)h::cn_runoff(50.0, std::numeric_limits<double>::quiet_NaN(), System::si),
                 InputError);
    EXPECT_THROW((void)h::cn_runoff(-1.0, 70.0, System::si), InputError);
}

TEST(CompositeRunoff, BothWaysComputedAndCompared) {
    // Similar parts: the two ways agree closely, no warning.
    const std::vector<h::CnPart> close = {{1e5, 74.0}, {1e5, 76.0}};
    const auto a = h::composite_runoff(close, 100.0, System::si);
    EXPECT_NEAR(a.value.composite_cn, 75.0, 1e-12);
    EXPECT_EQ(a.lines.warning_count(), 0u);
    const double q74 = h::cn_runoff_depth_mm(100.0, 74.0);
    const double q76 = h::cn_runoff_depth_mm(100.0, 76.0);
    EXPECT_NEAR(a.value.runoff_weighted_mm, (q74 + q76) / 2.0, 1e-12);
    EXPECT_NEAR(a.value.runoff_composite_mm, h::cn_runoff_depth_mm(100.0, 75.0), 1e-12);
    // Paved and sandy lawn on a small storm: composite CN badly underestimates runoff.
    const std::vector<h::CnPart> mixed = {{3e4, 98.0}, {7e4, 39.0}};
    const auto b = h::composite_runoff(mixed, u::in_to_mm(1.5), System::us_customary);
    EXPECT_EQ(b.lines.warning_count(), 1u);
    EXPECT_GT(b.value.runoff_weighted_mm, b.value.runoff_composite_mm);
    EXPECT_GT(b.value.relative_difference, 0.05);
    // The threshold is a setting.
    EXPECT_EQ(
        h::composite_runoff(mixed, u::in_to_mm(1.5), System::us_customary, h::IaRatio::r020, 10.0)
            .lines.warning_count(),
        0u);
    EXPECT_THROW((void)h::composite_cn({}, System::si), InputError);
    EXPECT_THROW((void)h::composite_cn({{0.0, 70.0}}, System::si), InputError);
}

TEST(AntecedentMoisture, ChowFormulas) {
    // Chow, Maidment and Mays (1988) eq. 5.5.4 and 5.5.5 (from memory), CN 75 by hand.
    EXPECT_NEAR(h::cn_amc_i(75.0).value, 4.2 * 75.0 / (10.0 - 0.058 * 75.0), 1e-12);
    EXPECT_NEAR(h::cn_amc_iii(75.0).value, 23.0 * 75.0 / (10.0 + 0.13 * 75.0), 1e-12);
    EXPECT_LT(h::cn_amc_i(75.0).value, 75.0);
    EXPECT_GT(h::cn_amc_iii(75.0).value, 75.0);
    EXPECT_NEAR(h::cn_amc_iii(100.0).value, 100.0, 1e-12); // both map 100 to 100
    EXPECT_NEAR(h::cn_amc_i(100.0).value, 100.0, 1e-12);
    EXPECT_THROW((void)h::cn_amc_i(20.0), InputError);
}

} // namespace
