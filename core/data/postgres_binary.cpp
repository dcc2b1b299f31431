#include "core/data/postgres_binary.h"

#include <bit>
#include <charconv>
#include <cmath>
#include <cstdint>
#include <cstring>

namespace calivera::postgres {
namespace {

template <typename Unsigned>
Unsigned bigEndian(std::string_view bytes, std::size_t at = 0) {
  Unsigned value = 0;
  for (std::size_t i = 0; i < sizeof(Unsigned); ++i) {
    value = static_cast<Unsigned>((value << 8) | static_cast<unsigned char>(bytes[at + i]));
  }
  return value;
}

Decoded finite(double candidate, double& value, std::string& word, const char* whenNot) {
  if (!std::isfinite(candidate)) {
    word = std::isnan(candidate) ? "NaN" : (candidate > 0 ? "Infinity" : "-Infinity");
    if (whenNot != nullptr) word = whenNot;
    return Decoded::NotFinite;
  }
  value = candidate;
  return Decoded::Number;
}

Decoded decodeNumeric(std::string_view bytes, double& value, std::string& word) {
  if (bytes.size() < 8) return Decoded::Malformed;
  const auto ndigits = static_cast<std::int16_t>(bigEndian<std::uint16_t>(bytes, 0));
  const auto weight = static_cast<std::int16_t>(bigEndian<std::uint16_t>(bytes, 2));
  const std::uint16_t sign = bigEndian<std::uint16_t>(bytes, 4);
  if (ndigits < 0 || bytes.size() != 8 + 2 * static_cast<std::size_t>(ndigits)) {
    return Decoded::Malformed;
  }
  switch (sign) {
    case 0xC000:
      word = "NaN";
      return Decoded::NotFinite;
    case 0xD000:
      word = "Infinity";
      return Decoded::NotFinite;
    case 0xF000:
      word = "-Infinity";
      return Decoded::NotFinite;
    case 0x0000:
    case 0x4000:
      break;
    default:
      return Decoded::Malformed;
  }
  if (ndigits == 0) {
    value = sign == 0x4000 ? -0.0 : 0.0;
    return Decoded::Number;
  }
  // The digits as one decimal integer times a power of ten: "-12345678e-4".
  std::string text = sign == 0x4000 ? "-" : "";
  text.reserve(text.size() + 4 * static_cast<std::size_t>(ndigits) + 8);
  for (int i = 0; i < ndigits; ++i) {
    const std::uint16_t digit =
        bigEndian<std::uint16_t>(bytes, 8 + 2 * static_cast<std::size_t>(i));
    if (digit > 9999) return Decoded::Malformed;
    char group[4] = {static_cast<char>('0' + digit / 1000),
                     static_cast<char>('0' + digit / 100 % 10),
                     static_cast<char>('0' + digit / 10 % 10), static_cast<char>('0' + digit % 10)};
    text.append(group, 4);
  }
  text += 'e';
  text += std::to_string(4 * (static_cast<int>(weight) - (ndigits - 1)));
  double parsed = 0;
  const auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), parsed);
  if (error != std::errc() || end != text.data() + text.size()) {
    word = "a numeric beyond a double's range";
    return Decoded::NotFinite;
  }
  return finite(parsed, value, word, nullptr);
}

}  // namespace

bool isNumberType(unsigned oid) {
  switch (oid) {
    case kBoolOid:
    case kInt2Oid:
    case kInt4Oid:
    case kInt8Oid:
    case kFloat4Oid:
    case kFloat8Oid:
    case kNumericOid:
      return true;
    default:
      return false;
  }
}

Decoded decodeNumber(unsigned oid, std::string_view bytes, double& value, std::string& word) {
  switch (oid) {
    case kBoolOid:
      if (bytes.size() != 1) return Decoded::Malformed;
      value = bytes[0] != 0 ? 1.0 : 0.0;
      return Decoded::Number;
    case kInt2Oid:
      if (bytes.size() != 2) return Decoded::Malformed;
      value = static_cast<std::int16_t>(bigEndian<std::uint16_t>(bytes));
      return Decoded::Number;
    case kInt4Oid:
      if (bytes.size() != 4) return Decoded::Malformed;
      value = static_cast<std::int32_t>(bigEndian<std::uint32_t>(bytes));
      return Decoded::Number;
    case kInt8Oid:
      if (bytes.size() != 8) return Decoded::Malformed;
      value = static_cast<double>(static_cast<std::int64_t>(bigEndian<std::uint64_t>(bytes)));
      return Decoded::Number;
    case kFloat4Oid: {
      if (bytes.size() != 4) return Decoded::Malformed;
      const auto single = std::bit_cast<float>(bigEndian<std::uint32_t>(bytes));
      if (!std::isfinite(single)) return finite(single, value, word, nullptr);
      // As its text: the shortest decimal of the binary32, read as a double.
      char text[32];
      const auto written = std::to_chars(text, text + sizeof text, single);
      double parsed = 0;
      std::from_chars(text, written.ptr, parsed);
      value = parsed;
      return Decoded::Number;
    }
    case kFloat8Oid: {
      if (bytes.size() != 8) return Decoded::Malformed;
      return finite(std::bit_cast<double>(bigEndian<std::uint64_t>(bytes)), value, word, nullptr);
    }
    case kNumericOid:
      return decodeNumeric(bytes, value, word);
    default:
      return Decoded::Malformed;
  }
}

}  // namespace calivera::postgres
