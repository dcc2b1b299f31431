#pragma once
// The model in the space of its predictors, as plain data (no Qt): the risk curve against one
// predictor with the others held fixed, and the risk surface over two predictors from which the
// boundary "predicted risk = threshold" is traced. Both evaluate the real model (core's
// linearPredictor) on a synthetic table, so splines, transformations and interactions are honoured
// exactly; the boundary is therefore a curve whenever the model makes it one.
//
// Held values: numeric predictors default to the median over the analysed patients, text
// predictors to the reference level (the first level, in sorted order, that no indicator term of
// the model names; else the first level).

#include <cstdint>
#include <map>
#include <string>
#include <utility>
#include <vector>

#include "core/data/table.h"
#include "core/model/model.h"
#include "core/study/study_analysis.h"

namespace calivera {

struct PredictorInfo {
  std::string variable;  // model variable
  std::string column;    // cohort column after mapping
  bool numeric = true;
  double lo = 0.0, hi = 0.0, median = 0.0;  // numeric: over the analysed rows
  std::vector<std::string> levels;          // text
  std::string defaultValue;                 // as text
  std::string unit;                         // as the model file states it, else empty
};

// One entry per model variable; empty when the model or cohort is missing.
std::vector<PredictorInfo> describePredictors(const Model& model,
                                              const std::map<std::string, std::string>& mapping,
                                              const CohortData& cohort);

struct RiskCurveData {
  std::string variable;
  std::string unit;
  std::vector<double> x, risk;  // ascending x
  std::vector<double> rug;      // cohort values (at most kMaxRug, evenly spaced quantiles)
  std::string heldText;         // "age = 64, sex = female"
};

struct BoundaryPatient {
  double x = 0.0, y = 0.0;
  bool event = false;
};

struct BoundaryData {
  std::string xVariable, yVariable;
  std::string xUnit, yUnit;
  std::vector<double> xs, ys;             // grid coordinates, ascending
  std::vector<double> risk;               // risk[j * xs.size() + i] at (xs[i], ys[j])
  std::vector<BoundaryPatient> patients;  // thinned to at most kMaxPatients
  std::size_t patientStride = 1;          // every k-th analysed patient is shown
  std::string heldText;
};

inline constexpr std::size_t kMaxRug = 2000;
inline constexpr std::size_t kMaxPatients = 3000;

// Throws InputError when a held value is not a number for a numeric predictor.
RiskCurveData riskCurve(const Model& model, const std::map<std::string, std::string>& mapping,
                        const CohortData& cohort, const std::vector<PredictorInfo>& predictors,
                        const std::string& variable, const std::map<std::string, std::string>& held,
                        int points = 200);

BoundaryData riskSurface(const Model& model, const std::map<std::string, std::string>& mapping,
                         const CohortData& cohort, const std::vector<PredictorInfo>& predictors,
                         const std::string& xVariable, const std::string& yVariable,
                         const std::map<std::string, std::string>& held, int gridPoints = 60);

using Polyline = std::vector<std::pair<double, double>>;

// Marching squares over the grid at `level`, interpolated along cell edges on the logit scale,
// segments chained into polylines.
std::vector<Polyline> contourAt(const BoundaryData& surface, double level);

// x values where the curve crosses `level` (linear interpolation between grid points).
std::vector<double> crossings(const RiskCurveData& curve, double level);

}  // namespace calivera
