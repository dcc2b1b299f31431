#pragma once
// Values of PostgreSQL's binary wire format (the type's "send" function, as a BINARY cursor
// returns it), decoded to the double its text form would read as, so that a column fetched in
// binary (half the server's work of writing text: issue 16's row mode) gives the numbers the CSV
// route gives for the same data.
//
// Layouts (PostgreSQL 15 source, src/backend/utils/adt: boolsend, int2send/int4send/int8send,
// float4send/float8send, numeric_send; all big-endian):
// - boolean: one byte, 1 true, 0 false.
// - smallint, integer, bigint: two's complement in 2, 4 or 8 bytes.
// - real, double precision: IEEE 754 binary32 / binary64.
// - numeric: int16 ndigits, int16 weight, uint16 sign (0x0000 +, 0x4000 -, 0xC000 NaN,
//   0xD000 +Infinity, 0xF000 -Infinity), int16 dscale, then ndigits base-10000 digits (int16);
//   the value is the sum of digit[i] * 10000^(weight - i).
//
// Text equivalence: a real is written as text as its shortest decimal that reads back as the
// same binary32 (PostgreSQL 12 and later, extra_float_digits = 1); that decimal, read as a
// double, is what a CSV export gives, so a real goes through std::to_chars(float) and back. A
// numeric's decimal digits are read by std::from_chars, correctly rounded like its text. A
// double precision value and an integer convert exactly as their text would read.

#include <string>
#include <string_view>

namespace calivera::postgres {

inline constexpr unsigned kBoolOid = 16;
inline constexpr unsigned kInt8Oid = 20;
inline constexpr unsigned kInt2Oid = 21;
inline constexpr unsigned kInt4Oid = 23;
inline constexpr unsigned kFloat4Oid = 700;
inline constexpr unsigned kFloat8Oid = 701;
inline constexpr unsigned kNumericOid = 1700;

// True for the types decodeNumber reads.
bool isNumberType(unsigned oid);

enum class Decoded {
  Number,     // `value` holds it
  NotFinite,  // NaN or an infinity (or a numeric beyond a double's range): `word` names it
  Malformed,  // the bytes do not fit the type's layout
};

// Decodes one non-NULL value of a number type (isNumberType) from its binary form.
Decoded decodeNumber(unsigned oid, std::string_view bytes, double& value, std::string& word);

}  // namespace calivera::postgres
