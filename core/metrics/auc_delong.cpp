#include "core/metrics/auc_delong.h"

#include <algorithm>
#include <cmath>
#include <stdexcept>

namespace calivera {
namespace {

// One block of tied risks with the placement value shared by its events and by its non-events.
struct TieBlock {
  std::size_t begin = 0, end = 0;  // positions in the sorted cohort
  std::size_t events = 0, nonEvents = 0;
  double v10 = 0.0;  // placement of each event of the block among the non-events
  double v01 = 0.0;  // placement of each non-event of the block among the events
};

template <typename Visit>
void forEachTieBlock(const SortedCohort& sorted, Visit&& visit) {
  const std::size_t n = sorted.size();
  const double n1 = static_cast<double>(sorted.events);
  const double n0 = static_cast<double>(sorted.nonEvents());
  if (n1 == 0 || n0 == 0) throw std::invalid_argument("AUC needs events and non-events");
  std::size_t nonEventsBelow = 0;
  std::size_t begin = 0;
  while (begin < n) {
    std::size_t end = begin + 1;
    while (end < n && sorted.risk[end] == sorted.risk[begin]) ++end;
    TieBlock block;
    block.begin = begin;
    block.end = end;
    block.events = sorted.eventsAtOrAbove[begin] - sorted.eventsAtOrAbove[end];
    block.nonEvents = (end - begin) - block.events;
    const std::size_t eventsAbove = sorted.eventsAtOrAbove[end];
    block.v10 =
        (static_cast<double>(nonEventsBelow) + 0.5 * static_cast<double>(block.nonEvents)) / n0;
    block.v01 = (static_cast<double>(eventsAbove) + 0.5 * static_cast<double>(block.events)) / n1;
    visit(block);
    nonEventsBelow += block.nonEvents;
    begin = end;
  }
}

struct Moments {
  double auc = 0.0, s10 = 0.0, s01 = 0.0, variance = 0.0;
  bool incomplete = false;
};

Moments momentsOf(const SortedCohort& sorted) {
  const double n1 = static_cast<double>(sorted.events);
  const double n0 = static_cast<double>(sorted.nonEvents());
  double sum10 = 0.0;
  forEachTieBlock(sorted,
                  [&](const TieBlock& b) { sum10 += static_cast<double>(b.events) * b.v10; });
  Moments m;
  m.auc = sum10 / n1;
  // Second pass about the mean: no cancellation for AUC near 1.
  double ss10 = 0.0, ss01 = 0.0;
  forEachTieBlock(sorted, [&](const TieBlock& b) {
    ss10 += static_cast<double>(b.events) * (b.v10 - m.auc) * (b.v10 - m.auc);
    ss01 += static_cast<double>(b.nonEvents) * (b.v01 - m.auc) * (b.v01 - m.auc);
  });
  m.incomplete = sorted.events < 2 || sorted.nonEvents() < 2;
  m.s10 = sorted.events > 1 ? ss10 / (n1 - 1.0) : 0.0;
  m.s01 = sorted.nonEvents() > 1 ? ss01 / (n0 - 1.0) : 0.0;
  m.variance = m.s10 / n1 + m.s01 / n0;
  return m;
}

}  // namespace

Interval aucPlainInterval(double auc, double se, double z) {
  return {auc - z * se, auc + z * se};
}

Interval aucLogitInterval(double auc, double se, double z) {
  if (auc <= 0.0 || auc >= 1.0) return {auc, auc};
  const double centre = std::log(auc / (1.0 - auc));
  const double half = z * se / (auc * (1.0 - auc));
  const auto expit = [](double x) { return 1.0 / (1.0 + std::exp(-x)); };
  return {expit(centre - half), expit(centre + half)};
}

DelongPlacements delongPlacements(const SortedCohort& sorted) {
  const Moments m = momentsOf(sorted);
  DelongPlacements c;
  c.auc = m.auc;
  c.s10 = m.s10;
  c.s01 = m.s01;
  c.variance = m.variance;
  c.varianceIncomplete = m.incomplete;
  // Per-patient values in input order: scatter each block's value to its patients' input indices,
  // then compact events and non-events keeping input order.
  const std::size_t n = sorted.size();
  std::vector<double> placement(n, 0.0);
  forEachTieBlock(sorted, [&](const TieBlock& b) {
    for (std::size_t i = b.begin; i < b.end; ++i) {
      placement[sorted.order[i]] = sorted.event[i] ? b.v10 : b.v01;
    }
  });
  std::vector<std::uint8_t> isEvent(n, 0);
  for (std::size_t i = 0; i < n; ++i) isEvent[sorted.order[i]] = sorted.event[i];
  c.v10.reserve(sorted.events);
  c.v01.reserve(sorted.nonEvents());
  for (std::size_t i = 0; i < n; ++i) (isEvent[i] ? c.v10 : c.v01).push_back(placement[i]);
  return c;
}

DelongPlacements delongPlacements(const std::vector<double>& risk,
                                  const std::vector<double>& outcome) {
  return delongPlacements(sortCohort(risk, outcome));
}

AucEstimate aucWithDelong(const SortedCohort& sorted, double z) {
  const Moments m = momentsOf(sorted);
  AucEstimate e;
  e.auc = m.auc;
  e.se = std::sqrt(m.variance);
  e.ciLogit = aucLogitInterval(e.auc, e.se, z);
  e.ciPlain = aucPlainInterval(e.auc, e.se, z);
  e.varianceIncomplete = m.incomplete;
  return e;
}

}  // namespace calivera
