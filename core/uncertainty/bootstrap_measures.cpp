#include "core/uncertainty/bootstrap_measures.h"

namespace calivera {

const std::array<BootstrappedMeasure, kBootstrappedMeasureCount>& bootstrappedMeasures() {
  static const std::array<BootstrappedMeasure, kBootstrappedMeasureCount> measures = {{
      {"auc", "AUC", 4, [](const ValidationResult& r) { return r.discrimination.auc; },
       &ValidationBootstrap::auc},
      {"brier", "Brier", 4, [](const ValidationResult& r) { return r.overall.brier; },
       &ValidationBootstrap::brier},
      {"brier_scaled", "scaled Brier", 4,
       [](const ValidationResult& r) { return r.overall.brierScaled; },
       &ValidationBootstrap::brierScaled},
      {"calibration_intercept", "calibration intercept", 4,
       [](const ValidationResult& r) { return r.calibration.intercept; },
       &ValidationBootstrap::calibrationIntercept},
      {"calibration_slope", "calibration slope", 4,
       [](const ValidationResult& r) { return r.calibration.slope; },
       &ValidationBootstrap::calibrationSlope},
      {"oe_ratio", "O/E", 4, [](const ValidationResult& r) { return r.calibration.oeRatio; },
       &ValidationBootstrap::oeRatio},
      {"ici", "ICI", 4, [](const ValidationResult& r) { return r.calibration.ici; },
       &ValidationBootstrap::ici},
      {"e90", "E90", 4, [](const ValidationResult& r) { return r.calibration.e90; },
       &ValidationBootstrap::e90},
  }};
  return measures;
}

}  // namespace calivera
