#include "core/report/site_curves.h"

#include <algorithm>
#include <cmath>

#include "core/util/shown_text.h"

namespace calivera {

SiteCurvesPlot siteCurvesPlot(const SiteAnalysis& analysis) {
  SiteCurvesPlot plot;
  plot.title = "Calibration by site";
  double largest = 0.0;
  for (std::size_t i = 0; i < analysis.sites.size(); ++i) {
    const SiteMeasures& s = analysis.sites[i];
    if (s.missingLevel) continue;
    SiteCurve curve{visibleName(s.name, 60), i, {}};  // names from files: controls written out
    for (const CalibrationCurvePoint& p : s.calibrationCurve) {
      if (!std::isfinite(p.risk) || !std::isfinite(p.observed)) continue;
      curve.points.push_back(p);
      largest = std::max({largest, p.risk, p.observed});
    }
    if (curve.points.size() >= 2) {
      plot.curves.push_back(std::move(curve));
    } else {
      plot.leftOut.push_back(visibleName(s.name, 60) + ": no calibration curve" +
                             (s.noMetricsReason.empty()
                                  ? std::string(" (too few patients)")
                                  : " (" + visibleName(s.noMetricsReason, 300) + ")"));
    }
  }
  // The axes end at the first tenth above every point, so low-risk cohorts are not squeezed into
  // a corner; at least 0.1, at most 1.
  plot.axisMax = std::clamp(std::ceil(largest * 10.0 - 1e-9) / 10.0, 0.1, 1.0);
  plot.note =
      "Each site's smoothed (loess) calibration curve within its own range of predicted risk; "
      "the dash-dot diagonal is perfect calibration. A small site's curve is uncertain.";
  return plot;
}

}  // namespace calivera
