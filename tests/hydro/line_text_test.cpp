// SPDX-License-Identifier: MIT
// Every line of a typical computation, on both sheets, renders without a template error: each
// placeholder of each formula names a quantity the line carries.
#include "catchpeak/hydro/curve_number.hpp"
#include "catchpeak/hydro/rational.hpp"
#include "catchpeak/hydro/tc.hpp"
#include "catchpeak/hydro/tr55_peak.hpp"
#include "catchpeak/hydro/unit_hydrograph.hpp"
#include "support/calc_lines.hpp"

#include "catchpeak/core/units.hpp"

#include <gtest/gtest.h>

#include <set>
#include <string>

namespace {

using catchpeak::CalcLines;
using catchpeak::LineKind;
using catchpeak::units::System;
namespace u = catchpeak::units;
namespace h = catchpeak::hydro;

/// The lines of one computation of every hydro function, with inputs chosen so that the
/// warnings and notes appear too (outside the methods' data, capped, clamped, converted).
CalcLines all_lines(System s) {
    CalcLines all;
    const auto add = [&](const auto &r) { all.append(r.lines); };
    // Time of concentration.
    add(h::kirpich_tc_min(u::ft_to_m(4780.0), 0.0095, u::acre_to_m2(250.0), s));
    add(h::nrcs_lag_tc_min(u::ft_to_m(6900.0), 75.0, 2.8, u::mi2_to_m2(20.0), s));
    add(h::sheet_flow_tt_min(0.24, u::ft_to_m(350.0), 91.44, 0.01, h::SheetFlowLimit::tr55_300_ft,
                             s));
    add(h::sheet_flow_tt_min(0.24, u::ft_to_m(150.0), 91.44, 0.01, h::SheetFlowLimit::neh630_100_ft,
                             s));
    add(h::shallow_flow_tt_min(300.0, 0.02, h::ShallowSurface::paved, s));
    add(h::shallow_flow_tt_min(300.0, 0.02, h::ShallowSurface::unpaved, s));
    add(h::channel_flow_tt_min(0.05, 2.0, 4.0, 0.005, 1000.0, s));
    add(h::kerby_tov_min(u::ft_to_m(1300.0), 0.4, 0.02, s));
    add(h::sum_travel_times_min({18.0, 12.0, 30.0}, s));
    add(h::apply_minimum_tc(3.2, 5.0));
    // Curve number, both ratios, with and without runoff; composite and moisture conditions.
    add(h::cn_runoff(u::in_to_mm(3.0), 75.0, s));
    add(h::cn_runoff(u::in_to_mm(1.5), 50.0, s));
    add(h::cn_runoff(u::in_to_mm(3.0), 75.0, s, h::IaRatio::r005));
    add(h::composite_runoff({{3e4, 98.0}, {7e4, 39.0}}, u::in_to_mm(1.5), s));
    add(h::cn_amc_i(75.0));
    add(h::cn_amc_iii(75.0));
    // Rational Method: the three ways of reading Cf, capped Cf C, a catchment over the limit.
    h::FrequencyFactorTable cf;
    cf.rows = {{10.0, 1.0}, {25.0, 1.1}, {100.0, 1.25}};
    cf.origin.source = "invented";
    add(h::frequency_factor(cf, 25.0));
    add(h::frequency_factor(cf, 50.0));
    add(h::frequency_factor(cf, 500.0));
    add(h::rational_peak_m3_s(0.95, 1.25, 100.0, u::ha_to_m2(120.0), s));
    // TR-55 peak: Ia/P and tc outside the table, ponds between rows and beyond the table.
    h::PeakCoefficientTable coef;
    coef.rows = {{h::StormType::type_ii, 0.10, 2.55, -0.61, -0.16},
                 {h::StormType::type_ii, 0.50, 2.2, -0.3, 0.1}};
    coef.origin.source = "invented";
    h::PondFactorTable ponds;
    ponds.rows = {{0.0, 1.0}, {1.0, 0.87}, {5.0, 0.72}};
    ponds.origin.source = "invented";
    for (const double pond : {0.0, 2.0, 5.0, 8.0}) {
        add(h::tr55_peak(coef, ponds, h::StormType::type_ii, u::mi2_to_m2(1.0), 3.0,
                         u::in_to_mm(5.0), u::in_to_mm(0.2), u::in_to_mm(3.0), pond, s));
    }
    add(h::tr55_peak(coef, ponds, h::StormType::type_ii, u::mi2_to_m2(1.0), 900.0, u::in_to_mm(2.0),
                     u::in_to_mm(1.5), u::in_to_mm(0.1), 0.0, s));
    // Unit hydrograph: steps aggregated and split, a duration too long for tp.
    h::DimensionlessUnitHydrograph uh;
    uh.t_over_tp = {0.0, 1.0, 2.0};
    uh.q_over_qp = {0.0, 1.0, 0.0};
    uh.origin.source = "invented";
    catchpeak::rain::Hyetograph rain;
    rain.step_s = 300.0;
    rain.depth_mm = {5.0, 10.0, 30.0, 20.0, 5.0};
    add(h::unit_hydrograph_from_rainfall(uh, rain, 80.0, 1e6, 60.0, s));
    rain.step_s = 3600.0;
    add(h::unit_hydrograph_from_rainfall(uh, rain, 80.0, 1e6, 60.0, s));
    h::UnitHydrographSettings coarse;
    coarse.step_fraction_of_tc = 2.0;
    add(h::unit_hydrograph_from_rainfall(uh, rain, 80.0, 1e6, 60.0, s, coarse));
    return all;
}

void expect_every_line_renders(System s) {
    const CalcLines lines = all_lines(s);
    std::set<std::string> keys;
    std::size_t warnings = 0;
    std::size_t notes = 0;
    for (const auto &l : lines.lines()) {
        EXPECT_FALSE(l.key.empty()) << "a line without a key";
        keys.insert(l.key);
        catchpeak::LineText t;
        ASSERT_NO_THROW(t = catchpeak::test::text(l)) << l.key;
        EXPECT_FALSE(t.label.empty()) << l.key;
        EXPECT_FALSE(t.numbers.empty()) << l.key;
        EXPECT_FALSE(t.source.empty()) << l.key;
        for (const auto *part : {&t.label, &t.symbols, &t.numbers, &t.source}) {
            EXPECT_EQ(part->find_first_of("{}"), std::string::npos) << l.key << ": " << *part;
        }
        warnings += l.kind == LineKind::warning ? 1 : 0;
        notes += l.kind == LineKind::note ? 1 : 0;
    }
    // The inputs reach the warnings and notes chosen above, not only the calculations.
    EXPECT_GE(warnings, 10u);
    EXPECT_GE(notes, 2u);
    EXPECT_GE(keys.size(), 45u);
}

TEST(HydroLineText, EveryLineRendersOnAnSiSheet) { expect_every_line_renders(System::si); }

TEST(HydroLineText, EveryLineRendersOnAUsSheet) { expect_every_line_renders(System::us_customary); }

} // namespace
