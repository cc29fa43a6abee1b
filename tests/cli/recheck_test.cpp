// SPDX-License-Identifier: MIT
// `catchpeak recheck` on the command line: exit codes and what it prints.
#include "catchpeak/cli/run.hpp"
#include "catchpeak/core/error.hpp"
#include "support/test_env.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <fstream>
#include <sstream>
#include <string>
#include <vector>

using catchpeak::ExitCode;
namespace fs = std::filesystem;

namespace {

void write(const fs::path &path, const std::string &text) {
    std::ofstream(path, std::ios::binary) << text;
}

struct Result {
    int code;
    std::string out;
    std::string err;
};

Result cli(const std::vector<std::string> &args) {
    std::ostringstream out;
    std::ostringstream err;
    const int code = catchpeak::cli::run(args, out, err);
    return {code, out.str(), err.str()};
}

/// A small SI table-input project, run once; returns its output folder.
fs::path project_run(const fs::path &dir) {
    write(dir / "project.toml", "[project]\nname = \"Fern Court\"\nunits = \"SI\"\n"
                                "[inputs]\ncatchment_table = \"catchments.csv\"\n"
                                "[rainfall]\nidf = \"idf.csv\"\nreturn_periods_yr = [10]\n"
                                "[output]\nfolder = \"out\"\n");
    write(dir / "catchments.csv", "id,area_ha,length_m,relief_m,c,tc_min\n"
                                  "A-1,1.0,100,2,0.6,10\n");
    write(dir / "idf.csv", "# unit: mm/h\nduration_min,10\n5,150\n10,120\n30,70\n");
    const auto r = cli({"run", (dir / "project.toml").string(), "--quiet"});
    EXPECT_EQ(r.code, 0) << r.err;
    return dir / "out";
}

} // namespace

TEST(CliRecheck, UnchangedRunExitsZero) {
    const auto out = project_run(catchpeak::test::scratch_dir("cli_recheck_ok"));
    const auto r = cli({"recheck", out.string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::success)) << r.out << r.err;
    EXPECT_NE(r.out.find(" lines reproduced, 0 differ\n"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("4 of 4 inputs unchanged"), std::string::npos) << r.out;
}

TEST(CliRecheck, ChangedInputExitsWithInputsChangedAndNamesTheFile) {
    const auto dir = catchpeak::test::scratch_dir("cli_recheck_changed");
    const auto out = project_run(dir);
    write(dir / "catchments.csv", "id,area_ha,length_m,relief_m,c,tc_min\nA-1,1.2,100,2,0.6,10\n");
    const auto r = cli({"recheck", out.string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::inputs_changed)) << r.out << r.err;
    EXPECT_NE(r.out.find("catchment table 'catchments.csv'"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("line A-1-L1 differs"), std::string::npos) << r.out;
    EXPECT_EQ(r.out.find(" lines reproduced, 0 differ\n"), std::string::npos) << r.out;
}

TEST(CliRecheck, MissingInputExitsWithInputsChanged) {
    const auto dir = catchpeak::test::scratch_dir("cli_recheck_input_gone");
    const auto out = project_run(dir);
    fs::remove(dir / "idf.csv");
    const auto r = cli({"recheck", out.string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::inputs_changed)) << r.out << r.err;
    EXPECT_NE(r.out.find("input missing since the run: IDF 'idf.csv'"), std::string::npos) << r.out;
}

TEST(CliRecheck, NumbersThatDoNotFollowFromUnchangedInputsExitNotReproduced) {
    // The inputs are those of the run, but the recorded peak flow and its line were altered in
    // results.json: recheck recomputes other numbers and says the run is not reproduced.
    const auto dir = catchpeak::test::scratch_dir("cli_recheck_altered");
    const auto out = project_run(dir);
    nlohmann::ordered_json results;
    {
        std::ifstream in(out / "results.json");
        in >> results;
    }
    auto &peak = results.at("design_points").at(0).at("peaks").at(0);
    const std::string line_id = peak.at("line_id").get<std::string>();
    peak["q_m3_s"] = peak.at("q_m3_s").get<double>() * 1.01;
    for (auto &line : results.at("design_points").at(0).at("lines")) {
        if (line.at("id") == line_id) {
            line["value"] = line.at("value").get<double>() * 1.01;
        }
    }
    write(out / "results.json", results.dump(2));
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
    const auto dir = catchpeak::test::scratch_dir("cli_recheck_no_results");
    const auto out = project_run(dir);
    fs::remove(out / "results.json");
    const auto r = cli({"recheck", out.string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::bad_input));
    EXPECT_NE(r.err.find("results.json"), std::string::npos) << r.err;
}

TEST(CliRecheck, OutputFolderElsewhereFindsTheProjectByItsRecordedPlace) {
    // The run record keeps the project file's path relative to the output folder, so recheck
    // finds it wherever the output went; a project file moved since needs --project.
    const auto dir = catchpeak::test::scratch_dir("cli_recheck_project");
    (void)project_run(dir);
    const auto elsewhere = dir / "runs" / "one";
    ASSERT_EQ(
        cli({"run", (dir / "project.toml").string(), "--quiet", "--out", elsewhere.string()}).code,
        0);
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
    const auto dir = catchpeak::test::scratch_dir("cli_recheck_block_storm");
    write(dir / "project.toml", "[project]\nname = \"Fern Court\"\nunits = \"US\"\n"
                                "[inputs]\ncatchment_table = \"catchments.csv\"\n"
                                "[rainfall]\nidf = \"idf.csv\"\nreturn_periods_yr = [10]\n"
                                "design_storm = \"alternating_block\"\nstorm_duration_min = 120\n"
                                "[methods]\npeak = [\"scs_unit_hydrograph\"]\n"
                                "[settings]\nstorm_time_step_min = 5\n"
                                "[output]\nfolder = \"out\"\n");
    write(dir / "catchments.csv", "id,area_ha,length_m,relief_m,cn,tc_min\n"
                                  "A-1,20.0,600,6,78,25\n");
    write(dir / "idf.csv", "# unit: mm/h\nduration_min,10\n5,150\n10,120\n30,70\n60,45\n"
                           "120,28\n");
    const auto check = cli({"check", (dir / "project.toml").string()});
    EXPECT_EQ(check.code, 0) << check.err;
    const auto run = cli({"run", (dir / "project.toml").string(), "--quiet"});
    ASSERT_EQ(run.code, 0) << run.err;
    ASSERT_TRUE(fs::exists(dir / "out" / "results.json"));
    const auto r = cli({"recheck", (dir / "out").string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::success)) << r.out << r.err;
    EXPECT_NE(r.out.find("1 peaks reproduced, 0 differ"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find(" lines reproduced, 0 differ\n"), std::string::npos) << r.out;
}

// A project whose catchment has land parts (a land table): recheck reproduces it, verifies the
// land table's hash (and the shipped land tables'), and names the land table when it changed.
TEST(CliRecheck, ALandTableIsRecordedAndReproduced) {
    const auto dir = catchpeak::test::scratch_dir("cli_recheck_land");
    write(dir / "project.toml", "[project]\nname = \"Fern Court\"\nunits = \"US\"\n"
                                "[inputs]\ncatchment_table = \"catchments.csv\"\n"
                                "catchment_land_table = \"catchment-land.csv\"\n"
                                "[rainfall]\nidf = \"idf.csv\"\nreturn_periods_yr = [10]\n"
                                "[output]\nfolder = \"out\"\n");
    write(dir / "catchments.csv", "id,area_ac,length_ft,relief_ft,tc_min\nA-1,2.0,400,6,10\n");
    write(dir / "catchment-land.csv", "id,class,soil_group,area_ac\n"
                                      "A-1,paved_parking_roofs,C,0.8\n"
                                      "A-1,open_space_good,B/D,1.2\n");
    write(dir / "idf.csv", "# unit: mm/h\nduration_min,10\n5,150\n10,120\n30,70\n");
    ASSERT_EQ(cli({"run", (dir / "project.toml").string(), "--quiet"}).code, 0);
    const auto out = dir / "out";
    std::ifstream rec(out / "run-record.json");
    std::ostringstream record_text;
    record_text << rec.rdbuf();
    const std::string record = record_text.str();
    EXPECT_NE(record.find("\"catchment land table\""), std::string::npos) << record;
    EXPECT_NE(record.find("config/land/curve_numbers.csv"), std::string::npos) << record;

    auto r = cli({"recheck", out.string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::success)) << r.out << r.err;
    // project, catchment table, land table, IDF, frequency factors, three land tables
    EXPECT_NE(r.out.find("8 of 8 inputs unchanged"), std::string::npos) << r.out;

    write(dir / "catchment-land.csv", "id,class,soil_group,area_ac\n"
                                      "A-1,paved_parking_roofs,C,1.0\n"
                                      "A-1,open_space_good,B/D,1.0\n");
    r = cli({"recheck", out.string()});
    EXPECT_EQ(r.code, static_cast<int>(ExitCode::inputs_changed)) << r.out << r.err;
    EXPECT_NE(r.out.find("catchment land table 'catchment-land.csv'"), std::string::npos) << r.out;
    EXPECT_EQ(r.out.find(" lines reproduced, 0 differ\n"), std::string::npos) << r.out;
}
