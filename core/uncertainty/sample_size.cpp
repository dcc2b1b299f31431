#include "core/uncertainty/sample_size.h"

#include <algorithm>
#include <cmath>
#include <functional>
#include <limits>
#include <sstream>

#include "core/util/errors.h"

namespace calivera {
namespace {

constexpr double kZ975 = 1.959963984540054;
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
constexpr double kPi = 3.141592653589793;

double expit(double x) {
  return 1.0 / (1.0 + std::exp(-x));
}

// E[f(LP)] for LP ~ Normal(mean, sd) by composite Simpson's rule over mean +/- 12 sd.
double normalExpectation(double mean, double sd, const std::function<double(double)>& f) {
  constexpr int kIntervals = 4000;  // even
  const double lo = -12.0, h = 24.0 / kIntervals;
  double sum = 0.0;
  for (int k = 0; k <= kIntervals; ++k) {
    const double z = lo + h * k;
    const double weight = (k == 0 || k == kIntervals) ? 1.0 : (k % 2 == 1 ? 4.0 : 2.0);
    sum += weight * std::exp(-0.5 * z * z) * f(mean + sd * z);
  }
  return sum * h / 3.0 / std::sqrt(2.0 * kPi);
}

double slopeN(double iaa, double iab, double ibb, double se) {
  const double determinant = iaa * ibb - iab * iab;
  if (!(determinant > 0.0)) return kNaN;
  return iaa / (se * se * determinant);
}

double roundUp(double n) {
  return std::isfinite(n) ? std::ceil(n - 1e-9) : kNaN;
}

std::string formatNumber(double value) {
  std::ostringstream out;
  out << value;
  return out.str();
}

}  // namespace

double seForCiWidth(double width) {
  return width / (2.0 * kZ975);
}
double lnOeSeForCiWidth(double width) {
  return std::asinh(width / 2.0) / kZ975;
}

double requiredNForOe(double prevalence, double seLnOe) {
  return (1.0 - prevalence) / (prevalence * seLnOe * seLnOe);
}

double normalLpMeanForPrevalence(double prevalence, double lpSd) {
  double lo = -60.0, hi = 60.0;
  for (int iteration = 0; iteration < 200 && hi - lo > 1e-12; ++iteration) {
    const double mid = 0.5 * (lo + hi);
    (normalExpectation(mid, lpSd, expit) < prevalence ? lo : hi) = mid;
  }
  return 0.5 * (lo + hi);
}

double requiredNForSlopeNormal(double lpMean, double lpSd, double seSlope) {
  const auto v = [](double lp) { return expit(lp) * (1.0 - expit(lp)); };
  const double iaa = normalExpectation(lpMean, lpSd, v);
  const double iab = normalExpectation(lpMean, lpSd, [&](double lp) { return lp * v(lp); });
  const double ibb = normalExpectation(lpMean, lpSd, [&](double lp) { return lp * lp * v(lp); });
  return slopeN(iaa, iab, ibb, seSlope);
}

double requiredNForSlopeEmpirical(const std::vector<double>& linearPredictor, double seSlope) {
  if (linearPredictor.empty()) return kNaN;
  // Centre first so the information determinant is not a difference of large numbers.
  double centre = 0.0;
  for (double lp : linearPredictor) centre += lp;
  centre /= static_cast<double>(linearPredictor.size());
  double iaa = 0.0, iab = 0.0, ibb = 0.0;
  for (double lp : linearPredictor) {
    const double p = expit(lp);
    const double v = p * (1.0 - p);
    const double x = lp - centre;
    iaa += v;
    iab += x * v;
    ibb += x * x * v;
  }
  const auto n = static_cast<double>(linearPredictor.size());
  return slopeN(iaa / n, iab / n, ibb / n, seSlope);
}

double newcombeCSe(double c, double prevalence, double n) {
  const double half = n / 2.0 - 1.0;
  const double variance = c * (1.0 - c) *
                          (1.0 + half * (1.0 - c) / (2.0 - c) + half * c / (1.0 + c)) /
                          (n * n * prevalence * (1.0 - prevalence));
  return std::sqrt(variance);
}

double requiredNForC(double c, double prevalence, double seC) {
  if (!(c > 0.0 && c < 1.0) || !(prevalence > 0.0 && prevalence < 1.0)) return kNaN;
  // SE falls monotonically with n (about 1/sqrt(n)); bisection on n.
  double lo = 2.0, hi = 1e12;
  if (newcombeCSe(c, prevalence, lo) <= seC) return lo;
  while (hi - lo > 1e-6 * hi) {
    const double mid = std::sqrt(lo * hi);
    (newcombeCSe(c, prevalence, mid) > seC ? lo : hi) = mid;
  }
  return hi;
}

double requiredNForNetBenefit(double sensitivity, double specificity, double prevalence,
                              double threshold, double seStandardizedNb) {
  const double w = threshold / (1.0 - threshold);
  const double phi = prevalence;
  const double bracket =
      sensitivity * (1.0 - sensitivity) / phi +
      w * w * specificity * (1.0 - specificity) * (1.0 - phi) / (phi * phi) +
      w * w * (1.0 - specificity) * (1.0 - specificity) * (1.0 - phi) / (phi * phi * phi);
  return bracket / (seStandardizedNb * seStandardizedNb);
}

SampleSizeAssessment assessSampleSize(const std::vector<double>& outcome,
                                      const std::vector<double>& risk,
                                      const std::vector<double>& linearPredictor, double auc,
                                      const SampleSizeTargets& targets,
                                      const CohortPrecision& achieved) {
  SampleSizeAssessment a;
  a.n = outcome.size();
  for (double y : outcome) a.events += y > 0.5 ? 1 : 0;
  a.nonEvents = a.n - a.events;
  if (a.events == 0 || a.nonEvents == 0) {
    throw AnalysisError("sample-size assessment needs both events and non-events");
  }
  const double phi = static_cast<double>(a.events) / static_cast<double>(a.n);
  a.prevalence = phi;
  a.rules.push_back({">= 100 events and >= 100 non-events (discrimination, overall calibration)",
                     a.events >= 100 && a.nonEvents >= 100});
  a.rules.push_back({">= 200 events (calibration curve)", a.events >= 200});

  const auto add = [&](std::string name, double width, double se, double n,
                       std::optional<double> achievedWidth, std::string note) {
    SampleSizeCriterion c;
    c.criterion = std::move(name);
    c.targetCiWidth = width;
    c.targetSe = se;
    c.requiredN = roundUp(n);
    c.requiredEvents = std::isfinite(c.requiredN) ? roundUp(c.requiredN * phi) : kNaN;
    c.achievedCiWidth = achievedWidth;
    c.met = std::isfinite(c.requiredN) && static_cast<double>(a.n) >= c.requiredN;
    c.note = std::move(note);
    a.criteria.push_back(std::move(c));
  };
  const double seOe = lnOeSeForCiWidth(targets.oeCiWidth);
  add("O/E", targets.oeCiWidth, seOe, requiredNForOe(phi, seOe), achieved.oeCiWidth,
      "SE of ln(O/E) for a CI of this width around O/E = 1");
  const double seSlope = seForCiWidth(targets.slopeCiWidth);
  add("calibration slope", targets.slopeCiWidth, seSlope,
      requiredNForSlopeEmpirical(linearPredictor, seSlope), achieved.slopeCiWidth,
      "LP distribution of this cohort, model assumed calibrated");
  const double seC = seForCiWidth(targets.cCiWidth);
  add("C statistic", targets.cCiWidth, seC, requiredNForC(auc, phi, seC), achieved.cCiWidth,
      "Newcombe SE at the observed C statistic " + formatNumber(auc));
  const double seNb = seForCiWidth(targets.netBenefitCiWidth);
  for (std::size_t k = 0; k < targets.netBenefitThresholds.size(); ++k) {
    const double t = targets.netBenefitThresholds[k];
    double tp = 0.0, tn = 0.0;
    for (std::size_t i = 0; i < outcome.size(); ++i) {
      const bool flagged = risk[i] >= t;
      if (outcome[i] > 0.5)
        tp += flagged ? 1.0 : 0.0;
      else
        tn += flagged ? 0.0 : 1.0;
    }
    const double se = tp / static_cast<double>(a.events);
    const double sp = tn / static_cast<double>(a.nonEvents);
    const std::optional<double> width =
        k < achieved.netBenefitCiWidth.size() ? achieved.netBenefitCiWidth[k] : std::nullopt;
    add("net benefit t=" + formatNumber(t), targets.netBenefitCiWidth, seNb,
        requiredNForNetBenefit(se, sp, phi, t, seNb), width,
        "standardized net benefit; sensitivity " + formatNumber(se) + ", specificity " +
            formatNumber(sp) + " as observed");
  }

  a.adequate = std::all_of(a.rules.begin(), a.rules.end(), [](const auto& r) { return r.met; });
  for (const auto& c : a.criteria) {
    if (std::isfinite(c.requiredN) && !(c.requiredN <= a.requiredN)) {
      a.requiredN = c.requiredN;
      a.drivingCriterion = c.criterion;
    }
    a.adequate = a.adequate && c.met;
  }
  const bool criteriaMet =
      std::all_of(a.criteria.begin(), a.criteria.end(), [](const auto& c) { return c.met; });
  std::ostringstream verdict;
  verdict << "The cohort (n = " << a.n << ", " << a.events << " events) ";
  if (a.adequate) {
    verdict << "meets the rules of thumb and every precision criterion.";
  } else if (criteriaMet) {
    verdict << "meets the precision criteria but not every rule of thumb; read the estimates"
            << " with their confidence intervals.";
  } else {
    verdict << "is smaller than needed to judge the model precisely: the precision criteria ask"
            << " for n >= " << a.requiredN << " (driven by the " << a.drivingCriterion
            << "); read the estimates with their confidence intervals.";
  }
  a.verdict = verdict.str();
  return a;
}

}  // namespace calivera
