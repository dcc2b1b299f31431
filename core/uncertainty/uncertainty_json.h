#pragma once
// JSON form of the uncertainty results, the keys the validate, update and internal commands
// write and the README documents. snake_case keys; intervals as [lo, hi] (as in
// core/report/validation_json.h); NaN and infinities as null (JSON has no NaN).

#include <nlohmann/json.hpp>

#include "core/uncertainty/model_comparison.h"
#include "core/uncertainty/model_update.h"
#include "core/uncertainty/optimism.h"
#include "core/uncertainty/sample_size.h"
#include "core/uncertainty/subgroups.h"
#include "core/uncertainty/uncertainty_run.h"
#include "core/uncertainty/validation_bootstrap.h"

namespace calivera {

nlohmann::json toJson(const BootstrapSummary& summary);
nlohmann::json toJson(const ValidationBootstrap& bootstrap);
nlohmann::json toJson(const ModelComparison& comparison);
// One entry per level: {column, level, n, events, too_small, warnings, metrics, bootstrap}.
nlohmann::json toJson(const SubgroupAnalysis& subgroups);
nlohmann::json toJson(const SampleSizeAssessment& assessment);
nlohmann::json toJson(const OptimismResult& optimism);
nlohmann::json toJson(const ClosedTestResult& closedTest);

// Adds "sample_size" and, when computed, "bootstrap", "comparison" and "subgroups" to the
// validation JSON object `out`.
void addUncertaintyJson(nlohmann::json& out, const UncertaintyResults& results);

// The per-cohort measures of a ValidationResult that a subgroup reports (not the curves' points).
nlohmann::json headlineMetricsJson(const ValidationResult& result);

}  // namespace calivera
