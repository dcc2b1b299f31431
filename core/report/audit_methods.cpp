#include "core/report/audit_methods.h"

namespace calivera {

const std::vector<MethodParagraph>& auditMethodParagraphs() {
  static const std::vector<MethodParagraph> paragraphs = {
      {"Discrimination (AUC, c-statistic)",
       "The area under the ROC curve is the probability that a randomly chosen patient with the "
       "event received a higher predicted risk than a randomly chosen patient without it, ties "
       "counting one half (Mann-Whitney). Its standard error follows DeLong's placement-value "
       "method, computed from midranks; the 95% interval is formed on the logit scale so that it "
       "stays inside 0 to 1.",
       "DeLong, DeLong & Clarke-Pearson, Biometrics 1988;44:837-45; Sun & Xu, IEEE Signal "
       "Processing Letters 2014;21:1389-93; Hanley & McNeil, Radiology 1982;143:29-36."},
      {"Calibration intercept and slope",
       "Calibration-in-the-large is the intercept of a logistic regression of the outcome with the "
       "model's linear predictor as offset (target 0). The calibration slope is the coefficient of "
       "the linear predictor in a logistic regression on it (target 1). Together with the "
       "calibration curve they place the model on the calibration hierarchy (mean, weak, moderate "
       "calibration).",
       "Cox, Biometrika 1958; Van Calster et al., J Clin Epidemiol 2016;74:167-76."},
      {"Observed/expected ratio and Spiegelhalter's z",
       "O/E divides the number of observed events by the sum of predicted risks. Spiegelhalter's "
       "z tests whether the squared prediction errors are larger than the predicted risks imply.",
       "Spiegelhalter, Stat Med 1986;5:421-33."},
      {"Calibration curve, ICI, E50, E90, Emax",
       "The observed proportion of events is smoothed against predicted risk by local regression "
       "(loess). ICI is the mean absolute difference between predicted risk and the smoothed "
       "observed proportion over the cohort; E50 and E90 are its median and 90th percentile, "
       "Emax its maximum.",
       "Austin & Steyerberg, Stat Med 2019;38:4051-65."},
      {"Brier score",
       "The mean squared difference between predicted risk and outcome (0 is perfect). The scaled "
       "Brier score compares it with a model that predicts the cohort's prevalence for everyone.",
       "Brier, Monthly Weather Review 1950; Steyerberg et al., Epidemiology 2010;21:128-38."},
      {"Hosmer-Lemeshow test and grouped calibration",
       "Patients are grouped by quantiles of predicted risk; observed and expected events per "
       "group are compared with a chi-square statistic, with g - 2 degrees of freedom on the "
       "development data and g when a fixed model is applied to new data. The test depends on "
       "the grouping and its power grows with the sample size, so it is reported after the "
       "calibration curve, intercept and slope. Group proportions carry Wilson 95% intervals.",
       "Hosmer & Lemeshow, Commun Stat A 1980;9:1043-69; Hosmer et al., Stat Med "
       "1997;16:965-80; Wilson, JASA 1927."},
      {"Decision curve (net benefit)",
       "Net benefit at threshold t is TP/n - FP/n x t/(1 - t), compared with treating everyone "
       "and treating no one. It should be read over a range of thresholds that clinicians judge "
       "reasonable, not at one threshold picked from the data.",
       "Vickers & Elkin, Med Decis Making 2006;26:565-74; Vickers, van Calster & Steyerberg, "
       "Diagn Progn Res 2019;3:18."},
      {"Threshold table",
       "At each selected threshold a patient counts as flagged when the predicted risk is at or "
       "above it. Sensitivity, specificity and predictive values carry Wilson 95% score "
       "intervals.",
       "Wilson, JASA 1927; Newcombe, Stat Med 1998;17:857-72."},
      {"Sample size",
       "External validation needs at least 100 events and 100 non-events, and preferably 200 "
       "events or more; precision-based sizes for O/E, slope, c-statistic and net benefit are "
       "given by Riley et al.",
       "Vergouwe et al., J Clin Epidemiol 2005; Collins, Ogundimu & Altman, Stat Med 2016; "
       "Riley et al., Stat Med 2021;40:4230-51."},
  };
  return paragraphs;
}

std::vector<ChecklistItem> auditChecklist(bool apparent, bool subgroups,
                                          const std::string& imputation) {
  const bool imputed = !imputation.empty();
  using S = ChecklistStatus;
  return {
      {"Title identifying the study as a validation of a prediction model", S::Covered,
       "Title page (as entered by the user)"},
      {"Source of data (registry, trial, records) and study design", S::UserMustAdd,
       "Describe where the cohort came from and how it was assembled"},
      {"Eligibility criteria for participants", S::UserMustAdd,
       "State inclusion and exclusion criteria applied before this analysis"},
      {"Key study dates (start and end of accrual, end of follow-up)", S::UserMustAdd,
       "Give the dates the cohort covers"},
      {"Setting and location (centres, country, level of care)", S::UserMustAdd,
       "Describe the clinical setting of the cohort"},
      {"Outcome definition and how it was ascertained", S::UserMustAdd,
       "Define the outcome; the report only names the outcome column"},
      {"Predictors and how the predictions were computed", S::Covered,
       "Section 1: model file, fingerprint, terms and development record"},
      {"Sample size: participants and outcome events", S::Covered,
       "Section 1 (rows read, analysed, events) and the warnings"},
      {"Missing data: how many and how handled", S::Covered,
       imputation == "chained_equations"
           ? "Section 1: rows excluded per column; Section 2, missing data: patterns, the "
             "columns imputed by chained equations with their methods, complete cases and the "
             "imputed copies pooled by Rubin's rules"
       : imputed ? "Section 1: rows excluded per column; Section 2, missing data: patterns, "
                   "complete cases and the imputed copies pooled by Rubin's rules (say how the "
                   "copies were imputed)"
                 : "Section 1: rows excluded per column (complete-case analysis); Section 2, "
                   "missing data: the columns missing together, when any are"},
      {apparent ? "Performance on the development data (apparent performance)"
                : "Type of validation (external, on a new cohort)",
       S::Covered, "Section 1, settings"},
      {"Performance measures with confidence intervals (discrimination, calibration)", S::Covered,
       "Section 2: summary table, ROC and calibration charts"},
      {"Clinical utility (net benefit over a range of thresholds)", S::Covered,
       "Section 2: decision curve and threshold table"},
      {"Differences from the development data (case mix, predictors, outcome)", S::UserMustAdd,
       "Compare the cohort with the development population"},
      {"Subgroup and fairness assessment (e.g. by sex, age band, site)",
       subgroups ? S::Covered : S::UserMustAdd,
       subgroups ? "Section 2: subgroups; add any relevant subgroup not analysed"
                 : "Report performance in relevant subgroups"},
      {"Limitations and interpretation", S::UserMustAdd,
       "Discuss limitations; the caution statement is on every page"},
      {"Software and reproducibility (version, input fingerprints, settings)", S::Covered,
       "Title page and footer of every page"},
  };
}

}  // namespace calivera
