#pragma once
// The `clusters` object of the results JSON (validate --cluster): per-site measures with their
// standard errors, each measure's random-effects pool (estimates and intervals back-transformed
// to the measure's natural scale; tau^2 on the pooling scale named by `scale`), the fixed-effect
// pool beside it, the sites left out with their reasons, and net benefit pooled two ways.

#include <nlohmann/json.hpp>

#include "core/sites/site_pooling.h"

namespace calivera {

nlohmann::json siteAnalysisJson(const SiteAnalysis& analysis);
// One site's entry of `clusters.sites` (also the measures of a site summary file).
nlohmann::json siteMeasuresJson(const SiteMeasures& site);
// A site's calibration curve on the grid (SiteMeasures::calibrationCurve): [[risk, observed], ...]
// (in `clusters.sites[].calibration_curve` and in a site summary file).
nlohmann::json calibrationCurveJson(const std::vector<CalibrationCurvePoint>& points);

}  // namespace calivera
