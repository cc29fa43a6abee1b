// SPDX-License-Identifier: MIT
#include "catchpeak/report/outputs.hpp"

#include "catchpeak/app/sha256.hpp"

#include "catchpeak/core/error.hpp"
#include "catchpeak/report/results_json.hpp"
#include "catchpeak/report/sheet.hpp"
#include "catchpeak/report/summary_csv.hpp"
#include "report/sample_results.hpp"
#include "support/test_env.hpp"
#include "support/test_project.hpp"

#include <gtest/gtest.h>

#include <fstream>
#include <iterator>

namespace catchpeak::report {
namespace {

TEST(Outputs, WritesTheFourFilesAndNothingPartial) {
    const auto r = test::sample_results(2, units::System::si, {10}, false);
    const auto dir = test::scratch_dir("outputs") / "new" / "folder";
    const auto out = write_outputs(r, dir, [](const auto &f) { return app::sha256_file(f); });
    for (const auto &f : {out.results_json, out.run_record, out.summary_csv, out.sheet_pdf}) {
        EXPECT_TRUE(std::filesystem::exists(f)) << f;
        EXPECT_GT(std::filesystem::file_size(f), 0u) << f;
    }
    EXPECT_GE(out.sheet_pages, 4u);
    const auto files = std::distance(std::filesystem::directory_iterator(dir),
                                     std::filesystem::directory_iterator{});
    EXPECT_EQ(files, 4);
    EXPECT_TRUE(test::pending_files(dir).empty());
    EXPECT_EQ(read_results_json(dir).points.size(), 2u);
    const auto record = read_run_record(dir);
    EXPECT_EQ(record.run_time_utc, r.stamp.run_time_utc);
    // Every output but the record itself, with the SHA-256 of its bytes on disk.
    ASSERT_EQ(record.outputs.size(), 3u);
    for (const auto &o : record.outputs) {
        EXPECT_NE(o.path, std::string(run_record_file_name));
        EXPECT_EQ(o.sha256, app::sha256_file(dir / o.path)) << o.path;
    }
}

// A failed run left part of its output set: when results.json could not be written, a new
// calculation-sheet.pdf and summary.csv were already under their final names.
TEST(Outputs, WhenResultsJsonCannotBeWrittenNoOutputOfTheRunIsPutInPlace) {
    const auto dir = test::scratch_dir("outputs_results_blocked");
    std::ofstream(dir / sheet_file_name) << "older sheet";
    std::ofstream(dir / summary_file_name) << "older summary";
    std::filesystem::create_directories(dir / results_file_name / "in-the-way");
    const auto r = test::sample_results(1, units::System::si, {10}, false);
    EXPECT_THROW((void)write_outputs(r, dir, [](const auto &f) { return app::sha256_file(f); }),
                 InputError);
    EXPECT_EQ(test::read_file(dir / sheet_file_name), "older sheet");
    EXPECT_EQ(test::read_file(dir / summary_file_name), "older summary");
    EXPECT_FALSE(std::filesystem::exists(dir / run_record_file_name));
    EXPECT_TRUE(test::pending_files(dir).empty());
}

TEST(Outputs, UnwritableFolderIsAnInputError) {
    const auto base = test::scratch_dir("outputs_blocked");
    const auto file = base / "not-a-folder";
    std::ofstream(file) << "x";
    const auto r = test::sample_results(1, units::System::si, {10}, false);
    EXPECT_THROW((void)write_outputs(r, file / "out", [](const auto &f) { return f.string(); }),
                 InputError);
}

} // namespace
} // namespace catchpeak::report
