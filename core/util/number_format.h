#pragma once
// Numbers in messages and level names: the shortest decimal text that reads back to the same
// double (std::to_chars), so "2" stays "2" and 0.1 stays "0.1".

#include <charconv>
#include <string>

namespace calivera {

inline std::string formatShortest(double value) {
  char buffer[32];
  const auto [end, error] = std::to_chars(buffer, buffer + sizeof buffer, value);
  return error == std::errc() ? std::string(buffer, end) : std::string("?");
}

}  // namespace calivera
