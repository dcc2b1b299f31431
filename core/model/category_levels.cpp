#include "core/model/category_levels.h"

#include <algorithm>
#include <charconv>
#include <cstdio>
#include <map>
#include <optional>

#include "core/util/errors.h"
#include "core/util/number_format.h"

namespace calivera {
namespace {

constexpr std::size_t kMaxListed = 5;
constexpr std::size_t kMaxDistinctNumeric = 1000;

std::string mappedColumn(const Model& model, const std::string& variable) {
  const auto found = model.columnMapping.find(variable);
  return found == model.columnMapping.end() ? variable : found->second;
}

// Model variable -> the levels its indicator terms name (products included), in first-use order.
void collectIndicatorLevels(const Term& term,
                            std::map<std::string, std::vector<std::string>>& out) {
  if (term.kind == TransformKind::Product) {
    for (const Term& factor : term.factors) collectIndicatorLevels(factor, out);
    return;
  }
  if (term.kind != TransformKind::Indicator) return;
  std::vector<std::string>& levels = out[term.variable];
  if (std::find(levels.begin(), levels.end(), term.level) == levels.end()) {
    levels.push_back(term.level);
  }
}

std::optional<double> asNumber(const std::string& text) {
  double value = 0.0;
  const auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), value);
  if (text.empty() || error != std::errc() || end != text.data() + text.size()) return std::nullopt;
  return value;
}

struct Unmatched {
  std::string level;
  std::size_t rows = 0;
};

std::string knownList(const std::vector<std::string>& levels,
                      const std::vector<std::string>* reference) {
  std::string out;
  if (reference) {
    for (const std::string& r : *reference) {
      out += (out.empty() ? "'" : ", '") + shownText(r) + "' (reference)";
    }
  }
  for (const std::string& level : levels) {
    out += (out.empty() ? "'" : ", '") + shownText(level) + "'";
  }
  return out;
}

std::string unmatchedList(const std::vector<Unmatched>& unmatched) {
  std::string out;
  for (std::size_t i = 0; i < unmatched.size() && i < kMaxListed; ++i) {
    out += (i ? ", '" : "'") + shownText(unmatched[i].level) + "' (" +
           std::to_string(unmatched[i].rows) + (unmatched[i].rows == 1 ? " row)" : " rows)");
  }
  if (unmatched.size() > kMaxListed) {
    out += " and " + std::to_string(unmatched.size() - kMaxListed) + " more";
  }
  return out;
}

}  // namespace

std::vector<std::string> checkCategoryLevels(const Model& model, const Table& table,
                                             const std::vector<std::uint32_t>& rows) {
  std::map<std::string, std::vector<std::string>> indicatorLevels;
  for (const Term& term : model.terms) collectIndicatorLevels(term, indicatorLevels);
  std::vector<std::string> warnings;
  for (const auto& [variable, levels] : indicatorLevels) {
    const std::string columnName = mappedColumn(model, variable);
    const Column* column = table.find(columnName);
    if (column == nullptr) continue;  // designMatrix names the missing column
    const auto ref = model.referenceLevels.find(variable);
    const std::vector<std::string>* reference =
        ref == model.referenceLevels.end() ? nullptr : &ref->second;
    const auto isReference = [&](const std::string& level) {
      return reference &&
             std::find(reference->begin(), reference->end(), level) != reference->end();
    };
    std::vector<Unmatched> unmatched;
    if (column->kind == ColumnKind::Text) {
      std::vector<std::size_t> counts(column->levels.size(), 0);
      for (const std::uint32_t r : rows) {
        const std::int32_t code = column->codes[r];
        if (code >= 0) ++counts[static_cast<std::size_t>(code)];
      }
      for (std::size_t code = 0; code < counts.size(); ++code) {
        const std::string& level = column->levels[code];
        if (counts[code] == 0 || std::find(levels.begin(), levels.end(), level) != levels.end() ||
            isReference(level)) {
          continue;
        }
        unmatched.push_back({level, counts[code]});
      }
    } else {
      std::vector<double> known;
      for (const std::string& level : levels) {
        if (const auto v = asNumber(level)) known.push_back(*v);
      }
      if (reference) {
        for (const std::string& r : *reference) {
          if (const auto v = asNumber(r)) known.push_back(*v);
        }
      }
      std::map<double, std::size_t> counts;
      for (const std::uint32_t r : rows) {
        const double v = column->numbers[r];
        if (v != v || std::find(known.begin(), known.end(), v) != known.end()) continue;
        if (++counts[v] == 1 && counts.size() > kMaxDistinctNumeric) break;
      }
      for (const auto& [value, n] : counts) unmatched.push_back({formatShortest(value), n});
    }
    if (unmatched.empty()) continue;
    // Warnings travel into reports, which name files without their folders: no path in them.
    const std::string where =
        "column '" + shownText(columnName) + "'" +
        (columnName == variable ? "" : " (model variable '" + shownText(variable) + "')");
    if (!reference && unmatched.size() == 1) {
      warnings.push_back(where + ": level " + unmatchedList(unmatched) +
                         " matches no term of the model and is taken as its reference level; "
                         "the model file does not record its reference level, so check that it "
                         "is (model levels: " +
                         knownList(levels, nullptr) + ")");
      continue;
    }
    throw InputError(table.sourceName + ": " + where + ": " +
                     (unmatched.size() == 1 ? "level " : "levels ") + unmatchedList(unmatched) +
                     (unmatched.size() == 1 ? " is" : " are") +
                     " not known to the model (its levels: " + knownList(levels, reference) +
                     "), and would otherwise be scored as the reference level. Recode the "
                     "column, or pair the variable with a column that uses the model's levels "
                     "(the column mapping)");
  }
  return warnings;
}

}  // namespace calivera
