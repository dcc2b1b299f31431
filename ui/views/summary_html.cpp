#include "ui/views/summary_html.h"

#include <QFileInfo>
#include <cmath>

#include "core/present/measures.h"
#include "core/present/readings.h"
#include "core/present/wording.h"
#include "core/study/study_analysis.h"
#include "render/charts/chart_text.h"

namespace calivera::ui {

namespace {

QString esc(const std::string& s) {
  return QString::fromStdString(s).toHtmlEscaped();
}

QString row(const QString& name, const QString& value, const QString& reading = {}) {
  return QStringLiteral(
             "<tr><td><b>%1</b></td><td style='padding-left:12px'>%2</td>"
             "<td style='padding-left:12px; color:#333'>%3</td></tr>")
      .arg(name, value, reading);
}

// One measure of the catalog (core/present/measures.h): its label, its estimate with the analytic
// interval, the percentile bootstrap interval under it when there is one, and `reading` (or the
// catalog's meaning and target).
QString measureRow(const char* key, const ValidationResult& r, const ValidationBootstrap* b,
                   const QString& reading = {}) {
  const Measure& m = measureByKey(key);
  QString value = esc(measureWithCiText(m, r));
  if (b != nullptr && m.bootstrap != nullptr) {
    value += QStringLiteral("<br><span style='color:#0b4f7a'>bootstrap %1</span>")
                 .arg(esc(measureBootstrapText(m, *b)));
  }
  QString said = reading;
  if (said.isEmpty()) {
    said = esc(m.meaning);
    if (*m.target != '\0') said = QStringLiteral("target %1; %2").arg(esc(m.target), said);
  }
  return row(esc(m.label), value, said);
}

// Several measures on one row, "a / b / c", with the bootstrap intervals of those that have one.
QString measuresRow(const QString& label, const std::vector<const char*>& keys,
                    const ValidationResult& r, const ValidationBootstrap* b,
                    const QString& reading) {
  QStringList values;
  QStringList boots;
  for (const char* key : keys) {
    const Measure& m = measureByKey(key);
    values << esc(measureText(m, r));
    if (b != nullptr && m.bootstrap != nullptr) {
      boots << QStringLiteral("%1 %2").arg(esc(m.label), esc(measureBootstrapText(m, *b)));
    }
  }
  QString value = values.join(QStringLiteral(" / "));
  if (!boots.isEmpty()) {
    value += QStringLiteral("<br><span style='color:#0b4f7a'>bootstrap %1</span>")
                 .arg(boots.join(QStringLiteral(", ")));
  }
  return row(label, value, reading);
}

QString metText(bool met) {
  return met ? QString::fromUtf8(sizeCriterionText(true))
             : QStringLiteral("<b style='color:#a04000'>%1</b>").arg(sizeCriterionText(false));
}

QString count(double v) {
  return std::isfinite(v) ? QString::number(v, 'f', 0) : QStringLiteral("not defined");
}

}  // namespace

QString sampleSizeHtml(const SampleSizeAssessment& s) {
  QString html = QStringLiteral("<h3>Is the cohort large enough to judge the model?</h3>");
  html += QStringLiteral("<p><b>%1</b></p>").arg(esc(s.verdict));
  html += QStringLiteral(
      "<table cellspacing='0' cellpadding='2'><tr><th align='left'>Check</th>"
      "<th align='left' style='padding-left:12px'>Needed</th>"
      "<th align='left' style='padding-left:12px'>Available</th>"
      "<th align='left' style='padding-left:12px'>95% CI width: target / achieved</th>"
      "<th align='left' style='padding-left:12px'>Result</th></tr>");
  const auto line = [](const QString& check, const QString& needed, const QString& available,
                       const QString& width, bool met) {
    return QStringLiteral(
               "<tr><td>%1</td><td style='padding-left:12px'>%2</td>"
               "<td style='padding-left:12px'>%3</td><td style='padding-left:12px'>%4</td>"
               "<td style='padding-left:12px'>%5</td></tr>")
        .arg(check, needed, available, width, metText(met));
  };
  const QString available =
      QStringLiteral("%1 events, %2 non-events").arg(s.events).arg(s.nonEvents);
  for (const RuleOfThumb& r : s.rules) {
    html +=
        line(QStringLiteral("Rule of thumb"), esc(r.rule), available, QStringLiteral("—"), r.met);
  }
  for (const SampleSizeCriterion& c : s.criteria) {
    const QString achieved =
        c.achievedCiWidth ? fixed(*c.achievedCiWidth, 3) : QStringLiteral("not estimated");
    html +=
        line(QStringLiteral("Riley size: %1").arg(esc(c.criterion)),
             QStringLiteral("n ≥ %1 (%2 events)").arg(count(c.requiredN), count(c.requiredEvents)),
             QStringLiteral("n = %1 (%2 events)").arg(s.n).arg(s.events),
             QStringLiteral("%1 / %2").arg(fixed(c.targetCiWidth, 3), achieved), c.met);
  }
  html += QStringLiteral("</table>");
  html += QStringLiteral(
      "<p style='color:#333'>Rules of thumb: 100 events and 100 non-events (Vergouwe et al. "
      "2005), 200 events for calibration (Collins, Ogundimu &amp; Altman 2016). Riley size: the "
      "n at which the 95% CI of the measure has the target width (Riley et al., Stat Med 2021), "
      "assuming this cohort's prevalence and linear-predictor distribution; the achieved width "
      "is that of the interval shown below.</p>");
  return html;
}

QString decisionCurveReading(const std::vector<DecisionCurvePoint>& curve, double lo, double hi) {
  int inRange = 0, better = 0;
  for (const auto& p : curve) {
    if (p.threshold < lo - 1e-12 || p.threshold > hi + 1e-12) continue;
    ++inRange;
    if (p.netBenefit > p.netBenefitTreatAll && p.netBenefit > 0) ++better;
  }
  if (inRange == 0) {
    return QStringLiteral("No threshold of the decision-curve grid lies in your range %1 to %2.")
        .arg(fixed(lo, 3), fixed(hi, 3));
  }
  return QStringLiteral(
             "Within your range of reasonable thresholds (%1 to %2) the model has a "
             "higher net benefit than both treating everyone and treating no one at "
             "%3 of %4 thresholds examined.")
      .arg(fixed(lo, 3), fixed(hi, 3))
      .arg(better)
      .arg(inRange);
}

QString summaryHtml(const StudyState& study) {
  QString html = QStringLiteral("<html><body style='font-size:10pt'>");
  html += QStringLiteral("<h3>Cohort</h3><table>");
  if (study.data) {
    html += row(study.data->database ? QStringLiteral("Source") : QStringLiteral("File"),
                QString::fromStdString(cohortShortLabel(*study.data)).toHtmlEscaped(),
                QStringLiteral("SHA-256 %1…").arg(esc(study.data->sha256.substr(0, 16))));
  }
  const ExclusionReport& ex = study.exclusions;
  if (ex.rowsRead > 0) {
    html += row(QStringLiteral("Rows read"), QString::number(ex.rowsRead));
    QString reasons;
    for (const auto& c : ex.byColumn) {
      if (c.rowsMissing == 0) continue;
      if (!reasons.isEmpty()) reasons += QStringLiteral("; ");
      reasons += QStringLiteral("%1 missing in %2").arg(c.rowsMissing).arg(esc(c.column));
    }
    html += row(QStringLiteral("Rows excluded"), QString::number(ex.rowsExcluded),
                reasons.isEmpty() ? QStringLiteral("no missing values in the columns used")
                                  : reasons + QStringLiteral(" (a row may miss several)"));
    html += row(QStringLiteral("Rows analysed"), QString::number(ex.rowsAnalysed));
    const ImputedValidation* imputed = study.run ? study.run->imputed.get() : nullptr;
    html += row(QStringLiteral("Missing values"),
                imputed == nullptr
                    ? QStringLiteral("complete cases only")
                    : QStringLiteral("complete cases here; pooled over %1 imputed copies in "
                                     "Tables → Missing data")
                          .arg(imputed->indices.size()),
                imputed == nullptr ? QStringLiteral("Analysis → Missing values and imputation…")
                                   : esc(imputed->method == "chained_equations"
                                             ? std::string("imputed here by chained equations")
                                             : "copies stacked in column " + imputed->column));
  }
  html += QStringLiteral("</table>");
  if (study.model) {
    html += QStringLiteral("<h3>Model</h3><table>");
    html += row(QStringLiteral("Name"), esc(study.model->name));
    html += row(QStringLiteral("Source"),
                study.modelSource == ModelSource::Fitted
                    ? QStringLiteral("fitted on this cohort (performance below is apparent)")
                    : QStringLiteral("model file"));
    html += row(QStringLiteral("Terms"), QString::number(study.model->terms.size()));
    html += QStringLiteral("</table>");
  }
  if (!study.result) {
    html += QStringLiteral("<p>Run the validation (Analysis → Run validation) to see results.</p>");
    return html + QStringLiteral("</body></html>");
  }
  const ValidationResult& r = *study.result;
  const UncertaintyResults* u = study.uncertainty.get();
  const ValidationBootstrap* b = (u != nullptr && u->bootstrap) ? &*u->bootstrap : nullptr;
  if (u != nullptr) html += sampleSizeHtml(u->sampleSize);

  std::vector<std::string> warnings = readingWarnings(r.cohort);
  warnings.insert(warnings.end(), study.modelWarnings.begin(), study.modelWarnings.end());
  warnings.insert(warnings.end(), r.warnings.begin(), r.warnings.end());
  if (b != nullptr) {
    for (const auto& w : b->warnings) warnings.push_back("Bootstrap: " + w);
  }
  if (!warnings.empty()) {
    html += QStringLiteral("<h3>Warnings</h3><ul>");
    for (const auto& w : warnings) html += QStringLiteral("<li>%1</li>").arg(esc(w));
    html += QStringLiteral("</ul>");
  }

  html += QStringLiteral("<h3>Patients</h3><table>");
  html += row(QStringLiteral("Analysed"), QString::number(r.cohort.n));
  html += row(QStringLiteral("Events"), QString::number(r.cohort.events),
              QStringLiteral("observed event rate %1").arg(fixed(r.cohort.prevalence, 4)));
  html += QStringLiteral("</table>");

  if (b != nullptr) {
    html += QStringLiteral(
                "<p style='color:#0b4f7a'><b>Bootstrap:</b> %1 resamples of the patients with "
                "replacement, seed %2, %3 threads; %4 failed replicates (a resample with one "
                "outcome class) left out. Percentile 95% intervals (Efron &amp; Tibshirani 1993) "
                "appear under the analytic ones.</p>")
                .arg(b->run.replicates)
                .arg(b->run.seed)
                .arg(b->run.threads)
                .arg(b->run.failed);
  }

  html += QStringLiteral("<h3>Discrimination</h3><table>");
  html += measureRow("auc", r, b, esc(readDiscrimination(r.discrimination)));
  html += row(QStringLiteral("DeLong SE"), fixed(r.discrimination.aucSe, 4),
              QStringLiteral("interval on the logit scale, so it stays within 0 and 1"));
  html += measureRow("discrimination_slope", r, b);
  html += QStringLiteral("</table>");

  const Calibration& c = r.calibration;
  const HierarchyReading hierarchy = readCalibrationHierarchy(c);
  html += QStringLiteral("<h3>Calibration</h3>");
  html += QStringLiteral("<p><b>Calibration hierarchy (Van Calster et al. 2016): %1.</b> %2</p>")
              .arg(esc(c.hierarchyLevel.empty() ? hierarchy.level : c.hierarchyLevel),
                   esc(hierarchy.explanation));
  html += QStringLiteral("<table>");
  html += measureRow("calibration_intercept", r, b);
  html += measureRow("calibration_slope", r, b);
  html += measureRow("oe_ratio", r, b);
  html += measuresRow(QStringLiteral("Spiegelhalter z / p"), {"spiegelhalter_z", "spiegelhalter_p"},
                      r, b, esc(measureByKey("spiegelhalter_z").meaning));
  html += measuresRow(QStringLiteral("ICI / E50 / E90 / Emax"), {"ici", "e50", "e90", "emax"}, r, b,
                      QStringLiteral("distance of the smoothed curve from the ideal line (Austin & "
                                     "Steyerberg 2019): mean, median, 90th percentile, maximum"));
  html += measuresRow(QStringLiteral("Hosmer-Lemeshow chi-square / df / p"),
                      {"hosmer_lemeshow_statistic", "hosmer_lemeshow_df", "hosmer_lemeshow_p"}, r,
                      b, esc(readHosmerLemeshow(r.hosmerLemeshow)));
  html += QStringLiteral("</table>");

  html += QStringLiteral("<h3>Overall accuracy</h3><table>");
  html += measureRow("brier", r, b);
  html += measureRow("brier_scaled", r, b);
  html += QStringLiteral("</table>");

  html += QStringLiteral("<h3>Clinical utility</h3><p>%1</p>")
              .arg(decisionCurveReading(r.decisionCurve, study.analysis.reasonableLo,
                                        study.analysis.reasonableHi));
  return html + QStringLiteral("</body></html>");
}

}  // namespace calivera::ui
