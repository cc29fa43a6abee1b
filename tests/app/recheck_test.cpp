// SPDX-License-Identifier: MIT
// recheck: an unchanged run is reproduced; a changed catchment table, IDF table or built-in
// coefficient table is reported by role and file, with the lines that no longer reproduce.
#include "catchpeak/app/recheck.hpp"
#include "support/calc_lines.hpp"

#include "catchpeak/app/pipeline.hpp"
#include "catchpeak/core/error.hpp"
#include "support/test_project.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <cstdlib>
#include <fstream>
#include <map>
#include <optional>
#include <sstream>
#include <string>

using namespace catchpeak::app;
using catchpeak::ExitCode;
namespace fs = std::filesystem;

// The LeakSanitizer suppression for fontconfig (the run renders the sheet) is defined once for
// this test program, in pipeline_test.cpp.

namespace {

using catchpeak::test::read_file;
using catchpeak::test::replace_in_file;
using catchpeak::test::TestProject;
using catchpeak::test::write_file;

/// A small SI table-input project: IN-1 with a given tc, OUT-1 with Kirpich.
TestProject small_project(const std::string &scratch_name,
                          const std::string &return_periods = "[2, 10]") {
    TestProject p(scratch_name);
    p.project.text("name", "Alder Row inlets");
    p.rainfall.set("return_periods_yr", return_periods);
    p.methods.text("tc", "kirpich").set("peak", "[\"rational\"]");
    p.catchments("id,area_ha,length_m,relief_m,c,tc_min\n"
                 "IN-1,0.72,80,1.6,0.5,10\n"
                 "OUT-1,3.0,500,5,0.45,\n");
    p.idf("# invented IDF table for the test\n"
          "# unit: mm/h\n"
          "duration_min,2,10,25\n"
          "5,110,150,170\n"
          "10,90,120,135\n"
          "15,75,100,112\n"
          "60,30,40,45\n");
    return p;
}

/// Every file of a folder with its content, to show that recheck writes nothing.
std::map<std::string, std::string> snapshot(const fs::path &dir) {
    std::map<std::string, std::string> m;
    for (const auto &e : fs::recursive_directory_iterator(dir)) {
        m[e.path().string()] = e.is_regular_file() ? read_file(e.path()) : "(folder)";
    }
    return m;
}

std::size_t recorded_line_count(const fs::path &out_dir) {
    const std::string text = read_file(out_dir / "results.json");
    std::size_t n = 0;
    for (auto at = text.find("\"symbols\""); at != std::string::npos;
         at = text.find("\"symbols\"", at + 1)) {
        ++n;
    }
    return n;
}

const InputCheck *input(const RecheckReport &r, const std::string &role) {
    for (const auto &i : r.inputs) {
        if (i.role == role) {
            return &i;
        }
    }
    return nullptr;
}

bool has_differing_line(const RecheckReport &r, const std::string &id_prefix,
                        const std::string &label, const std::string &field) {
    return std::any_of(r.line_differences.begin(), r.line_differences.end(), [&](const auto &d) {
        return d.id.rfind(id_prefix, 0) == 0 && d.recorded &&
               catchpeak::test::text(*d.recorded).label == label &&
               std::find(d.fields.begin(), d.fields.end(), field) != d.fields.end();
    });
}

/// Sets an environment variable for the life of the object.
class ScopedEnv {
  public:
    ScopedEnv(const char *name, const std::string &value) : name_(name) {
        if (const char *old = std::getenv(name)) {
            old_ = old;
        }
        ::setenv(name, value.c_str(), 1);
    }
    ScopedEnv(const ScopedEnv &) = delete;
    ScopedEnv &operator=(const ScopedEnv &) = delete;
    ~ScopedEnv() {
        if (old_) {
            ::setenv(name_, old_->c_str(), 1);
        } else {
            ::unsetenv(name_);
        }
    }

  private:
    const char *name_;
    std::optional<std::string> old_;
};

} // namespace

TEST(Recheck, UnchangedRunIsReproducedAndTheFolderIsNotTouched) {
    auto p = small_project("recheck_unchanged");
    const auto &dir = p.dir();
    const auto out = p.run_app();
    const auto before = snapshot(out);
    const auto r = recheck(out);
    EXPECT_EQ(snapshot(out), before);
    EXPECT_TRUE(r.all_reproduced()) << format_recheck(r);
    EXPECT_EQ(r.exit_code(), ExitCode::success);
    // project file, catchment table, IDF, frequency factor table
    ASSERT_EQ(r.inputs.size(), 4u);
    EXPECT_EQ(r.inputs_not_unchanged(), 0u);
    const std::size_t n = recorded_line_count(out);
    ASSERT_GT(n, 10u);
    EXPECT_EQ(r.lines_reproduced, n);
    EXPECT_TRUE(r.line_differences.empty());
    EXPECT_EQ(r.peaks_reproduced, 4u); // 2 design points x 2 return periods
    EXPECT_NE(format_recheck(r).find(std::to_string(n) + " lines reproduced, 0 differ"),
              std::string::npos)
        << format_recheck(r);
    EXPECT_EQ(fs::weakly_canonical(r.project_file), fs::weakly_canonical(dir / "project.toml"));
}

TEST(Recheck, ChangedCatchmentTableIsNamedWithTheLinesThatDiffer) {
    auto p = small_project("recheck_table");
    const auto &dir = p.dir();
    const auto out = p.run_app();
    replace_in_file(dir / "catchments.csv", "OUT-1,3.0,500,5,0.45,", "OUT-1,3.0,500,5,0.5,");
    const auto r = recheck(out);
    EXPECT_FALSE(r.all_reproduced());
    // Lines differ too, but a changed input is the reason: that code wins.
    EXPECT_EQ(r.exit_code(), ExitCode::inputs_changed);
    const auto *t = input(r, "catchment table");
    ASSERT_NE(t, nullptr);
    EXPECT_EQ(t->status, InputCheck::Status::changed);
    EXPECT_EQ(input(r, "IDF")->status, InputCheck::Status::unchanged);
    // C of OUT-1 and its peak flows changed; nothing of IN-1 did.
    EXPECT_TRUE(has_differing_line(r, "OUT-1-", "Runoff coefficient", "value"));
    EXPECT_TRUE(has_differing_line(r, "OUT-1-", "Peak flow, Rational Method", "numbers"));
    for (const auto &d : r.line_differences) {
        EXPECT_EQ(d.id.rfind("OUT-1-", 0), 0u) << d.id;
    }
    EXPECT_EQ(r.peak_differences.size(), 2u); // OUT-1 at 2 and 10 years
    const std::string text = format_recheck(r);
    EXPECT_NE(text.find("input changed since the run: catchment table 'catchments.csv'"),
              std::string::npos)
        << text;
    EXPECT_NE(text.find(std::to_string(r.line_differences.size()) + " differ"), std::string::npos);
    EXPECT_NE(text.find("  recorded:   Runoff coefficient | "), std::string::npos) << text;
}

TEST(Recheck, ChangedIdfTableIsReported) {
    auto p = small_project("recheck_idf");
    const auto &dir = p.dir();
    const auto out = p.run_app();
    // IN-1 has tc = 10 min: its 10-year intensity is the table value at 10 min.
    replace_in_file(dir / "idf.csv", "10,90,120,135", "10,90,125,135");
    const auto r = recheck(out);
    EXPECT_FALSE(r.all_reproduced());
    EXPECT_EQ(input(r, "IDF")->status, InputCheck::Status::changed);
    EXPECT_EQ(input(r, "catchment table")->status, InputCheck::Status::unchanged);
    EXPECT_TRUE(has_differing_line(r, "IN-1-", "Rainfall intensity, 10.00 min, 10.00 yr", "value"))
        << format_recheck(r);
    EXPECT_NE(format_recheck(r).find("IDF 'idf.csv'"), std::string::npos);
}

TEST(Recheck, ChangedBuiltInFrequencyFactorTableIsReported) {
    // A copy of the method tables, so that this test may change one.
    auto p = small_project("recheck_cf", "[25]");
    const auto &dir = p.dir();
    fs::copy(catchpeak::test::config_dir(), dir / "config", fs::copy_options::recursive);
    const ScopedEnv env("CATCHPEAK_CONFIG_DIR", (dir / "config").string());
    const auto out = p.run_app();
    EXPECT_TRUE(recheck(out).all_reproduced());

    const auto cf = dir / "config" / "rational_frequency_factors.csv";
    replace_in_file(cf, "\n25,1.1\n", "\n25,1.15\n");
    const auto r = recheck(out);
    EXPECT_FALSE(r.all_reproduced());
    const auto *t = input(r, "frequency factor table");
    ASSERT_NE(t, nullptr);
    EXPECT_EQ(t->status, InputCheck::Status::changed);
    EXPECT_EQ(fs::weakly_canonical(t->resolved), fs::weakly_canonical(cf));
    EXPECT_TRUE(has_differing_line(r, "IN-1-", "Frequency factor", "value"));
    EXPECT_TRUE(has_differing_line(r, "OUT-1-", "Frequency factor", "value"));
    EXPECT_NE(format_recheck(r).find("frequency factor table "
                                     "'config/rational_frequency_factors.csv'"),
              std::string::npos)
        << format_recheck(r);
}

TEST(Recheck, MissingInputIsReportedAndNothingReproduces) {
    auto p = small_project("recheck_missing_input");
    const auto &dir = p.dir();
    const auto out = p.run_app();
    fs::remove(dir / "idf.csv");
    const auto r = recheck(out);
    EXPECT_FALSE(r.all_reproduced());
    EXPECT_EQ(r.exit_code(), ExitCode::inputs_changed);
    EXPECT_EQ(input(r, "IDF")->status, InputCheck::Status::missing);
    EXPECT_FALSE(r.recompute_error.empty());
    EXPECT_EQ(r.lines_reproduced, 0u);
    EXPECT_EQ(r.line_differences.size(), recorded_line_count(out));
    EXPECT_NE(format_recheck(r).find("input missing since the run: IDF 'idf.csv'"),
              std::string::npos);
}

TEST(Recheck, ChangedInputWhoseLinesStillAgreeIsStillAChangedInput) {
    // A comment added to the IDF table changes its SHA-256 but no number: every line is
    // reproduced, yet the run record no longer verifies the file, so the run is not confirmed.
    auto p = small_project("recheck_comment");
    const auto &dir = p.dir();
    const auto out = p.run_app();
    replace_in_file(dir / "idf.csv", "# unit: mm/h\n", "# unit: mm/h\n# a comment added later\n");
    const auto r = recheck(out);
    EXPECT_EQ(input(r, "IDF")->status, InputCheck::Status::changed);
    EXPECT_TRUE(r.line_differences.empty()) << format_recheck(r);
    EXPECT_TRUE(r.peak_differences.empty());
    EXPECT_FALSE(r.all_reproduced());
    EXPECT_EQ(r.exit_code(), ExitCode::inputs_changed);
}

TEST(Recheck, AlteredNumbersWithUnchangedInputsAreNotReproduced) {
    // Every input is as recorded; a line value of results.json was altered after the run.
    auto p = small_project("recheck_altered");
    const auto out = p.run_app();
    nlohmann::ordered_json results = nlohmann::ordered_json::parse(read_file(out / "results.json"));
    auto &line = results.at("design_points").at(1).at("lines").at(0);
    const std::string id = line.at("id").get<std::string>();
    line["value"] = line.at("value").get<double>() * 1.001;
    write_file(out / "results.json", results.dump(2));
    const auto r = recheck(out);
    EXPECT_EQ(r.inputs_not_unchanged(), 0u);
    ASSERT_EQ(r.line_differences.size(), 1u) << format_recheck(r);
    EXPECT_EQ(r.line_differences[0].id, id);
    EXPECT_TRUE(r.peak_differences.empty());
    EXPECT_FALSE(r.all_reproduced());
    EXPECT_EQ(r.exit_code(), ExitCode::not_reproduced);
}

TEST(Recheck, OutputFolderElsewhereFindsTheProjectOrNeedsIt) {
    auto p = small_project("recheck_elsewhere", "[2]");
    const auto &dir = p.dir();
    const auto project = p.file();
    fs::create_directories(dir / "runs");
    RunOptions options;
    options.quiet = true;
    options.out_dir = dir / "runs" / "first";
    (void)p.run_app(options);
    // Found by the path the run record keeps, relative to the output folder.
    EXPECT_TRUE(recheck(dir / "runs" / "first").all_reproduced());
    // Moved since: not found, unless given.
    const auto moved = dir / "moved.toml";
    fs::rename(project, moved);
    EXPECT_THROW((void)recheck(dir / "runs" / "first"), catchpeak::InputError);
    RecheckOptions ro;
    ro.project_file = moved;
    EXPECT_TRUE(recheck(dir / "runs" / "first", ro).all_reproduced());
}

TEST(Recheck, MissingFolderOrResultsIsAnInputError) {
    auto p = small_project("recheck_no_folder");
    EXPECT_THROW((void)recheck(p.dir() / "nowhere"), catchpeak::InputError);
    const auto out = p.run_app();
    fs::remove(out / "results.json");
    try {
        (void)recheck(out);
        FAIL() << "no error";
    } catch (const catchpeak::InputError &e) {
        EXPECT_NE(std::string(e.what()).find("results.json"), std::string::npos) << e.what();
    }
}

TEST(Recheck, ChangedOrMissingOutputIsReportedByFile) {
    auto p = small_project("recheck_outputs");
    const auto out = p.run_app();
    const auto unchanged = recheck(out);
    ASSERT_EQ(unchanged.outputs.size(), 3u); // results.json, summary.csv, the sheet
    EXPECT_EQ(unchanged.outputs_not_unchanged(), 0u);

    replace_in_file(out / "summary.csv", "IN-1", "IN-2");
    ASSERT_TRUE(fs::remove(out / "calculation-sheet.pdf"));
    const auto r = recheck(out);
    EXPECT_EQ(r.outputs_not_unchanged(), 2u);
    EXPECT_EQ(r.inputs_not_unchanged(), 0u);
    EXPECT_TRUE(r.line_differences.empty()) << format_recheck(r);
    EXPECT_FALSE(r.all_reproduced());
    EXPECT_EQ(r.exit_code(), ExitCode::outputs_changed);
    for (const auto &o : r.outputs) {
        const auto expected = o.path == "summary.csv"             ? InputCheck::Status::changed
                              : o.path == "calculation-sheet.pdf" ? InputCheck::Status::missing
                                                                  : InputCheck::Status::unchanged;
        EXPECT_EQ(o.status, expected) << o.path;
    }
    const std::string text = format_recheck(r);
    EXPECT_NE(text.find("output changed since the run: 'summary.csv'"), std::string::npos) << text;
    EXPECT_NE(text.find("output missing since the run: 'calculation-sheet.pdf'"), std::string::npos)
        << text;
    EXPECT_NE(text.find("1 of 3 outputs unchanged"), std::string::npos) << text;
}

TEST(Recheck, ChangedInputWinsOverAChangedOutput) {
    auto p = small_project("recheck_outputs_and_inputs");
    const auto out = p.run_app();
    ASSERT_TRUE(fs::remove(out / "summary.csv"));
    replace_in_file(p.dir() / "idf.csv", "10,90,120,135", "10,90,125,135");
    EXPECT_EQ(recheck(out).exit_code(), ExitCode::inputs_changed);
}
