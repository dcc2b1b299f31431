#pragma once
// Is the validation cohort large enough to judge the model?
//
// Rules of thumb: at least 100 events and 100 non-events (Vergouwe et al., J Clin Epidemiol
// 2005 — memory); at least 200 events for calibration (Collins, Ogundimu & Altman, Stat Med 2016
// — memory).
//
// Precision-based minimum sizes of Riley et al., Stat Med 2021;40:4230-51 (read: the O/E formula
// and the check value; the other expressions are from memory and were recomputed, see below).
// Each criterion asks for the n at which the 95% CI of a measure has a target width:
//   O/E (read):        n = (1 - phi) / (phi SE^2), SE of ln(O/E) (delta method).
//   slope (memory, recomputed from the Fisher information of the calibration model
//     logit P(y) = a + b LP at a = 0, b = 1): n = I_aa / (SE^2 (I_aa I_bb - I_ab^2)), with
//     I_aa = E[p(1-p)], I_ab = E[LP p(1-p)], I_bb = E[LP^2 p(1-p)], p = expit(LP), the expectation
//     over the LP distribution of the validation population (normal, or the cohort's own LPs).
//   C statistic (memory): SE from Newcombe's form of the Hanley-McNeil variance (Newcombe, Stat
//     Med 2006;25:543-57), both (n1 - 1) and (n0 - 1) replaced by n/2 - 1:
//     SE^2 = C(1-C)[1 + (n/2-1)(1-C)/(2-C) + (n/2-1)C/(1+C)] / (n^2 phi (1-phi)), solved for n
//     by bisection.
//   standardized net benefit sNB = NB / phi at threshold t (memory, recomputed by the delta
//     method with Se, Sp and phi estimated): n = [Se(1-Se)/phi + w^2 Sp(1-Sp)(1-phi)/phi^2 +
//     w^2 (1-Sp)^2 (1-phi)/phi^3] / SE^2, w = t/(1-t).
// Target widths (defaults after Riley et al.): O/E 0.2 (CI about 0.9 to 1.1 at O/E = 1), slope
// 0.2, C 0.1, sNB 0.2. A width W gives SE = W / (2 * 1.96), for O/E on the log scale
// SE = asinh(W / 2) / 1.96 (CI exp(+/- 1.96 SE) around O/E = 1).
//
// Check (Riley et al. 2021, read): phi = 0.018 needs 9835 participants (177 events), driven by the
// slope. Our slope criterion reproduces it for a normal LP with SD 2.2 (mean then fixed by phi);
// the SD was found by inverting the published n (computed, tests/reference/scripts/riley_size.py),
// not read from the paper.

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

namespace calivera {

struct SampleSizeTargets {
  double oeCiWidth = 0.2;
  double slopeCiWidth = 0.2;
  double cCiWidth = 0.1;
  double netBenefitCiWidth = 0.2;            // of the standardized net benefit
  std::vector<double> netBenefitThresholds;  // empty: no net-benefit criterion
};

// One criterion's result. requiredN is NaN when the criterion cannot be evaluated.
struct SampleSizeCriterion {
  std::string criterion;  // "O/E", "calibration slope", "C statistic", "net benefit t=0.1"
  double targetCiWidth = 0.0;
  double targetSe = 0.0;
  double requiredN = 0.0;       // rounded up
  double requiredEvents = 0.0;  // requiredN * phi, rounded to nearest (as Riley et al. report)
  std::optional<double> achievedCiWidth;  // in this cohort, when the analysis estimated it
  bool met = false;                       // cohort n >= requiredN
  std::string note;
};

struct RuleOfThumb {
  std::string rule;  // e.g. ">= 100 events and >= 100 non-events"
  bool met = false;
};

struct SampleSizeAssessment {
  std::size_t n = 0, events = 0, nonEvents = 0;
  double prevalence = 0.0;
  std::vector<RuleOfThumb> rules;
  std::vector<SampleSizeCriterion> criteria;
  double requiredN = 0.0;  // largest over the criteria
  std::string drivingCriterion;
  bool adequate = false;  // every rule and criterion met
  std::string verdict;    // one sentence for the reader
};

// --- the formulas, usable on their own (planning a study) -------------------------------------

double seForCiWidth(double width);      // W / (2 * 1.96)
double lnOeSeForCiWidth(double width);  // asinh(W / 2) / 1.96
double requiredNForOe(double prevalence, double seLnOe);
// Information integrals over a normal LP(mean, sd) by Gauss-Hermite-free fine-grid quadrature.
double requiredNForSlopeNormal(double lpMean, double lpSd, double seSlope);
// Same, with the expectation over the given LP values (each patient weight 1).
double requiredNForSlopeEmpirical(const std::vector<double>& linearPredictor, double seSlope);
double newcombeCSe(double c, double prevalence, double n);
double requiredNForC(double c, double prevalence, double seC);
double requiredNForNetBenefit(double sensitivity, double specificity, double prevalence,
                              double threshold, double seStandardizedNb);
// Mean of a normal LP with the given SD whose mean risk E[expit(LP)] equals `prevalence`.
double normalLpMeanForPrevalence(double prevalence, double lpSd);

// --- the assessment of a cohort --------------------------------------------------------------

struct CohortPrecision {  // achieved 95% CI widths from the validation, when available
  std::optional<double> oeCiWidth, slopeCiWidth, cCiWidth;
  std::vector<std::optional<double>> netBenefitCiWidth;  // per target threshold (bootstrap)
};

// Assumptions come from the cohort itself: phi = observed prevalence, the LP distribution = the
// cohort's LPs (the model taken as calibrated), C = the observed AUC, Se/Sp at each threshold as
// observed. Throws AnalysisError for an empty cohort or one outcome class.
SampleSizeAssessment assessSampleSize(const std::vector<double>& outcome,
                                      const std::vector<double>& risk,
                                      const std::vector<double>& linearPredictor, double auc,
                                      const SampleSizeTargets& targets,
                                      const CohortPrecision& achieved);

}  // namespace calivera
