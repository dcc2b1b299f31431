#include "core/report/site_tables.h"

#include <cmath>
#include <filesystem>
#include <limits>

#include "core/present/number_text.h"

namespace calivera {
namespace {

using table_columns::count;
using table_columns::interval;
using table_columns::number;
using table_columns::pValue;
using table_columns::text;

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
const Interval kNoInterval{kNaN, kNaN};

// The pooled columns shared by the measure and the net-benefit tables, in their order.
void addPoolValues(std::vector<TableValue>& row, PoolingScale scale,
                   const RandomEffectsOutcome& outcome) {
  if (!outcome.pool) {
    row.insert(row.end(),
               {TableValue::ofCount(0), TableValue::of(kNaN), TableValue::of(kNoInterval),
                TableValue::of(kNoInterval), TableValue::of(kNaN), TableValue::of(kNaN),
                TableValue::of(kNaN), TableValue::of(kNoInterval), TableValue::of(kNaN),
                TableValue::of(kNaN)});
    return;
  }
  const RandomEffectsPool& p = *outcome.pool;
  row.insert(row.end(),
             {TableValue::ofCount(p.k), TableValue::of(toNaturalScale(scale, p.estimate)),
              TableValue::of(toNaturalScale(scale, p.ci)),
              TableValue::of(p.predictionInterval ? toNaturalScale(scale, *p.predictionInterval)
                                                  : kNoInterval),
              TableValue::of(p.tau2), TableValue::of(p.i2),
              TableValue::of(toNaturalScale(scale, p.fixedEstimate)),
              TableValue::of(toNaturalScale(scale, p.fixedCi)), TableValue::of(p.q),
              TableValue::of(p.qPValue)});
}

std::vector<TableColumn> poolColumns() {
  return {count("k", "Sites pooled"),
          number("estimate", "Pooled", 3, "Random effects (REML), back-transformed"),
          interval("ci_lo", "ci_hi", "95% CI", 3,
                   "Hartung-Knapp-Sidik-Jonkman, never narrower than the plain interval"),
          interval("prediction_lo", "prediction_hi", "95% prediction interval", 3,
                   "Where a new site's value is expected: t on k-2 df (needs 3 sites)"),
          number("tau2", "tau\u00b2", 4, "Between-site variance on the pooling scale"),
          number("i2", "I\u00b2", 3, "Share of variability due to between-site differences"),
          number("fixed_estimate", "Fixed effect", 3, "Inverse-variance common effect"),
          interval("fixed_ci_lo", "fixed_ci_hi", "Fixed-effect 95% CI", 3),
          number("cochran_q", "Q", 3, "Cochran's Q on k-1 df"),
          pValue("cochran_q_p", "Q p-value")};
}

}  // namespace

std::string exclusionText(const std::vector<SiteExclusion>& excluded) {
  std::string text;
  for (const SiteExclusion& e : excluded) {
    text += (text.empty() ? "" : "; ") + e.site + ": " + e.reason;
  }
  return text;
}

ResultTable sitesTable(const SiteAnalysis& analysis) {
  ResultTable t;
  t.fileName = "sites.csv";
  t.columns = {text("site", "Site"),  // 0
               count("n", "Patients"),
               count("events", "Events"),
               number("auc", "AUC", 3, "The site validated on its own"),
               interval("auc_ci_lo", "auc_ci_hi", "AUC 95% CI", 3, "DeLong, on the logit scale"),
               number("auc_se", "AUC SE", 4, "DeLong"),  // 5
               number("oe_ratio", "O/E", 3, "Observed / expected events; target 1"),
               number("log_oe_se", "SE of log O/E", 4, "sqrt(1/O - 1/n)"),
               number("calibration_intercept", "Cal. intercept", 3, "Target 0"),
               number("calibration_intercept_se", "Intercept SE", 4),
               number("calibration_slope", "Cal. slope", 3, "Target 1"),  // 10
               number("calibration_slope_se", "Slope SE", 4),
               number("brier", "Brier", 4),
               text("notes", "Notes", "Why a site has no metrics, and its warnings")};
  t.shownOrder = {0, 1, 2, 3, 4, 6, 8, 10, 12, 13};
  for (const SiteMeasures& site : analysis.sites) {
    std::string notes = site.missingLevel ? "patients with no site value: shown, never pooled" : "";
    if (!site.hasMetrics) notes += (notes.empty() ? "" : "; ") + site.noMetricsReason;
    for (const std::string& w : site.warnings) notes += (notes.empty() ? "" : "; ") + w;
    t.rows.push_back(
        {TableValue::of(site.name), TableValue::ofCount(site.n), TableValue::ofCount(site.events),
         TableValue::of(site.auc), TableValue::of(site.aucCi), TableValue::of(site.aucSe),
         TableValue::of(site.oeRatio), TableValue::of(site.hasMetrics ? site.logOeSe() : kNaN),
         TableValue::of(site.intercept), TableValue::of(site.interceptSe),
         TableValue::of(site.slope), TableValue::of(site.slopeSe), TableValue::of(site.brier),
         TableValue::of(notes)});
  }
  return t;
}

ResultTable pooledSitesTable(const SiteAnalysis& analysis) {
  ResultTable t;
  t.fileName = "sites_pooled.csv";
  t.columns = {text("measure", "Measure"),
               text("scale", "Pooled on", "logit, log or identity; estimates shown as measured")};
  for (TableColumn& c : poolColumns()) t.columns.push_back(std::move(c));
  t.columns.push_back(text("left_out", "Sites left out", "With the reason for each"));
  t.columns.push_back(text("problem", "Problem", "Why there is no pooled value"));
  // The screen and the summary leave out the fixed-effect interval and Q; the CSV keeps them.
  t.shownOrder = {0, 1, 2, 3, 4, 5, 6, 7, 8, 12, 13};
  for (const PooledMeasure& m : analysis.measures) {
    std::vector<TableValue> row{TableValue::of(m.label),
                                TableValue::of(std::string(poolingScaleName(m.scale)))};
    addPoolValues(row, m.scale, m.pooled);
    row.push_back(TableValue::of(exclusionText(m.excluded)));
    row.push_back(TableValue::of(m.pooled.problem));
    t.rows.push_back(std::move(row));
  }
  return t;
}

ResultTable pooledNetBenefitTable(const SiteAnalysis& analysis) {
  ResultTable t;
  t.fileName = "sites_net_benefit.csv";
  t.columns = {number("threshold", "Threshold", 3),
               count("patients", "Patients", "Every site's patients together"),
               count("true_positives", "True positives"),
               count("false_positives", "False positives"),
               number("net_benefit_by_counts", "Net benefit (all patients)", 4,
                      "From the summed counts of every site")};
  for (TableColumn& c : poolColumns()) t.columns.push_back(std::move(c));
  t.columns.push_back(text("left_out", "Sites left out", "With the reason for each"));
  t.shownOrder = {0, 4, 5, 6, 7, 8, 10, 15};
  for (const PooledNetBenefit& nb : analysis.netBenefit) {
    std::vector<TableValue> row{
        TableValue::of(nb.threshold), TableValue::ofCount(nb.n),
        nb.byCounts ? TableValue::ofCount(nb.truePositives) : TableValue::of(kNaN),
        nb.byCounts ? TableValue::ofCount(nb.falsePositives) : TableValue::of(kNaN),
        TableValue::of(nb.byCounts.value_or(kNaN))};
    addPoolValues(row, PoolingScale::Identity, nb.pooled);
    row.push_back(TableValue::of(exclusionText(nb.excluded)));
    t.rows.push_back(std::move(row));
  }
  return t;
}

ResultTable summaryInputsTable(const PooledSummaries& pooled) {
  ResultTable t;
  t.fileName = "site_inputs.csv";
  t.columns = {text("site", "Site"),
               text("file", "File"),
               count("n", "Patients"),
               count("events", "Events"),
               text("suppression", "Small cells", "Counts below this were withheld by the site"),
               text("software_version", "Calivera", "The version that wrote the summary"),
               text("sha256", "File SHA-256", "Of the file's bytes as read", 64)};
  for (const SummaryFile& f : pooled.inputs) {
    const SiteSummary& s = f.summary;
    t.rows.push_back(
        {TableValue::of(s.measures.name),
         TableValue::of(std::filesystem::path(f.path).filename().string()),
         TableValue::ofCount(s.measures.n), TableValue::ofCount(s.measures.events),
         TableValue::of(s.suppressBelow > 0 ? "below " + std::to_string(s.suppressBelow)
                                            : std::string("none")),
         TableValue::of(s.softwareVersion), TableValue::of(f.sha256)});
  }
  return t;
}

std::string pooledOverallText(const PooledSummaries& pooled) {
  return "All sites' patients together: " + std::to_string(pooled.n) + " patients, " +
         std::to_string(pooled.events) + " events; O/E " + formatNumber(pooled.overallOe, 3) +
         "; Brier score " + formatNumber(pooled.overallBrier, 4) +
         "; AUC from the sites' histograms " + formatNumber(pooled.overallAuc.auc, 4) +
         ", the exact value lying within \u00b1" + formatNumber(pooled.overallAuc.errorBound, 4) +
         " of it.";
}

}  // namespace calivera
