// SPDX-License-Identifier: MIT
// `catchpeak recheck` on the command line: exit codes and what it prints.
#include "catchpeak/app/sha256.hpp"
#include "catchpeak/cli/run.hpp"
#include "catchpeak/core/error.hpp"
#include "support/test_project.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <sstream>
#include <string>
#include <vector>

using catchpeak::ExitCode;
namespace fs = std::filesystem;

namespace {

using catchpeak::test::cli;
using catchpeak::test::read_file;
using catchpeak::test::TestProject;
using catchpeak::test::write_file;

/// A small SI table-input project (not yet written).
TestProject fern_court(const std::string &scratch_name) {
    TestProject p(scratch_name);
    p.project.text("name", "Fern Court");
    p.catchments("id,area_ha,length_m,relief_m,c,tc_min\n"
                 "A-1,1.0,100,2,0.6,10\n");
    p.idf("# unit: mm/h\nduration_min,10\n5,150\n10,120\n30,70\n");
    return p;
}

/// Runs the project once; returns its output folder.
fs::path project_run(TestProject &p) {
    const auto r = p.command("run", {"--quiet"});
    EXPECT_EQ(r.code, 0) << r.err;
    return p.out_dir();
}

} // namespace

TEST(CliRecheck, UnchangedRunExitsZero) {
    auto p = fern_court("cli_recheck_ok");
    const auto out = project_run(p);
    const auto r = cli({"recheck", out.string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::success)) << r.out << r.err;
    EXPECT_NE(r.out.find(" lines reproduced, 0 differ\n"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("4 of 4 inputs unchanged"), std::string::npos) << r.out;
}

TEST(CliRecheck, ChangedInputExitsWithInputsChangedAndNamesTheFile) {
    auto p = fern_court("cli_recheck_changed");
    const auto &dir = p.dir();
    const auto out = project_run(p);
    write_file(dir / "catchments.csv",
               "id,area_ha,length_m,relief_m,c,tc_min\nA-1,1.2,100,2,0.6,10\n");
    const auto r = cli({"recheck", out.string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::inputs_changed)) << r.out << r.err;
    EXPECT_NE(r.out.find("catchment table 'catchments.csv'"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("line A-1-L1 differs"), std::string::npos) << r.out;
    EXPECT_EQ(r.out.find(" lines reproduced, 0 differ\n"), std::string::npos) << r.out;
}

TEST(CliRecheck, MissingInputExitsWithInputsChanged) {
    auto p = fern_court("cli_recheck_input_gone");
    const auto &dir = p.dir();
    const auto out = project_run(p);
    fs::remove(dir / "idf.csv");
    const auto r = cli({"recheck", out.string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::inputs_changed)) << r.out << r.err;
    EXPECT_NE(r.out.find("input missing since the run: IDF 'idf.csv'"), std::string::npos) << r.out;
}

TEST(CliRecheck, NumbersThatDoNotFollowFromUnchangedInputsExitNotReproduced) {
    // The inputs are those of the run, but the recorded peak flow and its line were altered in
    // results.json: recheck recomputes other numbers and says the run is not reproduced.
    auto p = fern_court("cli_recheck_altered");
    const auto out = project_run(p);
    auto results = nlohmann::ordered_json::parse(read_file(out / "results.json"));
    auto &peak = results.at("design_points").at(0).at("peaks").at(0);
    const std::string line_id = peak.at("line_id").get<std::string>();
    peak["q_m3_s"] = peak.at("q_m3_s").get<double>() * 1.01;
    for (auto &line : results.at("design_points").at(0).at("lines")) {
        if (line.at("id") == line_id) {
            line["value"] = line.at("value").get<double>() * 1.01;
        }
    }
    write_file(out / "results.json", results.dump(2));
    const auto r = cli({"recheck", out.string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::not_reproduced)) << r.out << r.err;
    EXPECT_NE(r.out.find("4 of 4 inputs unchanged"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("line " + line_id + " differs"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find(" peaks reproduced, 1 differ\n"), std::string::npos) << r.out;
}

TEST(CliRecheck, MissingFolderExitsTwoWithAMessage) {
    const auto dir = catchpeak::test::scratch_dir("cli_recheck_missing");
    const auto r = cli({"recheck", (dir / "nowhere").string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::bad_input));
    EXPECT_NE(r.err.find("the output folder does not exist"), std::string::npos) << r.err;
}

TEST(CliRecheck, MissingResultsExitsTwoWithAMessage) {
    auto p = fern_court("cli_recheck_no_results");
    const auto out = project_run(p);
    fs::remove(out / "results.json");
    const auto r = cli({"recheck", out.string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::bad_input));
    EXPECT_NE(r.err.find("results.json"), std::string::npos) << r.err;
}

TEST(CliRecheck, OutputFolderElsewhereFindsTheProjectByItsRecordedPlace) {
    // The run record keeps the project file's path relative to the output folder, so recheck
    // finds it wherever the output went; a project file moved since needs --project.
    auto p = fern_court("cli_recheck_project");
    const auto &dir = p.dir();
    (void)project_run(p);
    const auto elsewhere = dir / "runs" / "one";
    ASSERT_EQ(p.command("run", {"--quiet", "--out", elsewhere.string()}).code, 0);
    auto r = cli({"recheck", elsewhere.string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::success)) << r.out << r.err;

    fs::rename(dir / "project.toml", dir / "moved.toml");
    r = cli({"recheck", elsewhere.string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::bad_input)) << r.out << r.err;
    EXPECT_NE(r.err.find("is found at none of"), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("--project"), std::string::npos) << r.err;
    r = cli({"recheck", elsewhere.string(), "--project", (dir / "moved.toml").string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::success)) << r.out << r.err;
}

TEST(CliRecheck, AlternatingBlockStormRunIsReproduced) {
    // The unit hydrograph of the alternating-block storm from the project's IDF (no storm type,
    // no 24-hour depths): check, run, then recheck reproduces every line and peak.
    auto p = fern_court("cli_recheck_block_storm");
    p.project.text("units", "US");
    p.rainfall.text("design_storm", "alternating_block").set("storm_duration_min", "120");
    p.methods.set("peak", "[\"scs_unit_hydrograph\"]");
    p.settings.set("storm_time_step_min", "5");
    p.catchments("id,area_ha,length_m,relief_m,cn,tc_min\n"
                 "A-1,20.0,600,6,78,25\n");
    p.idf("# unit: mm/h\nduration_min,10\n5,150\n10,120\n30,70\n60,45\n"
          "120,28\n");
    const auto check = p.command("check");
    EXPECT_EQ(check.code, 0) << check.err;
    const auto run = p.command("run", {"--quiet"});
    ASSERT_EQ(run.code, 0) << run.err;
    ASSERT_TRUE(fs::exists(p.out_dir() / "results.json"));
    const auto r = cli({"recheck", p.out_dir().string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::success)) << r.out << r.err;
    EXPECT_NE(r.out.find("1 peaks reproduced, 0 differ"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find(" lines reproduced, 0 differ\n"), std::string::npos) << r.out;
}

// A project whose catchment has land parts (a land table): recheck reproduces it, verifies the
// land table's hash (and the shipped land tables'), and names the land table when it changed.
TEST(CliRecheck, ALandTableIsRecordedAndReproduced) {
    auto p = fern_court("cli_recheck_land");
    const auto &dir = p.dir();
    p.project.text("units", "US");
    p.inputs.text("catchment_land_table", "catchment-land.csv");
    p.catchments("id,area_ac,length_ft,relief_ft,tc_min\nA-1,2.0,400,6,10\n");
    p.with_file("catchment-land.csv", "id,class,soil_group,area_ac\n"
                                      "A-1,paved_parking_roofs,C,0.8\n"
                                      "A-1,open_space_good,B/D,1.2\n");
    ASSERT_EQ(p.command("run", {"--quiet"}).code, 0);
    const auto out = p.out_dir();
    const std::string record = read_file(out / "run-record.json");
    EXPECT_NE(record.find("\"catchment land table\""), std::string::npos) << record;
    EXPECT_NE(record.find("config/land/curve_numbers.csv"), std::string::npos) << record;

    auto r = cli({"recheck", out.string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::success)) << r.out << r.err;
    // project, catchment table, land table, IDF, frequency factors, three land tables
    EXPECT_NE(r.out.find("8 of 8 inputs unchanged"), std::string::npos) << r.out;

    write_file(dir / "catchment-land.csv", "id,class,soil_group,area_ac\n"
                                           "A-1,paved_parking_roofs,C,1.0\n"
                                           "A-1,open_space_good,B/D,1.0\n");
    r = cli({"recheck", out.string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::inputs_changed)) << r.out << r.err;
    EXPECT_NE(r.out.find("catchment land table 'catchment-land.csv'"), std::string::npos) << r.out;
    EXPECT_EQ(r.out.find(" lines reproduced, 0 differ\n"), std::string::npos) << r.out;
}

// run-record.json holds the SHA-256 of every output; recheck names an output that changed or is
// gone since the run, with its own exit code.
TEST(CliRecheck, ChangedOutputExitsWithOutputsChangedAndNamesTheFile) {
    auto p = fern_court("cli_recheck_output_changed");
    const auto out = project_run(p);
    std::string csv = read_file(out / "summary.csv");
    ASSERT_FALSE(csv.empty());
    csv.back() = csv.back() == 'x' ? 'y' : 'x'; // one byte
    write_file(out / "summary.csv", csv);
    const auto r = cli({"recheck", out.string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::outputs_changed)) << r.out << r.err;
    EXPECT_EQ(static_cast<int>(ExitCode::outputs_changed), 5);
    EXPECT_NE(r.out.find("output changed since the run: 'summary.csv'"), std::string::npos)
        << r.out;
    EXPECT_NE(r.out.find("2 of 3 outputs unchanged"), std::string::npos) << r.out;
    // The inputs and the numbers are as recorded.
    EXPECT_NE(r.out.find("4 of 4 inputs unchanged"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find(" lines reproduced, 0 differ\n"), std::string::npos) << r.out;
}

TEST(CliRecheck, MissingOutputExitsWithOutputsChangedAndNamesTheFile) {
    auto p = fern_court("cli_recheck_output_gone");
    const auto out = project_run(p);
    ASSERT_TRUE(fs::remove(out / "calculation-sheet.pdf"));
    const auto r = cli({"recheck", out.string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::outputs_changed)) << r.out << r.err;
    EXPECT_NE(r.out.find("output missing since the run: 'calculation-sheet.pdf'"),
              std::string::npos)
        << r.out;
}

TEST(CliRecheck, TheRunRecordHoldsTheHashOfEveryOutputButItself) {
    auto p = fern_court("cli_recheck_output_hashes");
    const auto out = project_run(p);
    const auto record = nlohmann::json::parse(read_file(out / "run-record.json"));
    std::vector<std::string> paths;
    for (const auto &o : record.at("outputs")) {
        paths.push_back(o.at("path").get<std::string>());
        EXPECT_EQ(o.at("sha256"), catchpeak::app::sha256_file(out / paths.back())) << paths.back();
    }
    std::sort(paths.begin(), paths.end());
    EXPECT_EQ(paths,
              (std::vector<std::string>{"calculation-sheet.pdf", "results.json", "summary.csv"}));
}
