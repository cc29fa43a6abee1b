// SPDX-License-Identifier: MIT
// Where tests find their inputs and write their outputs. CTest passes the folders through the
// environment (tests/CMakeLists.txt), so no test depends on the working directory.
#pragma once

#include <cstdlib>
#include <filesystem>
#include <stdexcept>
#include <string>

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

/// A fresh, empty scratch folder for one test, under the build tree.
inline std::filesystem::path scratch_dir(const std::string &test_name) {
    auto dir = env_path("CATCHPEAK_TEST_SCRATCH") / test_name;
    std::filesystem::remove_all(dir);
    std::filesystem::create_directories(dir);
    return dir;
}

} // namespace catchpeak::test
