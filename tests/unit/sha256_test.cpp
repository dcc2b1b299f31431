// SHA-256 against the published example of FIPS 180-2 (Secure Hash Standard, NIST 2002,
// Appendix B.1 "SHA-256 Example (One-Block Message)" for "abc", and B.2 for the 448-bit message).

#include "core/util/sha256.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>

#include "core/util/errors.h"

namespace calivera {
namespace {

TEST(Sha256, Fips180OneBlockExample) {
  EXPECT_EQ(sha256OfBytes("abc"),
            "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
}

TEST(Sha256, Fips180MultiBlockExample) {
  EXPECT_EQ(sha256OfBytes("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq"),
            "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
}

TEST(Sha256, FileDigestEqualsByteDigest) {
  const std::filesystem::path path = std::filesystem::temp_directory_path() / "calivera_sha256.txt";
  {
    std::ofstream out(path, std::ios::binary);
    out << "abc";
  }
  EXPECT_EQ(sha256OfFile(path.string()), sha256OfBytes("abc"));
  std::filesystem::remove(path);
  EXPECT_THROW(sha256OfFile(path.string()), InputError);
}

}  // namespace
}  // namespace calivera
