#include "core/report/audit_uncertainty.h"

#include <algorithm>
#include <cmath>

#include "core/present/wording.h"
#include "core/report/audit_blocks.h"
#include "core/report/audit_format.h"

namespace calivera {
namespace {

constexpr std::size_t kMaxNetBenefitRows = 15;
const std::string kWithheld = "withheld";

// Estimate over its interval, so narrow columns never break inside a number.
std::string stacked(double value, const Interval& ci, int decimals) {
  return formatFixed(value, decimals) + "\n(" + formatFixed(ci.lo, decimals) + "\u2013" +
         formatFixed(ci.hi, decimals) + ")";
}

std::string yesNo(bool met) {
  return sizeCriterionText(met);
}

std::string suppressedText(const std::string& text, const DisclosurePlan& plan) {
  return plan.active() ? suppressSmallNumbersInText(text, plan.below()) : text;
}

std::string sampleSizeVerdict(const SampleSizeAssessment& a, const DisclosurePlan& plan) {
  const bool criteriaMet =
      std::all_of(a.criteria.begin(), a.criteria.end(), [](const auto& c) { return c.met; });
  std::string text =
      "Verdict: the cohort (n = " + plan.rowsAnalysed() + ", " + plan.events() + " events) ";
  if (a.adequate) return text + "meets the rules of thumb and every precision criterion below.";
  if (criteriaMet) {
    return text +
           "meets the precision criteria but not every rule of thumb; read every estimate with "
           "its confidence interval.";
  }
  text += "is smaller than needed to judge the model precisely";
  if (!plan.eventsHidden() && std::isfinite(a.requiredN)) {
    text += ": the precision criteria ask for n \u2265 " + formatFixed(a.requiredN, 0) +
            " (driven by the " + a.drivingCriterion + ")";
  }
  return text + ". Read every estimate with its confidence interval.";
}

// The comparison's net-benefit rows the report prints: the reasonable range when one is set,
// else the tabulated thresholds; thinned to at most kMaxNetBenefitRows (the CSV has all).
std::vector<const NetBenefitDifferencePoint*> reportedPoints(
    const std::vector<NetBenefitDifferencePoint>& points, const AuditSettings& settings,
    const std::vector<double>& tabulated) {
  std::vector<const NetBenefitDifferencePoint*> chosen;
  for (const NetBenefitDifferencePoint& p : points) {
    const bool wanted = settings.reasonableThresholds
                            ? p.threshold >= settings.reasonableThresholds->lo - 1e-9 &&
                                  p.threshold <= settings.reasonableThresholds->hi + 1e-9
                            : std::any_of(tabulated.begin(), tabulated.end(), [&](double t) {
                                return std::abs(t - p.threshold) < 1e-9;
                              });
    if (wanted) chosen.push_back(&p);
  }
  if (chosen.size() <= kMaxNetBenefitRows) return chosen;
  const std::size_t step = (chosen.size() + kMaxNetBenefitRows - 1) / kMaxNetBenefitRows;
  std::vector<const NetBenefitDifferencePoint*> thinned;
  for (std::size_t i = 0; i < chosen.size(); i += step) thinned.push_back(chosen[i]);
  if (thinned.back() != chosen.back()) thinned.push_back(chosen.back());
  return thinned;
}

// True when the confusion table of `result` at `threshold` holds a count the plan hides.
bool smallAt(const ValidationResult& result, double threshold, const DisclosurePlan& plan) {
  const auto row =
      std::find_if(result.thresholds.begin(), result.thresholds.end(),
                   [&](const ThresholdRow& r) { return std::abs(r.threshold - threshold) < 1e-9; });
  return row != result.thresholds.end() && plan.confusionSmall(row->tp, row->fp, row->fn, row->tn);
}

std::string bootstrapRunText(const BootstrapSummary& run) {
  return std::to_string(run.replicates) + " resamples of the patients (seed " +
         std::to_string(run.seed) + "); " +
         (run.failed == 0 ? std::string("no replicate failed")
                          : std::to_string(run.failed) +
                                " failed (a resample with one outcome class) and were left out");
}

// The compared models' names as the report prints them: each with its file name added when two
// models share a name (two fits of the same outcome are both called after it by default).
std::vector<std::string> modelNames(const AuditReportInput& input) {
  const UncertaintyResults& u = *input.uncertainty;
  std::vector<std::string> names = u.comparison->models;
  for (std::size_t m = 0; m < names.size(); ++m) {
    if (std::count(names.begin(), names.end(), names[m]) < 2) continue;
    std::vector<std::string> files{fileNameOnly(input.modelFile.name)};
    for (const ComparedModelFile& f : u.comparedModels) files.push_back(fileNameOnly(f.path));
    std::vector<std::string> named = names;
    for (std::size_t k = 0; k < named.size() && k < files.size(); ++k) {
      named[k] += " [" + files[k] + "]";
    }
    return named;
  }
  return names;
}

}  // namespace

DisclosureExtras disclosureExtras(const UncertaintyResults& results) {
  DisclosureExtras extras;
  for (const SubgroupAnalysis& analysis : results.subgroups) {
    std::vector<LevelCount>& levels = extras.subgroups.emplace_back();
    for (const SubgroupResult& level : analysis.levels) levels.push_back({level.n, level.events});
  }
  if (results.comparison) extras.comparisonRows = results.comparisonRows;
  return extras;
}

void addSampleSizeSection(const UncertaintyResults& results, const DisclosurePlan& plan,
                          std::vector<ReportBlock>& blocks) {
  const SampleSizeAssessment& a = results.sampleSize;
  blocks.push_back(reportHeading("Is the cohort large enough? (sample size)", 2));
  blocks.push_back(reportParagraph(sampleSizeVerdict(a, plan)));

  ReportTable rules;
  rules.caption = std::string(kTablePrefix) + "Sample size: rules of thumb";
  rules.header = {"Rule", "This cohort", "Status"};
  rules.widths = {0.56, 0.32, 0.12};
  rules.align = {CellAlign::Left, CellAlign::Left, CellAlign::Left};
  const std::string cohort = plan.events() + " events, " + plan.nonEvents() + " non-events";
  for (const RuleOfThumb& rule : a.rules)
    rules.rows.push_back({rule.rule, cohort, yesNo(rule.met)});
  rules.note =
      "Vergouwe et al. 2005 (100 events and 100 non-events); Collins, Ogundimu & Altman 2016 "
      "(200 events for the calibration curve).";
  blocks.push_back(reportTable(rules));

  ReportTable criteria;
  criteria.caption =
      std::string(kTablePrefix) + "Sample size: precision-based minimum (Riley et al. 2021)";
  criteria.header = {"Criterion",       "Target 95% CI width", "Required n",
                     "Required events", "Achieved CI width",   "Status"};
  criteria.widths = {0.27, 0.15, 0.13, 0.14, 0.18, 0.13};
  criteria.align = {CellAlign::Left,  CellAlign::Right, CellAlign::Right,
                    CellAlign::Right, CellAlign::Right, CellAlign::Left};
  if (plan.eventsHidden()) {
    // The required sizes follow from the prevalence, which would reveal the hidden events.
    criteria.rows.push_back({kWithheld, "", "", "", "", ""});
    criteria.note =
        "Withheld: the required sizes follow from the prevalence, and the event count is hidden "
        "by small-cell suppression.";
  } else {
    for (const SampleSizeCriterion& c : a.criteria) {
      criteria.rows.push_back(
          {c.criterion, formatFixed(c.targetCiWidth, 2), formatFixed(c.requiredN, 0),
           formatFixed(c.requiredEvents, 0),
           c.achievedCiWidth ? formatFixed(*c.achievedCiWidth, 3) : std::string("not estimated"),
           yesNo(c.met)});
    }
    criteria.note =
        "Required n: the smallest cohort whose 95% CI would reach the target width, taking this "
        "cohort's prevalence, distribution of the linear predictor, C statistic and (net "
        "benefit, standardized) sensitivity and specificity as given. Achieved width: this "
        "report's analytic intervals for O/E, slope and C; the bootstrap band for net benefit.";
  }
  blocks.push_back(reportTable(criteria));
}

std::string bootstrapCiText(const BootstrapEstimate& estimate, int decimals) {
  return formatInterval(estimate.ci, decimals);
}

std::string bootstrapNote(const ValidationBootstrap& bootstrap) {
  return "Bootstrap column: percentile 95% intervals (Efron 1979) from " +
         bootstrapRunText(bootstrap.run) +
         ". Analytic column: the intervals of the methods in Section 3.";
}

void addComparisonSection(const AuditReportInput& input, const DisclosurePlan& plan,
                          const std::vector<double>& tabulated, std::vector<ReportBlock>& blocks) {
  const UncertaintyResults& u = *input.uncertainty;
  if (!u.comparison) return;
  const ModelComparison& c = *u.comparison;
  const std::vector<std::string> names = modelNames(input);
  blocks.push_back(reportHeading("Comparison with other models", 2));
  std::string text =
      "The validated model was compared with " + std::to_string(c.models.size() - 1) +
      (c.models.size() == 2 ? " further model" : " further models") + " on the same patients. ";
  if (plan.comparisonRowsHidden()) {
    text +=
        "The comparison rests on fewer patients than the validation (how many is hidden by "
        "small-cell suppression): those complete in every column a compared model uses.";
  } else if (u.comparisonRows < input.result.cohort.n) {
    text += "The comparison rests on " + plan.comparisonRows() +
            " patients complete in every column a compared model uses, " + plan.rowsNotCompared() +
            " fewer than the validation; every figure of this section is from those patients, "
            "so the validated model's AUC here can differ from the one above.";
  } else {
    text +=
        "Every analysed patient was complete for every model (n = " + plan.rowsAnalysed() + ").";
  }
  blocks.push_back(reportParagraph(text));

  ReportTable models;
  models.caption = std::string(kTablePrefix) + "Models compared";
  models.header = {"Model", "File name and SHA-256", "AUC (95% CI)"};
  models.widths = {0.24, 0.52, 0.24};
  models.align = {CellAlign::Left, CellAlign::Left, CellAlign::Left};
  for (std::size_t m = 0; m < c.models.size(); ++m) {
    const std::string file =
        m == 0 ? fileNameOnly(input.modelFile.name) + "\n" + input.modelFile.sha256
               : fileNameOnly(u.comparedModels.at(m - 1).path) + "\n" +
                     u.comparedModels.at(m - 1).sha256;
    const std::string auc =
        m < u.comparedResults.size()
            ? formatWithCi(c.aucs[m], u.comparedResults[m].discrimination.aucCi, 3)
            : formatFixed(c.aucs[m], 3);
    models.rows.push_back({(m == 0 ? "(validated) " : "") + names[m], file, auc});
  }
  models.note = "AUC with its DeLong 95% CI (logit scale), every model on the same patients.";
  blocks.push_back(reportTable(models));

  ReportTable delong;
  delong.caption = std::string(kTablePrefix) + "Paired DeLong test of the AUC differences";
  delong.header = {"First vs second", "AUC difference (95% CI)", "z", "p", "Correlation"};
  delong.widths = {0.34, 0.28, 0.12, 0.12, 0.14};
  delong.align = {CellAlign::Left, CellAlign::Left, CellAlign::Right, CellAlign::Right,
                  CellAlign::Right};
  for (const ModelPairComparison& pair : c.pairs) {
    const PairedAucTest& t = pair.auc;
    delong.rows.push_back({names[t.first] + " vs " + names[t.second],
                           formatWithCi(t.difference, t.differenceCi, 3), formatFixed(t.z, 2),
                           formatFixed(t.pValue, 3), formatFixed(t.correlation, 3)});
  }
  delong.note =
      "Difference: AUC of the first minus the second, 95% CI difference \u00b1 1.96 SE; z and "
      "two-sided p of the paired test; correlation of the two AUC estimates on the same "
      "patients.";
  blocks.push_back(reportTable(delong));

  const bool boot = c.bootstrap.replicates > 0;
  for (const ModelPairComparison& pair : c.pairs) {
    const std::string first = names[pair.auc.first], second = names[pair.auc.second];
    ReportTable nb;
    nb.caption = std::string(kTablePrefix) + "Net-benefit difference, " + first + " minus " +
                 second + (boot ? " (bootstrap 95% CI)" : "");
    nb.header = {"Threshold", "Net benefit, " + first, "Net benefit, " + second,
                 "Difference (95% CI)"};
    nb.widths = {0.16, 0.24, 0.24, 0.36};
    nb.align = {CellAlign::Right, CellAlign::Right, CellAlign::Right, CellAlign::Left};
    bool withheld = false;
    for (const NetBenefitDifferencePoint* p :
         reportedPoints(pair.netBenefit, input.settings, tabulated)) {
      const bool hide = plan.active() && pair.auc.second < u.comparedResults.size() &&
                        (smallAt(u.comparedResults[pair.auc.first], p->threshold, plan) ||
                         smallAt(u.comparedResults[pair.auc.second], p->threshold, plan));
      withheld = withheld || hide;
      if (hide) {
        nb.rows.push_back({formatThreshold(p->threshold), kComplementaryMark, kComplementaryMark,
                           kComplementaryMark});
        continue;
      }
      nb.rows.push_back(
          {formatThreshold(p->threshold), formatFixed(p->netBenefitFirst, 4),
           formatFixed(p->netBenefitSecond, 4),
           boot ? formatWithCi(p->difference, p->ci, 4) : formatFixed(p->difference, 4)});
    }
    if (nb.rows.empty()) continue;
    nb.note = (input.settings.reasonableThresholds
                   ? "Thresholds over the reasonable range set for this validation"
                   : "Thresholds of the threshold table (no reasonable range was set)") +
              std::string(pair.netBenefit.size() > nb.rows.size()
                              ? "; the CSV tables hold every threshold. "
                              : ". ") +
              (boot ? "Bootstrap: both models on each of " + bootstrapRunText(c.bootstrap) + "."
                    : "No bootstrap was run, so the differences have no intervals.");
    if (withheld) {
      nb.note += " s: withheld, a confusion count of one model at this threshold is below " +
                 std::to_string(plan.below()) + ".";
    }
    blocks.push_back(reportTable(nb));
  }
}

void addSubgroupSection(const UncertaintyResults& results, const DisclosurePlan& plan,
                        std::vector<ReportBlock>& blocks) {
  if (results.subgroups.empty()) return;
  blocks.push_back(reportHeading("Subgroups", 2));
  std::string intro =
      "Each level's measures are computed on that level's patients alone, exactly as validating "
      "that subset by itself would give (TRIPOD+AI asks for performance in relevant subgroups). "
      "A level with fewer than 100 events or non-events is too small to judge: its estimates are "
      "shown for completeness, not for conclusions.";
  if (plan.active()) {
    intro +=
        " With small-cell suppression, a level whose patients, events or non-events "
        "include a hidden count shows <" +
        std::to_string(plan.below()) + " or " + kComplementaryMark +
        " and its measures are withheld.";
  }
  blocks.push_back(reportParagraph(intro));
  for (std::size_t c = 0; c < results.subgroups.size(); ++c) {
    const SubgroupAnalysis& analysis = results.subgroups[c];
    ReportTable table;
    table.caption = std::string(kTablePrefix) + "Subgroups by '" + analysis.column + "'";
    table.header = {
        "Level", "n",      "Events", "AUC (95% CI)", "Calibration intercept", "Calibration slope",
        "O/E",   "Reading"};
    table.widths = {0.15, 0.07, 0.08, 0.14, 0.15, 0.14, 0.12, 0.15};
    table.align = {CellAlign::Left,  CellAlign::Right, CellAlign::Right, CellAlign::Right,
                   CellAlign::Right, CellAlign::Right, CellAlign::Right, CellAlign::Left};
    std::vector<std::string> notes;
    for (std::size_t l = 0; l < analysis.levels.size(); ++l) {
      const SubgroupResult& level = analysis.levels[l];
      std::vector<std::string> row{reportName(level.level), plan.levelN(c, l),
                                   plan.levelEvents(c, l)};
      if (plan.levelHidden(c, l)) {
        row.insert(row.end(),
                   {kWithheld, kWithheld, kWithheld, kWithheld, "withheld: small counts"});
        table.rows.push_back(row);
        continue;
      }
      for (const std::string& w : level.warnings)
        notes.push_back(reportName(level.level) + ": " + w);
      if (!level.metrics) {
        row.insert(row.end(), {"-", "-", "-", "-", "no measures"});
        table.rows.push_back(row);
        continue;
      }
      const ValidationResult& m = *level.metrics;
      const Calibration& cal = m.calibration;
      row.push_back(stacked(m.discrimination.auc, m.discrimination.aucCi, 3));
      row.push_back(stacked(cal.intercept, cal.interceptCi, 2));
      row.push_back(stacked(cal.slope, cal.slopeCi, 2));
      row.push_back(stacked(cal.oeRatio, cal.oeCi, 2));
      row.push_back(subgroupSizeText(level.tooSmall, true, level.events));
      table.rows.push_back(row);
    }
    for (std::size_t i = 0; i < notes.size(); ++i) {
      table.note += (i ? "; " : "") + notes[i];
    }
    if (!table.note.empty()) table.note = "Warnings: " + table.note + ".";
    blocks.push_back(reportTable(table));
  }
}

std::vector<std::string> uncertaintyWarnings(const UncertaintyResults& results,
                                             const DisclosurePlan& plan) {
  std::vector<std::string> warnings;
  if (results.bootstrap) {
    // Counts of replicates and band points, not of patients: nothing to suppress.
    for (const std::string& w : results.bootstrap->warnings) warnings.push_back("Bootstrap: " + w);
  }
  if (results.comparison) {
    for (const std::string& w : results.comparison->warnings) {
      // The comparison's patients are stated (suppressed) in its own section.
      if (w.rfind("compared on ", 0) == 0) continue;
      warnings.push_back("Comparison: " + suppressedText(w, plan));
    }
  }
  return warnings;
}

std::vector<ReportBlock> uncertaintyMethods(const UncertaintyResults& results) {
  std::vector<ReportBlock> blocks;
  const auto add = [&](const std::string& title, const std::string& text,
                       const std::string& source) {
    blocks.push_back(reportHeading(title, 2));
    blocks.push_back(reportParagraph(text + " Source: " + source));
  };
  add("Precision-based sample size",
      "For each measure the minimum sample size is the n at which its 95% confidence interval "
      "would have the target width: O/E from the standard error of ln(O/E), the calibration "
      "slope from the Fisher information of the calibration model over this cohort's linear "
      "predictor, the C statistic from Newcombe's form of its variance, the standardized net "
      "benefit by the delta method at the observed sensitivity and specificity. The rules of "
      "thumb are stated beside them.",
      "Riley et al., Stat Med 2021;40:4230-51; Newcombe, Stat Med 2006;25:543-57; Vergouwe et "
      "al., J Clin Epidemiol 2005; Collins, Ogundimu & Altman, Stat Med 2016.");
  if (results.bootstrap) {
    add("Bootstrap percentile intervals and bands",
        "Patients are resampled with replacement; every resample recomputes every measure with "
        "the same validation as the point estimates, and the 2.5th and 97.5th percentiles (type "
        "7 quantiles) of the replicates form the 95% interval. Bands do the same for the net "
        "benefit at every threshold and for the smoothed calibration curve at fixed risks. Each "
        "replicate draws from its own seeded generator, so the same seed gives the same intervals "
        "for any number of threads; a resample with one outcome class fails and is counted, not "
        "replaced.",
        "Efron, Ann Stat 1979;7:1-26; Efron & Tibshirani, An Introduction to the Bootstrap, 1993; "
        "Hyndman & Fan, Am Stat 1996;50:361-5; Steele, Lea & Flood, OOPSLA 2014 (SplitMix64).");
  }
  if (results.comparison) {
    add("Comparing models on the same patients",
        "The AUCs of the models are compared with DeLong's paired test: the covariance of the "
        "AUCs comes from the placement values of each model on the same events and non-events, "
        "and z is the difference over its standard error. The net-benefit difference at each "
        "threshold gets a percentile bootstrap interval from resampling patients, both models on "
        "the same resample so the pairing is kept.",
        "DeLong, DeLong & Clarke-Pearson, Biometrics 1988;44:837-45; Sun & Xu, IEEE Signal "
        "Processing Letters 2014;21:1389-93; Vickers & Elkin, Med Decis Making 2006;26:565-74.");
  }
  if (!results.subgroups.empty()) {
    add("Subgroups",
        "Every measure is computed on each level's patients alone with the same methods as for "
        "the whole cohort; patients with a missing value form their own level, so none is "
        "dropped.",
        "Collins et al. (TRIPOD+AI), BMJ 2024;385:e078378.");
  }
  return blocks;
}

void addUncertaintyChartData(const AuditReportInput& input, AuditDocument& doc) {
  if (!input.uncertainty) return;
  const UncertaintyResults& u = *input.uncertainty;
  if (u.bootstrap) {
    doc.calibrationBand = u.bootstrap->calibrationCurve;
    // A band point where the chart left out the model's point (small counts) is left out too.
    for (const BandPoint& p : u.bootstrap->netBenefit) {
      const bool kept = std::any_of(
          doc.chartData.decisionCurve.begin(), doc.chartData.decisionCurve.end(),
          [&](const DecisionCurvePoint& d) { return std::abs(d.threshold - p.x) < 1e-12; });
      if (kept) doc.netBenefitBand.push_back(p);
    }
  }
  if (!u.comparison) return;
  const std::vector<std::string> names = modelNames(input);
  for (std::size_t m = 1; m < u.comparedResults.size() && m < names.size(); ++m) {
    const ValidationResult& result = u.comparedResults[m];
    ExclusionReport none;
    none.rowsRead = none.rowsAnalysed = result.cohort.n;
    const DisclosurePlan plan(result, none, {}, doc.suppressBelow);
    doc.comparisons.push_back({names[m], plan.chartData(result)});
  }
}

}  // namespace calivera
