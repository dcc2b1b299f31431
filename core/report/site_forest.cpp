#include "core/report/site_forest.h"

#include <cmath>

#include "core/present/number_text.h"
#include "core/util/shown_text.h"

namespace calivera {
namespace {

std::string valueText(double estimate, const Interval& ci) {
  return formatNumber(estimate, 3) + " (" + formatRange(ci.lo, ci.hi, 3) + ")";
}

std::optional<double> idealValue(const std::string& key) {
  if (key == "oe_ratio" || key == "calibration_slope") return 1.0;
  if (key == "calibration_intercept") return 0.0;
  return std::nullopt;  // the c-statistic has no line of perfection worth drawing
}

}  // namespace

std::vector<ForestPlot> forestPlots(const SiteAnalysis& analysis) {
  constexpr double kZ = 1.959963984540054;
  std::vector<ForestPlot> plots;
  for (const PooledMeasure& m : analysis.measures) {
    ForestPlot plot;
    plot.title = m.label;
    plot.scale = m.scale;
    plot.ideal = idealValue(m.key);
    const RandomEffectsPool* pool = m.pooled.pool ? &*m.pooled.pool : nullptr;
    double totalWeight = 0.0;
    if (pool) {
      for (const double v : m.variances) totalWeight += 1.0 / (v + pool->tau2);
    }
    for (std::size_t i = 0; i < m.sites.size(); ++i) {
      ForestRow row;
      row.label = visibleName(m.sites[i], 60);  // names from files: controls written out
      const double se = std::sqrt(m.variances[i]);
      row.estimate = toNaturalScale(m.scale, m.estimates[i]);
      row.ci = toNaturalScale(m.scale, {m.estimates[i] - kZ * se, m.estimates[i] + kZ * se});
      row.weight = pool ? (1.0 / (m.variances[i] + pool->tau2)) / totalWeight : 0.0;
      row.valueText = valueText(row.estimate, row.ci);
      plot.sites.push_back(row);
    }
    for (const SiteExclusion& e : m.excluded) {
      plot.leftOut.push_back(visibleName(e.site, 60) + ": " + visibleName(e.reason, 300));
    }
    if (pool) {
      ForestRow pooled;
      pooled.label = "Pooled (random effects)";
      pooled.estimate = toNaturalScale(m.scale, pool->estimate);
      pooled.ci = toNaturalScale(m.scale, pool->ci);
      pooled.valueText = valueText(pooled.estimate, pooled.ci);
      plot.pooled = pooled;
      if (pool->predictionInterval) {
        plot.predictionInterval = toNaturalScale(m.scale, *pool->predictionInterval);
      }
      plot.note =
          "k = " + std::to_string(pool->k) + "; \u03c4\u00b2 = " + formatNumber(pool->tau2, 4) +
          (m.scale == PoolingScale::Identity
               ? std::string()
               : std::string(" (") + poolingScaleName(m.scale) + " scale)") +
          "; I\u00b2 = " + formatNumber(100.0 * pool->i2, 0) + "%" +
          (pool->predictionInterval
               ? "; 95% prediction interval " +
                     formatRange(plot.predictionInterval->lo, plot.predictionInterval->hi, 3)
               : "; no prediction interval (fewer than 3 sites)");
    } else {
      plot.note = "not pooled: " + m.pooled.problem;
    }
    plots.push_back(std::move(plot));
  }
  return plots;
}

}  // namespace calivera
