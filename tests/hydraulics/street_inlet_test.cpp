// SPDX-License-Identifier: MIT
// Street inlets: curb opening on grade, curb opening and grate in a sag (HEC-22 ch. 4).
#include "catchpeak/hydraulics/street_inlet.hpp"

#include "catchpeak/core/error.hpp"

#include "support/calc_lines.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

namespace catchpeak::hydraulics {
namespace {

using units::System;

/// HEC-22 eq. 4-22 as printed (FHWA HEC-22, 3rd ed. (2009); REFERENCES: checked in several
/// secondary copies): LT = 0.817 Q^0.42 SL^0.3 (1/(n S))^0.6 in SI, S = Sx or Se.
double eq_4_22_si(double q, double sl, double n, double s) {
    return 0.817 * std::pow(q, 0.42) * std::pow(sl, 0.3) * std::pow(1.0 / (n * s), 0.6);
}

const Gutter plain{0.02, 0.01, 0.016, 0.0, 0.0};

// Uniform gutter: LT by eq. 4-22, E = 1 - (1 - L/LT)^1.8 (eq. 4-23), Qi = E Q, Qb = Q - Qi
// (HEC-22 (2009) ch. 4). Tolerance: rounding of double powers.
TEST(CurbOnGrade, UniformGutterLengthEfficiencyAndBypass) {
    const double q = 0.05;
    const double lt = eq_4_22_si(q, 0.01, 0.016, 0.02);
    const auto r = curb_on_grade(plain, 3.0, q, System::si);
    EXPECT_NEAR(r.value.length_total_m, lt, 1e-12);
    const double e = 1.0 - std::pow(1.0 - 3.0 / lt, 1.8);
    EXPECT_NEAR(r.value.efficiency, e, 1e-12);
    EXPECT_NEAR(r.value.intercepted_m3_s, e * q, 1e-12);
    EXPECT_NEAR(r.value.bypass_m3_s, (1.0 - e) * q, 1e-12);
    EXPECT_TRUE(r.lines.has("gutter.spread_uniform")); // the gutter's lines come first
    EXPECT_EQ(test::text(test::line_keyed(r.lines, "inlet.curb_length_total")).source,
              "FHWA HEC-22, 3rd ed. (2009) eq. 4-22");
    EXPECT_EQ(test::text(test::line_keyed(r.lines, "inlet.curb_efficiency")).source,
              "FHWA HEC-22, 3rd ed. (2009) eq. 4-23");
    // An opening at least LT long takes it all.
    const auto all = curb_on_grade(plain, lt * 1.01, q, System::si);
    EXPECT_DOUBLE_EQ(all.value.efficiency, 1.0);
    EXPECT_DOUBLE_EQ(all.value.bypass_m3_s, 0.0);
}

// The SI and US constants of eq. 4-22 (0.817 and 0.6) are the same equation: 0.6 x 35.315^0.42
// / 3.2808 = 0.817. Tolerance: the published constants' rounding, taken as 0.5 %.
TEST(CurbOnGrade, SiAndUsConstantsAgree) {
    const auto si = curb_on_grade(plain, 3.0, 0.05, System::si);
    const auto us = curb_on_grade(plain, 3.0, 0.05, System::us_customary);
    EXPECT_NEAR(us.value.length_total_m, si.value.length_total_m, 0.005 * si.value.length_total_m);
}

// Depressed (composite) gutter: Se = Sx + S'w Eo with S'w = a/W (eq. 4-24) and Eo of the
// gutter flow (eq. 4-4) replaces Sx in eq. 4-22; the depression shortens LT.
TEST(CurbOnGrade, DepressedGutterUsesTheEquivalentCrossSlope) {
    const Gutter g{0.02, 0.01, 0.016, 0.6, 0.05};
    const double q = 0.05;
    const auto flow = gutter_spread(g, q, System::si);
    const double se = 0.02 + 0.05 / 0.6 * flow.value.frontal_ratio;
    const auto r = curb_on_grade(g, 3.0, q, System::si);
    EXPECT_NEAR(test::line_keyed(r.lines, "inlet.curb_equivalent_slope").value(), se, 1e-12);
    EXPECT_NEAR(r.value.length_total_m, eq_4_22_si(q, 0.01, 0.016, se), 1e-12);
    EXPECT_LT(r.value.length_total_m,
              curb_on_grade(plain, 3.0, q, System::si).value.length_total_m);
    EXPECT_NEAR(r.value.spread_m, flow.value.spread_m, 1e-12);
}

// Sag: weir Q = Cw (L + 1.8 W) d^1.5 with Cw = 1.25 in a depressed gutter, while the depth at
// the lip di = d + a is within the opening height h (HEC-22 (2009) ch. 4; the coefficient
// 2.3 ft^0.5/s US and the depth limits agree with the TxDOT Hydraulic Design Manual ch. 10,
// which rounds the SI coefficient to 1.27).
TEST(CurbInSag, DepressedWeirAtShallowDepth) {
    const Gutter g{0.02, 0.0, 0.016, 0.6, 0.05};
    const auto r = curb_in_sag(g, {2.0, 0.15}, 0.08, System::si);
    EXPECT_EQ(r.value.regime, SagRegime::weir);
    EXPECT_NEAR(r.value.capacity_m3_s, 1.25 * (2.0 + 1.8 * 0.6) * std::pow(0.08, 1.5), 1e-12);
    EXPECT_TRUE(r.lines.has("inlet.sag_lip_depth"));
    // A long opening (L > 3.6 m) or no depression: Q = Cw L d^1.5, Cw = 1.60 (TxDOT Hydraulic
    // Design Manual ch. 10, "3.0 ft^0.5/s or 1.60 m^0.5/s without depression").
    const auto long_one = curb_in_sag(g, {4.0, 0.15}, 0.08, System::si);
    EXPECT_NEAR(long_one.value.capacity_m3_s, 1.60 * 4.0 * std::pow(0.08, 1.5), 1e-12);
    const auto undepressed = curb_in_sag(plain, {2.0, 0.15}, 0.1, System::si);
    EXPECT_NEAR(undepressed.value.capacity_m3_s, 1.60 * 2.0 * std::pow(0.1, 1.5), 1e-12);
}

// Sag: orifice Q = Co h L (2 g do)^0.5, Co = 0.67, do = di - h/2, from di >= 1.4 h; the lesser
// of weir and orifice between h and 1.4 h (HEC-22 (2009) ch. 4; TxDOT Hydraulic Design Manual
// ch. 10: "weir to depths equal to the curb opening height and as an orifice at depths greater
// than 1.4 times the opening height ... the lesser of the computed weir and orifice capacity").
TEST(CurbInSag, OrificeAndTransition) {
    const CurbInSag inlet{2.0, 0.1};
    const auto deep = curb_in_sag(plain, inlet, 0.2, System::si);
    EXPECT_EQ(deep.value.regime, SagRegime::orifice);
    EXPECT_NEAR(deep.value.capacity_m3_s, 0.67 * 0.1 * 2.0 * std::sqrt(2.0 * 9.81 * 0.15), 1e-12);
    const auto mid = curb_in_sag(plain, inlet, 0.12, System::si);
    EXPECT_EQ(mid.value.regime, SagRegime::transition);
    const double qw = 1.60 * 2.0 * std::pow(0.12, 1.5);
    const double qo = 0.67 * 0.1 * 2.0 * std::sqrt(2.0 * 9.81 * 0.07);
    EXPECT_NEAR(mid.value.capacity_m3_s, std::min(qw, qo), 1e-12);
    EXPECT_EQ(
        test::text(test::line_keyed(mid.lines, "inlet.sag_capacity")).source.rfind("TxDOT", 0), 0U);
}

// Grate in a sag: weir Q = Cw P d^1.5 (Cw = 1.66 SI), orifice Q = Co A (2 g d)^0.5 (Co =
// 0.67), the lesser of the two (TxDOT Hydraulic Design Manual ch. 10, grate inlets in sag;
// HEC-22 (2009) ch. 4); clogging C reduces P and A by (1 - C/100).
TEST(GrateInSag, WeirOrificeAndClogging) {
    const GrateInSag clean{0.6 + 2.0 * 0.6, 0.2, 0.0};
    const auto shallow = grate_in_sag(clean, 0.05, System::si);
    EXPECT_EQ(shallow.value.regime, SagRegime::weir);
    EXPECT_NEAR(shallow.value.capacity_m3_s, 1.66 * 1.8 * std::pow(0.05, 1.5), 1e-12);
    EXPECT_EQ(shallow.lines.warning_count(), 1U); // no clogging allowance: a warning
    const auto deep = grate_in_sag(clean, 0.5, System::si);
    EXPECT_EQ(deep.value.regime, SagRegime::orifice);
    EXPECT_NEAR(deep.value.capacity_m3_s, 0.67 * 0.2 * std::sqrt(2.0 * 9.81 * 0.5), 1e-12);
    const auto half = grate_in_sag({1.8, 0.2, 50.0}, 0.5, System::si);
    EXPECT_NEAR(half.value.capacity_m3_s, 0.5 * deep.value.capacity_m3_s, 1e-12);
    EXPECT_EQ(half.lines.warning_count(), 0U);
    EXPECT_THROW((void)grate_in_sag({1.8, 0.2, 100.0}, 0.5, System::si), InputError);
    EXPECT_THROW((void)grate_in_sag({1.8, 0.2, -1.0}, 0.5, System::si), InputError);
}

// The SI and US coefficients of the sag equations are the same equations within their
// rounding: 3.0 ft^0.5/s is 1.66 m^0.5/s, 2.3 is 1.27 (HEC-22 prints 1.25), g 32.2 / 9.81.
// Tolerance: 2 %, the largest of these roundings (1.25 against 1.27).
TEST(CurbInSag, SiAndUsCoefficientsAgree) {
    const Gutter g{0.02, 0.0, 0.016, 0.6, 0.05};
    for (const double d : {0.05, 0.12, 0.3}) {
        const auto si = curb_in_sag(g, {2.0, 0.15}, d, System::si);
        const auto us = curb_in_sag(g, {2.0, 0.15}, d, System::us_customary);
        EXPECT_NEAR(us.value.capacity_m3_s, si.value.capacity_m3_s, 0.02 * si.value.capacity_m3_s)
            << "d = " << d;
        const auto gsi = grate_in_sag({1.8, 0.2, 50.0}, d, System::si);
        const auto gus = grate_in_sag({1.8, 0.2, 50.0}, d, System::us_customary);
        EXPECT_NEAR(gus.value.capacity_m3_s, gsi.value.capacity_m3_s,
                    0.02 * gsi.value.capacity_m3_s)
            << "d = " << d;
    }
}

// Every line of every inlet function prints in both unit systems: each template names only
// quantities its line holds (the report throws otherwise), and each line names its source.
TEST(StreetInlet, EveryLinePrints) {
    const Gutter depressed{0.02, 0.01, 0.016, 0.6, 0.05};
    for (const auto system : {System::si, System::us_customary}) {
        std::vector<CalcLines> all;
        all.push_back(curb_on_grade(plain, 3.0, 0.05, system).lines);
        all.push_back(curb_on_grade(depressed, 3.0, 0.05, system).lines);
        all.push_back(curb_on_grade(depressed, 1.0, 0.01, system).lines); // spread within W
        for (const double d : {0.05, 0.12, 0.3}) {
            all.push_back(curb_in_sag(depressed, {2.0, 0.15}, d, system).lines);
            all.push_back(grate_in_sag({1.8, 0.2, 0.0}, d, system).lines);
        }
        for (const auto &lines : all) {
            for (const auto &l : lines.lines()) {
                const auto t = test::text(l);
                EXPECT_FALSE(t.numbers.empty()) << l.key;
                EXPECT_FALSE(t.source.empty()) << l.key;
            }
        }
    }
}

TEST(StreetInlet, RefusesWhatIsNotAnInlet) {
    EXPECT_THROW((void)curb_on_grade(plain, 0.0, 0.05, System::si), InputError);
    EXPECT_THROW((void)curb_in_sag(plain, {2.0, 0.0}, 0.1, System::si), InputError);
    EXPECT_THROW((void)curb_in_sag(plain, {2.0, 0.1}, 0.0, System::si), InputError);
    EXPECT_THROW((void)grate_in_sag({0.0, 0.2, 50.0}, 0.1, System::si), InputError);
}

} // namespace
} // namespace catchpeak::hydraulics
