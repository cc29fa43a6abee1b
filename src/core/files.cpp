// SPDX-License-Identifier: MIT
#include "catchpeak/core/files.hpp"

#include "catchpeak/core/error.hpp"

#include <fmt/format.h>

#include <atomic>
#include <fstream>
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
