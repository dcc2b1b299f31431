#include "ui/state/analysis.h"

#include <algorithm>
#include <cmath>
#include <filesystem>

#include "core/data/cohort.h"
#include "core/model/linear_predictor.h"
#include "core/util/errors.h"
#include "core/util/sha256.h"

namespace calivera::ui {

namespace {

// Maps a sub-range of the overall progress onto a step's own 0..1 progress.
ProgressCallback subProgress(const ProgressCallback& progress, double from, double to) {
  if (!progress) return {};
  return [progress, from, to](double f) { return progress(from + (to - from) * f); };
}

void collectVariables(const Term& term, std::vector<std::string>& out) {
  if (term.kind == TransformKind::Product) {
    for (const Term& f : term.factors) collectVariables(f, out);
    return;
  }
  if (!term.variable.empty() &&
      std::find(out.begin(), out.end(), term.variable) == out.end()) {
    out.push_back(term.variable);
  }
}

std::string problemText(FitProblem problem) {
  switch (problem) {
    case FitProblem::None: return {};
    case FitProblem::CompleteSeparation:
      return "complete separation: some predictor values predict the outcome perfectly, so "
             "maximum-likelihood estimates do not exist; consider Firth's penalized fit";
    case FitProblem::QuasiSeparation:
      return "quasi-complete separation: estimates for some terms are unstable or infinite; "
             "consider Firth's penalized fit";
    case FitProblem::RankDeficient:
      return "some predictors are constant or collinear; their coefficients are not identifiable";
    case FitProblem::NotConverged: return "the fit did not converge";
  }
  return {};
}

}  // namespace

CsvOptions csvOptionsFor(const ImportSettings& settings) {
  CsvOptions options;
  options.delimiter = settings.delimiter;
  options.missingTokens = settings.missingTokens;
  return options;
}

LoadedTable loadCohortFile(const std::string& path, const ImportSettings& settings) {
  LoadedTable loaded;
  CsvReadResult read = readCsvFile(path, csvOptionsFor(settings));
  loaded.delimiter = read.delimiter;
  loaded.table = std::make_shared<const Table>(std::move(read.table));
  loaded.record.path = std::filesystem::absolute(path).string();
  loaded.record.sha256 = sha256OfFile(path);
  return loaded;
}

std::vector<std::string> modelVariables(const Model& model) {
  std::vector<std::string> out;
  for (const Term& t : model.terms) collectVariables(t, out);
  return out;
}

AnalysisOutput runAnalysis(const std::shared_ptr<const Table>& table, Model model,
                           const StudyState& study, const ProgressCallback& progress) {
  if (!table) throw InputError("no cohort is loaded");
  if (study.import.outcomeColumn.empty()) throw InputError("no outcome column is chosen");
  for (const auto& [from, to] : study.columnMapping) model.columnMapping[from] = to;
  reportProgress(progress, 0.0);

  std::vector<std::string> columns = requiredColumns(model);
  if (std::find(columns.begin(), columns.end(), study.import.outcomeColumn) == columns.end()) {
    columns.push_back(study.import.outcomeColumn);
  }
  AnalysisRows selected = selectCompleteCases(*table, columns);
  auto cohort = std::make_shared<CohortData>();
  cohort->table = table;
  cohort->rows = selected.rows;
  cohort->outcome = outcomeValues(
      *table, OutcomeSpec{study.import.outcomeColumn, study.import.eventValue}, selected.rows);
  reportProgress(progress, 0.05);
  cohort->linearPredictor = linearPredictor(model, *table, selected.rows);
  cohort->risk.resize(cohort->linearPredictor.size());
  std::transform(cohort->linearPredictor.begin(), cohort->linearPredictor.end(),
                 cohort->risk.begin(), logisticRisk);
  reportProgress(progress, 0.1);

  ValidationInput input;
  input.outcome = cohort->outcome;
  input.risk = cohort->risk;
  input.linearPredictor = cohort->linearPredictor;
  ValidationOptions options;
  options.groups = study.analysis.groups;
  options.apparent = study.analysis.apparent;
  options.progress = subProgress(progress, 0.1, 1.0);

  AnalysisOutput out;
  out.result = std::make_shared<const ValidationResult>(validate(input, options));
  out.model = std::move(model);
  out.cohort = std::move(cohort);
  out.exclusions = selected.exclusions;
  return out;
}

FittedModel fitModel(const Table& table, const ImportSettings& import, const FitSettings& fit,
                     const ProgressCallback& progress) {
  if (fit.predictors.empty()) throw InputError("choose at least one predictor to fit a model");
  Model model;
  model.name = "Fitted on " + std::filesystem::path(table.sourceName).filename().string();
  model.outcome = import.outcomeColumn;
  for (const std::string& name : fit.predictors) {
    const Column& column = table.require(name);
    if (column.kind == ColumnKind::Numeric) {
      Term term;
      term.name = name;
      term.variable = name;
      model.terms.push_back(term);
    } else {
      for (std::size_t level = 1; level < column.levels.size(); ++level) {
        Term term;
        term.name = name + "=" + column.levels[level];
        term.variable = name;
        term.kind = TransformKind::Indicator;
        term.level = column.levels[level];
        model.terms.push_back(term);
      }
    }
  }
  std::vector<std::string> columns = requiredColumns(model);
  columns.push_back(import.outcomeColumn);
  AnalysisRows selected = selectCompleteCases(table, columns);
  const std::vector<double> y =
      outcomeValues(table, OutcomeSpec{import.outcomeColumn, import.eventValue}, selected.rows);
  const Eigen::MatrixXd design = designMatrix(model, table, selected.rows);
  Eigen::MatrixXd X(design.rows(), design.cols() + 1);
  X.col(0).setOnes();
  X.rightCols(design.cols()) = design;
  const Eigen::VectorXd yv = Eigen::Map<const Eigen::VectorXd>(y.data(), Eigen::Index(y.size()));
  FitOptions options;
  options.firth = fit.firth;
  options.progress = progress;

  FittedModel out;
  out.fit = fitLogistic(X, yv, nullptr, options);
  model.intercept.coefficient = out.fit.beta(0);
  model.intercept.se = out.fit.se(0);
  for (std::size_t i = 0; i < model.terms.size(); ++i) {
    const auto k = static_cast<Eigen::Index>(i + 1);
    model.terms[i].estimate.coefficient = out.fit.beta(k);
    if (std::isfinite(out.fit.se(k))) model.terms[i].estimate.se = out.fit.se(k);
  }
  std::size_t events = 0;
  for (double v : y) events += v > 0.5 ? 1 : 0;
  model.development.n = static_cast<long long>(y.size());
  model.development.events = static_cast<long long>(events);
  model.development.method = fit.firth ? "Firth penalized likelihood" : "maximum likelihood";
  model.development.software = "calivera workstation";
  if (const std::string text = problemText(out.fit.problem); !text.empty()) {
    out.warnings.push_back(text);
  }
  if (!out.fit.converged && out.fit.problem != FitProblem::NotConverged) {
    out.warnings.push_back("the fit did not converge");
  }
  for (const std::string& w : out.fit.warnings) out.warnings.push_back(w);
  out.model = std::move(model);
  out.exclusions = selected.exclusions;
  return out;
}

}  // namespace calivera::ui
