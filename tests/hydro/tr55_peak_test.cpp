// SPDX-License-Identifier: MIT
#include "catchpeak/hydro/tr55_peak.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/core/units.hpp"
#include "support/calc_lines.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <string>

namespace {

using catchpeak::InputError;
using catchpeak::LineKind;
using catchpeak::units::System;
namespace u = catchpeak::units;
namespace h = catchpeak::hydro;
using catchpeak::test::line_starting_with;

// Invented coefficients: simple numbers so that interpolation is checked by hand.
h::PeakCoefficientTable coefficients() {
    h::PeakCoefficientTable t;
    t.rows = {{h::StormType::type_ii, 0.10, 2.0, -0.5, -0.1},
              {h::StormType::type_ii, 0.50, 1.6, -0.1, 0.3}};
    t.origin.source = "invented";
    t.origin.status = "for a test";
    return t;
}

h::PondFactorTable ponds() {
    h::PondFactorTable t;
    t.rows = {{0.0, 1.0}, {1.0, 0.87}, {3.0, 0.75}, {5.0, 0.72}};
    t.origin.source = "invented";
    t.origin.status = "for a test";
    return t;
}

catchpeak::WithLines<h::Tr55Peak> run(double tc_h, double p_in, double ia_in, double pond, System s,
                                      h::StormType type = h::StormType::type_ii) {
    return h::tr55_peak(coefficients(), ponds(), type, u::mi2_to_m2(1.0), u::h_to_min(tc_h),
                        u::in_to_mm(p_in), u::in_to_mm(ia_in), u::in_to_mm(1.0), pond, s);
}

TEST(Tr55Peak, InterpolatesCoefficientsBetweenRows) {
    // Ia/P = 0.3, midway: C0 1.8, C1 -0.3, C2 0.1; tc = 1 h so log10 tc = 0 and qu = 10^1.8.
    const auto r = run(1.0, 4.0, 1.2, 0.0, System::us_customary);
    EXPECT_NEAR(r.value.ia_over_p, 0.3, 1e-12);
    EXPECT_NEAR(line_starting_with(r.lines, "Coefficient C0").value(), 1.8, 1e-12);
    EXPECT_NEAR(line_starting_with(r.lines, "Coefficient C1").value(), -0.3, 1e-12);
    EXPECT_NEAR(line_starting_with(r.lines, "Coefficient C2").value(), 0.1, 1e-12);
    EXPECT_NEAR(r.value.unit_peak_csm_per_in, std::pow(10.0, 1.8), 1e-9);
    // qp = qu Am Q Fp with Am = 1 mi2, Q = 1 in, Fp = 1.
    EXPECT_NEAR(u::m3s_to_cfs(r.value.peak_m3_s), std::pow(10.0, 1.8), 1e-9);
    EXPECT_EQ(r.lines.warning_count(), 0u);
    // tc = 10 h: log10 tc = 1, log10 qu = 1.8 - 0.3 + 0.1.
    EXPECT_NEAR(run(10.0, 4.0, 1.2, 0.0, System::us_customary).value.unit_peak_csm_per_in,
                std::pow(10.0, 1.6), 1e-9);
}

TEST(Tr55Peak, ClampsIaOverPAndTcWithWarnings) {
    const auto low = run(1.0, 4.0, 0.2, 0.0, System::us_customary); // Ia/P 0.05
    EXPECT_NEAR(low.value.ia_over_p, 0.10, 1e-12);
    EXPECT_EQ(low.lines.warning_count(), 1u);
    EXPECT_NEAR(low.value.unit_peak_csm_per_in, 100.0, 1e-9);        // row 0.10, C0 = 2.0
    const auto high = run(1.0, 4.0, 2.4, 0.0, System::us_customary); // Ia/P 0.6
    EXPECT_NEAR(high.value.ia_over_p, 0.50, 1e-12);
    const auto short_tc = run(0.05, 4.0, 0.4, 0.0, System::us_customary);
    EXPECT_EQ(short_tc.lines.warning_count(), 1u);
    // Evaluated at the 0.1 h limit.
    const double l = std::log10(0.1);
    EXPECT_NEAR(short_tc.value.unit_peak_csm_per_in, std::pow(10.0, 2.0 - 0.5 * l - 0.1 * l * l),
                1e-9);
}

TEST(Tr55Peak, PondFactorInterpolatedAndLimited) {
    EXPECT_NEAR(run(1.0, 4.0, 1.2, 2.0, System::us_customary).value.fp, 0.81, 1e-12);
    EXPECT_NEAR(run(1.0, 4.0, 1.2, 0.2, System::us_customary).value.fp, 1.0 - 0.2 * 0.13, 1e-12);
    const auto many = run(1.0, 4.0, 1.2, 10.0, System::us_customary);
    EXPECT_NEAR(many.value.fp, 0.72, 1e-12);
    EXPECT_EQ(many.lines.warning_count(), 1u);
    EXPECT_THROW((void)run(1.0, 4.0, 1.2, -1.0, System::us_customary), InputError);
}

TEST(Tr55Peak, SiSheetComputesInCsmAndConverts) {
    const auto si = run(1.0, 4.0, 1.2, 0.0, System::si);
    const auto us = run(1.0, 4.0, 1.2, 0.0, System::us_customary);
    EXPECT_NEAR(si.value.peak_m3_s, us.value.peak_m3_s, 1e-9 * us.value.peak_m3_s);
    EXPECT_EQ(catchpeak::test::text(si.lines.lines().back()).unit, "m3/s");
    EXPECT_EQ(catchpeak::test::text(us.lines.lines().back()).unit, "ft3/s");
    bool note = false;
    for (const auto &l : si.lines.lines()) {
        note = note ||
               (l.kind == LineKind::note &&
                catchpeak::test::text(l).numbers.find("only in US customary") != std::string::npos);
    }
    EXPECT_TRUE(note);
}

TEST(Tr55Peak, RefusesMissingStormTypeAndBadInput) {
    EXPECT_THROW((void)run(1.0, 4.0, 1.2, 0.0, System::si, h::StormType::type_iii), InputError);
    EXPECT_THROW((void)h::tr55_peak(coefficients(), ponds(), h::StormType::type_ii, 0.0, 60.0,
                                    100.0, 10.0, 40.0, 0.0, System::si),
                 InputError);
    EXPECT_THROW((void)h::tr55_peak(coefficients(), ponds(), h::StormType::type_ii, 1e6, 0.0, 100.0,
                                    10.0, 40.0, 0.0, System::si),
                 InputError);
}

} // namespace
