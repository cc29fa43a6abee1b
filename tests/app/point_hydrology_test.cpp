// SPDX-License-Identifier: MIT
// The SCS Curve Number methods wired into `catchpeak run` on a small table-input project. Every
// expected figure is computed by hand in this file from the published equations (the steps are
// written out below), never copied from catchpeak's output.
#include "catchpeak/app/pipeline.hpp"
#include "catchpeak/app/point_hydrology.hpp"
#include "support/calc_lines.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/core/units.hpp"
#include "catchpeak/report/sheet.hpp"
#include "support/input_error.hpp"
#include "support/test_env.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <numeric>
#include <sstream>
#include <string>

using namespace catchpeak::app;
using namespace catchpeak::project;
namespace fs = std::filesystem;

// (The LeakSanitizer suppression of fontconfig for this test program is in pipeline_test.cpp.)

namespace {

void write(const fs::path &path, const std::string &text) {
    std::ofstream(path, std::ios::binary) << text;
}

/// Replaces the first `from` in a file by `to`; throws when `from` is not in it.
void replace_in_file(const fs::path &path, const std::string &from, const std::string &to) {
    std::ifstream in(path, std::ios::binary);
    std::ostringstream s;
    s << in.rdbuf();
    std::string text = s.str();
    const auto at = text.find(from);
    if (at == std::string::npos) {
        throw std::runtime_error("test set-up: text not found: " + from);
    }
    text.replace(at, from.size(), to);
    write(path, text);
}

/// Invented project: SP-1 (640 ac = 1 mi2, CN 80, tc given 30 min) and SP-2 (NRCS lag tc:
/// L = 304.8 m = 1000 ft, slope 4 %, CN 80). One return period, P24 = 127 mm = 5.0 in, Type II.
fs::path scs_project(const fs::path &dir) {
    write(dir / "project.toml", R"([project]
name = "Meadowbrook Farm drainage"
units = "SI"

[inputs]
catchment_table = "catchments.csv"

[rainfall]
return_periods_yr = [25]
storm_type = "II"
depths_24h_mm = { "25" = 127.0 }

[methods]
tc = "nrcs_lag"
peak = ["tr55_graphical", "scs_unit_hydrograph"]

[settings]
minimum_tc_min = 5

[output]
folder = "out"
)");
    write(dir / "catchments.csv", "id,area_ac,length_m,slope_percent,cn,tc_min\n"
                                  "SP-1,640,3000,2,80,30\n"
                                  "SP-2,40,304.8,4,80,\n");
    return dir / "project.toml";
}

const catchpeak::report::DesignPointResult &point(const catchpeak::report::RunResults &r,
                                                  const std::string &id) {
    for (const auto &p : r.points) {
        if (p.id == id) {
            return p;
        }
    }
    throw std::runtime_error("no design point " + id);
}

const catchpeak::report::Peak &peak(const catchpeak::report::DesignPointResult &dp,
                                    const std::string &method) {
    for (const auto &p : dp.peaks) {
        if (catchpeak::key_of(p.method) == method) {
            return p;
        }
    }
    throw std::runtime_error("no peak " + method);
}

// Hand computation, TR-55 ch. 2, inches (eq. 2-4, 2-2, 2-3):
//   S = 1000/80 - 10 = 2.5 in; Ia = 0.2 x 2.5 = 0.5 in; P = 127 / 25.4 = 5.0 in;
//   Q = (5.0 - 0.5)^2 / (5.0 - 0.5 + 2.5) = 20.25 / 7 = 2.892857 in = 73.4786 mm.
// (TR-55 Table 2-1 prints 2.89 in for P = 5.0 in, CN 80.)
constexpr double s_in = 1000.0 / 80.0 - 10.0;
constexpr double ia_in = 0.2 * s_in;
constexpr double p_in = 5.0;
constexpr double q_in = (p_in - ia_in) * (p_in - ia_in) / (p_in - ia_in + s_in);
constexpr double q_mm = q_in * 25.4;

} // namespace

TEST(PointHydrology, Tr55GraphicalComputedByHand) {
    const auto dir = catchpeak::test::scratch_dir("point_tr55");
    const Project p = load_project(scs_project(dir));
    std::ostringstream progress;
    const auto r = compute_project(p, progress, true);
    const auto &dp = point(r, "SP-1");
    EXPECT_EQ(dp.tc_method, catchpeak::TcMethod::given);
    EXPECT_DOUBLE_EQ(dp.tc_min, 30.0);
    const auto &pk = peak(dp, "tr55_graphical");
    EXPECT_DOUBLE_EQ(pk.return_period_yr, 25.0);
    EXPECT_NEAR(pk.intermediates.at("rainfall_depth_mm"), 127.0, 1e-9);
    // Tolerance 1e-6 mm: floating point only.
    EXPECT_NEAR(pk.intermediates.at("runoff_depth_mm"), q_mm, 1e-6);
    EXPECT_NEAR(q_in, 2.89, 0.005); // TR-55 Table 2-1, printed to 0.01 in
    EXPECT_NEAR(pk.intermediates.at("initial_abstraction_mm"), ia_in * 25.4, 1e-6);
    // Ia/P = 0.5 / 5.0 = 0.10: exactly the first Type II row of the shipped coefficient table
    // (config/tr55_peak_coefficients.csv: II, 0.10, C0 = 2.55323, C1 = -0.61512,
    // C2 = -0.16403), so no interpolation between rows.
    EXPECT_NEAR(pk.intermediates.at("ia_over_p"), 0.10, 1e-12);
    // TR-55 ch. 4: log10(qu) = C0 + C1 log10(tc) + C2 (log10 tc)^2, tc = 0.5 h.
    const double lt = std::log10(0.5);
    const double qu = std::pow(10.0, 2.55323 - 0.61512 * lt - 0.16403 * lt * lt);
    // Tolerance 1e-6 relative: floating point only (same coefficients, same equation).
    EXPECT_NEAR(pk.intermediates.at("unit_peak_csm_per_in"), qu, qu * 1e-6);
    // qp = qu Am Q Fp (TR-55 eq. 4-1), Am = 640 ac = 1 mi2, Fp = 1 (no ponds given), in ft3/s;
    // 1 ft3/s = 0.028316846592 m3/s (exact).
    EXPECT_DOUBLE_EQ(pk.intermediates.at("fp"), 1.0);
    const double qp_m3_s = qu * 1.0 * q_in * 1.0 * 0.028316846592;
    EXPECT_NEAR(pk.q_m3_s, qp_m3_s, qp_m3_s * 1e-6);
    // The Q line of the peak is the line in m3/s that the sheet and summary.csv point to.
    ASSERT_FALSE(pk.line_id.empty());
    bool found = false;
    for (const auto &l : dp.lines.lines()) {
        if (l.id == pk.line_id) {
            found = true;
            EXPECT_EQ(catchpeak::test::text(l).unit, "m3/s");
            EXPECT_NEAR(l.value(), pk.q_m3_s, 1e-12);
        }
    }
    EXPECT_TRUE(found) << pk.line_id;
}

TEST(PointHydrology, UnitHydrographAgreesWithTheEquations) {
    const auto dir = catchpeak::test::scratch_dir("point_uh");
    const Project p = load_project(scs_project(dir));
    std::ostringstream progress;
    const auto r = compute_project(p, progress, true);
    const auto &dp = point(r, "SP-1");
    const auto &pk = peak(dp, "scs_unit_hydrograph");
    ASSERT_TRUE(pk.hydrograph.has_value());
    const auto &h = *pk.hydrograph;
    ASSERT_GT(h.step_s, 0.0);
    ASSERT_EQ(h.rain_mm.size(), h.q_m3_s.size());
    ASSERT_EQ(h.excess_mm.size(), h.q_m3_s.size());
    // The whole storm falls: the rain plotted adds up to P (1e-6 mm: floating point sums).
    EXPECT_NEAR(std::accumulate(h.rain_mm.begin(), h.rain_mm.end(), 0.0), 127.0, 1e-6);
    // The excess of the mass curve adds up to the runoff of the whole depth, eq. 2-3 above.
    EXPECT_NEAR(std::accumulate(h.excess_mm.begin(), h.excess_mm.end(), 0.0), q_mm, 1e-6);
    EXPECT_NEAR(pk.intermediates.at("runoff_depth_mm"), q_mm, 1e-6);
    // Volume = Q A = 0.0734786 m x 640 ac (2589988.110336 m2). Tolerance 2 %: the
    // dimensionless unit hydrograph is a table of ordinates at 0.1 t/tp printed to three
    // decimals, so its area is 1 only within that precision, and it is sampled at step D.
    const double volume_m3 = q_mm / 1000.0 * 2589988.110336;
    EXPECT_NEAR(pk.intermediates.at("volume_m3"), volume_m3, 0.02 * volume_m3);
    // Unit hydrograph time to peak, NEH 630 ch. 16: tp = D/2 + 0.6 tc (tc = 30 min).
    const double d_min = pk.intermediates.at("step_min");
    EXPECT_NEAR(pk.intermediates.at("unit_hydrograph_tp_min"), d_min / 2.0 + 0.6 * 30.0, 1e-9);
    // The convolved peak cannot exceed the unit hydrograph's peak (NEH 630 ch. 16, SI form
    // qp = 0.208 A Q / tp, A km2, Q mm, tp h) times the whole runoff depth, since every ordinate
    // is a sum of excess depths times ordinates no higher than that peak. 1 % margin for the
    // rounded 0.208 (computed: 484 x 0.0283168 / (2.589988 x 25.4) = 0.20834).
    const double tp_h = pk.intermediates.at("unit_hydrograph_tp_min") / 60.0;
    const double bound = 0.208 * 2.589988110336 * q_mm / tp_h;
    EXPECT_GT(pk.q_m3_s, 0.0);
    EXPECT_LT(pk.q_m3_s, 1.01 * bound);
    // The peak is the largest ordinate, at its time. The Type II storm's intense part is
    // at about 12 h (TP-149 Table 1: about half the depth has fallen by 12 h), so the peak comes
    // after 11.5 h and before 12 h + 5 tp (the unit hydrograph's base).
    const double qmax = *std::max_element(h.q_m3_s.begin(), h.q_m3_s.end());
    EXPECT_DOUBLE_EQ(pk.q_m3_s, qmax);
    const double t_peak_h = pk.intermediates.at("time_to_peak_min") / 60.0;
    EXPECT_GT(t_peak_h, 11.5);
    EXPECT_LT(t_peak_h, 12.0 + 5.0 * tp_h);
    ASSERT_FALSE(pk.line_id.empty());
}

TEST(PointHydrology, NrcsLagComputedByHand) {
    const auto dir = catchpeak::test::scratch_dir("point_lag");
    const Project p = load_project(scs_project(dir));
    std::ostringstream progress;
    const auto r = compute_project(p, progress, true);
    const auto &dp = point(r, "SP-2");
    EXPECT_EQ(dp.tc_method, catchpeak::TcMethod::nrcs_lag);
    // NEH 630 ch. 15: lag = l^0.8 (S + 1)^0.7 / (1900 Y^0.5) h, l = 1000 ft, S = 2.5 in,
    // Y = 4 % (no mean slope in the table: the flow-path slope, stated in a note);
    // tc = lag / 0.6.
    const double lag_h = std::pow(1000.0, 0.8) * std::pow(2.5 + 1.0, 0.7) / (1900.0 * 2.0);
    // Tolerance 1e-6 min: floating point only.
    EXPECT_NEAR(dp.tc_min, lag_h / 0.6 * 60.0, 1e-6);
    bool note = false;
    for (const auto &l : dp.lines.lines()) {
        if (catchpeak::test::text(l).numbers.find("slope of the longest flow path") !=
            std::string::npos) {
            note = true;
        }
    }
    EXPECT_TRUE(note);
}

TEST(PointHydrology, ReferencesAndCautionNotes) {
    const auto dir = catchpeak::test::scratch_dir("point_refs");
    const Project p = load_project(scs_project(dir));
    std::ostringstream progress;
    const auto r = compute_project(p, progress, true);
    std::vector<std::string> keys;
    for (const auto &ref : r.references) {
        keys.push_back(ref.key);
        EXPECT_FALSE(ref.citation.empty());
    }
    for (const std::string k :
         {"TR-55 (1986)", "NEH 630 ch. 15 (2010)", "NEH 630 ch. 16 (2007)", "TP-149 (1973)"}) {
        EXPECT_EQ(std::count(keys.begin(), keys.end(), k), 1) << k;
    }
    // Kirpich is not used by this project.
    EXPECT_EQ(std::count(keys.begin(), keys.end(), "Kirpich (1940)"), 0);
    // The default notes, and one more: SP-1's unit-hydrograph peak is averaged over the storm
    // table's 11.5-12 h interval (StormTableAveraging below).
    const auto &defaults = catchpeak::report::default_caution_notes();
    ASSERT_EQ(r.caution_notes.size(), defaults.size() + 1);
    EXPECT_TRUE(std::equal(defaults.begin(), defaults.end(), r.caution_notes.begin()));
    EXPECT_EQ(r.caution_notes.back().rfind("Storm table averaging: ", 0), 0u);
}

TEST(PointHydrology, CompositeRunoffOfLandParts) {
    // Two parts, 1 ha each, CN 98 and CN 70, P = 127 mm (5.0 in). By hand, TR-55 eq. 2-1 to 2-4:
    //   CN 98: S = 0.204082 in, Ia = 0.040816, Q = 4.959184^2 / 5.163265 = 4.763162 in;
    //   CN 70: S = 4.285714 in, Ia = 0.857143, Q = 4.142857^2 / 8.428571 = 2.036319 in;
    //   weighted Q = 3.399741 in; composite CN 84: S = 1.904762, Ia = 0.380952,
    //   Q = 4.619048^2 / 6.523810 = 3.270396 in; difference 3.8 % (below the 5 % warning).
    const auto dir = catchpeak::test::scratch_dir("point_parts");
    const Project p = load_project(scs_project(dir));
    PointInputs in;
    in.area_m2 = 20000.0;
    in.longest_flow_path_m = 200.0;
    in.slope = 0.02;
    in.cn = 84.0;
    in.tc_min = 10.0;
    in.land_parts = {{"roofs", 10000.0, 98.0}, {"lawn", 10000.0, 70.0}};
    in.source = "test input";
    const auto loaded = load_hydrology_tables(p, config_dir());
    catchpeak::report::DesignPointResult dp;
    dp.id = "SP-9";
    compute_point_hydrology(p, in, loaded.view(), dp);
    auto q = [](double cn) {
        const double s = 1000.0 / cn - 10.0;
        return (p_in - 0.2 * s) * (p_in - 0.2 * s) / (p_in - 0.2 * s + s);
    };
    const double weighted_in = 0.5 * q(98.0) + 0.5 * q(70.0);
    EXPECT_NEAR(weighted_in, 3.3997, 1e-4); // the hand figures in the comment above
    bool weighted_line = false;
    for (const auto &l : dp.lines.lines()) {
        if (l.kind == catchpeak::LineKind::calculation && catchpeak::test::text(l).unit == "mm" &&
            std::abs(l.value() - weighted_in * 25.4) < 1e-6) {
            weighted_line = true;
        }
    }
    EXPECT_TRUE(weighted_line) << "no line with the area-weighted runoff";
    // The peaks use the composite CN (TR-55's procedure), Q of CN 84.
    EXPECT_NEAR(peak(dp, "tr55_graphical").intermediates.at("runoff_depth_mm"), q(84.0) * 25.4,
                1e-6);
}

TEST(PointHydrology, RunWritesTheSheetWithTheHydrograph) {
    const auto dir = catchpeak::test::scratch_dir("point_run");
    RunOptions options;
    options.quiet = true;
    options.run_time_utc = "2026-01-01T00:00:00Z";
    std::ostringstream out;
    std::ostringstream err;
    run_project(scs_project(dir), options, out, err);
    EXPECT_TRUE(fs::exists(dir / "out" / "results.json"));
    std::ifstream in(dir / "out" / "results.json");
    std::ostringstream s;
    s << in.rdbuf();
    EXPECT_NE(s.str().find("\"scs_unit_hydrograph\""), std::string::npos);
    EXPECT_NE(s.str().find("\"excess_mm\""), std::string::npos);
}

TEST(PointHydrology, IaFivePercentWithTr55IsAWarning) {
    const auto dir = catchpeak::test::scratch_dir("point_ia005");
    Project p = load_project(scs_project(dir));
    p.settings.initial_abstraction_ratio = 0.05;
    std::ostringstream progress;
    const auto r = compute_project(p, progress, true);
    bool warned = false;
    for (const auto &l : point(r, "SP-1").lines.lines()) {
        if (l.kind == catchpeak::LineKind::warning && l.key == "point.tr55_ia_005") {
            warned = true;
        }
    }
    EXPECT_TRUE(warned);
}

namespace {

/// Invented project with the alternating-block storm: AB-1 (1 km2, CN 80, tc given 30 min) and
/// AB-2 (the same with tc 60 min, longer than the 50-min storm). The 10-year IDF gives the
/// depths i t = 20, 28, 33, 36, 38, 40 mm at 10 to 60 min. No storm type, no 24-hour depths.
fs::path block_project(const fs::path &dir) {
    write(dir / "project.toml", R"([project]
name = "Alder Bend outfall"
units = "SI"

[inputs]
catchment_table = "catchments.csv"

[rainfall]
idf = "idf.csv"
return_periods_yr = [10]
design_storm = "alternating_block"
storm_duration_min = 50

[methods]
tc = "kirpich"
peak = ["rational", "scs_unit_hydrograph"]

[settings]
storm_time_step_min = 10

[output]
folder = "out"
)");
    write(dir / "catchments.csv", "id,area_km2,length_m,slope_percent,c,cn,tc_min\n"
                                  "AB-1,1.0,1500,2,0.5,80,30\n"
                                  "AB-2,1.0,1500,2,0.5,80,60\n");
    write(dir / "idf.csv", "# unit: mm/h\nduration_min,10\n10,120\n20,84\n30,66\n40,54\n"
                           "50,45.6\n60,40\n");
    return dir / "project.toml";
}

} // namespace

TEST(PointHydrology, UnitHydrographOfTheAlternatingBlockStorm) {
    const auto dir = catchpeak::test::scratch_dir("point_block_storm");
    const Project p = load_project(block_project(dir));
    std::ostringstream progress;
    const auto r = compute_project(p, progress, true);
    const auto &dp = point(r, "AB-1");
    const auto &pk = peak(dp, "scs_unit_hydrograph");
    // The storm's depth is the IDF depth for 50 min: 45.6 mm/h x 50/60 h = 38 mm.
    EXPECT_NEAR(pk.intermediates.at("rainfall_depth_mm"), 38.0, 1e-9);
    // Runoff by hand (TR-55 ch. 2, mm): S = 25400/80 - 254 = 63.5 mm, Ia = 12.7 mm,
    // Q = (38 - 12.7)^2 / (38 - 12.7 + 63.5) = 640.09 / 88.8 = 7.20822 mm.
    const double q = (38.0 - 12.7) * (38.0 - 12.7) / (38.0 - 12.7 + 63.5);
    EXPECT_NEAR(pk.intermediates.at("runoff_depth_mm"), q, 1e-6); // floating point only
    // Volume of the hydrograph = runoff depth x area, 1 km2. Tolerance 2 %: the dimensionless
    // unit hydrograph's table (ordinates printed to three decimals) has an area of 1 only
    // within that precision.
    const double volume_m3 = q / 1000.0 * 1.0e6;
    EXPECT_NEAR(pk.intermediates.at("volume_m3"), volume_m3, 0.02 * volume_m3);
    ASSERT_TRUE(pk.hydrograph.has_value());
    const auto &h = *pk.hydrograph;
    double sum_q = 0.0;
    for (double v : h.q_m3_s) {
        sum_q += v * h.step_s;
    }
    EXPECT_NEAR(sum_q, volume_m3, 0.02 * volume_m3);
    // The hyetograph plotted is the alternating block: all 38 mm, and the rain of the central
    // block (20 mm in 20 to 30 min) is the heaviest: the largest bin lies in it.
    EXPECT_NEAR(std::accumulate(h.rain_mm.begin(), h.rain_mm.end(), 0.0), 38.0, 1e-9);
    const auto heaviest = static_cast<double>(std::max_element(h.rain_mm.begin(), h.rain_mm.end()) -
                                              h.rain_mm.begin());
    EXPECT_GE(heaviest * h.step_s, 20.0 * 60.0 - 1e-9);
    EXPECT_LT(heaviest * h.step_s, 30.0 * 60.0);
    // The sheet's lines: the storm depth and a block depth; no 24-hour depth.
    bool storm_depth = false;
    bool block = false;
    for (const auto &l : dp.lines.lines()) {
        storm_depth = storm_depth || (catchpeak::test::text(l).label == "Storm depth" &&
                                      std::abs(l.value() - 38.0) < 1e-9);
        block = block ||
                catchpeak::test::text(l).label == "Block depth 1 of 5, placed 20.00 to 30.00 min";
        EXPECT_EQ(catchpeak::test::text(l).label.find("24-hour"), std::string::npos)
            << catchpeak::test::text(l).label;
        EXPECT_NE(l.key, "point.storm_shorter_than_tc");
    }
    EXPECT_TRUE(storm_depth);
    EXPECT_TRUE(block);
    // The Rational Method is unchanged: it takes i(tc) = i(30 min) = 66 mm/h from the IDF.
    EXPECT_NEAR(peak(dp, "rational").intermediates.at("intensity_mm_per_h"), 66.0, 1e-9);
    // AB-2's tc (60 min) is longer than the storm: a warning line.
    const auto &dp2 = point(r, "AB-2");
    EXPECT_TRUE(std::any_of(dp2.lines.lines().begin(), dp2.lines.lines().end(), [](auto &l) {
        return l.key == "point.storm_shorter_than_tc" &&
               catchpeak::test::text(l).label == "Storm shorter than the time of concentration";
    }));
    // The Chow et al. reference is listed.
    EXPECT_TRUE(std::any_of(r.references.begin(), r.references.end(),
                            [](auto &ref) { return ref.key == "Chow, Maidment & Mays (1988)"; }));
}

namespace {

/// The project of scs_project with the unit hydrograph alone and, in place of storm_type, the
/// project's own 24-hour table storm.csv (invented): 30 % of the depth by 11 h, 80 % by 13 h.
fs::path storm_table_project(const fs::path &dir, const std::string &table) {
    const fs::path file = scs_project(dir);
    replace_in_file(file, "storm_type = \"II\"", "storm_table = \"storm.csv\"");
    replace_in_file(file, "peak = [\"tr55_graphical\", \"scs_unit_hydrograph\"]",
                    "peak = [\"scs_unit_hydrograph\"]");
    write(dir / "storm.csv", table);
    return file;
}

const std::string regional_storm = "# name: Regional 24-hour storm\n"
                                   "# source: invented for this test\n"
                                   "# status: checked (invented)\n"
                                   "hour,cumulative_fraction\n"
                                   "0,0\n11,0.3\n13,0.8\n24,1\n";

} // namespace

TEST(PointHydrology, ProjectStormTableInPlaceOfTheNrcsOne) {
    const auto dir = catchpeak::test::scratch_dir("point_storm_table");
    const Project p = load_project(storm_table_project(dir, regional_storm));
    ASSERT_TRUE(p.rainfall.storm_table.has_value());
    EXPECT_FALSE(p.rainfall.storm_type.has_value());
    std::ostringstream progress;
    const auto r = compute_project(p, progress, true);
    const auto &dp = point(r, "SP-1");
    // The sheet names the table as given, with its own name and source.
    const auto *note = dp.lines.find_last("storm.distribution_project");
    ASSERT_NE(note, nullptr);
    const auto text = catchpeak::test::text(*note);
    EXPECT_NE(text.numbers.find("Regional 24-hour storm"), std::string::npos) << text.numbers;
    EXPECT_NE(text.numbers.find("storm.csv"), std::string::npos) << text.numbers;
    EXPECT_NE(text.numbers.find("[rainfall] storm_table"), std::string::npos) << text.numbers;
    EXPECT_NE(text.source.find("invented for this test"), std::string::npos) << text.source;
    EXPECT_EQ(dp.lines.find_last("storm.distribution"), nullptr);
    // The hyetograph follows the table: the steepest interval is 11 to 13 h, 0.5 of the depth
    // in 2 h, so a 6-min step there holds 127 mm x 0.5 x 0.1 / 2 = 3.175 mm (linear
    // interpolation between the table's points; floating point only).
    const auto *largest = dp.lines.find_last("storm.largest_step");
    ASSERT_NE(largest, nullptr);
    EXPECT_NEAR(largest->value(), 127.0 * 0.5 * 0.1 / 2.0, 1e-9);
    // Not the TP-149 reference (the table is the project's), and the run record holds the file
    // as given.
    EXPECT_FALSE(std::any_of(r.references.begin(), r.references.end(),
                             [](auto &ref) { return ref.key == "TP-149 (1973)"; }));
    EXPECT_TRUE(std::any_of(r.stamp.inputs.begin(), r.stamp.inputs.end(), [](auto &in) {
        return in.role == "design storm" && in.path == "storm.csv";
    }));
}

TEST(PointHydrology, StormTableAndStormTypeTogetherAreRefused) {
    const auto dir = catchpeak::test::scratch_dir("point_storm_table_both");
    const fs::path file = storm_table_project(dir, regional_storm);
    replace_in_file(file, "storm_table = ", "storm_type = \"II\"\nstorm_table = ");
    const std::string msg = catchpeak::test::input_error_of([&] { (void)load_project(file); });
    EXPECT_NE(msg.find("[rainfall] storm_table"), std::string::npos) << msg;
    EXPECT_NE(msg.find("storm_type"), std::string::npos) << msg;
    EXPECT_NE(msg.find("not both"), std::string::npos) << msg;
}

TEST(PointHydrology, StormTableWithTheTr55GraphicalMethodIsRefused) {
    const auto dir = catchpeak::test::scratch_dir("point_storm_table_tr55");
    const fs::path file = storm_table_project(dir, regional_storm);
    replace_in_file(file, "peak = [\"scs_unit_hydrograph\"]",
                    "peak = [\"tr55_graphical\", \"scs_unit_hydrograph\"]");
    const std::string msg = catchpeak::test::input_error_of([&] { (void)load_project(file); });
    EXPECT_NE(msg.find("[rainfall] storm_table"), std::string::npos) << msg;
    EXPECT_NE(msg.find("TR-55 graphical"), std::string::npos) << msg;
}

TEST(PointHydrology, BadStormTableNamesTheFileAndLine) {
    // Line 7 of the file (three comment lines, the header, "0,0", "11,0.3", then "13,0.2")
    // decreases.
    const std::string decreasing = "# name: Bad storm\n# source: invented\n# status: checked\n"
                                   "hour,cumulative_fraction\n0,0\n11,0.3\n13,0.2\n24,1\n";
    const auto dir = catchpeak::test::scratch_dir("point_storm_table_bad");
    const fs::path file = storm_table_project(dir, decreasing);
    // `catchpeak check` finds it (InputError: exit 2).
    const std::string check = catchpeak::test::input_error_of([&] {
        std::ostringstream out;
        check_project_file(file, out);
    });
    EXPECT_NE(check.find("storm.csv:7"), std::string::npos) << check;
    EXPECT_NE(check.find("[rainfall] storm_table"), std::string::npos) << check;
    EXPECT_NE(check.find("never decrease"), std::string::npos) << check;
    // A table that is not 24 hours long: the last row's line is named.
    write(dir / "storm.csv", "# name: Short storm\n# source: invented\n# status: checked\n"
                             "hour,cumulative_fraction\n0,0\n6,0.5\n12,1\n");
    const std::string msg = catchpeak::test::input_error_of([&] {
        std::ostringstream progress;
        (void)compute_project(load_project(file), progress, true);
    });
    EXPECT_NE(msg.find("storm.csv:7"), std::string::npos) << msg;
    EXPECT_NE(msg.find("ends at 12 h"), std::string::npos) << msg;
}

TEST(PointHydrology, StormTableAveragingOnlyWhereItMattersAndExplainedOnce) {
    // TP-149 Table 1 (config/storms/nrcs_type_ii.csv) has points at 11.5 h and 12 h and none
    // between: linear interpolation spreads the storm's most intense half hour evenly.
    //   SP-1, tc 30 min: D = 6 min / 2 = 3 min (D <= 0.133 tc = 3.99 min, NEH 630 ch. 16 as
    //     coded): the interval spans ten unit-hydrograph steps, and its peak is averaged.
    //   SP-4, tc 240 min: D = 5 x 6 = 30 min (0.133 tc = 31.9 min): 11.5-12 h is exactly its
    //     24th step, taken as one block whatever the rain does inside it; no averaging.
    // Before, the warning was given whenever the 6-min storm step was finer than the table,
    // SP-4's too, and no caution note said why.
    const auto dir = catchpeak::test::scratch_dir("point_storm_averaging");
    const fs::path file = scs_project(dir);
    replace_in_file(file, "return_periods_yr = [25]", "return_periods_yr = [10, 25]");
    replace_in_file(file, "depths_24h_mm = { \"25\" = 127.0 }",
                    "depths_24h_mm = { \"10\" = 110.0, \"25\" = 127.0 }");
    replace_in_file(file, "peak = [\"tr55_graphical\", \"scs_unit_hydrograph\"]",
                    "peak = [\"scs_unit_hydrograph\"]");
    write(dir / "catchments.csv", "id,area_ac,length_m,slope_percent,cn,tc_min\n"
                                  "SP-1,640,3000,2,80,30\n"
                                  "SP-4,6400,30000,1,80,240\n");
    std::ostringstream progress;
    const auto r = compute_project(load_project(file), progress, true);
    auto averaged = [](const catchpeak::report::DesignPointResult &dp) {
        std::vector<const catchpeak::CalcLine *> found;
        for (const auto &l : dp.lines.lines()) {
            if (l.kind == catchpeak::LineKind::warning && l.flags.averaged) {
                found.push_back(&l);
            }
        }
        return found;
    };
    const auto sp1 = averaged(point(r, "SP-1"));
    ASSERT_EQ(sp1.size(), 2u); // one short line for each peak, 10- and 25-year
    for (const auto *l : sp1) {
        const auto t = catchpeak::test::text(*l);
        EXPECT_EQ(t.label, "Peak averaged over a table interval");
        EXPECT_NE(t.numbers.find("11.50 to 12.00 h"), std::string::npos) << t.numbers;
        EXPECT_NE(t.numbers.find("Storm table averaging"), std::string::npos) << t.numbers;
    }
    EXPECT_NE(catchpeak::test::text(*sp1[0]).numbers.find("10-year"), std::string::npos);
    EXPECT_NE(catchpeak::test::text(*sp1[1]).numbers.find("25-year"), std::string::npos);
    EXPECT_DOUBLE_EQ(peak(point(r, "SP-4"), "scs_unit_hydrograph").intermediates.at("step_min"),
                     30.0);
    EXPECT_TRUE(averaged(point(r, "SP-4")).empty());
    // Why, once for the run: one caution note naming the table and the interval.
    const auto notes = std::count_if(r.caution_notes.begin(), r.caution_notes.end(), [](auto &n) {
        return n.rfind("Storm table averaging: ", 0) == 0;
    });
    ASSERT_EQ(notes, 1);
    const std::string &note = r.caution_notes.back();
    EXPECT_NE(note.find("2 unit-hydrograph peaks at 1 design point"), std::string::npos) << note;
    EXPECT_NE(note.find("NRCS 24-hour Type II"), std::string::npos) << note;
    EXPECT_NE(note.find("11.50 h and 12.00 h"), std::string::npos) << note;
}

namespace {

/// An invented two-part catchment: 0.6 ha of roofs (CN 98) and 1.4 ha of pasture (CN 61),
/// tc given 10 min, with the composite CN 0.3 x 98 + 0.7 x 61 = 72.1 (TR-55 Ex. 2-1's
/// area-weighting), through both SCS methods of scs_project (P = 127 mm = 5.0 in).
catchpeak::report::DesignPointResult two_part_point(const Project &p) {
    PointInputs in;
    in.area_m2 = 20000.0;
    in.longest_flow_path_m = 200.0;
    in.slope = 0.02;
    in.cn = 0.3 * 98.0 + 0.7 * 61.0;
    in.tc_min = 10.0;
    in.land_parts = {{"roofs, soil group B", 6000.0, 98.0},
                     {"pasture, soil group B", 14000.0, 61.0}};
    in.source = "test input";
    const auto loaded = load_hydrology_tables(p, config_dir());
    catchpeak::report::DesignPointResult dp;
    dp.id = "TP-1";
    compute_point_hydrology(p, in, loaded.view(), dp);
    return dp;
}

/// TR-55 eq. 2-3 and 2-4 in inches: S = 1000/CN - 10, Q = (P - 0.2 S)^2 / (P + 0.8 S).
double runoff_in(double p, double cn) {
    const double s = 1000.0 / cn - 10.0;
    return p > 0.2 * s ? (p - 0.2 * s) * (p - 0.2 * s) / (p + 0.8 * s) : 0.0;
}

} // namespace

TEST(PointHydrology, CnWeightingRunoffTakesTheWeightedRunoffOfTheParts) {
    const auto dir = catchpeak::test::scratch_dir("point_cn_weighting_runoff");
    Project p = load_project(scs_project(dir));
    p.methods.cn_weighting = CnWeighting::runoff;
    const auto dp = two_part_point(p);
    // By hand: Q = 0.3 Q(98) + 0.7 Q(61), P = 5.0 in; Ia of the composite CN 72.1.
    const double q_weighted_mm = (0.3 * runoff_in(5.0, 98.0) + 0.7 * runoff_in(5.0, 61.0)) * 25.4;
    const double ia_mm = 0.2 * (1000.0 / 72.1 - 10.0) * 25.4;
    const auto &tr55 = peak(dp, "tr55_graphical");
    // Tolerance 1e-6 mm: floating point only (the SI sheet evaluates in mm, 25400/CN - 254).
    EXPECT_NEAR(tr55.intermediates.at("runoff_depth_mm"), q_weighted_mm, 1e-6);
    EXPECT_NEAR(tr55.intermediates.at("initial_abstraction_mm"), ia_mm, 1e-6);
    EXPECT_NEAR(tr55.intermediates.at("ia_over_p"), ia_mm / 127.0, 1e-9);
    // The unit hydrograph convolves the weighted excess: its sum is the same Q.
    const auto &uh = peak(dp, "scs_unit_hydrograph");
    EXPECT_NEAR(uh.intermediates.at("runoff_depth_mm"), q_weighted_mm, 1e-6);
    ASSERT_TRUE(uh.hydrograph.has_value());
    EXPECT_NEAR(
        std::accumulate(uh.hydrograph->excess_mm.begin(), uh.hydrograph->excess_mm.end(), 0.0),
        q_weighted_mm, 1e-6);
    // The sheet: the choice stated once, each part's Q on its own line, the weighted Q.
    std::size_t notes = 0;
    std::vector<double> part_q_mm;
    for (const auto &l : dp.lines.lines()) {
        notes += l.key == "point.cn_weighting_runoff" ? 1 : 0;
        if (l.key == "cn.runoff") {
            part_q_mm.push_back(l.value());
        }
    }
    EXPECT_EQ(notes, 1u);
    ASSERT_EQ(part_q_mm.size(), 2u); // one return period, two parts; no composite-CN runoff
    EXPECT_NEAR(part_q_mm[0], runoff_in(5.0, 98.0) * 25.4, 1e-6);
    EXPECT_NEAR(part_q_mm[1], runoff_in(5.0, 61.0) * 25.4, 1e-6);
    EXPECT_NEAR(dp.lines.find_last("cn.runoff_weighted")->value(), q_weighted_mm, 1e-6);
    EXPECT_TRUE(dp.lines.has("uh.rainfall_excess_parts"));
    EXPECT_FALSE(dp.lines.has("cn.composite_differs"));
    EXPECT_EQ(dp.land.cn_weighting, "runoff");
}

TEST(PointHydrology, CnWeightingDefaultIsTheCompositeCnAsBefore) {
    const auto dir = catchpeak::test::scratch_dir("point_cn_weighting_default");
    const Project p = load_project(scs_project(dir));
    EXPECT_EQ(p.methods.cn_weighting, CnWeighting::composite);
    const auto dp = two_part_point(p);
    // Both peaks take the runoff of the composite CN 72.1 (TR-55 eq. 2-3, 2-4 by hand).
    const double q_composite_mm = runoff_in(5.0, 72.1) * 25.4;
    EXPECT_NEAR(peak(dp, "tr55_graphical").intermediates.at("runoff_depth_mm"), q_composite_mm,
                1e-6);
    EXPECT_NEAR(peak(dp, "scs_unit_hydrograph").intermediates.at("runoff_depth_mm"), q_composite_mm,
                1e-6);
    EXPECT_FALSE(dp.lines.has("point.cn_weighting_runoff"));
    EXPECT_FALSE(dp.lines.has("cn.part"));
    EXPECT_FALSE(dp.lines.has("uh.rainfall_excess_parts"));
    // The weighted runoff is still shown beside it, with the warning when they differ: here
    // 0.3 Q(98) + 0.7 Q(61) against Q(72.1), by hand 7.6 % apart (over 5 %).
    const double q_weighted_in = 0.3 * runoff_in(5.0, 98.0) + 0.7 * runoff_in(5.0, 61.0);
    EXPECT_GT(std::abs(q_weighted_in * 25.4 - q_composite_mm) / (q_weighted_in * 25.4), 0.05);
    EXPECT_TRUE(dp.lines.has("cn.composite_differs"));
    EXPECT_EQ(dp.land.cn_weighting, "composite");
}
