// SPDX-License-Identifier: MIT
#pragma once

#include <filesystem>
#include <string>
#include <string_view>

namespace catchpeak::app {

/// SHA-256 (FIPS 180-4) of some bytes, as 64 lower-case hex digits.
[[nodiscard]] std::string sha256_hex(std::string_view bytes);

/// SHA-256 of a file's contents. Throws InputError when the file cannot be read.
[[nodiscard]] std::string sha256_file(const std::filesystem::path &path);

} // namespace catchpeak::app
