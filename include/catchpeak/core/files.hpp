// SPDX-License-Identifier: MIT
#pragma once
// Writing files so that nothing half-written is left behind, and reading whole files. Shared by
// io, report and app.

#include <filesystem>
#include <string>
#include <string_view>
#include <vector>

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

/// Files written together, as one set: each under a temporary name (PendingFile), and all of
/// them renamed to their final names by commit() only once every one is complete. A set
/// destroyed without a commit removes its temporary files, so a failed run leaves the older
/// files of the set as they were and none of its own. Move-only.
class PendingFiles {
  public:
    PendingFiles() = default;
    PendingFiles(const PendingFiles &) = delete;
    PendingFiles &operator=(const PendingFiles &) = delete;
    PendingFiles(PendingFiles &&) noexcept = default;
    PendingFiles &operator=(PendingFiles &&) noexcept = default;
    ~PendingFiles() = default;

    /// Adds the file `final_path` to the set; returns where to write it now.
    std::filesystem::path add(std::filesystem::path final_path);
    /// Renames every file of the set to its final name, in the order they were added. Checks
    /// first that every final name can take a file (a folder of that name cannot), so that
    /// none is renamed when one would fail. Throws InputError naming the file otherwise.
    void commit();

  private:
    std::vector<PendingFile> files_;
};

/// Removes from `dir` (not its subfolders) the temporary files that a PendingFile of this
/// program left there for one of `final_names` ("results.json", ...) when its process ended
/// without a chance to clean up (killed, power lost): names of the form
/// ".<stem>.part-<pid>-<n><extension>" (and the journal files of a GeoPackage being written)
/// whose process <pid> no longer runs, or is this one (which is writing none of them when it
/// calls this). Nothing else is touched. Returns the files removed; a file that cannot be
/// removed is left (and not listed).
std::vector<std::filesystem::path>
remove_stale_temporaries(const std::filesystem::path &dir,
                         const std::vector<std::string> &final_names);

/// Writes a text file through a PendingFile (temporary name, then rename).
/// Throws InputError naming the file when it cannot be written.
void write_text_file_atomic(const std::filesystem::path &path, std::string_view text);

/// Reads a whole file as bytes; throws InputError naming the file when it cannot be opened.
[[nodiscard]] std::string read_text_file(const std::filesystem::path &path);

} // namespace catchpeak
