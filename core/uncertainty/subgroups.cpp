#include "core/uncertainty/subgroups.h"

#include <algorithm>
#include <charconv>
#include <map>
#include <set>

#include "core/metrics/size_warnings.h"
#include "core/util/errors.h"

namespace calivera {
namespace {

std::string shortestNumber(double value) {
  char buffer[64];
  const auto [end, ec] = std::to_chars(buffer, buffer + sizeof buffer, value);
  return ec == std::errc() ? std::string(buffer, end) : std::to_string(value);
}

}  // namespace

std::vector<std::string> subgroupLabels(const Table& table, const std::string& column,
                                        const std::vector<std::uint32_t>& rows,
                                        std::size_t maxLevels, const std::string& role) {
  const Column& c = table.require(column);
  std::vector<std::string> labels;
  labels.reserve(rows.size());
  for (const std::uint32_t row : rows) {
    if (c.isMissing(row)) {
      labels.emplace_back(kMissingLevel);
    } else if (c.kind == ColumnKind::Text) {
      labels.push_back(c.levels[static_cast<std::size_t>(c.codes[row])]);
    } else {
      labels.push_back(shortestNumber(c.numbers[row]));
    }
  }
  const std::set<std::string> distinct(labels.begin(), labels.end());
  if (distinct.size() > maxLevels) {
    throw InputError(
        table.sourceName + ": column '" + column + "' has " + std::to_string(distinct.size()) +
        " distinct values; a " + role + " column needs at most " + std::to_string(maxLevels) +
        " levels (group a continuous value into bands first; identifiers are never " + role + "s)");
  }
  return labels;
}

SubgroupAnalysis validateSubgroups(const std::string& column,
                                   const std::vector<std::string>& labels,
                                   const ValidationInput& input, const ValidationOptions& options,
                                   const ValidationBootstrapOptions& bootstrapOptions) {
  if (labels.size() != input.outcome.size()) {
    throw InputError("subgroup labels and patients differ in number");
  }
  // Level order: numbers ascending when every label is a number, else byte
  // order; missing last.
  std::map<std::string, std::vector<std::size_t>> members;
  for (std::size_t i = 0; i < labels.size(); ++i) members[labels[i]].push_back(i);
  std::vector<std::string> levels;
  for (const auto& [level, unused] : members) {
    if (level != kMissingLevel) levels.push_back(level);
  }
  const auto asNumber = [](const std::string& s, double& out) {
    const auto [ptr, ec] = std::from_chars(s.data(), s.data() + s.size(), out);
    return ec == std::errc() && ptr == s.data() + s.size();
  };
  double unusedNumber = 0.0;
  if (std::all_of(levels.begin(), levels.end(),
                  [&](const std::string& s) { return asNumber(s, unusedNumber); })) {
    std::sort(levels.begin(), levels.end(), [&](const std::string& a, const std::string& b) {
      double x = 0.0, y = 0.0;
      asNumber(a, x);
      asNumber(b, y);
      return x < y;
    });
  }
  if (members.count(kMissingLevel)) levels.emplace_back(kMissingLevel);

  SubgroupAnalysis analysis;
  analysis.column = column;
  ValidationOptions levelOptions = options;
  levelOptions.progress = nullptr;
  const ProgressCallback& whole = bootstrapOptions.bootstrap.progress;
  for (std::size_t k = 0; k < levels.size(); ++k) {
    const std::string& level = levels[k];
    const std::vector<std::size_t>& index = members[level];
    // Each level's bootstrap fills its own share of the bar (it restarted at 0 per level).
    ValidationBootstrapOptions levelBootstrap = bootstrapOptions;
    if (whole) {
      const double from = static_cast<double>(k) / static_cast<double>(levels.size());
      const double share = 1.0 / static_cast<double>(levels.size());
      levelBootstrap.bootstrap.progress = [whole, from, share](double f) {
        return whole(from + share * f);
      };
    }
    SubgroupResult result;
    result.level = level;
    result.n = index.size();
    ValidationInput subset;
    std::vector<double> lp;
    for (const std::size_t i : index) {
      subset.outcome.push_back(input.outcome[i]);
      subset.risk.push_back(input.risk[i]);
      if (input.linearPredictor) lp.push_back((*input.linearPredictor)[i]);
      result.events += input.outcome[i] > 0.5 ? 1 : 0;
    }
    if (input.linearPredictor) subset.linearPredictor = std::move(lp);
    const std::size_t nonEvents = result.n - result.events;
    result.tooSmall = result.events < kMinEventsAndNonEvents || nonEvents < kMinEventsAndNonEvents;
    result.warnings = sizeWarningTexts(result.events, nonEvents);
    try {
      result.metrics = validate(subset, levelOptions);
      if (bootstrapOptions.bootstrap.replicates > 0) {
        result.bootstrap =
            bootstrapValidation(subset, levelOptions, *result.metrics, levelBootstrap);
      }
    } catch (const AnalysisError& error) {
      result.warnings.push_back(std::string("no metrics: ") + error.what());
    }
    analysis.levels.push_back(std::move(result));
  }
  reportProgress(whole, 1.0);
  return analysis;
}

}  // namespace calivera
