#include "core/metrics/hosmer_lemeshow.h"

#include <algorithm>
#include <boost/math/distributions/chi_squared.hpp>
#include <limits>
#include <stdexcept>

#include "core/metrics/proportion_ci.h"

namespace calivera {

std::vector<CalibrationGroup> riskGroups(const SortedCohort& sorted, int groups) {
  if (groups < 1) throw std::invalid_argument("number of groups must be at least 1");
  const std::size_t n = sorted.size();
  std::vector<CalibrationGroup> result;
  if (n == 0) return result;
  std::vector<double> cuts;
  for (int k = 0; k <= groups; ++k) {
    cuts.push_back(quantileType7(sorted.risk, static_cast<double>(k) / groups));
  }
  cuts.erase(std::unique(cuts.begin(), cuts.end()), cuts.end());
  // Upper end (exclusive position) of each right-closed interval; the lowest cut is included in
  // the first group. A single distinct cut (all risks equal) forms one group.
  std::vector<std::size_t> ends;
  for (std::size_t k = 1; k < cuts.size(); ++k) {
    ends.push_back(static_cast<std::size_t>(
        std::upper_bound(sorted.risk.begin(), sorted.risk.end(), cuts[k]) - sorted.risk.begin()));
  }
  if (ends.empty() || ends.back() != n) ends.push_back(n);
  std::size_t begin = 0;
  for (const std::size_t end : ends) {
    if (end <= begin) continue;
    CalibrationGroup g;
    g.n = end - begin;
    g.observed = sorted.eventsAtOrAbove[begin] - sorted.eventsAtOrAbove[end];
    for (std::size_t i = begin; i < end; ++i) g.expected += sorted.risk[i];
    g.meanRisk = g.expected / static_cast<double>(g.n);
    g.observedProportion = static_cast<double>(g.observed) / static_cast<double>(g.n);
    g.observedCi = wilsonInterval(g.observed, g.n);
    g.riskLo = sorted.risk[begin];
    g.riskHi = sorted.risk[end - 1];
    result.push_back(g);
    begin = end;
  }
  return result;
}

HosmerLemeshow hosmerLemeshow(const SortedCohort& sorted, int groups, bool apparent,
                              std::vector<std::string>& warnings) {
  HosmerLemeshow hl;
  hl.groups = riskGroups(sorted, groups);
  const int formed = static_cast<int>(hl.groups.size());
  if (formed < groups) {
    warnings.push_back("Hosmer-Lemeshow: tied risks allowed only " + std::to_string(formed) +
                       " of " + std::to_string(groups) + " groups; statistic and df use " +
                       std::to_string(formed));
  }
  const double nan = std::numeric_limits<double>::quiet_NaN();
  bool undefined = false;
  for (const CalibrationGroup& g : hl.groups) {
    const double n = static_cast<double>(g.n);
    const double o = static_cast<double>(g.observed);
    const double denominator = g.expected * (1.0 - g.expected / n);
    if (!(denominator > 0.0)) {
      undefined = true;
      continue;
    }
    hl.statistic += (o - g.expected) * (o - g.expected) / denominator;
  }
  hl.df = apparent ? formed - 2 : formed;
  if (undefined) {
    hl.statistic = nan;
    warnings.push_back("Hosmer-Lemeshow: a group has all risks 0 or all 1; statistic undefined");
  }
  if (hl.df < 1) {
    hl.pValue = nan;
    warnings.push_back("Hosmer-Lemeshow: fewer than 1 degree of freedom; no p-value");
  } else if (!undefined) {
    hl.pValue = boost::math::cdf(boost::math::complement(
        boost::math::chi_squared(static_cast<double>(hl.df)), hl.statistic));
  } else {
    hl.pValue = nan;
  }
  return hl;
}

}  // namespace calivera
