#include "core/fit/cohort_fit.h"

#include <algorithm>
#include <charconv>

#include "core/fit/spline_knots.h"
#include "core/model/analysed_fingerprint.h"
#include "core/model/linear_predictor.h"
#include "core/util/errors.h"
#include "core/util/number_format.h"
#include "core/util/stage_times.h"

namespace calivera {
namespace {

void checkPredictors(const Table& table, const CohortFitSpec& spec) {
  if (spec.predictors.empty()) throw InputError("no predictors given");
  std::set<std::string> seen;
  for (const std::string& name : spec.predictors) {
    table.require(name);
    if (name == spec.outcome.column) {
      throw InputError(table.sourceName + ": column '" + name +
                       "' is the outcome and cannot also be a predictor");
    }
    if (!seen.insert(name).second) {
      throw InputError("predictor '" + name + "' is listed more than once");
    }
  }
  for (const auto& [column, level] : spec.referenceLevels) {
    if (!seen.count(column)) {
      throw InputError("a reference level is given for '" + column +
                       "', which is not among the predictors");
    }
    const bool categorical =
        table.require(column).kind == ColumnKind::Text || spec.categorical.count(column);
    if (!categorical) {
      throw InputError("a reference level is given for '" + column +
                       "', which is numeric; declare it categorical to code it by level");
    }
  }
  for (const std::string& column : spec.categorical) {
    if (!seen.count(column)) {
      throw InputError("'" + column + "' is declared categorical but is not among the predictors");
    }
  }
  for (const auto& [column, knots] : spec.splineKnots) {
    if (!seen.count(column)) {
      throw InputError("a spline is asked for '" + column + "', which is not among the predictors");
    }
    if (table.require(column).kind != ColumnKind::Numeric || spec.categorical.count(column)) {
      throw InputError("a spline is asked for '" + column +
                       "', which is categorical; a spline needs a numeric predictor");
    }
    if (knots < kMinSplineKnots || knots > kMaxSplineKnots) {
      throw InputError("spline for '" + column + "': give 3 to 7 knots, not " +
                       std::to_string(knots));
    }
  }
}

// Levels of a categorical predictor present in the analysed rows, in their natural order.
std::vector<std::string> presentLevels(const Column& column,
                                       const std::vector<std::uint32_t>& rows) {
  std::vector<std::string> levels;
  if (column.kind == ColumnKind::Text) {
    std::vector<bool> present(column.levels.size(), false);
    for (const std::uint32_t row : rows)
      present[static_cast<std::size_t>(column.codes[row])] = true;
    for (std::size_t i = 0; i < present.size(); ++i) {
      if (present[i]) levels.push_back(column.levels[i]);
    }
    return levels;
  }
  std::set<double> values;
  for (const std::uint32_t row : rows) values.insert(column.numbers[row]);
  for (const double value : values) levels.push_back(formatShortest(value));
  return levels;
}

bool sameLevel(const Column& column, const std::string& a, const std::string& b) {
  if (column.kind == ColumnKind::Text) return a == b;
  double x = 0, y = 0;
  const auto [pa, ea] = std::from_chars(a.data(), a.data() + a.size(), x);
  const auto [pb, eb] = std::from_chars(b.data(), b.data() + b.size(), y);
  return ea == std::errc() && eb == std::errc() && pa == a.data() + a.size() &&
         pb == b.data() + b.size() && x == y;
}

CategoricalCoding codeCategorical(const Table& table, const Column& column,
                                  const std::vector<std::uint32_t>& rows,
                                  const CohortFitSpec& spec) {
  const std::vector<std::string> levels = presentLevels(column, rows);
  std::string list;
  for (const std::string& level : levels) list += (list.empty() ? "'" : ", '") + level + "'";
  if (levels.size() < 2) {
    throw AnalysisError(table.sourceName + ": predictor '" + column.name + "' has the single " +
                        "level " + list + " in the " + std::to_string(rows.size()) +
                        " analysed rows, so its effect cannot be estimated");
  }
  CategoricalCoding coding;
  coding.column = column.name;
  coding.reference = levels.front();
  if (const auto given = spec.referenceLevels.find(column.name);
      given != spec.referenceLevels.end()) {
    const auto match = std::find_if(levels.begin(), levels.end(), [&](const std::string& level) {
      return sameLevel(column, level, given->second);
    });
    if (match == levels.end()) {
      throw InputError(table.sourceName + ": reference level '" + given->second +
                       "' does not occur in column '" + column.name + "' among the analysed " +
                       "rows (levels: " + list + ")");
    }
    coding.reference = *match;
  }
  for (const std::string& level : levels) {
    if (level != coding.reference) coding.levels.push_back(level);
  }
  return coding;
}

// "the intercept" or "term 'race=black' (column 'race')".
std::string describeColumn(const Model& model, int column) {
  if (column == 0) return "the intercept";
  const Term& term = model.terms[static_cast<std::size_t>(column - 1)];
  return term.name == term.variable ? "'" + term.name + "'"
                                    : "'" + term.name + "' (column '" + term.variable + "')";
}

std::string describeColumns(const Model& model, const std::vector<int>& columns) {
  std::string text;
  for (const int column : columns)
    text += (text.empty() ? "" : ", ") + describeColumn(model, column);
  return text;
}

// X is [1 design]: column j >= 1 is the j-th term.
void rejectConstantTerms(const Table& table, const Model& model, const Eigen::MatrixXd& X) {
  for (Eigen::Index j = 1; j < X.cols(); ++j) {
    if (X.rows() > 0 && (X.col(j).array() == X(0, j)).all()) {
      throw AnalysisError(
          table.sourceName + ": predictor " + describeColumn(model, static_cast<int>(j)) + " is " +
          formatShortest(X(0, j)) + " in every one of the " + std::to_string(X.rows()) +
          " analysed rows, so its effect cannot be estimated");
    }
  }
}

void throwForProblem(const Table& table, const Model& model, const FitResult& fit) {
  const std::string where = table.sourceName + ": ";
  switch (fit.problem) {
    case FitProblem::None:
      return;
    case FitProblem::RankDeficient:
      throw AnalysisError(where + "the predictors " + describeColumns(model, fit.problemColumns) +
                          " are collinear (one is a linear combination of the others) in the "
                          "analysed rows; drop one of them");
    case FitProblem::CompleteSeparation:
    case FitProblem::QuasiSeparation: {
      std::vector<int> named;
      for (const int column : fit.problemColumns) {
        if (column != 0) named.push_back(column);
      }
      const std::string kind =
          fit.problem == FitProblem::CompleteSeparation ? "complete" : "quasi-complete";
      const std::string by = named.empty() ? "the outcome takes a single value"
                                           : "separation by " + describeColumns(model, named);
      throw AnalysisError(where + kind + " separation (" + by +
                          "): the outcome is perfectly predicted in part of the data, so the "
                          "maximum-likelihood estimates do not exist; Firth's penalized "
                          "likelihood (--firth) gives finite estimates");
    }
    case FitProblem::NotConverged:
      throw AnalysisError(where + "the fit did not converge in " + std::to_string(fit.iterations) +
                          " iterations");
  }
}

}  // namespace

namespace {

// `releasable`, when given, is `table` itself, owned by the caller and not needed afterwards.
CohortFit fitFromTable(const Table& table, Table* releasable, const CohortFitSpec& spec) {
  checkPredictors(table, spec);
  std::vector<std::string> used{spec.outcome.column};
  used.insert(used.end(), spec.predictors.begin(), spec.predictors.end());
  AnalysisRows selection = selectCompleteCases(table, used);
  CohortFit result;
  result.exclusions = selection.exclusions;
  const std::vector<std::uint32_t>& rows = selection.rows;
  const std::vector<double> outcome = outcomeValues(table, spec.outcome, rows);
  if (rows.empty()) {
    throw AnalysisError(table.sourceName + ": no row is complete over the outcome and the " +
                        "predictors, so there is nothing to fit");
  }

  Model& model = result.model;
  for (const std::string& name : spec.predictors) {
    const Column& column = table.require(name);
    if (const auto spline = spec.splineKnots.find(name); spline != spec.splineKnots.end()) {
      std::vector<double> values;
      values.reserve(rows.size());
      for (const std::uint32_t row : rows) values.push_back(column.numbers[row]);
      const std::vector<double> knots = defaultSplineKnots(std::move(values), spline->second, name);
      for (int basis = 0; basis + 2 <= spline->second; ++basis) {
        Term term;
        term.name = name + " spline " + std::to_string(basis);
        term.variable = name;
        term.kind = TransformKind::Spline;
        term.knots = knots;
        term.basisIndex = basis;
        term.splineScaled = true;
        model.terms.push_back(term);
      }
      continue;
    }
    if (column.kind == ColumnKind::Numeric && !spec.categorical.count(name)) {
      Term term;
      term.name = name;
      term.variable = name;
      term.kind = TransformKind::Linear;
      model.terms.push_back(term);
      continue;
    }
    CategoricalCoding coding = codeCategorical(table, column, rows, spec);
    for (const std::string& level : coding.levels) {
      Term term;
      term.name = name + "=" + level;
      term.variable = name;
      term.kind = TransformKind::Indicator;
      term.level = level;
      model.terms.push_back(term);
    }
    // Recorded in the model file, so a level the model does not know is refused when it is
    // validated elsewhere instead of being scored as the reference (category_levels.h).
    model.referenceLevels[name] = {coding.reference};
    result.codings.push_back(std::move(coding));
  }

  // The fingerprint reads the values, so it comes before they may be released.
  model.development.analysedSha256 = analysedDataFingerprint(model, table, rows, outcome);
  markStage("  analysed-data fingerprint");
  const Eigen::MatrixXd X = releasable != nullptr
                                ? designMatrixWithInterceptReleasing(model, *releasable, rows)
                                : designMatrixWithIntercept(model, table, rows);
  rejectConstantTerms(table, model, X);
  markStage("  design matrix");
  const Eigen::VectorXd y =
      Eigen::Map<const Eigen::VectorXd>(outcome.data(), static_cast<Eigen::Index>(outcome.size()));
  result.events = static_cast<std::size_t>(y.sum());
  result.fit = fitLogistic(X, y, nullptr, spec.fit);
  markStage("  maximum likelihood");
  throwForProblem(table, model, result.fit);
  if (spec.profileIntervals && !spec.fit.firth) {
    result.profile = profileLikelihoodIntervals(X, y, result.fit, spec.fit);
  }

  model.name =
      spec.modelName.empty() ? "logistic model for " + spec.outcome.column : spec.modelName;
  model.outcome = spec.outcome.eventValue ? spec.outcome.column + " = " + *spec.outcome.eventValue
                                          : spec.outcome.column;
  model.intercept = {result.fit.beta[0], result.fit.se[0]};
  for (std::size_t j = 0; j < model.terms.size(); ++j) {
    const auto k = static_cast<Eigen::Index>(j) + 1;
    model.terms[j].estimate = {result.fit.beta[k], result.fit.se[k]};
  }
  model.development.n = static_cast<long long>(rows.size());
  model.development.events = static_cast<long long>(result.events);
  model.development.software = std::string("calivera ") + CALIVERA_VERSION;
  model.development.method = spec.fit.firth
                                 ? "Firth penalized likelihood (Newton-Raphson)"
                                 : "maximum likelihood (Newton-Raphson with step-halving)";
  return result;
}

}  // namespace

CohortFit fitCohortModel(const Table& table, const CohortFitSpec& spec) {
  return fitFromTable(table, nullptr, spec);
}

CohortFit fitCohortModel(Table&& table, const CohortFitSpec& spec) {
  return fitFromTable(table, &table, spec);
}

}  // namespace calivera
