// SPDX-License-Identifier: MIT
#include "atomic_file.hpp"

#include "catchpeak/core/error.hpp"

#include <fstream>
#include <system_error>

namespace catchpeak::report::detail {

std::filesystem::path partial_name(const std::filesystem::path &file) {
    auto p = file;
    p += ".partial";
    return p;
}

void write_text_file(const std::filesystem::path &file, std::string_view text) {
    const auto tmp = partial_name(file);
    {
        std::ofstream out(tmp, std::ios::binary | std::ios::trunc);
        if (!out) {
            throw_input_error(file.string(), "cannot open the file for writing",
                              "a writable output folder");
        }
        out.write(text.data(), static_cast<std::streamsize>(text.size()));
        out.flush();
        if (!out) {
            std::error_code ec;
            std::filesystem::remove(tmp, ec);
            throw_input_error(file.string(), "writing the file failed (disk full?)",
                              "a writable output folder with free space");
        }
    }
    commit_partial(file);
}

void commit_partial(const std::filesystem::path &file) {
    std::error_code ec;
    std::filesystem::rename(partial_name(file), file, ec);
    if (ec) {
        std::error_code ignored;
        std::filesystem::remove(partial_name(file), ignored);
        throw_input_error(file.string(),
                          "cannot rename the finished file into place: " + ec.message());
    }
}

std::string read_text_file(const std::filesystem::path &file) {
    std::ifstream in(file, std::ios::binary);
    if (!in) {
        throw_input_error(file.string(), "cannot open the file for reading",
                          "an output folder written by catchpeak run");
    }
    std::string text;
    char buf[65536];
    while (in.read(buf, sizeof buf) || in.gcount() > 0) {
        text.append(buf, static_cast<std::size_t>(in.gcount()));
    }
    return text;
}

} // namespace catchpeak::report::detail
