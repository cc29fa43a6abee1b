// SPDX-License-Identifier: MIT
// End to end on small table-input projects. Every expected figure below was computed by hand
// (calculator, steps written out beside it) from the published equations, never copied from
// catchpeak's output.
#include "catchpeak/app/pipeline.hpp"

#include "catchpeak/core/error.hpp"
#include "support/killed_writer.hpp"
#include "support/results_json.hpp"
#include "support/test_project.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <fstream>
#include <sstream>
#include <string>

using namespace catchpeak::app;
using catchpeak::project::project_template;
namespace fs = std::filesystem;

// Under LeakSanitizer (asan preset): the run renders the calculation sheet, and fontconfig keeps
// its font configuration in memory for the life of the process. Only leaks from libfontconfig
// itself are suppressed.
extern "C" const char *__lsan_default_suppressions() { return "leak:libfontconfig.so\n"; }

using catchpeak::test::point;

namespace {

using catchpeak::test::read_file;
using catchpeak::test::TestProject;
using catchpeak::test::write_file;

/// An SI project: IN-1 with a given tc read straight off the IDF table, OUT-1 with Kirpich.
TestProject si_project(const std::string &scratch_name) {
    TestProject p(scratch_name);
    p.project.text("name", "Birchwood Lane inlets");
    p.rainfall.set("return_periods_yr", "[2, 10]");
    p.methods.text("tc", "kirpich").set("peak", "[\"rational\"]");
    p.settings.set("minimum_tc_min", "5");
    p.catchments("id,area_ha,length_m,relief_m,c,tc_min\n"
                 "IN-1,0.72,80,1.6,0.5,10\n"
                 "OUT-1,3.0,500,5,0.45,\n");
    p.idf("# invented IDF table for the test\n"
          "# unit: mm/h\n"
          "duration_min,2,10\n"
          "5,110,150\n"
          "10,90,120\n"
          "15,75,100\n"
          "60,30,40\n");
    return p;
}

double q(const nlohmann::json &p, double rp) {
    for (const auto &pk : p.at("peaks")) {
        if (pk.at("return_period_yr").get<double>() == rp && pk.at("method") == "rational") {
            return pk.at("q_m3_s").get<double>();
        }
    }
    throw std::runtime_error("no peak");
}

} // namespace

TEST(Pipeline, TableProjectSiComputedByHand) {
    auto p = si_project("pipeline_si");
    const auto &dir = p.dir();
    std::ostringstream out;
    std::ostringstream err;
    RunOptions options;
    options.run_time_utc = "2026-01-01T00:00:00Z";
    (void)p.run_app(options, out, err);
    const auto j = nlohmann::json::parse(read_file(dir / "out" / "results.json"));

    // IN-1: tc given as 10 min, i read from the table at 10 min (no interpolation).
    // Q = C i A / 360 (Rational Method, SI form: i mm/h, A ha, Q m3/s):
    // 2-year: 0.5 x 90 x 0.72 / 360 = 0.09 m3/s; 10-year: 0.5 x 120 x 0.72 / 360 = 0.12 m3/s.
    const auto &in1 = point(j, "IN-1");
    EXPECT_DOUBLE_EQ(in1.at("tc_min").get<double>(), 10.0);
    EXPECT_NEAR(q(in1, 2.0), 0.09, 1e-12);  // exact arithmetic; tolerance: floating point
    EXPECT_NEAR(q(in1, 10.0), 0.12, 1e-12); // exact arithmetic; tolerance: floating point
    EXPECT_DOUBLE_EQ(in1.at("catchment").at("area_m2").get<double>(), 7200.0);

    // OUT-1: Kirpich SI form tc = 0.0195 L^0.77 S^-0.385 (TxDOT HDM eq. 4-15), L = 500 m,
    // S = 5 / 500 = 0.01. By hand: ln 500 = 6.21461, x 0.77 = 4.78525, e^ = 119.74;
    // 0.01^-0.385 = 10^0.77 = 5.88844; tc = 0.0195 x 119.74 x 5.88844 = 13.749 min.
    // 10-year i, log-log between 10 min (120) and 15 min (100):
    // n = ln(100/120) / ln(15/10) = -0.182322 / 0.405465 = -0.449662;
    // i = 120 x (13.749 / 10)^n = 120 x e^(-0.449662 x 0.318377) = 120 x 0.866614 = 103.99 mm/h.
    // Q = 0.45 x 103.99 x 3.0 / 360 = 0.38997 m3/s.
    // Tolerance 0.02 %: the hand calculation carries 5 to 6 significant figures.
    const auto &out1 = point(j, "OUT-1");
    EXPECT_NEAR(out1.at("tc_min").get<double>(), 13.749, 13.749 * 2e-4);
    EXPECT_NEAR(q(out1, 10.0), 0.38997, 0.38997 * 2e-4);
    EXPECT_EQ(out1.at("tc_method"), "kirpich");

    // The summary table prints the same figures at 4 significant figures.
    EXPECT_NE(out.str().find("0.1200"), std::string::npos) << out.str();
    // The run record holds the time and the SHA-256 of the inputs; results.json does not.
    const auto rec = nlohmann::json::parse(read_file(dir / "out" / "run-record.json"));
    EXPECT_EQ(rec.at("run_time_utc"), "2026-01-01T00:00:00Z");
    // project file, catchment table, IDF and the frequency factor table.
    EXPECT_EQ(rec.at("inputs").size(), 4u);
    // And of the outputs but itself: the sheet, summary.csv and results.json.
    EXPECT_EQ(rec.at("outputs").size(), 3u);
    EXPECT_EQ(read_file(dir / "out" / "results.json").find("2026-01-01"), std::string::npos);
    // Every calculation line of a design point is numbered "<id>-L<n>", and each peak names
    // the line that gives it.
    EXPECT_EQ(in1.at("lines").at(0).at("id"), "IN-1-L1");
    const std::string q_line = in1.at("peaks").at(0).at("line_id");
    bool found = false;
    for (const auto &l : in1.at("lines")) {
        if (l.at("id") == q_line) {
            found = true;
            EXPECT_NEAR(l.at("value").get<double>(), 0.09, 1e-12); // the 2-year Q above
        }
    }
    EXPECT_TRUE(found) << q_line;
}

TEST(Pipeline, UsCustomarySheetUsesThePublishedUsForm) {
    TestProject p("pipeline_us");
    const auto &dir = p.dir();
    p.project.text("name", "Cedar Hollow lot").text("units", "US");
    p.inputs.text("catchment_table", "c.csv");
    p.with_file("c.csv", "id,area_ac,length_ft,slope_percent,c,tc_min\nLOT-1,2.0,300,2,0.6,10\n");
    p.idf("# unit: in/h\nduration_min,10\n5,5.0\n10,4.0\n30,2.5\n");
    std::ostringstream out;
    std::ostringstream err;
    RunOptions options;
    options.quiet = true;
    (void)p.run_app(options, out, err);
    EXPECT_TRUE(out.str().empty());
    const auto j = nlohmann::json::parse(read_file(dir / "out" / "results.json"));
    // Q = Cf C i A x 43560/43200 (1 acre-in/h = 43560 ft3 / 43200 s, exact), Cf = 1.0 for 10
    // years (config table): 0.6 x 4.0 x 2.0 = 4.8 ac-in/h x 1.008333 = 4.84 ft3/s
    // = 4.84 x 0.028316846592 = 0.137054 m3/s (computed by hand).
    EXPECT_NEAR(q(point(j, "LOT-1"), 10.0), 0.137054, 1e-6); // hand rounding at 6 figures
    // The sheet's line in ft3/s shows the US form.
    bool found = false;
    for (const auto &l : point(j, "LOT-1").at("lines")) {
        if (l.at("unit") == "ft3/s") {
            found = true;
            EXPECT_NEAR(l.at("value").get<double>(), 4.84, 1e-9); // exact arithmetic
        }
    }
    EXPECT_TRUE(found);
}

TEST(Pipeline, RationalPeaksFollowFromTheStoredFigures) {
    // Issue 17: results.json stored C and Cf but not the capped product, so Q recomputed from
    // them came out high wherever C Cf > 1. A checker takes cf_c_used, the intensity and the
    // area: Q = Cf C i A / 360 (SI form, i mm/h, A ha; Rational Method), on both sheets (the US
    // form converts exactly: 1 acre-in/h = 43560/43200 ft3/s). Cf 1.25 for 100 years
    // (config/rational_frequency_factors.csv) makes 0.9 x 1.25 = 1.125 capped at 1.0.
    for (const char *units : {"SI", "US"}) {
        TestProject p(std::string("pipeline_recompute_") + units);
        p.project.text("units", units);
        p.rainfall.set("return_periods_yr", "[10, 100]");
        p.catchments("id,area_ha,length_m,relief_m,c,tc_min\nPAVED,1.5,90,1.8,0.9,10\n");
        p.idf("# unit: mm/h\nduration_min,10,100\n5,150,210\n10,120,170\n60,40,60\n");
        std::ostringstream out;
        std::ostringstream err;
        RunOptions options;
        options.quiet = true;
        (void)p.run_app(options, out, err);
        const auto j = nlohmann::json::parse(read_file(p.dir() / "out" / "results.json"));
        const auto &pt = point(j, "PAVED");
        const double area_ha = pt.at("catchment").at("area_m2").get<double>() / 1e4;
        int peaks = 0;
        for (const auto &pk : pt.at("peaks")) {
            const auto &in = pk.at("intermediates");
            const double used = in.at("cf_c_used").get<double>();
            const double product = in.at("c").get<double>() * in.at("cf").get<double>();
            EXPECT_DOUBLE_EQ(used, std::min(product, 1.0)) << units;
            const double q = used * in.at("intensity_mm_per_h").get<double>() * area_ha / 360.0;
            // Tolerance: floating point of the unit conversions only.
            EXPECT_NEAR(pk.at("q_m3_s").get<double>(), q, q * 1e-12) << units;
            ++peaks;
        }
        EXPECT_EQ(peaks, 2) << units;
        // The 100-year peak is the capped one: 1.0 x 170 x 1.5 / 360 = 0.708333 m3/s.
        EXPECT_NEAR(pt.at("peaks").at(1).at("q_m3_s").get<double>(), 170.0 * 1.5 / 360.0, 1e-9)
            << units;
    }
}

TEST(Pipeline, TwoRunsGiveByteIdenticalResults) {
    auto p = si_project("pipeline_twice");
    const auto &dir = p.dir();
    std::ostringstream out;
    std::ostringstream err;
    RunOptions a;
    a.out_dir = dir / "a";
    a.quiet = true;
    RunOptions b = a;
    b.out_dir = dir / "b";
    (void)p.run_app(a, out, err);
    (void)p.run_app(b, out, err);
    const std::string ra = read_file(dir / "a" / "results.json");
    EXPECT_FALSE(ra.empty());
    EXPECT_EQ(ra, read_file(dir / "b" / "results.json"));
    EXPECT_EQ(read_file(dir / "a" / "summary.csv"), read_file(dir / "b" / "summary.csv"));
}

TEST(Pipeline, InitWritesTheTemplateAndRefusesToOverwrite) {
    const auto dir = catchpeak::test::scratch_dir("init");
    const auto file = init_project(dir / "new");
    EXPECT_EQ(read_file(file), std::string(project_template()));
    write_file(file, "edited");
    EXPECT_THROW(init_project(dir / "new"), catchpeak::InputError);
    EXPECT_EQ(read_file(file), "edited");
}

// A failed run left part of its output set: when results.json could not be written, a new
// calculation-sheet.pdf and summary.csv were already under their final names.
TEST(Pipeline, ARunThatCannotWriteResultsJsonPutsNoOutputInPlace) {
    auto p = si_project("pipeline_results_blocked");
    fs::create_directories(p.out_dir() / "results.json" / "in-the-way");
    try {
        (void)p.run_app();
        FAIL() << "expected an InputError";
    } catch (const catchpeak::InputError &e) {
        EXPECT_NE(std::string(e.what()).find("results.json"), std::string::npos) << e.what();
    }
    for (const char *name : {"calculation-sheet.pdf", "summary.csv", "run-record.json"}) {
        EXPECT_FALSE(fs::exists(p.out_dir() / name)) << name;
    }
    EXPECT_TRUE(catchpeak::test::pending_files(p.out_dir()).empty());
}

// After a run killed with kill -9 its hidden temporary files stayed in the output folder, and
// later runs did not remove them.
TEST(Pipeline, ARunRemovesTheTemporaryFilesOfAKilledRun) {
    auto p = si_project("pipeline_killed_before");
    fs::create_directories(p.out_dir());
    const auto sheet =
        catchpeak::test::temporary_of_killed_writer(p.out_dir() / "calculation-sheet.pdf");
    const auto json = catchpeak::test::temporary_of_killed_writer(p.out_dir() / "results.json");
    write_file(p.out_dir() / "my-notes.txt", "the engineer's own file");
    std::ostringstream out;
    std::ostringstream err;
    (void)p.run_app(TestProject::quiet_options(), out, err);
    EXPECT_FALSE(fs::exists(sheet));
    EXPECT_FALSE(fs::exists(json));
    EXPECT_NE(err.str().find(sheet.filename().string()), std::string::npos) << err.str();
    EXPECT_TRUE(catchpeak::test::pending_files(p.out_dir()).empty());
    EXPECT_EQ(read_file(p.out_dir() / "my-notes.txt"), "the engineer's own file");
}

// A run that fails before it writes anything removes them too.
TEST(Pipeline, AFailingRunRemovesTheTemporaryFilesOfAKilledRun) {
    auto p = si_project("pipeline_killed_then_fails");
    p.catchments("id,area_ha,length_m,relief_m,c,tc_min\nIN-1,-1,80,1.6,0.5,10\n");
    fs::create_directories(p.out_dir());
    const auto sheet =
        catchpeak::test::temporary_of_killed_writer(p.out_dir() / "calculation-sheet.pdf");
    EXPECT_THROW((void)p.run_app(), catchpeak::InputError);
    EXPECT_FALSE(fs::exists(sheet));
    EXPECT_TRUE(catchpeak::test::pending_files(p.out_dir()).empty());
}
