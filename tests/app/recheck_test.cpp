// SPDX-License-Identifier: MIT
// recheck: an unchanged run is reproduced; a changed catchment table, IDF table or built-in
// coefficient table is reported by role and file, with the lines that no longer reproduce.
#include "catchpeak/app/recheck.hpp"
#include "support/calc_lines.hpp"

#include "catchpeak/app/pipeline.hpp"
#include "catchpeak/core/error.hpp"
#include "support/test_env.hpp"

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

void write(const fs::path &path, const std::string &text) {
    std::ofstream(path, std::ios::binary) << text;
}

std::string read(const fs::path &path) {
    std::ifstream in(path, std::ios::binary);
    std::ostringstream s;
    s << in.rdbuf();
    return s.str();
}

/// A small SI table-input project: IN-1 with a given tc, OUT-1 with Kirpich.
fs::path small_project(const fs::path &dir, const std::string &return_periods = "[2, 10]") {
    write(dir / "project.toml", "[project]\nname = \"Alder Row inlets\"\nunits = \"SI\"\n"
                                "[inputs]\ncatchment_table = \"catchments.csv\"\n"
                                "[rainfall]\nidf = \"idf.csv\"\nreturn_periods_yr = " +
                                    return_periods +
                                    "\n[methods]\ntc = \"kirpich\"\npeak = [\"rational\"]\n"
                                    "[output]\nfolder = \"out\"\n");
    write(dir / "catchments.csv", "id,area_ha,length_m,relief_m,c,tc_min\n"
                                  "IN-1,0.72,80,1.6,0.5,10\n"
                                  "OUT-1,3.0,500,5,0.45,\n");
    write(dir / "idf.csv", "# invented IDF table for the test\n"
                           "# unit: mm/h\n"
                           "duration_min,2,10,25\n"
                           "5,110,150,170\n"
                           "10,90,120,135\n"
                           "15,75,100,112\n"
                           "60,30,40,45\n");
    return dir / "project.toml";
}

fs::path run(const fs::path &project) {
    std::ostringstream out;
    std::ostringstream err;
    RunOptions options;
    options.quiet = true;
    options.run_time_utc = "2026-01-01T00:00:00Z";
    return run_project(project, options, out, err);
}

void replace_in_file(const fs::path &path, const std::string &from, const std::string &to) {
    std::string text = read(path);
    const auto at = text.find(from);
    ASSERT_NE(at, std::string::npos) << from;
    text.replace(at, from.size(), to);
    write(path, text);
}

/// Every file of a folder with its content, to show that recheck writes nothing.
std::map<std::string, std::string> snapshot(const fs::path &dir) {
    std::map<std::string, std::string> m;
    for (const auto &e : fs::recursive_directory_iterator(dir)) {
        m[e.path().string()] = e.is_regular_file() ? read(e.path()) : "(folder)";
    }
    return m;
}

std::size_t recorded_line_count(const fs::path &out_dir) {
    const std::string text = read(out_dir / "results.json");
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
    const auto dir = catchpeak::test::scratch_dir("recheck_unchanged");
    const auto out = run(small_project(dir));
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
    const auto dir = catchpeak::test::scratch_dir("recheck_table");
    const auto out = run(small_project(dir));
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
    const auto dir = catchpeak::test::scratch_dir("recheck_idf");
    const auto out = run(small_project(dir));
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
    const auto dir = catchpeak::test::scratch_dir("recheck_cf");
    fs::copy(catchpeak::test::config_dir(), dir / "config", fs::copy_options::recursive);
    const ScopedEnv env("CATCHPEAK_CONFIG_DIR", (dir / "config").string());
    const auto out = run(small_project(dir, "[25]"));
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
    const auto dir = catchpeak::test::scratch_dir("recheck_missing_input");
    const auto out = run(small_project(dir));
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
    const auto dir = catchpeak::test::scratch_dir("recheck_comment");
    const auto out = run(small_project(dir));
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
    const auto dir = catchpeak::test::scratch_dir("recheck_altered");
    const auto out = run(small_project(dir));
    nlohmann::ordered_json results = nlohmann::ordered_json::parse(read(out / "results.json"));
    auto &line = results.at("design_points").at(1).at("lines").at(0);
    const std::string id = line.at("id").get<std::string>();
    line["value"] = line.at("value").get<double>() * 1.001;
    write(out / "results.json", results.dump(2));
    const auto r = recheck(out);
    EXPECT_EQ(r.inputs_not_unchanged(), 0u);
    ASSERT_EQ(r.line_differences.size(), 1u) << format_recheck(r);
    EXPECT_EQ(r.line_differences[0].id, id);
    EXPECT_TRUE(r.peak_differences.empty());
    EXPECT_FALSE(r.all_reproduced());
    EXPECT_EQ(r.exit_code(), ExitCode::not_reproduced);
}

TEST(Recheck, OutputFolderElsewhereFindsTheProjectOrNeedsIt) {
    const auto dir = catchpeak::test::scratch_dir("recheck_elsewhere");
    const auto project = small_project(dir, "[2]");
    fs::create_directories(dir / "runs");
    std::ostringstream o;
    std::ostringstream e;
    RunOptions options;
    options.quiet = true;
    options.out_dir = dir / "runs" / "first";
    run_project(project, options, o, e);
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
    const auto dir = catchpeak::test::scratch_dir("recheck_no_folder");
    EXPECT_THROW((void)recheck(dir / "nowhere"), catchpeak::InputError);
    const auto out = run(small_project(dir));
    fs::remove(out / "results.json");
    try {
        (void)recheck(out);
        FAIL() << "no error";
    } catch (const catchpeak::InputError &e) {
        EXPECT_NE(std::string(e.what()).find("results.json"), std::string::npos) << e.what();
    }
}
