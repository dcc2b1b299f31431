// Decoding PostgreSQL's binary format (core/data/postgres_binary.h). The byte strings are written
// by hand from the layouts of PostgreSQL 15's send functions (src/backend/utils/adt: boolsend,
// int2send, int4send, int8send, float4send, float8send, numeric_send), big-endian; the expected
// doubles are those the values' text forms read as (std::from_chars, as the CSV reader).
#include "core/data/postgres_binary.h"

#include <gtest/gtest.h>

#include <cmath>
#include <string>

namespace calivera::postgres {
namespace {

std::string bytes(std::initializer_list<int> values) {
  std::string out;
  for (int v : values) out.push_back(static_cast<char>(v));
  return out;
}

double decoded(unsigned oid, const std::string& raw) {
  double value = -12345;
  std::string word;
  EXPECT_EQ(decodeNumber(oid, raw, value, word), Decoded::Number) << oid;
  return value;
}

std::string notFinite(unsigned oid, const std::string& raw) {
  double value = 0;
  std::string word;
  EXPECT_EQ(decodeNumber(oid, raw, value, word), Decoded::NotFinite) << oid;
  return word;
}

TEST(PostgresBinary, IntegersAndBooleans) {
  EXPECT_EQ(decoded(kBoolOid, bytes({1})), 1.0);
  EXPECT_EQ(decoded(kBoolOid, bytes({0})), 0.0);
  EXPECT_EQ(decoded(kInt2Oid, bytes({0xFF, 0xFE})), -2.0);
  EXPECT_EQ(decoded(kInt4Oid, bytes({0x00, 0x01, 0x00, 0x00})), 65536.0);
  EXPECT_EQ(decoded(kInt4Oid, bytes({0x80, 0, 0, 0})), -2147483648.0);
  // 2^53 + 1 rounds to nearest (even) as its text "9007199254740993" reads.
  EXPECT_EQ(decoded(kInt8Oid, bytes({0x00, 0x20, 0, 0, 0, 0, 0, 0x01})), 9007199254740992.0);
}

TEST(PostgresBinary, FloatsReadAsTheirText) {
  // 0.1 as binary64: 0x3FB999999999999A.
  EXPECT_EQ(decoded(kFloat8Oid, bytes({0x3F, 0xB9, 0x99, 0x99, 0x99, 0x99, 0x99, 0x9A})), 0.1);
  // 0.1 as binary32 (0x3DCCCCCD) prints as "0.1", so it reads as the double 0.1, not as the
  // binary32 value 0.100000001490116...
  EXPECT_EQ(decoded(kFloat4Oid, bytes({0x3D, 0xCC, 0xCC, 0xCD})), 0.1);
  EXPECT_EQ(decoded(kFloat4Oid, bytes({0xC2, 0xF6, 0xE9, 0x79})), -123.456);  // "-123.456"
  EXPECT_EQ(notFinite(kFloat8Oid, bytes({0x7F, 0xF8, 0, 0, 0, 0, 0, 0})), "NaN");
  EXPECT_EQ(notFinite(kFloat8Oid, bytes({0xFF, 0xF0, 0, 0, 0, 0, 0, 0})), "-Infinity");
  EXPECT_EQ(notFinite(kFloat4Oid, bytes({0x7F, 0x80, 0, 0})), "Infinity");
}

TEST(PostgresBinary, NumericDigitsInBaseTenThousand) {
  // 30.2: ndigits 2, weight 0, sign +, dscale 1, digits 30 and 2000 (30 + 2000/10000).
  EXPECT_EQ(decoded(kNumericOid, bytes({0, 2, 0, 0, 0, 0, 0, 1, 0, 30, 0x07, 0xD0})), 30.2);
  // -0.0625: ndigits 1, weight -1, sign -, dscale 4, digit 625.
  EXPECT_EQ(decoded(kNumericOid, bytes({0, 1, 0xFF, 0xFF, 0x40, 0, 0, 4, 0x02, 0x71})), -0.0625);
  // 120000: ndigits 1, weight 1, digit 12 (12 * 10000).
  EXPECT_EQ(decoded(kNumericOid, bytes({0, 1, 0, 1, 0, 0, 0, 0, 0, 12})), 120000.0);
  // 0 has no digits.
  EXPECT_EQ(decoded(kNumericOid, bytes({0, 0, 0, 0, 0, 0, 0, 0})), 0.0);
  // 0.1234567890123456789: digits 1234 5678 9012 3456 7890 at weight -1, rounded once.
  EXPECT_EQ(decoded(kNumericOid, bytes({0, 5, 0xFF, 0xFF, 0, 0, 0, 20, 0x04, 0xD2, 0x16, 0x2E, 0x23,
                                        0x34, 0x0D, 0x80, 0x1E, 0xD2})),
            0.12345678901234567890);
  EXPECT_EQ(notFinite(kNumericOid, bytes({0, 0, 0, 0, 0xC0, 0, 0, 0})), "NaN");
  EXPECT_EQ(notFinite(kNumericOid, bytes({0, 0, 0, 0, 0xF0, 0, 0, 0})), "-Infinity");
  // 10000^400 is beyond a double.
  EXPECT_EQ(notFinite(kNumericOid, bytes({0, 1, 0x01, 0x90, 0, 0, 0, 0, 0, 1})),
            "a numeric beyond a double's range");
}

TEST(PostgresBinary, MalformedBytesAreSaidToBe) {
  double value = 0;
  std::string word;
  EXPECT_EQ(decodeNumber(kInt4Oid, bytes({0, 1}), value, word), Decoded::Malformed);
  EXPECT_EQ(decodeNumber(kFloat8Oid, bytes({0, 0, 0, 0}), value, word), Decoded::Malformed);
  // ndigits 2 but one digit's bytes.
  EXPECT_EQ(decodeNumber(kNumericOid, bytes({0, 2, 0, 0, 0, 0, 0, 0, 0, 1}), value, word),
            Decoded::Malformed);
  // A digit above 9999, and an unknown sign word.
  EXPECT_EQ(decodeNumber(kNumericOid, bytes({0, 1, 0, 0, 0, 0, 0, 0, 0x27, 0x10}), value, word),
            Decoded::Malformed);
  EXPECT_EQ(decodeNumber(kNumericOid, bytes({0, 0, 0, 0, 0x12, 0x34, 0, 0}), value, word),
            Decoded::Malformed);
  EXPECT_FALSE(isNumberType(1082));  // date
  EXPECT_TRUE(isNumberType(kNumericOid));
}

}  // namespace
}  // namespace calivera::postgres
