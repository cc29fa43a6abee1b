// SPDX-License-Identifier: MIT
#include "catchpeak/core/files.hpp"

#include "catchpeak/core/error.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <atomic>
#include <cerrno>
#include <charconv>
#include <fstream>
#include <optional>
#include <signal.h>
#include <sstream>
#include <system_error>
#include <unistd.h>

namespace catchpeak {

namespace {
std::atomic<unsigned long> counter{0};
}

PendingFile::PendingFile(std::filesystem::path final_path)
    : final_(std::move(final_path)), open_(true) {
    const auto n = counter.fetch_add(1);
    temp_ = final_.parent_path() / fmt::format(".{}.part-{}-{}{}", final_.stem().string(),
                                               static_cast<long>(::getpid()), n,
                                               final_.extension().string());
}

PendingFile::~PendingFile() { discard(); }

PendingFile::PendingFile(PendingFile &&other) noexcept
    : final_(std::move(other.final_)), temp_(std::move(other.temp_)), open_(other.open_) {
    other.open_ = false;
}

PendingFile &PendingFile::operator=(PendingFile &&other) noexcept {
    if (this != &other) {
        discard();
        final_ = std::move(other.final_);
        temp_ = std::move(other.temp_);
        open_ = other.open_;
        other.open_ = false;
    }
    return *this;
}

void PendingFile::commit() {
    if (!open_) {
        throw InternalError(fmt::format("{}: committed twice or after a move", final_.string()));
    }
    std::error_code ec;
    std::filesystem::rename(temp_, final_, ec);
    if (ec) {
        discard();
        throw_input_error(final_.string(), "cannot be written: " + ec.message(),
                          "a writable folder");
    }
    open_ = false;
}

void PendingFile::discard() noexcept {
    if (open_) {
        std::error_code ec;
        std::filesystem::remove(temp_, ec);
        open_ = false;
    }
}

std::filesystem::path PendingFiles::add(std::filesystem::path final_path) {
    files_.emplace_back(std::move(final_path));
    return files_.back().temp_path();
}

void PendingFiles::commit() {
    for (const auto &f : files_) {
        std::error_code ec;
        if (std::filesystem::is_directory(f.final_path(), ec)) {
            throw_input_error(f.final_path().string(),
                              "cannot be written: a folder of that name is in the way (no file "
                              "of this run was put in place)",
                              "an output folder without a folder of that name");
        }
    }
    for (auto &f : files_) {
        f.commit();
    }
    files_.clear();
}

namespace {

/// Takes the text after a stem; reads one ".part-<pid>-<n>" from its front into `pid`.
bool read_part(std::string_view &rest, long &pid) {
    constexpr std::string_view tag = ".part-";
    if (rest.substr(0, tag.size()) != tag) {
        return false;
    }
    rest.remove_prefix(tag.size());
    const auto number = [&rest](long &v) {
        const auto [end, ec] = std::from_chars(rest.data(), rest.data() + rest.size(), v);
        if (ec != std::errc() || end == rest.data()) {
            return false;
        }
        rest.remove_prefix(static_cast<std::size_t>(end - rest.data()));
        return true;
    };
    long n = 0;
    if (!number(pid) || rest.empty() || rest.front() != '-') {
        return false;
    }
    rest.remove_prefix(1);
    return number(n);
}

/// The processes that wrote `name` when it is a temporary name of a PendingFile for `final_name`
/// (a temporary of a temporary too: a writer that writes through a PendingFile of its own into
/// the temporary name of a set), or of the journal files SQLite keeps beside one; else nullopt.
std::optional<std::vector<long>> writers_of(std::string_view name,
                                            const std::filesystem::path &final_name) {
    const std::string stem = final_name.stem().string();
    const std::string ext = final_name.extension().string();
    std::string_view body = name;
    for (const std::string_view journal : {"-journal", "-wal", "-shm", ""}) {
        const std::string tail = ext + std::string(journal);
        if (body.size() > tail.size() && body.substr(body.size() - tail.size()) == tail) {
            body.remove_suffix(tail.size());
            break;
        }
    }
    std::size_t dots = 0;
    while (dots < body.size() && body[dots] == '.') {
        ++dots;
    }
    body.remove_prefix(dots);
    if (dots == 0 || body.substr(0, stem.size()) != stem) {
        return std::nullopt;
    }
    body.remove_prefix(stem.size());
    std::vector<long> pids(dots);
    for (auto &pid : pids) {
        if (!read_part(body, pid)) {
            return std::nullopt;
        }
    }
    if (!body.empty()) {
        return std::nullopt;
    }
    return pids;
}

/// Whether process `pid` runs, other than this one.
bool other_process_runs(long pid) {
    if (pid <= 0 || pid == static_cast<long>(::getpid())) {
        return false;
    }
    return ::kill(static_cast<pid_t>(pid), 0) == 0 || errno == EPERM;
}

} // namespace

std::vector<std::filesystem::path>
remove_stale_temporaries(const std::filesystem::path &dir,
                         const std::vector<std::string> &final_names) {
    std::vector<std::filesystem::path> stale;
    std::error_code ec;
    std::filesystem::directory_iterator it(dir, ec);
    if (ec) {
        return stale; // no folder yet: nothing to remove
    }
    for (const auto &entry : it) {
        const std::string name = entry.path().filename().string();
        const bool ours = std::any_of(final_names.begin(), final_names.end(), [&](const auto &f) {
            const auto pids = writers_of(name, f);
            return pids && std::none_of(pids->begin(), pids->end(), other_process_runs);
        });
        if (ours && entry.is_regular_file(ec)) {
            stale.push_back(entry.path());
        }
    }
    std::vector<std::filesystem::path> removed;
    for (const auto &f : stale) {
        if (std::filesystem::remove(f, ec)) {
            removed.push_back(f);
        }
    }
    std::sort(removed.begin(), removed.end());
    return removed;
}

void write_text_file_atomic(const std::filesystem::path &path, std::string_view text) {
    PendingFile file(path);
    {
        std::ofstream out(file.temp_path(), std::ios::binary | std::ios::trunc);
        out.write(text.data(), static_cast<std::streamsize>(text.size()));
        out.close();
        if (!out) {
            throw_input_error(path.string(),
                              "cannot be written (is the folder writable, the disk full?)",
                              "a writable folder with free space");
        }
    }
    file.commit();
}

std::string read_text_file(const std::filesystem::path &path) {
    std::ifstream in(path, std::ios::binary);
    if (!in) {
        throw_input_error(path.string(), "cannot be opened for reading",
                          "an existing, readable file");
    }
    std::ostringstream buffer;
    buffer << in.rdbuf();
    return buffer.str();
}

} // namespace catchpeak
