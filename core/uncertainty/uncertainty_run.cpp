#include "core/uncertainty/uncertainty_run.h"

#include <algorithm>
#include <cmath>

#include "core/metrics/threshold_table.h"
#include "core/model/linear_predictor.h"
#include "core/model/model_io.h"
#include "core/util/errors.h"
#include "core/util/sha256.h"

namespace calivera {
namespace {

// Progress of one part mapped into [from, to] of the whole request.
ProgressCallback segment(const ProgressCallback& whole, double from, double to) {
  if (!whole) return nullptr;
  return [whole, from, to](double f) { return whole(from + (to - from) * f); };
}

std::optional<double> widthOf(const Interval& ci) {
  const double w = ci.hi - ci.lo;
  return std::isfinite(w) ? std::optional(w) : std::nullopt;
}

std::vector<double> riskColumnValues(const Table& table, const std::string& column,
                                     const std::vector<std::uint32_t>& rows) {
  const Column& c = table.requireNumeric(column);
  std::vector<double> risk;
  risk.reserve(rows.size());
  for (const std::uint32_t r : rows) risk.push_back(c.numbers[r]);
  return risk;
}

std::vector<double> modelRisks(const Model& model, const Table& table,
                               const std::vector<std::uint32_t>& rows) {
  std::vector<double> risk = linearPredictor(model, table, rows);
  for (double& r : risk) r = logisticRisk(r);
  return risk;
}

}  // namespace

UncertaintySubject uncertaintySubject(const ValidationRun& run) {
  return UncertaintySubject{*run.table,
                            run.request.outcome,
                            run.model ? &*run.model : nullptr,
                            run.request.riskColumn,
                            run.modelName,
                            run.cohort.rows,
                            run.cohort.input,
                            run.request.options,
                            run.result};
}

UncertaintyResults runUncertainty(const ValidationRun& run, const UncertaintyRequest& request) {
  return runUncertainty(uncertaintySubject(run), request);
}

UncertaintyResults runUncertainty(const UncertaintySubject& subject,
                                  const UncertaintyRequest& request) {
  UncertaintyResults results;
  const ValidationInput& input = subject.input;
  const ValidationResult& apparent = subject.result;
  const bool comparing = !request.compareModelPaths.empty();
  const bool boot = request.bootstrapReplicates > 0;
  // Shares of the progress bar: the validation bootstrap, the comparison, the subgroups.
  const double parts = (boot ? 1.0 : 0.0) + (comparing ? 1.0 : 0.0) +
                       static_cast<double>(request.subgroupColumns.size()) +
                       (request.clusterColumn ? 1.0 : 0.0);
  double done = 0.0;
  const auto nextSegment = [&] {
    const double from = parts > 0 ? done / parts : 0.0;
    done += 1.0;
    return segment(request.progress, from, parts > 0 ? done / parts : 1.0);
  };

  ValidationBootstrapOptions bootstrapOptions;
  bootstrapOptions.bootstrap.replicates = request.bootstrapReplicates;
  bootstrapOptions.bootstrap.seed = request.seed;
  bootstrapOptions.bootstrap.threads = request.threads;
  if (boot) {
    bootstrapOptions.bootstrap.progress = nextSegment();
    results.bootstrap = bootstrapValidation(input, subject.options, apparent, bootstrapOptions);
  }

  // Sample size: after the bootstrap, so net-benefit CI widths at the target thresholds exist.
  std::vector<double> lp;
  if (input.linearPredictor) {
    lp = *input.linearPredictor;
  } else {
    for (double p : input.risk) {
      const double q = std::clamp(p, 1e-12, 1.0 - 1e-12);
      lp.push_back(std::log(q / (1.0 - q)));
    }
  }
  CohortPrecision precision;
  precision.oeCiWidth = widthOf(apparent.calibration.oeCi);
  precision.slopeCiWidth = widthOf(apparent.calibration.slopeCi);
  precision.cCiWidth = widthOf(apparent.discrimination.aucCi);
  for (double t : request.sampleSize.netBenefitThresholds) {
    std::optional<double> width;
    if (results.bootstrap) {
      for (const auto& p : results.bootstrap->netBenefit) {
        // Standardized NB = NB / prevalence, so its CI width is the NB width / prevalence.
        const std::optional<double> w = widthOf(p.ci);
        if (std::fabs(p.x - t) < 1e-9 && w) width = *w / apparent.cohort.prevalence;
      }
    }
    precision.netBenefitCiWidth.push_back(width);
  }
  results.sampleSize = assessSampleSize(input.outcome, input.risk, lp, apparent.discrimination.auc,
                                        request.sampleSize, precision);

  if (comparing) {
    std::vector<Model> models;
    std::vector<std::string> columns{subject.outcome.column};
    const auto addColumns = [&](const Model& m) {
      for (const auto& c : requiredColumns(m)) {
        if (std::find(columns.begin(), columns.end(), c) == columns.end()) columns.push_back(c);
      }
    };
    if (subject.model) addColumns(*subject.model);
    if (subject.riskColumn) columns.push_back(*subject.riskColumn);
    for (const auto& path : request.compareModelPaths) {
      models.push_back(readModelFile(path));
      addColumns(models.back());
      results.comparedModels.push_back(
          {path, sha256OfFile(path), models.back().name.empty() ? path : models.back().name});
    }
    const Table& table = subject.table;
    const AnalysisRows common = selectCompleteCases(table, columns);
    results.comparisonRows = common.rows.size();
    const std::vector<double> outcome = outcomeValues(table, subject.outcome, common.rows);
    std::vector<std::string> names{subject.modelName};
    std::vector<std::vector<double>> risks;
    risks.push_back(subject.model ? modelRisks(*subject.model, table, common.rows)
                                  : riskColumnValues(table, *subject.riskColumn, common.rows));
    for (std::size_t m = 0; m < models.size(); ++m) {
      names.push_back(results.comparedModels[m].name);
      risks.push_back(modelRisks(models[m], table, common.rows));
    }
    ComparisonOptions options;
    options.thresholds = subject.options.thresholds;
    options.bootstrap = bootstrapOptions.bootstrap;
    options.bootstrap.progress = nextSegment();
    results.comparison = compareModels(names, risks, outcome, options);
    ValidationOptions overlayOptions = subject.options;
    overlayOptions.progress = nullptr;
    for (const auto& risk : risks) {
      results.comparedResults.push_back(
          validate(ValidationInput{outcome, risk, std::nullopt}, overlayOptions));
    }
    if (common.rows.size() < subject.rows.size()) {
      results.comparison->warnings.push_back(
          "compared on " + std::to_string(common.rows.size()) +
          " patients complete for every model (" +
          std::to_string(subject.rows.size() - common.rows.size()) + " fewer than the validation)");
    }
  }

  for (const auto& column : request.subgroupColumns) {
    const std::vector<std::string> labels = subgroupLabels(subject.table, column, subject.rows);
    bootstrapOptions.bootstrap.progress = nextSegment();
    results.subgroups.push_back(
        validateSubgroups(column, labels, input, subject.options, bootstrapOptions));
  }
  if (request.clusterColumn) {
    const std::vector<std::string> labels =
        subgroupLabels(subject.table, *request.clusterColumn, subject.rows, kMaxSites, "site");
    const std::vector<double> thresholds = request.clusterThresholds.empty()
                                               ? defaultTableThresholds(apparent.thresholds)
                                               : request.clusterThresholds;
    ValidationOptions siteOptions = subject.options;
    siteOptions.progress = nextSegment();
    results.sites = validateSites(*request.clusterColumn, labels, input, siteOptions, thresholds);
  }
  reportProgress(request.progress, 1.0);
  return results;
}

}  // namespace calivera
