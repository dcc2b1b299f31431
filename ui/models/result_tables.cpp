#include "ui/models/result_tables.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "render/charts/chart_text.h"

namespace calivera::ui {

namespace {

constexpr double kZ95 = 1.959963984540054;

}  // namespace

namespace cells {

TableCell number(double v, int decimals) {
  return {fixed(v, decimals), std::isnan(v) ? -std::numeric_limits<double>::infinity() : v};
}
TableCell count(std::size_t v) {
  return {QString::number(v), static_cast<double>(v)};
}
TableCell interval(const Interval& ci, int decimals) {
  return {QStringLiteral("%1 to %2").arg(fixed(ci.lo, decimals), fixed(ci.hi, decimals)), ci.lo};
}
TableCell text(const QString& s) {
  return {s, 0.0, true};
}

}  // namespace cells

using cells::count;
using cells::interval;
using cells::number;

void fillThresholdTable(RecordTableModel& model, const std::vector<ThresholdRow>& rows,
                        const std::vector<DecisionCurvePoint>& decisionCurve) {
  const QStringList headers = {QStringLiteral("Threshold"),
                               QStringLiteral("Flagged"),
                               QStringLiteral("TP"),
                               QStringLiteral("FP"),
                               QStringLiteral("TN"),
                               QStringLiteral("FN"),
                               QStringLiteral("Sensitivity"),
                               QStringLiteral("Sensitivity 95% CI"),
                               QStringLiteral("Specificity"),
                               QStringLiteral("Specificity 95% CI"),
                               QStringLiteral("PPV"),
                               QStringLiteral("PPV 95% CI"),
                               QStringLiteral("NPV"),
                               QStringLiteral("NPV 95% CI"),
                               QStringLiteral("Net benefit"),
                               QStringLiteral("Flagged per 1000"),
                               QStringLiteral("Events caught per 1000"),
                               QStringLiteral("Events missed per 1000"),
                               QStringLiteral("Flagged without event per 1000")};
  const QStringList tips = {
      QStringLiteral("Patients with predicted risk at or above this value are flagged"),
      QStringLiteral("Number of patients flagged"),
      QStringLiteral("True positives: flagged, with the event"),
      QStringLiteral("False positives: flagged, without the event"),
      QStringLiteral("True negatives: not flagged, without the event"),
      QStringLiteral("False negatives: not flagged, with the event"),
      QStringLiteral("Share of patients with the event who are flagged"),
      QStringLiteral("Wilson score 95% interval"),
      QStringLiteral("Share of patients without the event who are not flagged"),
      QStringLiteral("Wilson score 95% interval"),
      QStringLiteral("Positive predictive value: share of flagged patients with the event"),
      QStringLiteral("Wilson score 95% interval"),
      QStringLiteral("Negative predictive value: share of unflagged patients without the event"),
      QStringLiteral("Wilson score 95% interval"),
      QStringLiteral("Net benefit (Vickers & Elkin 2006): TP/n − FP/n × t/(1 − t)"),
      QString(),
      QString(),
      QString(),
      QString()};
  std::vector<std::vector<TableCell>> cells;
  cells.reserve(rows.size());
  for (std::size_t i = 0; i < rows.size(); ++i) {
    const ThresholdRow& r = rows[i];
    double nb = std::numeric_limits<double>::quiet_NaN();
    if (i < decisionCurve.size() && std::abs(decisionCurve[i].threshold - r.threshold) < 1e-12) {
      nb = decisionCurve[i].netBenefit;
    }
    cells.push_back({number(r.threshold, 3), count(r.tp + r.fp), count(r.tp), count(r.fp),
                     count(r.tn), count(r.fn), number(r.sensitivity, 3),
                     interval(r.sensitivityCi, 3), number(r.specificity, 3),
                     interval(r.specificityCi, 3), number(r.ppv, 3), interval(r.ppvCi, 3),
                     number(r.npv, 3), interval(r.npvCi, 3), number(nb, 4),
                     number(r.flaggedPer1000, 1), number(r.eventsCaughtPer1000, 1),
                     number(r.eventsMissedPer1000, 1), number(r.flaggedWithoutEventPer1000, 1)});
  }
  model.setTable(headers, tips, std::move(cells));
}

void fillHosmerLemeshowTable(RecordTableModel& model, const HosmerLemeshow& hl) {
  const QStringList headers = {
      QStringLiteral("Risk group"),          QStringLiteral("Patients"),
      QStringLiteral("Lowest risk"),         QStringLiteral("Highest risk"),
      QStringLiteral("Mean predicted risk"), QStringLiteral("Expected events"),
      QStringLiteral("Observed events"),     QStringLiteral("Observed proportion"),
      QStringLiteral("Observed 95% CI")};
  const QStringList tips = {QStringLiteral("Groups of patients by quantiles of predicted risk"),
                            QString(),
                            QString(),
                            QString(),
                            QString(),
                            QStringLiteral("Sum of predicted risks in the group"),
                            QString(),
                            QString(),
                            QStringLiteral("Wilson score 95% interval")};
  std::vector<std::vector<TableCell>> cells;
  for (std::size_t g = 0; g < hl.groups.size(); ++g) {
    const CalibrationGroup& c = hl.groups[g];
    cells.push_back({count(g + 1), count(c.n), number(c.riskLo, 4), number(c.riskHi, 4),
                     number(c.meanRisk, 4), number(c.expected, 2), count(c.observed),
                     number(c.observedProportion, 4), interval(c.observedCi, 4)});
  }
  model.setTable(headers, tips, std::move(cells));
}

void fillCoefficientTable(RecordTableModel& model, const Model& riskModel,
                          const std::vector<ProfileBounds>* profile) {
  QStringList headers = {QStringLiteral("Term"),         QStringLiteral("Coefficient"),
                         QStringLiteral("SE"),           QStringLiteral("95% CI lower"),
                         QStringLiteral("95% CI upper"), QStringLiteral("Odds ratio"),
                         QStringLiteral("Unit expected")};
  QStringList tips = {
      QString(),
      QStringLiteral("Log odds ratio per unit of the term"),
      QStringLiteral("Standard error, when the model file or the fit provides it"),
      QStringLiteral("Wald interval: coefficient − 1.96 SE"),
      QStringLiteral("Wald interval: coefficient + 1.96 SE"),
      QStringLiteral("exp(coefficient); not shown for spline parts and the intercept, where "
                     "a per-unit odds ratio has no reading of its own"),
      QStringLiteral("Unit the model expects, when stated")};
  auto row = [](const QString& name, const Estimate& e, const QString& unit, bool oddsRatio) {
    const double se = e.se.value_or(std::numeric_limits<double>::quiet_NaN());
    return std::vector<TableCell>{
        {name, 0.0},
        number(e.coefficient, 4),
        number(se, 4),
        number(e.coefficient - kZ95 * se, 4),
        number(e.coefficient + kZ95 * se, 4),
        oddsRatio ? number(std::exp(e.coefficient), 4) : cells::text(QStringLiteral("—")),
        {unit, 0.0}};
  };
  std::vector<std::vector<TableCell>> cells;
  cells.push_back(row(QStringLiteral("(intercept)"), riskModel.intercept, QString(), false));
  for (const Term& t : riskModel.terms) {
    cells.push_back(row(QString::fromStdString(t.name), t.estimate,
                        QString::fromStdString(t.unit.value_or("")),
                        t.kind != TransformKind::Spline));
  }
  if (profile != nullptr && profile->size() == cells.size()) {
    headers << QStringLiteral("Profile 95% lower") << QStringLiteral("Profile 95% upper");
    tips << QStringLiteral(
                "Profile-likelihood interval (Venzon & Moolgavkar 1988): the values "
                "whose constrained fit lies within 3.84 of the minimum deviance")
         << tips.back();
    for (std::size_t i = 0; i < cells.size(); ++i) {
      cells[i].push_back(number((*profile)[i].lo, 4));
      cells[i].push_back(number((*profile)[i].hi, 4));
    }
  }
  model.setTable(headers, tips, std::move(cells));
}

int nearestThresholdRow(const std::vector<ThresholdRow>& rows, double t) {
  if (rows.empty()) return -1;
  const auto it = std::lower_bound(rows.begin(), rows.end(), t,
                                   [](const ThresholdRow& r, double v) { return r.threshold < v; });
  if (it == rows.end()) return static_cast<int>(rows.size()) - 1;
  if (it != rows.begin() && t - std::prev(it)->threshold < it->threshold - t) {
    return static_cast<int>(it - rows.begin()) - 1;
  }
  return static_cast<int>(it - rows.begin());
}

}  // namespace calivera::ui
