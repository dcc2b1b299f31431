#include "ui/models/uncertainty_tables.h"

#include <cmath>
#include <filesystem>
#include <limits>

#include "core/present/number_text.h"
#include "core/present/wording.h"
#include "ui/models/result_tables.h"

namespace calivera::ui {

namespace {

using cells::count;
using cells::interval;
using cells::number;
using cells::text;

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

QString q(const std::string& s) {
  return QString::fromStdString(s);
}

QString pairName(const ModelComparison& c, std::size_t first, std::size_t second) {
  return QStringLiteral("%1 − %2").arg(q(c.models[first]), q(c.models[second]));
}

}  // namespace

void fillComparedModelsTable(RecordTableModel& model, const UncertaintyResults& results) {
  const QStringList headers = {QStringLiteral("Model"),
                               QStringLiteral("File"),
                               QStringLiteral("SHA-256"),
                               QStringLiteral("AUC"),
                               QStringLiteral("AUC 95% CI"),
                               QStringLiteral("Brier"),
                               QStringLiteral("Cal. intercept"),
                               QStringLiteral("Cal. slope"),
                               QStringLiteral("O/E")};
  const QStringList tips = {QString(),
                            QStringLiteral("File name only; the study's own model is listed first"),
                            QStringLiteral("First 16 hex digits of the file's SHA-256"),
                            QStringLiteral("On the patients complete for every compared model"),
                            QStringLiteral("DeLong, on the logit scale"),
                            QString(),
                            QString(),
                            QString(),
                            QStringLiteral("Observed / expected events")};
  std::vector<std::vector<TableCell>> rows;
  if (results.comparison) {
    const ModelComparison& c = *results.comparison;
    for (std::size_t m = 0; m < c.models.size(); ++m) {
      QString file = QStringLiteral("(the study's model)"), sha;
      if (m > 0 && m - 1 < results.comparedModels.size()) {
        const ComparedModelFile& f = results.comparedModels[m - 1];
        file = q(std::filesystem::path(f.path).filename().string());
        sha = q(f.sha256.substr(0, 16));
      }
      std::vector<TableCell> row{text(q(c.models[m])), text(file), text(sha), number(c.aucs[m], 3)};
      if (m < results.comparedResults.size()) {
        const ValidationResult& r = results.comparedResults[m];
        row.push_back(interval(r.discrimination.aucCi, 3));
        row.push_back(number(r.overall.brier, 4));
        row.push_back(number(r.calibration.intercept, 3));
        row.push_back(number(r.calibration.slope, 3));
        row.push_back(number(r.calibration.oeRatio, 3));
      } else {
        for (int k = 0; k < 5; ++k) row.push_back(number(kNaN, 3));
      }
      rows.push_back(std::move(row));
    }
  }
  model.setTable(headers, tips, std::move(rows));
}

void fillDelongTable(RecordTableModel& model, const ModelComparison& comparison) {
  const QStringList headers = {
      QStringLiteral("Pair"),       QStringLiteral("AUC first"), QStringLiteral("AUC second"),
      QStringLiteral("Difference"), QStringLiteral("95% CI"),    QStringLiteral("SE"),
      QStringLiteral("z"),          QStringLiteral("p"),         QStringLiteral("Correlation")};
  const QStringList tips = {
      QStringLiteral("First model − second model"),
      QString(),
      QString(),
      QStringLiteral("AUC first − AUC second"),
      QStringLiteral("Difference ± 1.96 SE (DeLong, DeLong & Clarke-Pearson 1988)"),
      QStringLiteral("Paired DeLong standard error of the difference"),
      QStringLiteral("Difference / SE"),
      QStringLiteral("Two-sided, normal distribution"),
      QStringLiteral("Correlation of the two AUC estimates on the same patients")};
  std::vector<std::vector<TableCell>> rows;
  for (const ModelPairComparison& pair : comparison.pairs) {
    const PairedAucTest& t = pair.auc;
    TableCell p = number(t.pValue, 3);
    p.text = QString::fromStdString(formatPValue(t.pValue));
    rows.push_back({text(pairName(comparison, t.first, t.second)), number(t.aucFirst, 3),
                    number(t.aucSecond, 3), number(t.difference, 4), interval(t.differenceCi, 4),
                    number(t.se, 4), number(t.z, 3), p, number(t.correlation, 3)});
  }
  model.setTable(headers, tips, std::move(rows));
}

void fillNetBenefitDifferenceTable(RecordTableModel& model, const ModelComparison& comparison,
                                   double lo, double hi) {
  const QStringList headers = {QStringLiteral("Pair"),
                               QStringLiteral("Threshold"),
                               QStringLiteral("Net benefit first"),
                               QStringLiteral("Net benefit second"),
                               QStringLiteral("Difference"),
                               QStringLiteral("Bootstrap 95% CI")};
  const QStringList tips = {QStringLiteral("First model − second model"),
                            QStringLiteral("Within the threshold range you chose as reasonable"),
                            QStringLiteral("Vickers & Elkin 2006: TP/n − FP/n × t/(1 − t)"),
                            QString(),
                            QStringLiteral("First − second"),
                            QStringLiteral("Percentile interval, both models on each resample")};
  std::vector<std::vector<TableCell>> rows;
  for (const ModelPairComparison& pair : comparison.pairs) {
    const QString name = pairName(comparison, pair.auc.first, pair.auc.second);
    for (const NetBenefitDifferencePoint& p : pair.netBenefit) {
      if (p.threshold < lo - 1e-12 || p.threshold > hi + 1e-12) continue;
      rows.push_back({text(name), number(p.threshold, 3), number(p.netBenefitFirst, 4),
                      number(p.netBenefitSecond, 4), number(p.difference, 4), interval(p.ci, 4)});
    }
  }
  model.setTable(headers, tips, std::move(rows));
}

void fillSubgroupTable(RecordTableModel& model, const SubgroupAnalysis& analysis) {
  bool boot = false;
  for (const SubgroupResult& level : analysis.levels) boot = boot || level.bootstrap.has_value();
  QStringList headers = {QStringLiteral("Level"),
                         QStringLiteral("Patients"),
                         QStringLiteral("Events"),
                         QStringLiteral("Prevalence"),
                         QStringLiteral("AUC"),
                         QStringLiteral("AUC 95% CI"),
                         QStringLiteral("Cal. intercept"),
                         QStringLiteral("Intercept 95% CI"),
                         QStringLiteral("Cal. slope"),
                         QStringLiteral("Slope 95% CI"),
                         QStringLiteral("O/E"),
                         QStringLiteral("O/E 95% CI"),
                         QStringLiteral("ICI")};
  QStringList tips = {QString(),
                      QString(),
                      QString(),
                      QStringLiteral("Observed event rate in the subgroup"),
                      QStringLiteral("The subgroup validated on its own"),
                      QStringLiteral("DeLong, on the logit scale"),
                      QStringLiteral("Target 0"),
                      QString(),
                      QStringLiteral("Target 1"),
                      QString(),
                      QStringLiteral("Observed / expected events; target 1"),
                      QString(),
                      QStringLiteral("Integrated calibration index (Austin & Steyerberg 2019)")};
  if (boot) {
    headers << QStringLiteral("AUC bootstrap CI") << QStringLiteral("Slope bootstrap CI");
    tips << QStringLiteral("Percentile 95%, resampling the subgroup's patients") << QString();
  }
  headers << QStringLiteral("Size") << QStringLiteral("Warnings");
  tips << QStringLiteral("Too few patients: fails a sample-size rule of thumb") << QString();
  std::vector<std::vector<TableCell>> rows;
  for (const SubgroupResult& level : analysis.levels) {
    const double prevalence =
        level.n > 0 ? static_cast<double>(level.events) / static_cast<double>(level.n) : kNaN;
    std::vector<TableCell> row{text(q(level.level)), count(level.n), count(level.events),
                               number(prevalence, 4)};
    if (level.metrics) {
      const Discrimination& d = level.metrics->discrimination;
      const Calibration& c = level.metrics->calibration;
      row.insert(row.end(), {number(d.auc, 3), interval(d.aucCi, 3), number(c.intercept, 3),
                             interval(c.interceptCi, 3), number(c.slope, 3), interval(c.slopeCi, 3),
                             number(c.oeRatio, 3), interval(c.oeCi, 3), number(c.ici, 4)});
    } else {
      for (int k = 0; k < 9; ++k) row.push_back(number(kNaN, 3));
    }
    if (boot) {
      if (level.bootstrap) {
        row.push_back(interval(level.bootstrap->auc.ci, 3));
        row.push_back(interval(level.bootstrap->calibrationSlope.ci, 3));
      } else {
        row.push_back(text(QString()));
        row.push_back(text(QString()));
      }
    }
    row.push_back(text(QString::fromUtf8(
        subgroupSizeText(level.tooSmall, level.metrics.has_value(), level.events))));
    QString warnings;
    for (const auto& w : level.warnings) {
      warnings += (warnings.isEmpty() ? QString() : QStringLiteral("; ")) + q(w);
    }
    row.push_back(text(warnings));
    rows.push_back(std::move(row));
  }
  model.setTable(headers, tips, std::move(rows));
}

}  // namespace calivera::ui
