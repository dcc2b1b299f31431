#pragma once
// What the plot of every site's calibration curve on one set of axes shows (core/sites), as plain
// data for the report and the workstation to draw (render/charts/site_curves_plot.h). Each site's
// curve is its smoothed calibration curve read at risks 0.01, 0.02, ..., 0.99 inside the site's
// range (SiteMeasures::calibrationCurve): the same points whether the site's patients were
// validated here (validate --cluster) or the site sent a summary (calivera pool), so both routes
// draw the same picture.

#include <cstddef>
#include <string>
#include <vector>

#include "core/metrics/validation.h"
#include "core/sites/site_pooling.h"

namespace calivera {

struct SiteCurve {
  std::string label;                          // the site's name, as in the tables
  std::size_t siteIndex = 0;                  // into SiteAnalysis::sites
  std::vector<CalibrationCurvePoint> points;  // finite points only, by risk
};

struct SiteCurvesPlot {
  std::string title;
  std::vector<SiteCurve> curves;
  double axisMax = 1.0;              // both axes run from 0 to this (a multiple of 0.1)
  std::vector<std::string> leftOut;  // "QLD: no calibration curve (one outcome class)"
  std::string note;
};

SiteCurvesPlot siteCurvesPlot(const SiteAnalysis& analysis);

}  // namespace calivera
