// SPDX-License-Identifier: MIT
#pragma once
// Writing files so that nothing half-written is left behind, and reading whole files. Shared by
// io, report and app.

#include <filesystem>
#include <string>
#include <string_view>

namespace catchpeak {

/// A file being written under a temporary name in the folder of its final name
/// (".<name>.part-<n><extension>", so drivers that look at the extension still recognise it).
/// `commit()` renames it to the final name; if it is destroyed without a commit, the temporary
/// file is removed, so nothing half-written is left behind. Move-only.
class PendingFile {
  public:
    explicit PendingFile(std::filesystem::path final_path);
    ~PendingFile();
    PendingFile(const PendingFile &) = delete;
    PendingFile &operator=(const PendingFile &) = delete;
    PendingFile(PendingFile &&other) noexcept;
    PendingFile &operator=(PendingFile &&other) noexcept;

    /// Where to write now.
    [[nodiscard]] const std::filesystem::path &temp_path() const noexcept { return temp_; }
    [[nodiscard]] const std::filesystem::path &final_path() const noexcept { return final_; }
    /// Renames the temporary file to the final name (replacing an older file). Throws
    /// InputError naming the final file when the rename fails.
    void commit();
    /// Removes the temporary file (no error if it does not exist).
    void discard() noexcept;

  private:
    std::filesystem::path final_;
    std::filesystem::path temp_;
    bool open_ = false;
};

/// Writes a text file through a PendingFile (temporary name, then rename).
/// Throws InputError naming the file when it cannot be written.
void write_text_file_atomic(const std::filesystem::path &path, std::string_view text);

/// Reads a whole file as bytes; throws InputError naming the file when it cannot be opened.
[[nodiscard]] std::string read_text_file(const std::filesystem::path &path);

} // namespace catchpeak
