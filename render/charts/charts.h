#pragma once
// Every chart of the workstation, built from core result structs alone (no main-window state), for
// the workstation views and the PDF report alike. Typical report use:
//
//   charts::RocChart roc(result.discrimination);
//   roc.setThreshold(ThresholdState-or-snapshotFromCounts(...));
//   charts::renderChart(roc, painter, rect);
//
// Charts on a ValidationResult: RocChart, CalibrationChart, DecisionCurveChart, DistributionChart.
// Charts of the model in predictor space: RiskCurveChart, BoundaryChart (predictor_charts.h).

#include "render/charts/calibration_chart.h"
#include "render/charts/chart_render.h"
#include "render/charts/chart_style.h"
#include "render/charts/decision_curve_chart.h"
#include "render/charts/distribution_chart.h"
#include "render/charts/roc_chart.h"
