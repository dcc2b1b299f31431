#include "core/imputation/chained_equations.h"

#include <Eigen/Dense>
#include <algorithm>
#include <boost/math/distributions/chi_squared.hpp>
#include <cmath>
#include <limits>
#include <numbers>
#include <random>
#include <set>
#include <utility>

#include "core/uncertainty/bootstrap.h"
#include "core/util/errors.h"

namespace calivera {
namespace {

using Variable = ChainedEquationsData::Variable;
using Values = std::vector<std::vector<double>>;  // current values, [variable][position]

// The linear regression's ridge, relative to the diagonal of X'X (mice's default).
constexpr double kLinearRidge = 1e-5;

// Draws from one copy's generator, independent of the standard library's distributions.
class Draws {
 public:
  explicit Draws(std::uint64_t seed) : generator_(seed) {}
  std::uint32_t index(std::uint32_t n) { return uniformIndex(generator_, n); }
  double uniform() {  // in [0, 1)
    return static_cast<double>(generator_() >> 11) * 0x1.0p-53;
  }
  double openUniform() {  // in (0, 1)
    return (static_cast<double>(generator_() >> 11) + 0.5) * 0x1.0p-53;
  }
  double normal() {  // Box-Muller, one deviate per pair of uniforms
    const double radius = std::sqrt(-2.0 * std::log(openUniform()));
    return radius * std::cos(2.0 * std::numbers::pi * uniform());
  }
  double chiSquared(double df) {
    return boost::math::quantile(boost::math::chi_squared(df), openUniform());
  }
  Eigen::VectorXd normals(Eigen::Index n) {
    Eigen::VectorXd z(n);
    for (Eigen::Index i = 0; i < n; ++i) z(i) = normal();
    return z;
  }

 private:
  std::mt19937_64 generator_;
};

std::size_t predictorCount(const ChainedEquationsData& data, std::size_t target) {
  std::size_t q = 2;  // intercept, outcome
  for (std::size_t v = 0; v < data.variables.size(); ++v) {
    if (v == target) continue;
    q += data.variables[v].categorical ? data.variables[v].levels - 1 : 1;
  }
  return q;
}

// The imputation model's design for the patients at `positions`: intercept, outcome, then every
// other variable (numeric ones standardised, categorical ones as indicators of levels 1..K-1).
Eigen::MatrixXd design(const ChainedEquationsData& data, const Values& current, std::size_t target,
                       const std::vector<std::uint32_t>& positions) {
  const auto n = static_cast<Eigen::Index>(positions.size());
  // Every column is written below (indicator blocks zeroed first), so no zero fill here.
  Eigen::MatrixXd x(n, static_cast<Eigen::Index>(predictorCount(data, target)));
  x.col(0).setOnes();
  for (Eigen::Index i = 0; i < n; ++i)
    x(i, 1) = data.outcome[positions[static_cast<std::size_t>(i)]];
  Eigen::Index column = 2;
  for (std::size_t v = 0; v < data.variables.size(); ++v) {
    if (v == target) continue;
    const Variable& variable = data.variables[v];
    const std::vector<double>& values = current[v];
    if (!variable.categorical) {
      for (Eigen::Index i = 0; i < n; ++i) {
        x(i, column) =
            (values[positions[static_cast<std::size_t>(i)]] - variable.centre) / variable.scale;
      }
      ++column;
      continue;
    }
    x.middleCols(column, static_cast<Eigen::Index>(variable.levels) - 1).setZero();
    for (Eigen::Index i = 0; i < n; ++i) {
      const auto level = static_cast<Eigen::Index>(values[positions[static_cast<std::size_t>(i)]]);
      if (level > 0) x(i, column + level - 1) = 1.0;
    }
    column += static_cast<Eigen::Index>(variable.levels) - 1;
  }
  return x;
}

// Predictive mean matching after a Bayesian linear regression draw (van Buuren 2018, algorithms
// 3.1 and 3.3, type-1 matching).
void imputeByMatching(const Eigen::MatrixXd& xObserved, const Eigen::MatrixXd& xMissing,
                      const Variable& variable, const ChainedEquationsOptions& options,
                      Draws& draws, std::vector<double>& values) {
  Eigen::VectorXd y(xObserved.rows());
  for (Eigen::Index i = 0; i < y.size(); ++i) {
    y(i) = variable.values[variable.observedAt[static_cast<std::size_t>(i)]];
  }
  const Eigen::Index q = xObserved.cols();
  Eigen::MatrixXd xtx = Eigen::MatrixXd::Zero(q, q);
  xtx.selfadjointView<Eigen::Lower>().rankUpdate(xObserved.transpose());
  xtx = xtx.selfadjointView<Eigen::Lower>();
  for (Eigen::Index j = 0; j < q; ++j) {
    // A predictor that is zero for every observed patient gets an absolute ridge: its
    // coefficient stays 0 instead of making X'X singular.
    xtx(j, j) += xtx(j, j) > 0.0 ? kLinearRidge * xtx(j, j) : kLinearRidge;
  }
  const Eigen::LLT<Eigen::MatrixXd> factor(xtx);
  const Eigen::VectorXd beta = factor.solve(xObserved.transpose() * y);
  const Eigen::VectorXd fitted = xObserved * beta;
  const double rss = (y - fitted).squaredNorm();
  const double df = std::max(static_cast<double>(y.size() - q), 1.0);
  const double sigma = std::sqrt(rss / draws.chiSquared(df));
  const Eigen::MatrixXd v = factor.solve(Eigen::MatrixXd::Identity(q, q));
  const Eigen::MatrixXd root = Eigen::LLT<Eigen::MatrixXd>(v).matrixL();
  const Eigen::VectorXd drawn = beta + sigma * (root * draws.normals(q));

  std::vector<std::pair<double, std::uint32_t>> sorted(static_cast<std::size_t>(fitted.size()));
  for (std::size_t i = 0; i < sorted.size(); ++i) {
    sorted[i] = {fitted(static_cast<Eigen::Index>(i)), static_cast<std::uint32_t>(i)};
  }
  std::sort(sorted.begin(), sorted.end());
  const Eigen::VectorXd predicted = xMissing * drawn;
  const std::size_t pool =
      std::min<std::size_t>(static_cast<std::size_t>(options.donors), sorted.size());
  // Where each target would enter the sorted fitted means (std::lower_bound's position), found
  // by one walk over both in increasing order instead of a binary search per target: the same
  // positions with sequential memory access.
  const std::size_t missing = variable.missingAt.size();
  std::vector<std::pair<double, std::uint32_t>> targets(missing);
  for (std::size_t m = 0; m < missing; ++m) {
    targets[m] = {predicted(static_cast<Eigen::Index>(m)), static_cast<std::uint32_t>(m)};
  }
  std::sort(targets.begin(), targets.end());
  std::vector<std::size_t> entry(missing);
  std::size_t position = 0;
  for (const auto& [target, m] : targets) {
    const std::pair<double, std::uint32_t> key{target, 0U};
    while (position < sorted.size() && sorted[position] < key) ++position;
    entry[m] = position;
  }
  std::vector<std::uint32_t> donors(pool);
  for (std::size_t m = 0; m < missing; ++m) {
    const double target = predicted(static_cast<Eigen::Index>(m));
    // The `pool` observed patients whose fitted means are closest to the target.
    std::size_t hi = entry[m];
    std::size_t lo = hi;  // candidates below are [.., lo), above [hi, ..)
    for (std::size_t k = 0; k < pool; ++k) {
      const bool takeLow = hi == sorted.size() ||
                           (lo > 0 && target - sorted[lo - 1].first <= sorted[hi].first - target);
      donors[k] = takeLow ? sorted[--lo].second : sorted[hi++].second;
    }
    const std::uint32_t donor = donors[draws.index(static_cast<std::uint32_t>(pool))];
    values[variable.missingAt[m]] = variable.values[variable.observedAt[donor]];
  }
}

// Multinomial logistic regression (two levels: logistic regression) by Newton-Raphson with
// step-halving, the non-intercept coefficients under a ridge penalty. Coefficients are stored
// by level: entry j * q + a is predictor a of level j + 1 against level 0.
struct MultinomialFit {
  Eigen::VectorXd beta;
  Eigen::MatrixXd covariance;
};

Eigen::MatrixXd levelProbabilities(const Eigen::MatrixXd& x, const Eigen::VectorXd& beta,
                                   Eigen::Index contrasts) {
  const Eigen::Index q = x.cols();
  Eigen::MatrixXd eta(x.rows(), contrasts);
  for (Eigen::Index j = 0; j < contrasts; ++j) eta.col(j) = x * beta.segment(j * q, q);
  Eigen::MatrixXd p(x.rows(), contrasts);
  for (Eigen::Index i = 0; i < x.rows(); ++i) {
    const double top = std::max(0.0, eta.row(i).maxCoeff());
    double denominator = std::exp(-top);
    for (Eigen::Index j = 0; j < contrasts; ++j) denominator += std::exp(eta(i, j) - top);
    for (Eigen::Index j = 0; j < contrasts; ++j) p(i, j) = std::exp(eta(i, j) - top) / denominator;
  }
  return p;
}

double penalizedLogLikelihood(const Eigen::MatrixXd& x, const std::vector<int>& y,
                              const Eigen::VectorXd& beta, Eigen::Index contrasts) {
  const Eigen::MatrixXd p = levelProbabilities(x, beta, contrasts);
  double sum = 0.0;
  for (Eigen::Index i = 0; i < x.rows(); ++i) {
    const int level = y[static_cast<std::size_t>(i)];
    const double reference = 1.0 - p.row(i).sum();
    sum += std::log(std::max(level == 0 ? reference : p(i, level - 1), 1e-300));
  }
  const Eigen::Index q = x.cols();
  for (Eigen::Index j = 0; j < contrasts; ++j) {
    sum -= 0.5 * kCategoricalRidge * beta.segment(j * q + 1, q - 1).squaredNorm();
  }
  return sum;
}

// Minus the Hessian of the penalized log-likelihood.
Eigen::MatrixXd information(const Eigen::MatrixXd& x, const Eigen::MatrixXd& p) {
  const Eigen::Index q = x.cols(), contrasts = p.cols();
  Eigen::MatrixXd info(q * contrasts, q * contrasts);
  for (Eigen::Index j = 0; j < contrasts; ++j) {
    for (Eigen::Index k = j; k < contrasts; ++k) {
      Eigen::VectorXd w = -p.col(j).cwiseProduct(p.col(k));
      if (j == k) w += p.col(j);
      const Eigen::MatrixXd block = x.transpose() * (w.asDiagonal() * x);
      info.block(j * q, k * q, q, q) = block;
      info.block(k * q, j * q, q, q) = block;
    }
    for (Eigen::Index a = 1; a < q; ++a) info(j * q + a, j * q + a) += kCategoricalRidge;
  }
  return info;
}

MultinomialFit fitMultinomial(const Eigen::MatrixXd& x, const std::vector<int>& y,
                              Eigen::Index contrasts) {
  const Eigen::Index q = x.cols();
  Eigen::VectorXd beta = Eigen::VectorXd::Zero(q * contrasts);
  double current = penalizedLogLikelihood(x, y, beta, contrasts);
  for (int iteration = 0; iteration < 100; ++iteration) {
    const Eigen::MatrixXd p = levelProbabilities(x, beta, contrasts);
    Eigen::VectorXd gradient(q * contrasts);
    for (Eigen::Index j = 0; j < contrasts; ++j) {
      Eigen::VectorXd residual = -p.col(j);
      for (Eigen::Index i = 0; i < x.rows(); ++i) {
        if (y[static_cast<std::size_t>(i)] == j + 1) residual(i) += 1.0;
      }
      gradient.segment(j * q, q) = x.transpose() * residual;
      gradient.segment(j * q + 1, q - 1) -= kCategoricalRidge * beta.segment(j * q + 1, q - 1);
    }
    const Eigen::VectorXd step = information(x, p).ldlt().solve(gradient);
    double scale = 1.0, next = current;
    Eigen::VectorXd candidate = beta;
    for (int halving = 0; halving < 30; ++halving, scale /= 2.0) {
      candidate = beta + scale * step;
      next = penalizedLogLikelihood(x, y, candidate, contrasts);
      if (next >= current) break;
    }
    if (!(next >= current)) break;  // no step improves: at the maximum to rounding
    beta = candidate;
    const bool converged = std::abs(next - current) < 1e-10 * (std::abs(next) + 0.1);
    current = next;
    if (converged) break;
  }
  const Eigen::MatrixXd info = information(x, levelProbabilities(x, beta, contrasts));
  return {beta, info.ldlt().solve(Eigen::MatrixXd::Identity(info.rows(), info.cols()))};
}

// Logistic or multinomial imputation with coefficients drawn from the normal approximation of
// their posterior (van Buuren 2018, algorithm 3.4).
void imputeByLevels(const Eigen::MatrixXd& xObserved, const Eigen::MatrixXd& xMissing,
                    const Variable& variable, Draws& draws, std::vector<double>& values) {
  std::vector<int> y(variable.observedAt.size());
  for (std::size_t i = 0; i < y.size(); ++i) {
    y[i] = static_cast<int>(variable.values[variable.observedAt[i]]);
  }
  const auto contrasts = static_cast<Eigen::Index>(variable.levels) - 1;
  const MultinomialFit fit = fitMultinomial(xObserved, y, contrasts);
  const Eigen::MatrixXd covariance =
      0.5 * (fit.covariance + fit.covariance.transpose());  // symmetric to rounding
  const Eigen::LLT<Eigen::MatrixXd> root(covariance);
  Eigen::VectorXd drawn = fit.beta;
  if (root.info() == Eigen::Success) drawn += root.matrixL() * draws.normals(fit.beta.size());
  const Eigen::MatrixXd p = levelProbabilities(xMissing, drawn, contrasts);
  for (std::size_t m = 0; m < variable.missingAt.size(); ++m) {
    const double u = draws.uniform();
    double cumulative = 1.0 - p.row(static_cast<Eigen::Index>(m)).sum();  // level 0
    int level = 0;
    while (u >= cumulative && level < contrasts) {
      ++level;
      cumulative += p(static_cast<Eigen::Index>(m), level - 1);
    }
    values[variable.missingAt[m]] = static_cast<double>(level);
  }
}

}  // namespace

const char* imputationMethodKey(ImputationMethod method) {
  switch (method) {
    case ImputationMethod::PredictiveMeanMatching:
      return "predictive_mean_matching";
    case ImputationMethod::Logistic:
      return "logistic";
    case ImputationMethod::Multinomial:
      return "multinomial";
  }
  return "";
}

ChainedEquationsData prepareChainedEquations(const Table& table,
                                             const std::vector<std::string>& columns,
                                             const OutcomeSpec& outcome) {
  ChainedEquationsData data;
  const Column& outcomeColumn = table.require(outcome.column);
  for (std::size_t r = 0; r < table.rowCount; ++r) {
    if (!outcomeColumn.isMissing(r)) data.rows.push_back(static_cast<std::uint32_t>(r));
  }
  data.outcome = outcomeValues(table, outcome, data.rows);
  const std::string where = table.sourceName + ": column '";
  std::set<std::string> seen{outcome.column};
  for (const std::string& name : columns) {
    if (!seen.insert(name).second) continue;
    const Column& column = table.require(name);
    Variable variable;
    variable.name = name;
    variable.tableColumn = static_cast<std::size_t>(&column - table.columns.data());
    variable.categorical = column.kind == ColumnKind::Text;
    variable.values.resize(data.rows.size());
    // Categories are renumbered 0..K-1 over the levels observed among these patients.
    std::vector<int> classOf(column.levels.size(), -1);
    if (variable.categorical) {
      for (const std::uint32_t row : data.rows) {
        if (column.codes[row] >= 0) classOf[static_cast<std::size_t>(column.codes[row])] = 0;
      }
      for (std::size_t code = 0; code < classOf.size(); ++code) {
        if (classOf[code] != 0) continue;
        classOf[code] = static_cast<int>(variable.levels++);
        variable.levelCodes.push_back(static_cast<std::int32_t>(code));
      }
    }
    for (std::size_t i = 0; i < data.rows.size(); ++i) {
      const std::uint32_t row = data.rows[i];
      const bool missing = column.isMissing(row);
      (missing ? variable.missingAt : variable.observedAt).push_back(static_cast<std::uint32_t>(i));
      if (missing) {
        variable.values[i] = std::numeric_limits<double>::quiet_NaN();
      } else if (variable.categorical) {
        variable.values[i] = classOf[static_cast<std::size_t>(column.codes[row])];
      } else {
        variable.values[i] = column.numbers[row];
      }
    }
    if (variable.observedAt.empty()) {
      throw InputError(where + name +
                       "' has no value for any patient with a known outcome, so it cannot be "
                       "imputed");
    }
    if (variable.categorical) {
      if (!variable.missingAt.empty() && variable.levels < 2) {
        throw InputError(where + name +
                         "' holds a single level among the patients with a known outcome: an "
                         "imputation model needs two");
      }
      if (!variable.missingAt.empty() && variable.levels > kMaxImputedLevels) {
        throw InputError(where + name + "' has " + std::to_string(variable.levels) +
                         " levels; at most " + std::to_string(kMaxImputedLevels) +
                         " can be imputed");
      }
      variable.method =
          variable.levels == 2 ? ImputationMethod::Logistic : ImputationMethod::Multinomial;
    } else {
      double sum = 0.0, squares = 0.0;
      for (const std::uint32_t i : variable.observedAt) sum += variable.values[i];
      variable.centre = sum / static_cast<double>(variable.observedAt.size());
      for (const std::uint32_t i : variable.observedAt) {
        squares += (variable.values[i] - variable.centre) * (variable.values[i] - variable.centre);
      }
      const double sd = std::sqrt(squares / static_cast<double>(variable.observedAt.size()));
      variable.scale = sd > 0.0 && std::isfinite(sd) ? sd : 1.0;
    }
    if (!variable.missingAt.empty()) data.incomplete.push_back(data.variables.size());
    data.variables.push_back(std::move(variable));
  }
  if (data.incomplete.empty()) {
    throw InputError(table.sourceName +
                     ": no column the model reads is missing for a patient with a known outcome, "
                     "so there is nothing to impute: the complete-case results are the results");
  }
  for (const std::size_t target : data.incomplete) {
    if (predictorCount(data, target) > kMaxImputationPredictors) {
      throw InputError(where + data.variables[target].name + "' would be imputed from " +
                       std::to_string(predictorCount(data, target)) +
                       " predictors (categories count one per level); at most " +
                       std::to_string(kMaxImputationPredictors) + " are supported");
    }
  }
  return data;
}

Table imputedCopy(const Table& table, const ChainedEquationsData& data,
                  const ChainedEquationsOptions& options, std::size_t copy) {
  Draws draws(replicateSeed(options.seed, copy));
  Values current;
  current.reserve(data.variables.size());
  for (const Variable& variable : data.variables) current.push_back(variable.values);
  // Start from values drawn at random from each column's observed values.
  for (const std::size_t v : data.incomplete) {
    const Variable& variable = data.variables[v];
    const auto observed = static_cast<std::uint32_t>(variable.observedAt.size());
    for (const std::uint32_t m : variable.missingAt) {
      current[v][m] = variable.values[variable.observedAt[draws.index(observed)]];
    }
  }
  for (int iteration = 0; iteration < options.iterations; ++iteration) {
    for (const std::size_t v : data.incomplete) {
      const Variable& variable = data.variables[v];
      const Eigen::MatrixXd xObserved = design(data, current, v, variable.observedAt);
      const Eigen::MatrixXd xMissing = design(data, current, v, variable.missingAt);
      if (variable.categorical) {
        imputeByLevels(xObserved, xMissing, variable, draws, current[v]);
      } else {
        imputeByMatching(xObserved, xMissing, variable, options, draws, current[v]);
      }
    }
  }
  Table completed = table;
  for (const std::size_t v : data.incomplete) {
    const Variable& variable = data.variables[v];
    Column& column = completed.columns[variable.tableColumn];
    for (const std::uint32_t m : variable.missingAt) {
      const std::uint32_t row = data.rows[m];
      if (variable.categorical) {
        column.codes[row] = variable.levelCodes[static_cast<std::size_t>(current[v][m])];
      } else {
        column.numbers[row] = current[v][m];
      }
    }
    column.missingCount -= variable.missingAt.size();
  }
  return completed;
}

}  // namespace calivera
