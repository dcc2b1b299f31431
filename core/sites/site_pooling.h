#pragma once
// Validation across sites (`calivera validate --cluster COLUMN`): every site validated alone
// (core/uncertainty/subgroups.h), then each measure pooled by random-effects meta-analysis
// (random_effects.h) on the scale where its between-site distribution is closest to normal
// (Snell et al., Stat Methods Med Res 2018; Debray et al., BMJ 2017):
//   c-statistic            logit(AUC), SE = SE_DeLong / (AUC (1 - AUC))  (delta method);
//   O/E ratio              log(O/E),   SE = sqrt(1/O - 1/n): O binomial with E fixed (Debray et
//                          al., BMJ 2017, from memory of its supplement);
//   calibration intercept  as it is, Wald SE of the offset model;
//   calibration slope      as it is, Wald SE.
// Net benefit at the tabulated thresholds is pooled twice: as the sum of counts (every site's
// patients together, which is the whole cohort's net benefit) and as a random-effects mean of the
// sites' net benefits, each with the multinomial variance of its TP and FP proportions,
//   var(NB) = [p_tp (1 - p_tp) + w^2 p_fp (1 - p_fp) + 2 w p_tp p_fp] / n,  w = t / (1 - t)
// (common practice: the variance of a linear combination of multinomial proportions).
//
// A site that cannot give a measure (one outcome class, a DeLong SE that is not estimable, an AUC
// of 0 or 1, no events, a recalibration fit that did not converge or separated) is listed with the
// reason and left out of that measure's pooling only. Patients with no site value form the level
// "(missing)": counted and shown, never pooled as a site.

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "core/metrics/validation.h"
#include "core/sites/pooling_scale.h"
#include "core/sites/random_effects.h"
#include "core/sites/site_measures.h"
#include "core/uncertainty/subgroups.h"

namespace calivera {

// More sites than this is not a site column (an identifier): refused.
inline constexpr std::size_t kMaxSites = 1000;

struct SiteExclusion {
  std::string site;
  std::string reason;
};

struct PooledMeasure {
  std::string key;    // kPooledMeasureKeys
  std::string label;  // for people: "C-statistic (AUC)", ...
  PoolingScale scale = PoolingScale::Identity;
  // The sites pooled, with their estimates and variances on the pooling scale.
  std::vector<std::string> sites;
  std::vector<double> estimates, variances;
  std::vector<SiteExclusion> excluded;
  RandomEffectsOutcome pooled;  // on the pooling scale
};

struct PooledNetBenefit {
  double threshold = 0.0;
  // Sum of counts over every site with patients (the "(missing)" level excluded); absent when a
  // site withheld its counts at this threshold (small-cell suppression stays in force).
  std::size_t n = 0, truePositives = 0, falsePositives = 0;
  std::optional<double> byCounts;
  std::vector<std::string> suppressedAt;  // the sites that withheld their counts
  // Per site net benefit and its variance, then the random-effects mean (identity scale).
  std::vector<std::string> sites;
  std::vector<double> estimates, variances;
  std::vector<SiteExclusion> excluded;
  RandomEffectsOutcome pooled;
};

struct SiteAnalysis {
  std::string column;                       // the site column, or "site summaries"
  std::vector<SiteMeasures> sites;          // in site order; "(missing)" last
  std::vector<SubgroupResult> validations;  // validate --cluster only: each site's whole result
  std::vector<PooledMeasure> measures;      // in kPooledMeasureKeys order
  std::vector<PooledNetBenefit> netBenefit;
};

// Pools measures and net benefit (at `netBenefitThresholds`, each present in every site's
// threshold counts) over `sites`. Throws InputError when fewer than two sites (missing values
// aside) have patients: there is nothing to pool.
SiteAnalysis poolSites(const std::string& column, std::vector<SiteMeasures> sites,
                       const std::vector<double>& netBenefitThresholds);

// labels[i] is the site of patient i of `input` (subgroupLabels with kMaxSites): every site
// validated alone (as a subgroup), then poolSites. `netBenefitThresholds` each in (0, 1).
SiteAnalysis validateSites(const std::string& column, const std::vector<std::string>& labels,
                           const ValidationInput& input, const ValidationOptions& options,
                           const std::vector<double>& netBenefitThresholds);

// The multinomial variance of a net benefit from counts (see above).
double netBenefitVariance(double threshold, std::size_t tp, std::size_t fp, std::size_t n);

}  // namespace calivera
