#pragma once
// What a forest plot of one pooled measure shows (core/sites/site_pooling.h), as plain data for
// the report and the workstation to draw (render/charts/forest_plot.h): each site's estimate and
// 95% CI with its random-effects weight, the pooled estimate with its 95% CI, the prediction
// interval for a new site, the line of the ideal value, and tau² and I². Values on the measure's
// natural scale; `scale` says how the axis is spaced (logit or log spacing keeps each interval
// symmetric, as it was computed).

#include <optional>
#include <string>
#include <vector>

#include "core/metrics/validation.h"
#include "core/sites/site_pooling.h"

namespace calivera {

struct ForestRow {
  std::string label;
  double estimate = 0.0;
  Interval ci;
  double weight = 0.0;    // share of the random-effects weight, 0..1 (pooled row: 0)
  std::string valueText;  // "0.848 (0.828 to 0.865)"
};

struct ForestPlot {
  std::string title;  // the measure
  PoolingScale scale = PoolingScale::Identity;
  std::optional<double> ideal;  // perfect calibration: O/E 1, intercept 0, slope 1
  std::vector<ForestRow> sites;
  std::optional<ForestRow> pooled;  // absent: no pool (see note)
  std::optional<Interval> predictionInterval;
  std::string note;  // "k = 4; tau² = 0.040 (logit scale); I² = 68%", or why there is no pool
  std::vector<std::string> leftOut;  // "QLD: no events"
};

// One plot per pooled measure, in kPooledMeasureKeys order.
std::vector<ForestPlot> forestPlots(const SiteAnalysis& analysis);

}  // namespace calivera
