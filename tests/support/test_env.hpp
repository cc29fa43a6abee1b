// SPDX-License-Identifier: MIT
// Where tests find their inputs and write their outputs. CTest passes the folders through the
// environment (tests/CMakeLists.txt), so no test depends on the working directory.
#pragma once

#include <cstdlib>
#include <filesystem>
#include <stdexcept>
#include <string>
#include <system_error>
#include <vector>

#include <unistd.h>

namespace catchpeak::test {

inline std::filesystem::path env_path(const char *name) {
    const char *v = std::getenv(name);
    if (v == nullptr || *v == '\0') {
        throw std::runtime_error(std::string("test environment variable not set: ") + name +
                                 " (run the tests through ctest)");
    }
    return std::filesystem::path(v);
}

/// tests/data of the source tree (read only).
inline std::filesystem::path data_dir() { return env_path("CATCHPEAK_TEST_DATA"); }
/// config/ of the source tree (read only).
inline std::filesystem::path config_dir() { return env_path("CATCHPEAK_CONFIG_DIR"); }
/// The source tree's top folder (read only).
inline std::filesystem::path source_dir() { return env_path("CATCHPEAK_SOURCE_DIR"); }

/// The scratch root of this test process: "<CATCHPEAK_TEST_SCRATCH>/p<pid>". CTest runs every
/// test in its own process, in parallel; a folder per process keeps two tests that choose the
/// same scratch name (or a suite set-up run by each of them) from clobbering each other.
/// The folder is removed when the process ends.
inline const std::filesystem::path &process_scratch_root() {
    struct Root {
        std::filesystem::path path;
        Root() : path(env_path("CATCHPEAK_TEST_SCRATCH") / ("p" + std::to_string(::getpid()))) {}
        Root(const Root &) = delete;
        Root &operator=(const Root &) = delete;
        ~Root() {
            std::error_code ec;
            std::filesystem::remove_all(path, ec);
        }
    };
    static const Root root;
    return root.path;
}

/// A fresh, empty scratch folder for one test, under the build tree.
inline std::filesystem::path scratch_dir(const std::string &test_name) {
    auto dir = process_scratch_root() / test_name;
    std::filesystem::remove_all(dir);
    std::filesystem::create_directories(dir);
    return dir;
}

/// Files under `dir` (searched recursively) still carrying the temporary name of a file being
/// written (".<stem>.part-<pid>-<n><ext>", core/files.hpp): a finished or failed write leaves none.
/// A missing folder holds none.
inline std::vector<std::filesystem::path> pending_files(const std::filesystem::path &dir) {
    std::vector<std::filesystem::path> found;
    std::error_code ec;
    if (!std::filesystem::is_directory(dir, ec)) {
        return found;
    }
    for (const auto &e : std::filesystem::recursive_directory_iterator(dir)) {
        if (e.path().filename().string().find(".part-") != std::string::npos) {
            found.push_back(e.path());
        }
    }
    return found;
}

} // namespace catchpeak::test
