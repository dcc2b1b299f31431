#include "core/uncertainty/bootstrap_measures.h"

#include "core/present/measures.h"

namespace calivera {

namespace {

// Key, label, decimals and accessors come from the one catalog of measures.
BootstrappedMeasure fromCatalog(const char* key) {
  const Measure& m = measureByKey(key);
  return {m.key, m.label, m.decimals, m.estimate, m.bootstrap};
}

}  // namespace

const std::array<BootstrappedMeasure, kBootstrappedMeasureCount>& bootstrappedMeasures() {
  static const std::array<BootstrappedMeasure, kBootstrappedMeasureCount> measures = {{
      fromCatalog("auc"),
      fromCatalog("brier"),
      fromCatalog("brier_scaled"),
      fromCatalog("calibration_intercept"),
      fromCatalog("calibration_slope"),
      fromCatalog("oe_ratio"),
      fromCatalog("ici"),
      fromCatalog("e90"),
  }};
  return measures;
}

}  // namespace calivera
