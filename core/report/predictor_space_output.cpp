#include "core/report/predictor_space_output.h"

#include <algorithm>
#include <cmath>
#include <nlohmann/json.hpp>
#include <sstream>

#include "core/metrics/json_values.h"
#include "core/present/caution.h"
#include "core/present/number_text.h"
#include "core/report/csv_text.h"

namespace calivera {

namespace {

using nlohmann::json;

std::string withUnit(const std::string& variable, const std::string& unit) {
  return unit.empty() ? variable : variable + " (" + unit + ")";
}

json numbers(const std::vector<double>& values) {
  json out = json::array();
  for (double v : values) out.push_back(jsonNumber(v));
  return out;
}

// Enough decimals to tell grid points apart on the predictor's own scale.
int valueDecimals(double lo, double hi) {
  const double span = std::abs(hi - lo);
  if (span >= 100) return 0;
  if (span >= 10) return 1;
  if (span >= 1) return 2;
  return 3;
}

}  // namespace

std::string riskCurveCsv(const RiskCurveData& curve) {
  CsvText csv({"value", "risk"});
  for (std::size_t i = 0; i < curve.x.size(); ++i) csv.num(curve.x[i]).num(curve.risk[i]).end();
  return csv.str();
}

std::string riskSurfaceCsv(const BoundaryData& surface) {
  CsvText csv({"x_value", "y_value", "risk"});
  for (std::size_t j = 0; j < surface.ys.size(); ++j) {
    for (std::size_t i = 0; i < surface.xs.size(); ++i) {
      csv.num(surface.xs[i]).num(surface.ys[j]).num(surface.risk[j * surface.xs.size() + i]).end();
    }
  }
  return csv.str();
}

std::string riskCurveJson(const RiskCurveData& curve, double threshold) {
  json j;
  j["view"] = "risk_curve";
  j["predictor"] = curve.variable;
  j["unit"] = curve.unit;
  j["held"] = curve.heldText;
  j["threshold"] = threshold;
  j["crossings"] = numbers(crossings(curve, threshold));
  j["values"] = numbers(curve.x);
  j["risk"] = numbers(curve.risk);
  j["caution"] = kCautionText;
  return j.dump(2) + "\n";
}

std::string riskSurfaceJson(const BoundaryData& surface, double threshold) {
  json j;
  j["view"] = "risk_surface";
  j["x_predictor"] = surface.xVariable;
  j["x_unit"] = surface.xUnit;
  j["y_predictor"] = surface.yVariable;
  j["y_unit"] = surface.yUnit;
  j["held"] = surface.heldText;
  j["threshold"] = threshold;
  j["x_values"] = numbers(surface.xs);
  j["y_values"] = numbers(surface.ys);
  j["risk"] = numbers(surface.risk);  // risk[j * len(x_values) + i]
  json lines = json::array();
  for (const Polyline& line : contourAt(surface, threshold)) {
    json points = json::array();
    for (const auto& [x, y] : line) points.push_back(json::array({jsonNumber(x), jsonNumber(y)}));
    lines.push_back(points);
  }
  j["boundary"] = lines;
  j["caution"] = kCautionText;
  return j.dump(2) + "\n";
}

std::string riskCurveSummary(const RiskCurveData& curve, double threshold) {
  std::ostringstream out;
  const std::string name = withUnit(curve.variable, curve.unit);
  const double lo = curve.x.empty() ? 0.0 : curve.x.front();
  const double hi = curve.x.empty() ? 0.0 : curve.x.back();
  const int decimals = valueDecimals(lo, hi);
  out << "Predicted risk against " << name << ", from " << formatNumber(lo, decimals) << " to "
      << formatNumber(hi, decimals) << " (" << curve.x.size() << " points)\n";
  out << "Other predictors held at: " << (curve.heldText.empty() ? "(none)" : curve.heldText)
      << "\n\n";
  const std::vector<double> cuts = crossings(curve, threshold);
  out << "Threshold " << formatNumber(threshold, 3) << ": ";
  if (cuts.empty()) {
    out << "the curve does not cross it in this range\n\n";
  } else {
    out << "the curve crosses it at " << curve.variable << " =";
    for (std::size_t k = 0; k < cuts.size(); ++k) {
      out << (k ? ", " : " ") << formatNumber(cuts[k], decimals + 1);
    }
    out << "\n\n";
  }
  out << "  " << curve.variable << "  risk\n";
  const std::size_t n = curve.x.size();
  for (int k = 0; k <= 10 && n > 0; ++k) {
    const std::size_t i = std::min(n - 1, static_cast<std::size_t>(k) * (n - 1) / 10);
    out << "  " << formatNumber(curve.x[i], decimals) << "  " << formatNumber(curve.risk[i], 3)
        << "\n";
  }
  out << "\n" << kCautionText << "\n";
  return out.str();
}

std::string riskSurfaceSummary(const BoundaryData& surface, double threshold) {
  std::ostringstream out;
  out << "Predicted risk over " << withUnit(surface.xVariable, surface.xUnit) << " and "
      << withUnit(surface.yVariable, surface.yUnit) << " (" << surface.xs.size() << " x "
      << surface.ys.size() << " grid)\n";
  out << "Other predictors held at: " << (surface.heldText.empty() ? "(none)" : surface.heldText)
      << "\n\n";
  const auto [lo, hi] = std::minmax_element(surface.risk.begin(), surface.risk.end());
  if (lo != surface.risk.end()) {
    out << "Predicted risk on the grid: " << formatNumber(*lo, 3) << " to " << formatNumber(*hi, 3)
        << "\n";
  }
  const std::vector<Polyline> lines = contourAt(surface, threshold);
  std::size_t points = 0;
  for (const Polyline& line : lines) points += line.size();
  out << "Threshold " << formatNumber(threshold, 3) << ": ";
  if (lines.empty()) {
    out << "no boundary on this grid (the risk stays on one side)\n";
  } else {
    out << "boundary of " << lines.size() << (lines.size() == 1 ? " line" : " lines") << ", "
        << points << " points (written by --json)\n";
  }
  out << "\n" << kCautionText << "\n";
  return out.str();
}

}  // namespace calivera
