#pragma once
// Small readers for the committed reference files (tests only): a plain numeric CSV with a
// header, and the "model,term,value,se" / "term,value,se" tables written by the scripts in
// tests/reference/scripts. '#' lines are comments.

#include <cmath>
#include <fstream>
#include <map>
#include <sstream>
#include <stdexcept>
#include <string>
#include <vector>

namespace calivera::testing {

inline std::vector<std::string> splitCsvLine(const std::string& line) {
  std::vector<std::string> fields;
  std::stringstream stream(line);
  std::string field;
  while (std::getline(stream, field, ',')) fields.push_back(field);
  if (!line.empty() && line.back() == ',') fields.emplace_back();
  return fields;
}

// Rows of text fields keyed by header name.
inline std::map<std::string, std::vector<std::string>> readColumns(const std::string& path) {
  std::ifstream in(path);
  if (!in) throw std::runtime_error("cannot open " + path);
  std::string line;
  std::vector<std::string> header;
  std::map<std::string, std::vector<std::string>> columns;
  while (std::getline(in, line)) {
    if (line.empty() || line[0] == '#') continue;
    const std::vector<std::string> fields = splitCsvLine(line);
    if (header.empty()) {
      header = fields;
      continue;
    }
    for (std::size_t j = 0; j < header.size(); ++j) {
      columns[header[j]].push_back(j < fields.size() ? fields[j] : "");
    }
  }
  return columns;
}

struct ReferenceValue {
  double value = 0.0;
  double se = 0.0;  // 0 when the file gives none
};

// (model or "", term) -> value and SE.
inline std::map<std::pair<std::string, std::string>, ReferenceValue> readReference(
    const std::string& path) {
  auto columns = readColumns(path);
  std::map<std::pair<std::string, std::string>, ReferenceValue> out;
  const std::size_t n = columns["term"].size();
  for (std::size_t i = 0; i < n; ++i) {
    const std::string model = columns.count("model") ? columns["model"][i] : "";
    const std::string& se = columns["se"][i];
    out[{model, columns["term"][i]}] = {std::stod(columns["value"][i]),
                                        se.empty() ? 0.0 : std::stod(se)};
  }
  return out;
}

inline std::string referencePath(const std::string& name) {
  return std::string(CALIVERA_SOURCE_DIR) + "/tests/reference/data/" + name;
}

// |a - b| / max(|b|, tiny): the relative difference the reference tolerances are stated in.
inline double relativeDifference(double a, double b) {
  const double scale = std::abs(b) > 1e-300 ? std::abs(b) : 1e-300;
  return std::abs(a - b) / scale;
}

}  // namespace calivera::testing
