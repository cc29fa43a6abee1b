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

TEST(WeightedRunoff, TwoPartsByHand) {
    // An invented two-part catchment, 3 ha of CN 98 and 7 ha of CN 61, P = 4.0 in. Each part's
    // runoff by TR-55 eq. 2-3 and 2-4 (inches): S = 1000/CN - 10, Q = (P - 0.2 S)^2 /
    // (P + 0.8 S); the catchment's depth is their area-weighted mean.
    const double p_in = 4.0;
    auto q_in = [&](double cn) {
        const double s = 1000.0 / cn - 10.0;
        return (p_in - 0.2 * s) * (p_in - 0.2 * s) / (p_in + 0.8 * s);
    };
    const double expected_in = (3.0 * q_in(98.0) + 7.0 * q_in(61.0)) / 10.0;
    const std::vector<h::CnPart> parts = {{3.0e4, 98.0, "roofs, soil group B"},
                                          {7.0e4, 61.0, "pasture, soil group B"}};
    const auto w = h::weighted_runoff(parts, u::in_to_mm(p_in), System::us_customary);
    // Tolerance 1e-9 in: floating point only.
    EXPECT_NEAR(u::mm_to_in(w.value), expected_in, 1e-9);
    // Each part's Q is its own line (in, the sheet's unit), after a note naming the part.
    std::vector<double> part_q;
    std::vector<std::string> notes;
    for (const auto &l : w.lines.lines()) {
        if (l.key == "cn.runoff") {
            part_q.push_back(l.value());
        }
        if (l.key == "cn.part") {
            notes.push_back(catchpeak::test::text(l).numbers);
        }
    }
    ASSERT_EQ(part_q.size(), 2u);
    EXPECT_NEAR(part_q[0], q_in(98.0), 1e-9);
    EXPECT_NEAR(part_q[1], q_in(61.0), 1e-9);
    ASSERT_EQ(notes.size(), 2u);
    EXPECT_NE(notes[1].find("pasture, soil group B"), std::string::npos) << notes[1];
    const auto &weighted = catchpeak::test::line_keyed(w.lines, "cn.runoff_weighted");
    EXPECT_NEAR(weighted.value(), expected_in, 1e-9);
    EXPECT_EQ(weighted.rows.size(), 2u);
    // The Ia of the composite CN alone, without a runoff line.
    const auto ia = h::cn_initial_abstraction(u::in_to_mm(p_in), 72.1, System::us_customary);
    EXPECT_NEAR(u::mm_to_in(ia.value.ia_mm), 0.2 * (1000.0 / 72.1 - 10.0), 1e-9);
    EXPECT_TRUE(ia.lines.has("cn.initial_abstraction"));
    EXPECT_FALSE(ia.lines.has("cn.runoff"));
    EXPECT_THROW((void)h::weighted_runoff({}, 100.0, System::si), InputError);
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
