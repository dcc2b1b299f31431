#include "core/model/category_levels.h"

#include <algorithm>
#include <charconv>
#include <cstdio>
#include <map>
#include <optional>

#include "core/model/linear_predictor.h"
#include "core/util/errors.h"
#include "core/util/number_format.h"

namespace calivera {
namespace {

constexpr std::size_t kMaxListed = 5;
constexpr std::size_t kMaxDistinctNumeric = 1000;

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

const std::string& mappedLevel(const Model& model, const std::string& variable,
                               const std::string& cohortLevel) {
  const auto byVariable = model.levelMapping.find(variable);
  if (byVariable == model.levelMapping.end()) return cohortLevel;
  const auto found = byVariable->second.find(cohortLevel);
  return found == byVariable->second.end() ? cohortLevel : found->second;
}

std::map<std::string, std::vector<std::string>> indicatorLevels(const Model& model) {
  std::map<std::string, std::vector<std::string>> out;
  for (const Term& term : model.terms) collectIndicatorLevels(term, out);
  return out;
}

std::vector<std::string> checkCategoryLevels(const Model& model, const Table& table,
                                             const std::vector<std::uint32_t>& rows) {
  const std::map<std::string, std::vector<std::string>> known = indicatorLevels(model);
  std::vector<std::string> warnings;
  // The level mapping itself: only categorical variables of the model, onto levels it knows.
  for (const auto& [variable, pairs] : model.levelMapping) {
    const auto levels = known.find(variable);
    if (levels == known.end()) {
      throw UnknownLevelError(table.sourceName + ": level mapping for '" + shownText(variable) +
                              "': the model has no categorical variable of that name");
    }
    const Column* column = table.find(mappedColumn(model, variable));
    if (column != nullptr && column->kind != ColumnKind::Text) {
      throw UnknownLevelError(table.sourceName + ": level mapping for '" + shownText(variable) +
                              "': column '" + shownText(column->name) +
                              "' holds numbers; map levels of text columns only");
    }
    const auto ref = model.referenceLevels.find(variable);
    for (const auto& [from, to] : pairs) {
      const bool isLevel =
          std::find(levels->second.begin(), levels->second.end(), to) != levels->second.end();
      const bool isReference =
          ref != model.referenceLevels.end() &&
          std::find(ref->second.begin(), ref->second.end(), to) != ref->second.end();
      if (!isLevel && !isReference) {
        throw UnknownLevelError(
            table.sourceName + ": level mapping for '" + shownText(variable) + "' maps '" +
            shownText(from) + "' to '" + shownText(to) + "', which is not a level of the model (" +
            knownList(levels->second, ref == model.referenceLevels.end() ? nullptr : &ref->second) +
            ")");
      }
      if (column != nullptr &&
          std::find(column->levels.begin(), column->levels.end(), from) == column->levels.end()) {
        warnings.push_back("level mapping for '" + shownText(variable) + "': no patient has '" +
                           shownText(from) + "' in column '" + shownText(column->name) +
                           "'; the mapping changes nothing");
      }
    }
  }
  for (const auto& [variable, levels] : known) {
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
        const std::string& asModel = mappedLevel(model, variable, level);
        if (counts[code] == 0 || std::find(levels.begin(), levels.end(), asModel) != levels.end() ||
            isReference(asModel)) {
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
    throw UnknownLevelError(
        table.sourceName + ": " + where + ": " + (unmatched.size() == 1 ? "level " : "levels ") +
        unmatchedList(unmatched) + (unmatched.size() == 1 ? " is" : " are") +
        " not known to the model (its levels: " + knownList(levels, reference) +
        "), and would otherwise be scored as the reference level. Recode the "
        "column, map each level to one of the model's (--map-level "
        "VARIABLE:LEVEL=MODEL_LEVEL, or Model → Map variables in the workstation), "
        "or pair the variable with a column that uses the model's levels");
  }
  return warnings;
}

}  // namespace calivera
