// SPDX-License-Identifier: MIT
#include "catchpeak/app/sha256.hpp"

#include "catchpeak/core/error.hpp"
#include "support/test_env.hpp"

#include <gtest/gtest.h>

#include <cstdio>
#include <fstream>
#include <memory>
#include <string>

using catchpeak::app::sha256_file;
using catchpeak::app::sha256_hex;

namespace {

/// What a shell command prints on stdout.
std::string command_output(const std::string &command) {
    std::unique_ptr<FILE, int (*)(FILE *)> pipe(popen(command.c_str(), "r"), pclose);
    if (!pipe) {
        return {};
    }
    std::string out;
    char buf[256];
    while (std::fgets(buf, sizeof buf, pipe.get()) != nullptr) {
        out += buf;
    }
    return out;
}

} // namespace

// Expected digests: the SHA-256 examples of FIPS 180-2, appendix B.1 ("abc"), B.2 (the 448-bit
// message) and B.3 (one million 'a'); the digest of the empty message from NIST's example
// values for SHA-256 (value from memory, not checked against the source).
TEST(Sha256, FipsExampleOneBlock) {
    EXPECT_EQ(sha256_hex("abc"),
              "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
}

TEST(Sha256, FipsExampleTwoBlocks) {
    EXPECT_EQ(sha256_hex("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq"),
              "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
}

TEST(Sha256, FipsExampleOneMillionA) {
    EXPECT_EQ(sha256_hex(std::string(1'000'000, 'a')),
              "cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0");
}

TEST(Sha256, EmptyMessage) {
    EXPECT_EQ(sha256_hex(""), "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
}

TEST(Sha256, FileHashEqualsTheCoreutilsTool) {
    // A file of several read blocks (1 MiB each) and an odd tail, with every byte value: the
    // file is streamed in blocks, and the digest must be the same as of the whole at once.
    const auto path = catchpeak::test::scratch_dir("sha256_file") / "bytes.bin";
    std::string bytes;
    for (std::size_t i = 0; i < 3 * (std::size_t{1} << 20U) + 12'345; ++i) {
        bytes += static_cast<char>((i * 7919U + i / 251U) & 0xffU);
    }
    {
        std::ofstream out(path, std::ios::binary);
        out.write(bytes.data(), static_cast<std::streamsize>(bytes.size()));
    }
    const std::string tool = command_output("sha256sum '" + path.string() + "'");
    ASSERT_GE(tool.size(), 64U) << "sha256sum printed: " << tool;
    EXPECT_EQ(sha256_file(path), tool.substr(0, 64));
    EXPECT_EQ(sha256_hex(bytes), tool.substr(0, 64));
}

TEST(Sha256, EmptyFileHashEqualsTheCoreutilsTool) {
    const auto path = catchpeak::test::scratch_dir("sha256_empty_file") / "empty.txt";
    { std::ofstream out(path, std::ios::binary); }
    const std::string tool = command_output("sha256sum '" + path.string() + "'");
    ASSERT_GE(tool.size(), 64U) << "sha256sum printed: " << tool;
    EXPECT_EQ(sha256_file(path), tool.substr(0, 64));
}

TEST(Sha256, MissingFileIsAnInputError) {
    const auto dir = catchpeak::test::scratch_dir("sha256_missing");
    EXPECT_THROW((void)sha256_file(dir / "nowhere.tif"), catchpeak::InputError);
}
