#include "core/report/audit_sites.h"

#include <cmath>

#include "core/present/number_text.h"
#include "core/report/audit_blocks.h"
#include "core/report/audit_format.h"
#include "core/report/site_forest.h"
#include "core/report/site_tables.h"
#include "core/util/shown_text.h"

namespace calivera {
namespace {

constexpr double kZ = 1.959963984540054;

std::string withCi(double value, const Interval& ci, int decimals) {
  if (!std::isfinite(value)) return "-";
  return formatNumber(value, decimals) + " (" + formatRange(ci.lo, ci.hi, decimals) + ")";
}

std::string withSe(double value, double se, int decimals) {
  if (!std::isfinite(value)) return "-";
  return withCi(value, {value - kZ * se, value + kZ * se}, decimals);
}

ReportBlock forestBlock(ForestPlot plot) {
  ReportBlock block;
  block.kind = ReportBlock::Kind::Forest;
  block.forest = std::move(plot);
  return block;
}

bool anySmallSite(const SiteAnalysis& analysis, std::size_t below) {
  if (below == 0) return false;
  for (const SiteMeasures& s : analysis.sites) {
    const std::size_t nonEvents = s.n - s.events;
    if ((s.events > 0 && s.events < below) || (nonEvents > 0 && nonEvents < below)) return true;
  }
  return false;
}

}  // namespace

void addSiteSection(const SiteAnalysis& analysis, std::size_t suppressBelow,
                    std::vector<ReportBlock>& blocks) {
  blocks.push_back(reportHeading("Validation across sites", 2));
  blocks.push_back(reportParagraph(
      "Each site is validated on its own patients; each measure is then pooled across sites by "
      "random-effects meta-analysis on the scale where it is closest to normal (logit of the "
      "c-statistic, log of O/E, calibration intercept and slope as they are): REML between-site "
      "variance \u03c4\u00b2, a Hartung-Knapp-Sidik-Jonkman 95% confidence interval that is never "
      "narrower than the plain one, I\u00b2, and a 95% prediction interval for the value expected "
      "at a new site similar to these (t on k\u22122 df; needs three sites). The prediction "
      "interval, "
      "not the confidence interval, says how the model may perform in the next hospital. A site "
      "that cannot give a measure is listed with the reason and left out of that measure only."));
  const bool withhold = anySmallSite(analysis, suppressBelow);
  ReportTable sites;
  sites.caption = std::string(kTablePrefix) + "Sites, each validated alone";
  sites.header = {"Site",
                  "n",
                  "Events",
                  "AUC (95% CI)",
                  "O/E",
                  "Calibration intercept (95% CI)",
                  "Calibration slope (95% CI)"};
  sites.widths = {0.12, 0.08, 0.08, 0.2, 0.08, 0.22, 0.22};
  sites.align = {CellAlign::Left,  CellAlign::Right, CellAlign::Right, CellAlign::Right,
                 CellAlign::Right, CellAlign::Right, CellAlign::Right};
  std::vector<std::string> notes;
  for (const SiteMeasures& s : analysis.sites) {
    const std::string n = withhold ? "withheld" : std::to_string(s.n);
    const std::string events = withhold ? "withheld" : std::to_string(s.events);
    sites.rows.push_back({reportName(s.name), n, events, withCi(s.auc, s.aucCi, 3),
                          s.hasMetrics ? formatNumber(s.oeRatio, 3) : "-",
                          withSe(s.intercept, s.interceptSe, 2), withSe(s.slope, s.slopeSe, 2)});
    if (s.missingLevel) notes.push_back(reportName(s.name) + ": no site value, never pooled");
    if (!s.hasMetrics) notes.push_back(reportName(s.name) + ": " + s.noMetricsReason);
  }
  if (withhold) {
    notes.push_back("patient and event counts withheld: a site has fewer than " +
                    std::to_string(suppressBelow) + " events or non-events");
  }
  for (std::size_t i = 0; i < notes.size(); ++i) sites.note += (i ? "; " : "") + notes[i];
  if (!sites.note.empty()) sites.note += ".";
  blocks.push_back(reportTable(sites));

  ReportTable pooled;
  pooled.caption = std::string(kTablePrefix) + "Pooled across sites (random effects)";
  pooled.header = {"Measure",      "Sites",   "Pooled (95% CI)",      "95% prediction interval",
                   "\u03c4\u00b2", "I\u00b2", "Fixed effect (95% CI)"};
  pooled.widths = {0.18, 0.07, 0.2, 0.17, 0.09, 0.08, 0.21};
  pooled.align = {CellAlign::Left,  CellAlign::Right, CellAlign::Right, CellAlign::Right,
                  CellAlign::Right, CellAlign::Right, CellAlign::Right};
  for (const PooledMeasure& m : analysis.measures) {
    if (!m.pooled.pool) {
      pooled.rows.push_back({m.label, "0", "not pooled: " + m.pooled.problem, "-", "-", "-", "-"});
      continue;
    }
    const RandomEffectsPool& p = *m.pooled.pool;
    const auto natural = [&](double v) { return toNaturalScale(m.scale, v); };
    const int decimals = m.key == "c_statistic" ? 3 : 2;
    pooled.rows.push_back(
        {m.label, std::to_string(p.k),
         withCi(natural(p.estimate), {natural(p.ci.lo), natural(p.ci.hi)}, decimals),
         p.predictionInterval ? formatRange(natural(p.predictionInterval->lo),
                                            natural(p.predictionInterval->hi), decimals)
                              : "needs 3 sites",
         formatNumber(p.tau2, 4), formatNumber(100.0 * p.i2, 0) + "%",
         withCi(natural(p.fixedEstimate), {natural(p.fixedCi.lo), natural(p.fixedCi.hi)},
                decimals)});
  }
  pooled.note =
      "\u03c4\u00b2 is on the pooling scale (logit for the c-statistic, log for O/E). Estimates "
      "and "
      "intervals are shown on the measure's own scale.";
  blocks.push_back(reportTable(pooled));
  for (ForestPlot& plot : forestPlots(analysis)) blocks.push_back(forestBlock(std::move(plot)));
  ReportBlock curves;
  curves.kind = ReportBlock::Kind::SiteCurves;
  curves.siteCurves = siteCurvesPlot(analysis);
  blocks.push_back(std::move(curves));

  if (!analysis.netBenefit.empty()) {
    ReportTable nb;
    nb.caption = std::string(kTablePrefix) + "Net benefit across sites";
    nb.header = {"Threshold",
                 "All patients' counts",
                 "Random-effects mean (95% CI)",
                 "95% prediction interval",
                 "I\u00b2",
                 "Sites left out"};
    nb.widths = {0.1, 0.15, 0.25, 0.18, 0.07, 0.25};
    nb.align = {CellAlign::Right, CellAlign::Right, CellAlign::Right,
                CellAlign::Right, CellAlign::Right, CellAlign::Left};
    for (const PooledNetBenefit& row : analysis.netBenefit) {
      std::string left;
      for (const SiteExclusion& e : row.excluded)
        left += (left.empty() ? "" : "; ") + reportName(e.site);
      const RandomEffectsPool* p = row.pooled.pool ? &*row.pooled.pool : nullptr;
      nb.rows.push_back({formatThreshold(row.threshold),
                         row.byCounts ? formatNumber(*row.byCounts, 4) : "withheld",
                         p ? withCi(p->estimate, p->ci, 4) : "not pooled",
                         p && p->predictionInterval
                             ? formatRange(p->predictionInterval->lo, p->predictionInterval->hi, 4)
                             : "-",
                         p ? formatNumber(100.0 * p->i2, 0) + "%" : "-",
                         left.empty() ? "none" : left});
    }
    nb.note =
        "All patients' counts: every site's true and false positives summed, the net benefit of "
        "the patients together. Withheld where a site withheld its counts.";
    blocks.push_back(reportTable(nb));
  }
  blocks.push_back(reportParagraph(
      "Reading: pooled estimates and prediction intervals are evidence about how the model "
      "performed at these sites and may perform at similar ones; they are not an approval to use "
      "the model at any site."));
}

AuditDocument buildPooledSitesDocument(const PooledSummaries& pooled, const std::string& title,
                                       const std::string& createdAt) {
  AuditDocument doc;
  doc.title = title.empty() ? "Validation across sites: pooled site summaries" : title;
  doc.subtitle = "Created " + createdAt + " with Calivera " + CALIVERA_VERSION;
  doc.caution = auditCautionText();
  const SiteSummary& first = pooled.inputs.front().summary;
  doc.footer = {"Model: " + (first.modelKind == "model file"
                                 ? reportName(first.modelName) + ", SHA-256 " + first.modelSha256
                                 : "risk column " + reportName(first.riskColumn)),
                std::to_string(pooled.inputs.size()) + " site summaries pooled"};
  std::vector<ReportBlock>& blocks = doc.blocks;
  ReportBlock caution;
  caution.kind = ReportBlock::Kind::Caution;
  caution.text = doc.caution;
  blocks.push_back(caution);
  blocks.push_back(reportHeading("1  What was pooled"));
  blocks.push_back(reportParagraph(
      "Each site ran calivera summarize on its own patients and sent only aggregates. Every "
      "summary was checked against its content fingerprint and for the same model and settings "
      "before pooling."));
  ReportTable inputs;
  inputs.caption = std::string(kTablePrefix) + "Site summaries";
  inputs.header = {"Site", "File", "File SHA-256", "Suppression", "Calivera"};
  inputs.widths = {0.13, 0.19, 0.42, 0.14, 0.12};
  inputs.align = {CellAlign::Left, CellAlign::Left, CellAlign::Left, CellAlign::Left,
                  CellAlign::Left};
  for (const SummaryFile& f : pooled.inputs) {
    inputs.rows.push_back(
        {reportName(f.summary.measures.name), reportName(fileNameOnly(f.path)), f.sha256,
         f.summary.suppressBelow > 0 ? "below " + std::to_string(f.summary.suppressBelow) : "none",
         reportName(f.summary.softwareVersion)});
  }
  blocks.push_back(reportTable(inputs));
  blocks.push_back(reportParagraph(pooledOverallText(pooled)));
  for (const std::string& w : pooled.warnings)
    blocks.push_back(reportParagraph("- " + shownText(w, 600)));
  blocks.push_back(reportHeading("2  Results"));
  std::size_t suppressBelow = 0;
  for (const SummaryFile& f : pooled.inputs) {
    suppressBelow = std::max(suppressBelow, f.summary.suppressBelow);
  }
  addSiteSection(pooled.analysis, suppressBelow, blocks);
  numberTables(blocks);
  return doc;
}

}  // namespace calivera
