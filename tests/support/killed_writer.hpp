// SPDX-License-Identifier: MIT
// A temporary file as a catchpeak process leaves it when it is killed while writing (kill -9):
// a child process opens a PendingFile, writes part of it and kills itself with SIGKILL, so that
// no destructor runs.
#pragma once

#include "catchpeak/core/files.hpp"
#include "support/test_env.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <csignal>
#include <filesystem>
#include <fstream>
#include <sys/wait.h>
#include <unistd.h>

namespace catchpeak::test {

/// The id of a process that has ended (a child that exits at once).
inline long ended_process_id() {
    const pid_t child = ::fork();
    if (child == 0) {
        ::_exit(0);
    }
    int status = 0;
    ::waitpid(child, &status, 0);
    return static_cast<long>(child);
}

/// Writes part of `final_path` in a child process that is then killed; returns the temporary
/// file it left ("" and a test failure when none was left).
inline std::filesystem::path temporary_of_killed_writer(const std::filesystem::path &final_path) {
    const auto before = pending_files(final_path.parent_path());
    const pid_t child = ::fork();
    if (child == 0) {
        PendingFile f(final_path);
        std::ofstream(f.temp_path(), std::ios::binary) << "half written";
        ::kill(::getpid(), SIGKILL);
        ::_exit(0); // not reached
    }
    int status = 0;
    ::waitpid(child, &status, 0);
    EXPECT_TRUE(WIFSIGNALED(status) && WTERMSIG(status) == SIGKILL);
    for (const auto &f : pending_files(final_path.parent_path())) {
        if (std::find(before.begin(), before.end(), f) == before.end()) {
            return f;
        }
    }
    ADD_FAILURE() << "the killed writer left no temporary file for " << final_path;
    return {};
}

} // namespace catchpeak::test
