// SPDX-License-Identifier: MIT
#include "catchpeak/core/files.hpp"

#include "catchpeak/core/error.hpp"
#include "support/input_error.hpp"
#include "support/killed_writer.hpp"
#include "support/test_env.hpp"

#include <gtest/gtest.h>

#include <fmt/format.h>

#include <fstream>
#include <unistd.h>

namespace fs = std::filesystem;
namespace t = catchpeak::test;

namespace catchpeak {
namespace {

TEST(PendingFile, CommitRenamesTheTemporaryFileToItsFinalName) {
    const auto dir = t::scratch_dir("pending_commit");
    PendingFile f(dir / "out.json");
    EXPECT_EQ(f.temp_path().parent_path(), dir);
    EXPECT_EQ(f.temp_path().extension(), ".json"); // drivers that look at the extension
    std::ofstream(f.temp_path()) << "done";
    EXPECT_FALSE(fs::exists(dir / "out.json"));
    f.commit();
    EXPECT_TRUE(fs::exists(dir / "out.json"));
    EXPECT_TRUE(t::pending_files(dir).empty());
    EXPECT_EQ(read_text_file(dir / "out.json"), "done");
}

TEST(PendingFile, DestroyedWithoutCommitLeavesNothing) {
    const auto dir = t::scratch_dir("pending_discard");
    {
        PendingFile f(dir / "out.gpkg");
        std::ofstream(f.temp_path()) << "half";
        EXPECT_EQ(t::pending_files(dir).size(), 1u);
    }
    EXPECT_TRUE(t::pending_files(dir).empty());
    EXPECT_FALSE(fs::exists(dir / "out.gpkg"));
}

TEST(PendingFile, TwoPendingFilesForOneNameDoNotShareTheTemporaryName) {
    const auto dir = t::scratch_dir("pending_two");
    PendingFile a(dir / "x.txt");
    PendingFile b(dir / "x.txt");
    EXPECT_NE(a.temp_path(), b.temp_path());
}

TEST(PendingFile, AMovedFromFileCannotBeCommitted) {
    const auto dir = t::scratch_dir("pending_moved");
    PendingFile a(dir / "x.txt");
    std::ofstream(a.temp_path()) << "x";
    PendingFile b(std::move(a));
    EXPECT_THROW(a.commit(), InternalError); // NOLINT(bugprone-use-after-move): the point
    b.commit();
    EXPECT_TRUE(fs::exists(dir / "x.txt"));
}

TEST(WriteTextFileAtomic, ReplacesAnOlderFileWhole) {
    const auto dir = t::scratch_dir("atomic_replace");
    write_text_file_atomic(dir / "a.csv", "a much longer first version\n");
    write_text_file_atomic(dir / "a.csv", "short\n");
    EXPECT_EQ(read_text_file(dir / "a.csv"), "short\n");
    EXPECT_TRUE(t::pending_files(dir).empty());
}

TEST(WriteTextFileAtomic, MissingFolderIsAnInputErrorNamingTheFile) {
    const auto dir = t::scratch_dir("atomic_missing");
    const auto msg = t::input_error_of([&] { write_text_file_atomic(dir / "no" / "b.csv", "x"); });
    EXPECT_NE(msg.find("b.csv"), std::string::npos) << msg;
    EXPECT_TRUE(t::pending_files(dir).empty());
}

TEST(ReadTextFile, KeepsBytesAndNamesAMissingFile) {
    const auto dir = t::scratch_dir("read_text");
    const std::string bytes("a\r\nb\0c", 6);
    std::ofstream(dir / "f.bin", std::ios::binary).write(bytes.data(), 6);
    EXPECT_EQ(read_text_file(dir / "f.bin"), bytes);
    const auto msg = t::input_error_of([&] { (void)read_text_file(dir / "nothere.toml"); });
    EXPECT_NE(msg.find("nothere.toml"), std::string::npos) << msg;
}

TEST(PendingFiles, CommitRenamesEveryFileOfTheSet) {
    const auto dir = t::scratch_dir("pending_set");
    PendingFiles set;
    std::ofstream(set.add(dir / "a.pdf")) << "a";
    std::ofstream(set.add(dir / "b.csv")) << "b";
    EXPECT_FALSE(fs::exists(dir / "a.pdf"));
    set.commit();
    EXPECT_EQ(read_text_file(dir / "a.pdf"), "a");
    EXPECT_EQ(read_text_file(dir / "b.csv"), "b");
    EXPECT_TRUE(t::pending_files(dir).empty());
}

// A run whose results.json could not be put in place had already renamed its new sheet and
// summary over the old ones: a set renames none of its files when one of them cannot be.
TEST(PendingFiles, WhenOneFinalNameCannotTakeAFileNoneIsRenamed) {
    const auto dir = t::scratch_dir("pending_set_blocked");
    std::ofstream(dir / "a.pdf") << "old a";
    fs::create_directories(dir / "c.json" / "inside"); // a folder in the way
    {
        PendingFiles set;
        std::ofstream(set.add(dir / "a.pdf")) << "new a";
        std::ofstream(set.add(dir / "b.csv")) << "new b";
        std::ofstream(set.add(dir / "c.json")) << "new c";
        const auto msg = t::input_error_of([&] { set.commit(); });
        EXPECT_NE(msg.find("c.json"), std::string::npos) << msg;
    }
    EXPECT_EQ(read_text_file(dir / "a.pdf"), "old a");
    EXPECT_FALSE(fs::exists(dir / "b.csv"));
    EXPECT_TRUE(t::pending_files(dir).empty());
}

TEST(PendingFiles, DestroyedWithoutCommitLeavesNothing) {
    const auto dir = t::scratch_dir("pending_set_discard");
    {
        PendingFiles set;
        std::ofstream(set.add(dir / "a.pdf")) << "a";
        std::ofstream(set.add(dir / "b.csv")) << "b";
    }
    EXPECT_TRUE(t::pending_files(dir).empty());
    EXPECT_TRUE(fs::is_empty(dir));
}

// After a run killed with kill -9 its temporary files stayed in the output folder for good.
TEST(RemoveStaleTemporaries, RemovesWhatAKilledWriterLeftForTheNamedFiles) {
    const auto dir = t::scratch_dir("stale_killed");
    const auto sheet = t::temporary_of_killed_writer(dir / "calculation-sheet.pdf");
    const auto gpkg = t::temporary_of_killed_writer(dir / "catchments.gpkg");
    ASSERT_FALSE(sheet.empty());
    ASSERT_FALSE(gpkg.empty());
    std::ofstream(gpkg.string() + "-journal") << "journal"; // SQLite's, beside the GeoPackage
    const auto removed =
        remove_stale_temporaries(dir, {"calculation-sheet.pdf", "catchments.gpkg"});
    EXPECT_EQ(removed.size(), 3u);
    EXPECT_TRUE(fs::is_empty(dir)) << t::pending_files(dir).size();
}

TEST(RemoveStaleTemporaries, LeavesEveryOtherFile) {
    const auto dir = t::scratch_dir("stale_others");
    const long ended = t::ended_process_id();
    const long running = static_cast<long>(::getppid()); // the test runner, still running
    const std::vector<std::string> kept = {
        "results.json",
        "notes.txt",
        ".results.json.swp",
        fmt::format("results.part-{}-0.json", ended),      // not hidden
        fmt::format(".other.part-{}-0.json", ended),       // not one of the named files
        fmt::format(".results.part-{}-0.csv", ended),      // another extension
        fmt::format(".results.part-{}-0.json.bak", ended), // something after the name
        fmt::format(".results.part-{}-x.json", ended),     // not a number
        fmt::format(".results.part-{}-0.json", running),   // its writer still runs
    };
    for (const auto &name : kept) {
        std::ofstream(dir / name) << "x";
    }
    fs::create_directories(dir / fmt::format(".results.part-{}-1.json", ended)); // a folder
    std::ofstream(dir / fmt::format(".results.part-{}-2.json", ended)) << "stale";
    const auto removed = remove_stale_temporaries(dir, {"results.json"});
    ASSERT_EQ(removed.size(), 1u);
    EXPECT_EQ(removed[0].filename(), fmt::format(".results.part-{}-2.json", ended));
    for (const auto &name : kept) {
        EXPECT_TRUE(fs::exists(dir / name)) << name;
    }
    EXPECT_TRUE(fs::is_directory(dir / fmt::format(".results.part-{}-1.json", ended)));
}

TEST(RemoveStaleTemporaries, AMissingFolderHoldsNone) {
    const auto dir = t::scratch_dir("stale_missing");
    EXPECT_TRUE(remove_stale_temporaries(dir / "none", {"results.json"}).empty());
}

} // namespace
} // namespace catchpeak
