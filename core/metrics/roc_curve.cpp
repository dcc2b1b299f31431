#include "core/metrics/roc_curve.h"

#include <cmath>
#include <limits>

namespace calivera {

std::vector<RocPoint> rocCurve(const SortedCohort& sorted) {
  const std::size_t n = sorted.size();
  const double n1 = static_cast<double>(sorted.events);
  const double n0 = static_cast<double>(sorted.nonEvents());
  std::vector<RocPoint> curve;
  curve.reserve(n + 1);
  curve.push_back({std::numeric_limits<double>::infinity(), 0.0, 0.0});
  // Walk distinct risks from the highest down; at each the flagged set is positions begin..n-1.
  std::size_t end = n;
  while (end > 0) {
    std::size_t begin = end - 1;
    while (begin > 0 && sorted.risk[begin - 1] == sorted.risk[begin]) --begin;
    const std::size_t tp = sorted.eventsAtOrAbove[begin];
    const std::size_t fp = (n - begin) - tp;
    curve.push_back({sorted.risk[begin], n0 > 0 ? static_cast<double>(fp) / n0 : 0.0,
                     n1 > 0 ? static_cast<double>(tp) / n1 : 0.0});
    end = begin;
  }
  return curve;
}

std::vector<RocPoint> thinRocCurve(const std::vector<RocPoint>& curve, std::size_t maxPoints) {
  if (curve.size() <= 2) return curve;
  std::vector<RocPoint> kept{curve.front()};
  kept.reserve(curve.size());
  for (std::size_t i = 1; i + 1 < curve.size(); ++i) {
    const RocPoint& a = kept.back();
    const RocPoint& b = curve[i];
    const RocPoint& c = curve[i + 1];
    const double cross = (b.fpr - a.fpr) * (c.tpr - a.tpr) - (b.tpr - a.tpr) * (c.fpr - a.fpr);
    if (std::abs(cross) > 1e-15) kept.push_back(b);
  }
  kept.push_back(curve.back());
  if (maxPoints < 2 || kept.size() <= maxPoints) return kept;
  std::vector<double> length(kept.size(), 0.0);
  for (std::size_t i = 1; i < kept.size(); ++i) {
    const double dx = kept[i].fpr - kept[i - 1].fpr;
    const double dy = kept[i].tpr - kept[i - 1].tpr;
    length[i] = length[i - 1] + std::sqrt(dx * dx + dy * dy);
  }
  const double step = length.back() / static_cast<double>(maxPoints - 1);
  std::vector<RocPoint> thinned{kept.front()};
  double next = step;
  for (std::size_t i = 1; i + 1 < kept.size(); ++i) {
    if (length[i] >= next) {
      thinned.push_back(kept[i]);
      next = length[i] + step;
    }
  }
  thinned.push_back(kept.back());
  return thinned;
}

double areaUnderCurve(const std::vector<RocPoint>& curve) {
  double area = 0.0;
  for (std::size_t i = 1; i < curve.size(); ++i) {
    area += (curve[i].fpr - curve[i - 1].fpr) * (curve[i].tpr + curve[i - 1].tpr) / 2.0;
  }
  return area;
}

}  // namespace calivera
