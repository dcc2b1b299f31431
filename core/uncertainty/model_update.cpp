#include "core/uncertainty/model_update.h"

#include <boost/math/distributions/chi_squared.hpp>
#include <cmath>
#include <sstream>

#include "core/model/linear_predictor.h"
#include "core/util/errors.h"

namespace calivera {
namespace {

// -2 log L of risks expit(lp); log1p/exp forms stay finite for large |lp|.
double devianceOf(const std::vector<double>& lp, const std::vector<double>& y) {
  double sum = 0.0;
  for (std::size_t i = 0; i < lp.size(); ++i) {
    // log(1 + exp(-s)) with s = lp for events, -lp for non-events.
    const double s = y[i] > 0.5 ? lp[i] : -lp[i];
    sum += s > 0 ? std::log1p(std::exp(-s)) : -s + std::log1p(std::exp(s));
  }
  return 2.0 * sum;
}

double chiSquareP(double statistic, int df) {
  if (df <= 0) return 1.0;
  const boost::math::chi_squared distribution(df);
  return boost::math::cdf(boost::math::complement(distribution, std::max(statistic, 0.0)));
}

void noteFitProblems(const FitResult& fit, const std::string& what,
                     std::vector<std::string>& warnings) {
  for (const auto& w : fit.warnings) warnings.push_back(what + ": " + w);
  if (!fit.converged) warnings.push_back(what + ": the fit did not converge");
  if (fit.problem == FitProblem::CompleteSeparation || fit.problem == FitProblem::QuasiSeparation) {
    warnings.push_back(what + ": separation in the local data (consider --firth for the refit)");
  }
  if (fit.problem == FitProblem::RankDeficient) {
    warnings.push_back(what + ": constant or collinear columns in the local data");
  }
}

Eigen::VectorXd toEigen(const std::vector<double>& v) {
  return Eigen::Map<const Eigen::VectorXd>(v.data(), static_cast<Eigen::Index>(v.size()));
}

std::string formatFull(double value) {
  std::ostringstream out;
  out.precision(17);
  out << value;
  return out.str();
}

void checkData(const UpdateData& data) {
  if (data.table == nullptr || data.rows.size() != data.outcome.size()) {
    throw InputError("update: the rows and outcomes do not match");
  }
  std::size_t events = 0;
  for (double y : data.outcome) events += y > 0.5 ? 1 : 0;
  if (events == 0 || events == data.outcome.size()) {
    throw AnalysisError("updating needs both events and non-events in " + data.dataName);
  }
}

}  // namespace

const char* updateMethodName(UpdateMethod method) {
  switch (method) {
    case UpdateMethod::None:
      return "none";
    case UpdateMethod::Intercept:
      return "intercept";
    case UpdateMethod::Recalibrate:
      return "recalibrate";
    case UpdateMethod::Refit:
      return "refit";
  }
  return "none";
}

std::optional<UpdateMethod> parseUpdateMethod(const std::string& text) {
  for (UpdateMethod m : {UpdateMethod::Intercept, UpdateMethod::Recalibrate, UpdateMethod::Refit}) {
    if (text == updateMethodName(m)) return m;
  }
  return std::nullopt;
}

UpdatedModel updateModel(const Model& model, const UpdateData& data, UpdateMethod method,
                         const UpdateOptions& options) {
  checkData(data);
  const std::vector<double> lp = linearPredictor(model, *data.table, data.rows);
  const Eigen::VectorXd y = toEigen(data.outcome);
  const auto n = static_cast<Eigen::Index>(lp.size());
  FitOptions fitOptions = options.fit;
  fitOptions.firth = false;

  UpdatedModel result;
  result.method = method;
  result.model = model;
  std::ostringstream how;
  switch (method) {
    case UpdateMethod::None:
      result.deviance = devianceOf(lp, data.outcome);
      how << "no update";
      break;
    case UpdateMethod::Intercept: {
      const Eigen::MatrixXd ones = Eigen::MatrixXd::Ones(n, 1);
      const Eigen::VectorXd offset = toEigen(lp);
      const FitResult fit = fitLogistic(ones, y, &offset, fitOptions);
      noteFitProblems(fit, "intercept update", result.warnings);
      result.recalibrationIntercept = fit.beta[0];
      result.model.intercept.coefficient += fit.beta[0];
      result.model.intercept.se.reset();
      result.estimatedParameters = 1;
      how << "intercept update (recalibration in the large): intercept + "
          << formatFull(fit.beta[0]);
      break;
    }
    case UpdateMethod::Recalibrate: {
      Eigen::MatrixXd X(n, 2);
      X.col(0).setOnes();
      X.col(1) = toEigen(lp);
      const FitResult fit = fitLogistic(X, y, nullptr, fitOptions);
      noteFitProblems(fit, "logistic recalibration", result.warnings);
      const double a = fit.beta[0], b = fit.beta[1];
      result.recalibrationIntercept = a;
      result.recalibrationSlope = b;
      result.model.intercept.coefficient = a + b * model.intercept.coefficient;
      result.model.intercept.se.reset();
      for (Term& term : result.model.terms) {
        term.estimate.coefficient *= b;
        term.estimate.se.reset();
      }
      result.estimatedParameters = 2;
      how << "logistic recalibration a + b*LP with a = " << formatFull(a)
          << ", b = " << formatFull(b)
          << " (new intercept a + b*intercept, every coefficient times b)";
      break;
    }
    case UpdateMethod::Refit: {
      const Eigen::MatrixXd X = designMatrixWithIntercept(model, *data.table, data.rows);
      fitOptions.firth = options.firth;
      const FitResult fit = fitLogistic(X, y, nullptr, fitOptions);
      noteFitProblems(fit, "refit", result.warnings);
      result.model.intercept = {fit.beta[0],
                                fit.se.size() > 0 ? std::optional(fit.se[0]) : std::nullopt};
      for (std::size_t t = 0; t < result.model.terms.size(); ++t) {
        const auto c = static_cast<Eigen::Index>(t + 1);
        result.model.terms[t].estimate = {
            fit.beta[c], fit.se.size() > c ? std::optional(fit.se[c]) : std::nullopt};
      }
      result.estimatedParameters = static_cast<int>(X.cols());
      result.model.development = DevelopmentRecord{};
      result.model.development.n = static_cast<long long>(lp.size());
      long long events = 0;
      for (double v : data.outcome) events += v > 0.5 ? 1 : 0;
      result.model.development.events = events;
      result.model.development.dataSha256 = data.dataSha256;
      // Same terms on the same rows: the refitted model's development values are these.
      if (!data.analysedSha256.empty()) {
        result.model.development.analysedSha256 = data.analysedSha256;
      }
      result.model.development.software = std::string("calivera ") + CALIVERA_VERSION;
      result.model.development.method =
          options.firth ? "Firth penalized likelihood" : "maximum likelihood";
      how << "full refit (model revision) of every coefficient, same terms"
          << (options.firth ? ", Firth penalized likelihood" : "");
      break;
    }
  }
  if (method != UpdateMethod::None) {
    result.deviance =
        devianceOf(linearPredictor(result.model, *data.table, data.rows), data.outcome);
  }
  std::ostringstream provenance;
  provenance << "updated from model '" << model.name << "' by " << how.str() << " on data "
             << data.dataName << " (sha256 " << data.dataSha256 << ", n = " << lp.size()
             << ") with calivera " << CALIVERA_VERSION;
  if (model.provenance) provenance << "; earlier: " << *model.provenance;
  result.model.provenance = provenance.str();
  if (!result.model.name.empty()) {
    result.model.name += std::string(" (") + updateMethodName(method) + " update)";
  }
  return result;
}

ClosedTestResult closedTest(const Model& model, const UpdateData& data, double alpha,
                            const UpdateOptions& options) {
  checkData(data);
  ClosedTestResult result;
  result.alpha = alpha;
  UpdateOptions mlOptions = options;
  mlOptions.firth = false;  // likelihood-ratio tests need maximum-likelihood fits
  result.devianceOriginal = updateModel(model, data, UpdateMethod::None, mlOptions).deviance;
  const UpdatedModel intercept = updateModel(model, data, UpdateMethod::Intercept, mlOptions);
  const UpdatedModel recalibrated = updateModel(model, data, UpdateMethod::Recalibrate, mlOptions);
  const UpdatedModel refit = updateModel(model, data, UpdateMethod::Refit, mlOptions);
  result.devianceIntercept = intercept.deviance;
  result.devianceRecalibrated = recalibrated.deviance;
  result.devianceRefit = refit.deviance;
  for (const auto* updated : {&intercept, &recalibrated, &refit}) {
    result.warnings.insert(result.warnings.end(), updated->warnings.begin(),
                           updated->warnings.end());
  }
  const int refitParameters = refit.estimatedParameters;  // p + 1
  const auto test = [&](const std::string& hypothesis, double deviance, int parameters) {
    ClosedTestStep step;
    step.hypothesis = hypothesis;
    step.lrStatistic = deviance - result.devianceRefit;
    step.df = refitParameters - parameters;
    step.pValue = chiSquareP(step.lrStatistic, step.df);
    step.rejected = step.pValue < alpha;
    result.steps.push_back(step);
    return step.rejected;
  };
  if (!test("original vs refit", result.devianceOriginal, 0)) {
    result.suggested = UpdateMethod::None;
  } else if (!test("intercept update vs refit", result.devianceIntercept, 1)) {
    result.suggested = UpdateMethod::Intercept;
  } else if (refitParameters > 2 &&
             !test("recalibration vs refit", result.devianceRecalibrated, 2)) {
    result.suggested = UpdateMethod::Recalibrate;
  } else {
    result.suggested = UpdateMethod::Refit;
  }
  return result;
}

}  // namespace calivera
