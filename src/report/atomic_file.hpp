// SPDX-License-Identifier: MIT
// Writing output files so that nothing partial is left behind (internal to report).
#pragma once

#include <filesystem>
#include <string>
#include <string_view>

namespace catchpeak::report::detail {

/// The temporary name an output is written to before it is renamed: "<file>.partial".
[[nodiscard]] std::filesystem::path partial_name(const std::filesystem::path &file);

/// Writes `text` to `file` through partial_name(file), renamed when complete.
/// Throws InputError naming the file when it cannot be written.
void write_text_file(const std::filesystem::path &file, std::string_view text);

/// Renames partial_name(file) to `file`; throws InputError naming the file on failure.
void commit_partial(const std::filesystem::path &file);

/// Reads a whole file; throws InputError naming the file when it cannot be read.
[[nodiscard]] std::string read_text_file(const std::filesystem::path &file);

} // namespace catchpeak::report::detail
