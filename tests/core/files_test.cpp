// SPDX-License-Identifier: MIT
#include "catchpeak/core/files.hpp"

#include "catchpeak/core/error.hpp"
#include "support/input_error.hpp"
#include "support/test_env.hpp"

#include <gtest/gtest.h>

#include <fstream>

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

} // namespace
} // namespace catchpeak
