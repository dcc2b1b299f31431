#include "core/present/measures.h"

#include <cassert>
#include <cmath>

#include "core/present/number_text.h"

namespace calivera {

namespace {

using R = const ValidationResult&;
using VB = ValidationBootstrap;

std::vector<Measure> buildCatalog() {
  std::vector<Measure> m;
  // Discrimination (Harrell 2015; DeLong et al. 1988 for the SE).
  m.push_back({"auc", "AUC (c-statistic)", "", MeasureFormat::Fixed, 3,
               [](R r) { return r.discrimination.auc; }, [](R r) { return r.discrimination.aucCi; },
               [](R r) { return r.discrimination.aucSe; }, &VB::auc, "1",
               "chance that a patient with the event has a higher risk than one without; "
               "0.5 is chance",
               "Mann-Whitney form; interval: DeLong et al., Biometrics 1988"});
  m.push_back({"discrimination_slope", "Discrimination slope", "risk", MeasureFormat::Fixed, 3,
               [](R r) { return r.discrimination.discriminationSlope; }, nullptr, nullptr, nullptr,
               "", "mean predicted risk of patients with the event minus that of patients without",
               "Yates 1982; Tjur, Am Stat 2009"});
  // Overall accuracy (Brier 1950; scaled: Steyerberg et al. 2010).
  m.push_back({"brier", "Brier score", "squared risk", MeasureFormat::Fixed, 4,
               [](R r) { return r.overall.brier; }, nullptr, nullptr, &VB::brier, "0",
               "mean squared difference of predicted risk and outcome; lower is better",
               "Brier, Mon Weather Rev 1950"});
  m.push_back({"brier_scaled", "Scaled Brier score", "", MeasureFormat::Fixed, 3,
               [](R r) { return r.overall.brierScaled; }, nullptr, nullptr, &VB::brierScaled, "1",
               "share of the Brier score of predicting the event rate for everyone that the "
               "model removes",
               "common practice: 1 − Brier / (π(1 − π))"});
  // Calibration (Van Calster et al. 2016; Austin & Steyerberg 2019 for ICI and E-statistics).
  m.push_back({"calibration_intercept", "Calibration intercept", "log odds", MeasureFormat::Fixed,
               3, [](R r) { return r.calibration.intercept; },
               [](R r) { return r.calibration.interceptCi; },
               [](R r) { return r.calibration.interceptSe; }, &VB::calibrationIntercept, "0",
               "calibration-in-the-large; negative: risks too high on average",
               "Cox, Biometrika 1958; Van Calster et al., J Clin Epidemiol 2016"});
  m.push_back({"calibration_slope", "Calibration slope", "", MeasureFormat::Fixed, 3,
               [](R r) { return r.calibration.slope; }, [](R r) { return r.calibration.slopeCi; },
               [](R r) { return r.calibration.slopeSe; }, &VB::calibrationSlope, "1",
               "below 1: predictions too extreme; above 1: too modest",
               "Cox, Biometrika 1958; Van Calster et al., J Clin Epidemiol 2016"});
  m.push_back({"oe_ratio", "Observed / expected", "", MeasureFormat::Fixed, 3,
               [](R r) { return r.calibration.oeRatio; }, [](R r) { return r.calibration.oeCi; },
               nullptr, &VB::oeRatio, "1", "observed events per predicted event",
               "observed / expected; Poisson interval (common practice)"});
  m.push_back({"spiegelhalter_z", "Spiegelhalter z", "", MeasureFormat::Fixed, 2,
               [](R r) { return r.calibration.spiegelhalterZ; }, nullptr, nullptr, nullptr, "0",
               "tests whether squared errors exceed what the predicted risks imply",
               "Spiegelhalter, Stat Med 1986"});
  m.push_back({"spiegelhalter_p", "Spiegelhalter p", "", MeasureFormat::PValue, 3,
               [](R r) { return r.calibration.spiegelhalterP; }, nullptr, nullptr, nullptr, "",
               "two-sided p of the Spiegelhalter z", "Spiegelhalter, Stat Med 1986"});
  m.push_back({"ici", "ICI", "risk", MeasureFormat::Fixed, 4, [](R r) { return r.calibration.ici; },
               nullptr, nullptr, &VB::ici, "0",
               "mean distance of the smoothed calibration curve from the ideal line",
               "Austin & Steyerberg, Stat Med 2019"});
  m.push_back({"e50", "E50", "risk", MeasureFormat::Fixed, 4, [](R r) { return r.calibration.e50; },
               nullptr, nullptr, nullptr, "0",
               "median distance of the smoothed curve from the ideal line",
               "Austin & Steyerberg, Stat Med 2019"});
  m.push_back({"e90", "E90", "risk", MeasureFormat::Fixed, 4, [](R r) { return r.calibration.e90; },
               nullptr, nullptr, &VB::e90, "0", "90th percentile of that distance",
               "Austin & Steyerberg, Stat Med 2019"});
  m.push_back({"emax", "Emax", "risk", MeasureFormat::Fixed, 4,
               [](R r) { return r.calibration.emax; }, nullptr, nullptr, nullptr, "0",
               "largest distance of the smoothed curve from the ideal line",
               "Austin & Steyerberg, Stat Med 2019"});
  // Hosmer & Lemeshow 1980 (g - 2 df on development data, g on new data).
  m.push_back({"hosmer_lemeshow_statistic", "Hosmer-Lemeshow chi-square", "", MeasureFormat::Fixed,
               2, [](R r) { return r.hosmerLemeshow.statistic; }, nullptr, nullptr, nullptr, "",
               "grouped observed against expected events; little power in small cohorts",
               "Hosmer & Lemeshow, Commun Stat A 1980"});
  m.push_back({"hosmer_lemeshow_df", "Hosmer-Lemeshow df", "", MeasureFormat::Whole, 0,
               [](R r) { return static_cast<double>(r.hosmerLemeshow.df); }, nullptr, nullptr,
               nullptr, "", "degrees of freedom", "Hosmer & Lemeshow, Commun Stat A 1980"});
  m.push_back({"hosmer_lemeshow_p", "Hosmer-Lemeshow p", "", MeasureFormat::PValue, 3,
               [](R r) { return r.hosmerLemeshow.pValue; }, nullptr, nullptr, nullptr, "",
               "p of the Hosmer-Lemeshow chi-square", "Hosmer & Lemeshow, Commun Stat A 1980"});
  return m;
}

}  // namespace

const std::vector<Measure>& measureCatalog() {
  static const std::vector<Measure> catalog = buildCatalog();
  return catalog;
}

const Measure& measureByKey(std::string_view key) {
  for (const Measure& m : measureCatalog()) {
    if (key == m.key) return m;
  }
  assert(false && "no such measure in the catalog");
  return measureCatalog().front();
}

const Measure& measureOfPooledKey(std::string_view pooledKey) {
  return measureByKey(pooledKey == "c_statistic" ? std::string_view("auc") : pooledKey);
}

std::string measureText(const Measure& m, const ValidationResult& r) {
  const double v = m.estimate(r);
  switch (m.format) {
    case MeasureFormat::PValue:
      return formatPValue(v);
    case MeasureFormat::Whole:
      return formatNumber(v, 0);
    case MeasureFormat::Fixed:
      break;
  }
  return formatNumber(v, m.decimals);
}

std::string measureWithCiText(const Measure& m, const ValidationResult& r) {
  std::string text = measureText(m, r);
  if (m.interval == nullptr) return text;
  const Interval ci = m.interval(r);
  if (!std::isfinite(ci.lo) || !std::isfinite(ci.hi)) return text;
  return text + " (95% CI " + formatRange(ci.lo, ci.hi, m.decimals) + ")";
}

std::string measureBootstrapText(const Measure& m, const ValidationBootstrap& b) {
  if (m.bootstrap == nullptr) return {};
  const Interval& ci = (b.*(m.bootstrap)).ci;
  return formatRange(ci.lo, ci.hi, m.decimals);
}

}  // namespace calivera
