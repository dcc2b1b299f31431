#pragma once
// The catalog of the scalar measures of a validation: one row per measure with its key (JSON,
// summary.csv), its printed label, its unit, its decimals in every human-readable medium, where
// its estimate, analytic interval, standard error and bootstrap interval are, its target and a
// one-line meaning. summary.csv, the text summary, the workstation's summary and the PDF's
// performance table take labels, decimals and values from here, so a measure reads the same in
// every output (methods and sources: docs/methods.md).
//
// Formatting policy (core/present/number_text.h): estimates and intervals with the measure's
// decimals, p-values with one floor ("< 0.001"), undefined values as "not defined".

#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

#include "core/metrics/validation.h"
#include "core/uncertainty/validation_bootstrap.h"

namespace calivera {

enum class MeasureFormat {
  Fixed,   // `decimals` decimals
  PValue,  // formatPValue
  Whole,   // a whole number (degrees of freedom)
};

struct Measure {
  const char* key;    // summary.csv `statistic`, e.g. "calibration_slope"
  const char* label;  // as printed, e.g. "Calibration slope"
  const char* unit;   // "" when dimensionless
  MeasureFormat format = MeasureFormat::Fixed;
  int decimals = 3;
  double (*estimate)(const ValidationResult&) = nullptr;
  Interval (*interval)(const ValidationResult&) = nullptr;      // analytic 95% CI; nullptr: none
  double (*se)(const ValidationResult&) = nullptr;              // nullptr: none
  BootstrapEstimate ValidationBootstrap::*bootstrap = nullptr;  // nullptr: not bootstrapped
  const char* target = "";  // the value of a perfect model, "" when there is none
  const char* meaning = "";
  const char* source = "";  // the published definition (docs/methods.md has the full references)
};

// In summary.csv's order.
const std::vector<Measure>& measureCatalog();
// The catalog's entry for `key`; asserts that it exists (a programmer's error otherwise).
const Measure& measureByKey(std::string_view key);

// The catalog entry of a measure pooled over imputed copies (the keys of kImputedMeasureKeys,
// core/imputation/imputed_validation.h, where the catalog's "auc" is "c_statistic").
const Measure& measureOfPooledKey(std::string_view pooledKey);

// The estimate as printed ("0.712", "< 0.001", "8"); "not defined" for NaN.
std::string measureText(const Measure& m, const ValidationResult& r);
// The estimate with its analytic interval when it has one: "0.712 (95% CI 0.631 to 0.785)".
std::string measureWithCiText(const Measure& m, const ValidationResult& r);
// The bootstrap percentile interval: "0.702 to 0.801"; empty when the measure is not bootstrapped.
std::string measureBootstrapText(const Measure& m, const ValidationBootstrap& b);

}  // namespace calivera
