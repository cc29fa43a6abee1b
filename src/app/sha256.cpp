// SPDX-License-Identifier: MIT
// SHA-256 from nettle (Debian's nettle-dev): the hashing itself is the library's; this file only
// streams bytes into it and writes the digest as hex.
#include "catchpeak/app/sha256.hpp"

#include "catchpeak/core/error.hpp"

#include <nettle/sha2.h>

#include <array>
#include <cstdint>
#include <fstream>
#include <string>
#include <vector>

namespace catchpeak::app {

namespace {

/// A running SHA-256 (nettle's context is a plain struct: nothing to free).
class Sha256 {
  public:
    Sha256() { sha256_init(&ctx_); }

    void update(const char *data, std::size_t n) {
        sha256_update(&ctx_, n, reinterpret_cast<const std::uint8_t *>(data));
    }

    /// The digest as 64 lower-case hex digits. The context is reset afterwards.
    std::string finish() {
        std::array<std::uint8_t, SHA256_DIGEST_SIZE> digest{};
        sha256_digest(&ctx_, digest.size(), digest.data());
        constexpr char hex_digits[] = "0123456789abcdef";
        std::string hex;
        hex.reserve(2 * digest.size());
        for (const std::uint8_t b : digest) {
            hex += hex_digits[b >> 4U];
            hex += hex_digits[b & 0x0fU];
        }
        return hex;
    }

  private:
    sha256_ctx ctx_{};
};

} // namespace

std::string sha256_hex(std::string_view bytes) {
    Sha256 s;
    s.update(bytes.data(), bytes.size());
    return s.finish();
}

std::string sha256_file(const std::filesystem::path &path) {
    std::ifstream in(path, std::ios::binary);
    if (!in) {
        throw_input_error(path.string(), "cannot be opened to compute its SHA-256");
    }
    Sha256 s;
    // Blocks of 1 MiB: a large DEM is streamed, never held whole.
    std::vector<char> buf(std::size_t{1} << 20U);
    while (in) {
        in.read(buf.data(), static_cast<std::streamsize>(buf.size()));
        s.update(buf.data(), static_cast<std::size_t>(in.gcount()));
    }
    if (in.bad()) {
        throw_input_error(path.string(), "cannot be read to compute its SHA-256");
    }
    return s.finish();
}

} // namespace catchpeak::app
