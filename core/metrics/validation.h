#pragma once
// Everything a validation of a risk model on one cohort reports, as plain result types, and the
// one entry point that computes it. The command line, the workstation and the PDF report all show
// these numbers; nothing downstream recomputes a metric.
//
// Sources (see the .cpp file of each metric for details):
//   AUC with DeLong SE by midranks: DeLong et al., Biometrics 1988; Sun & Xu, IEEE SPL 2014.
//   Calibration intercept/slope: Cox 1958; Van Calster et al., J Clin Epidemiol 2016.
//   Spiegelhalter z: Stat Med 1986. Loess calibration curve, ICI/E50/E90/Emax: Austin &
//   Steyerberg, Stat Med 2019. Hosmer-Lemeshow: Commun Stat 1980. Net benefit: Vickers & Elkin,
//   Med Decis Making 2006. Wilson interval: JASA 1927.

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "core/util/progress.h"

namespace calivera {

struct Interval {
  double lo = 0.0;
  double hi = 0.0;
};

struct ValidationInput {
  std::vector<double> outcome;  // 0/1 per patient
  std::vector<double> risk;     // predicted risk in [0, 1]
  // Linear predictor when a model supplied it; otherwise logit(risk) is used, with risks of
  // exactly 0 or 1 clamped and reported as a warning.
  std::optional<std::vector<double>> linearPredictor;
};

struct ValidationOptions {
  int groups = 10;                    // Hosmer-Lemeshow and grouped calibration table
  std::vector<double> thresholds;     // decision curve and threshold table; empty: 0.01..0.99
  bool apparent = false;              // cohort is the development data: HL df = g - 2, else g
  int histogramBins = 50;             // risk distribution by outcome
  std::size_t loessExactMaxN = 5000;  // above this: exact fits on a quantile grid + interpolation
  int loessGridPoints = 500;
  std::size_t rocMaxPoints = 2000;  // thinning for plotting; the AUC is always exact
  ProgressCallback progress;
};

struct CohortSummary {
  std::size_t n = 0;
  std::size_t events = 0;
  double prevalence = 0.0;
  bool apparent = false;  // true: performance on the development data itself
};

struct RocPoint {
  double threshold = 0.0;  // flag risk >= threshold
  double fpr = 0.0;
  double tpr = 0.0;
};

struct Discrimination {
  double auc = 0.0;
  double aucSe = 0.0;                // DeLong
  Interval aucCi;                    // logit-transformed 95% CI (never passes 0 or 1)
  Interval aucCiPlain;               // AUC +/- 1.96 SE
  double discriminationSlope = 0.0;  // mean risk in events minus mean risk in non-events
  std::vector<RocPoint> roc;         // from (0,0) to (1,1), thinned
};

struct Overall {
  double brier = 0.0;
  double brierScaled = 0.0;  // 1 - Brier / (pi (1 - pi))
};

struct CalibrationCurvePoint {
  double risk = 0.0;
  double observed = 0.0;  // loess-smoothed observed proportion at this risk
};

struct CalibrationGroup {
  std::size_t n = 0;
  std::size_t observed = 0;  // events
  double expected = 0.0;     // sum of risks
  double meanRisk = 0.0;
  double observedProportion = 0.0;
  Interval observedCi;                // Wilson 95%
  double riskLo = 0.0, riskHi = 0.0;  // range of risks in the group
};

struct Calibration {
  double intercept = 0.0, interceptSe = 0.0;  // calibration-in-the-large, LP as offset
  Interval interceptCi;
  double slope = 0.0, slopeSe = 0.0;  // logistic regression of y on LP
  Interval slopeCi;
  double slopeModelIntercept = 0.0;  // the intercept fitted together with the slope
  double oeRatio = 0.0;
  Interval oeCi;
  double spiegelhalterZ = 0.0, spiegelhalterP = 0.0;
  double ici = 0.0, e50 = 0.0, e90 = 0.0, emax = 0.0;
  bool curveInterpolated = false;  // large n: exact local fits on a grid, interpolated between
  std::vector<CalibrationCurvePoint> curve;  // sorted by risk, thinned for plotting
  std::vector<CalibrationGroup> groups;      // by quantile groups of risk
  std::string hierarchyLevel;                // plain reading of the calibration hierarchy reached
};

struct HosmerLemeshow {
  double statistic = 0.0;
  int df = 0;
  double pValue = 0.0;
  std::vector<CalibrationGroup> groups;
};

struct DecisionCurvePoint {
  double threshold = 0.0;
  double netBenefit = 0.0;
  double netBenefitTreatAll = 0.0;
  double standardizedNetBenefit = 0.0;  // NB / prevalence
  double interventionsAvoidedPer100 = 0.0;
};

struct ThresholdRow {
  double threshold = 0.0;
  std::size_t tp = 0, fp = 0, tn = 0, fn = 0;
  double sensitivity = 0.0, specificity = 0.0, ppv = 0.0, npv = 0.0;
  Interval sensitivityCi, specificityCi, ppvCi, npvCi;  // Wilson 95%
  double flaggedPer1000 = 0.0;
  double eventsCaughtPer1000 = 0.0;
  double eventsMissedPer1000 = 0.0;
  double flaggedWithoutEventPer1000 = 0.0;
};

struct RiskHistogram {
  std::vector<double> binEdges;             // bins + 1 edges over [0, 1]
  std::vector<std::size_t> eventCounts;     // per bin
  std::vector<std::size_t> nonEventCounts;  // per bin
};

struct ValidationResult {
  CohortSummary cohort;
  Discrimination discrimination;
  Overall overall;
  Calibration calibration;
  HosmerLemeshow hosmerLemeshow;
  std::vector<DecisionCurvePoint> decisionCurve;
  std::vector<ThresholdRow> thresholds;
  RiskHistogram distribution;
  std::vector<std::string> warnings;
};

// Throws AnalysisError when only one outcome class is present or inputs are empty, and
// InputError when a risk lies outside [0, 1] or sizes differ.
ValidationResult validate(const ValidationInput& input, const ValidationOptions& options);

// FROM + k * STEP for k = 0.. while <= TO (+ tolerance), computed without accumulated rounding.
// Thresholds of one grid (decision curve, threshold table): more only costs memory and time.
inline constexpr long long kMaxThresholdCount = 10000;

// FROM, FROM + STEP, ... up to TO; InputError for a bad range or more than kMaxThresholdCount.
std::vector<double> thresholdRange(double from, double to, double step);

}  // namespace calivera
