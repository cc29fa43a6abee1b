// SPDX-License-Identifier: MIT
#include "catchpeak/app/sha256.hpp"

#include <gtest/gtest.h>

#include <string>

// Expected digests: the SHA-256 examples of FIPS 180-2 (appendix B.1 and B.2) and the digest of
// the empty message (value from memory, not checked against the source).
TEST(Sha256, FipsExampleOneBlock) {
    EXPECT_EQ(catchpeak::app::sha256_hex("abc"),
              "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
}

TEST(Sha256, FipsExampleTwoBlocks) {
    EXPECT_EQ(
        catchpeak::app::sha256_hex("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq"),
        "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
}

TEST(Sha256, EmptyMessage) {
    EXPECT_EQ(catchpeak::app::sha256_hex(""),
              "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
}
