#include "core/fit/logistic_fit.h"

#include <Eigen/Cholesky>
#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>

#include "core/fit/fit_diagnostics.h"
#include "core/fit/irls_pass.h"

namespace calivera {
namespace {

using detail::LogisticPass;
using detail::PassResult;

constexpr int kMaxHalvings = 30;
// Firth's iteration uses the expected information, not the Hessian of the penalized likelihood,
// so it converges linearly; the objective test alone could stop it early. It must also have
// made a step no larger than this (relative to the size of beta).
constexpr double kFirthStepTolerance = 1e-9;
// Fitted risks this close to 0 or 1 are reported, as R's glm does (10 * machine epsilon).
constexpr double kFittedEdge = 10 * std::numeric_limits<double>::epsilon();

// The iteration state at one beta: its pass, the Cholesky factor of X'WX and the objective the
// step-halving protects (-2 log L, or -2 log L - log det I for Firth).
struct State {
  Eigen::VectorXd beta;
  PassResult pass;
  Eigen::LLT<Eigen::MatrixXd> factor;
  Eigen::VectorXd score;
  double objective = 0.0;
  bool usable = false;
};

State evaluateAt(LogisticPass& pass, const Eigen::VectorXd& beta, bool firth) {
  State state;
  state.beta = beta;
  state.pass = pass.evaluate(beta);
  state.score = state.pass.score;
  state.objective = state.pass.deviance;
  state.usable = state.pass.finite;
  if (!state.usable || beta.size() == 0) return state;
  state.factor.compute(state.pass.information);
  const bool factored = state.factor.info() == Eigen::Success;
  if (firth) {
    // Firth (1993): maximise log L + 1/2 log det I(beta); the modified score adds
    // X'(h (1/2 - mu)) (Heinze & Schemper 2002, eq. 2).
    if (!factored) {
      state.usable = false;
      return state;
    }
    const Eigen::MatrixXd lower = state.factor.matrixL();
    state.objective -= 2.0 * lower.diagonal().array().log().sum();
    state.score += pass.firthAdjustment(lower);
  }
  state.usable = std::isfinite(state.objective);
  return state;
}

Eigen::VectorXd newtonStep(const State& state) {
  if (state.factor.info() == Eigen::Success) return state.factor.solve(state.score);
  return state.pass.information.ldlt().solve(state.score);
}

// Null deviance as R's glm defines it (see the header).
double nullDeviance(const Eigen::VectorXd& y, const Eigen::VectorXd* offset, bool intercept) {
  const Eigen::Index n = y.size();
  if (n == 0) return 0.0;
  const double events = y.sum();
  if (!offset) {
    if (!intercept) return 2.0 * static_cast<double>(n) * std::log(2.0);
    const double mean = events / static_cast<double>(n);
    if (mean <= 0.0 || mean >= 1.0) return 0.0;
    return -2.0 * (events * std::log(mean) + (static_cast<double>(n) - events) * std::log1p(-mean));
  }
  const auto devianceWith = [&](double a) {
    double sum = 0.0;
    for (Eigen::Index i = 0; i < n; ++i) sum += detail::devianceTerm(y[i], a + (*offset)[i]);
    return sum;
  };
  if (!intercept) return devianceWith(0.0);
  // One-parameter Newton-Raphson for the intercept beside the offset, with step-halving.
  double a = 0.0;
  double deviance = devianceWith(a);
  for (int iteration = 0; iteration < 100; ++iteration) {
    double gradient = 0.0, information = 0.0;
    for (Eigen::Index i = 0; i < n; ++i) {
      const double mu = detail::logistic(a + (*offset)[i]);
      gradient += y[i] - mu;
      information += mu * (1.0 - mu);
    }
    if (!(information > 0.0)) break;
    double step = gradient / information;
    double next = devianceWith(a + step);
    for (int h = 0; h < kMaxHalvings && !(next <= deviance); ++h) {
      step /= 2;
      next = devianceWith(a + step);
    }
    if (!(next <= deviance)) break;
    a += step;
    const double change = std::abs(next - deviance) / (std::abs(next) + 0.1);
    deviance = next;
    if (change < 1e-13) break;
  }
  return deviance;
}

void checkArguments(const Eigen::MatrixXd& X, const Eigen::VectorXd& y,
                    const Eigen::VectorXd* offset) {
  if (y.size() != X.rows()) throw std::invalid_argument("fitLogistic: y and X differ in rows");
  if (offset && offset->size() != X.rows()) {
    throw std::invalid_argument("fitLogistic: offset and X differ in rows");
  }
  if (((y.array() != 0.0) && (y.array() != 1.0)).any()) {
    throw std::invalid_argument("fitLogistic: y must be 0 or 1");
  }
  if (!X.allFinite() || (offset && !offset->allFinite())) {
    throw std::invalid_argument("fitLogistic: X and offset must be finite");
  }
}

}  // namespace

FitResult fitLogistic(const Eigen::MatrixXd& X, const Eigen::VectorXd& y,
                      const Eigen::VectorXd* offset, const FitOptions& options) {
  checkArguments(X, y, offset);
  const Eigen::Index n = X.rows();
  const Eigen::Index p = X.cols();
  const double nan = std::numeric_limits<double>::quiet_NaN();
  FitResult result;
  result.beta = Eigen::VectorXd::Zero(p);
  result.se = Eigen::VectorXd::Constant(p, nan);
  result.covariance = Eigen::MatrixXd::Constant(p, p, nan);
  const int intercept = detail::interceptColumn(X);
  if (n == 0) {
    result.problem = FitProblem::RankDeficient;
    result.warnings.push_back("no rows to fit");
    return result;
  }
  const double events = y.sum();
  if (events == 0.0 || events == static_cast<double>(n)) {
    result.warnings.push_back(std::string("every outcome is ") + (events == 0.0 ? "0" : "1") +
                              "; the intercept has no finite maximum-likelihood estimate");
  }

  // Start from the observed log odds in the intercept, the other coefficients at 0.
  Eigen::VectorXd start = Eigen::VectorXd::Zero(p);
  if (intercept >= 0 && !offset && events > 0 && events < static_cast<double>(n)) {
    const double mean = events / static_cast<double>(n);
    start[intercept] = std::log(mean / (1.0 - mean)) / X(0, intercept);
  }
  LogisticPass pass(X, y, offset, options.threads);
  State current = evaluateAt(pass, start, false);
  const detail::RankFinding rank = detail::checkRank(X, current.pass.information);
  if (rank.deficient) {
    result.problem = FitProblem::RankDeficient;
    result.problemColumns = rank.columns;
    result.warnings.push_back(rank.detail);
    result.deviance = current.pass.deviance;
    result.nullDeviance = nullDeviance(y, offset, intercept >= 0);
    return result;
  }
  if (options.firth) current = evaluateAt(pass, start, true);

  std::vector<Eigen::VectorXd> history{current.beta};
  for (int iteration = 1; iteration <= options.maxIterations && p > 0; ++iteration) {
    reportProgress(options.progress,
                   static_cast<double>(iteration - 1) / static_cast<double>(options.maxIterations));
    const Eigen::VectorXd step = newtonStep(current);
    if (!step.allFinite()) {
      result.warnings.push_back("the Newton step is not finite at iteration " +
                                std::to_string(iteration));
      break;
    }
    State next;
    double scale = 1.0;
    bool accepted = false;
    for (int h = 0; h <= kMaxHalvings && !accepted; ++h, scale /= 2) {
      next = evaluateAt(pass, current.beta + scale * step, options.firth);
      // Allow rounding-level increases, or the iteration would halve forever at the optimum.
      const double allowance = 1e-13 * (std::abs(current.objective) + 1.0);
      accepted = next.usable && next.objective <= current.objective + allowance;
    }
    result.iterations = iteration;
    if (!accepted) {
      // No step decreases the objective: at the optimum to machine precision if the predicted
      // decrease (the Newton decrement) is already negligible.
      const double decrement = step.dot(current.score);
      result.converged =
          decrement < options.relativeDevianceTolerance * (std::abs(current.objective) + 0.1);
      if (!result.converged) {
        result.warnings.push_back("step-halving could not reduce the deviance at iteration " +
                                  std::to_string(iteration));
      }
      break;
    }
    const double change =
        std::abs(next.objective - current.objective) / (std::abs(next.objective) + 0.1);
    const double moved = (next.beta - current.beta).cwiseAbs().maxCoeff();
    current = std::move(next);
    history.push_back(current.beta);
    const bool smallStep =
        !options.firth || moved <= kFirthStepTolerance * (1.0 + current.beta.cwiseAbs().maxCoeff());
    if (change < options.relativeDevianceTolerance && smallStep) {
      result.converged = true;
      break;
    }
  }
  if (p == 0) result.converged = true;

  result.beta = current.beta;
  result.deviance = current.pass.deviance;
  result.penalizedLogLikelihood = -0.5 * current.objective;
  result.aic = result.deviance + 2.0 * static_cast<double>(p);
  // Intercept + offset as the whole model (calibration-in-the-large) is its own null model.
  const bool isNullModel = offset && p == 1 && intercept == 0 && !options.firth && result.converged;
  result.nullDeviance = isNullModel ? result.deviance : nullDeviance(y, offset, intercept >= 0);
  // Standard errors from the information at the final estimate (the pass at current.beta).
  if (p > 0) {
    const Eigen::MatrixXd identity = Eigen::MatrixXd::Identity(p, p);
    result.covariance = current.factor.info() == Eigen::Success
                            ? Eigen::MatrixXd(current.factor.solve(identity))
                            : Eigen::MatrixXd(current.pass.information.ldlt().solve(identity));
    result.se = result.covariance.diagonal().array().sqrt();
  }
  // Recomputed: the pass's own copy may belong to a rejected step-halving candidate.
  Eigen::VectorXd eta = X * current.beta;
  if (offset) eta += *offset;
  for (Eigen::Index i = 0; i < n; ++i) {
    const double mu = detail::logistic(eta[i]);
    if (mu < kFittedEdge || mu > 1.0 - kFittedEdge) ++result.fittedZeroOrOne;
  }

  if (!options.firth && history.size() >= 2) {
    const std::size_t back = std::min<std::size_t>(3, history.size() - 1);
    const Eigen::VectorXd direction = history.back() - history[history.size() - 1 - back];
    const detail::SeparationFinding separation = detail::checkSeparation(X, y, direction, eta);
    if (separation.separated) {
      result.problem =
          separation.complete ? FitProblem::CompleteSeparation : FitProblem::QuasiSeparation;
      result.problemColumns = separation.columns;
      result.warnings.push_back(
          std::string(separation.complete ? "complete" : "quasi-complete") +
          " separation: the maximum-likelihood estimates do not exist (coefficients diverge); "
          "Firth's penalized likelihood gives finite estimates");
    }
  }
  if (result.problem == FitProblem::None && !result.converged) {
    result.problem = FitProblem::NotConverged;
    result.warnings.push_back("not converged after " + std::to_string(result.iterations) +
                              " iterations");
  }
  if (result.fittedZeroOrOne > 0) {
    result.warnings.push_back("fitted risks numerically 0 or 1 in " +
                              std::to_string(result.fittedZeroOrOne) + " rows");
  }
  reportProgress(options.progress, 1.0);
  return result;
}

}  // namespace calivera
