#pragma once
// The predictor-space views (core/study/predictor_space.h) as files and text, for
// `calivera predictor-space`: the risk curve against one predictor, or the risk surface over two
// with the boundary where predicted risk equals the threshold. These are the numbers the
// workstation's Predictor space tab draws, from the same core functions.
//
// Aggregates only: the model evaluated on a synthetic grid, held values (cohort medians or the
// reference level) and crossings. The rug of cohort values and the patients shown on the boundary
// chart are never written.

#include <string>

#include "core/study/predictor_space.h"

namespace calivera {

// CSV: one row per curve point, columns `value`, `risk`.
std::string riskCurveCsv(const RiskCurveData& curve);
// CSV: one row per grid point, columns `x_value`, `y_value`, `risk`.
std::string riskSurfaceCsv(const BoundaryData& surface);

// JSON with the predictor, unit, held values, threshold, crossings and every point (the curve),
// or the grid and the boundary polylines at the threshold (the surface); with the caution.
std::string riskCurveJson(const RiskCurveData& curve, double threshold);
std::string riskSurfaceJson(const BoundaryData& surface, double threshold);

// The text summary: what was held, where the threshold is crossed (or where the boundary runs),
// and an eleven-row excerpt of the curve; ends with the caution.
std::string riskCurveSummary(const RiskCurveData& curve, double threshold);
std::string riskSurfaceSummary(const BoundaryData& surface, double threshold);

}  // namespace calivera
