#include "ui/models/result_tables.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "core/present/number_text.h"
#include "core/util/shown_text.h"
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
  // The one wording of core/present/number_text.h ("LO to HI"; "not defined" once for none).
  return {QString::fromStdString(formatRange(ci.lo, ci.hi, decimals)),
          std::isnan(ci.lo) ? -std::numeric_limits<double>::infinity() : ci.lo};
}
TableCell text(const QString& s, std::size_t shownChars) {
  // Names from files (levels, model names) are shown with invisible and bidirectional controls
  // written out and cut, so one long name cannot widen the table; the tooltip holds them whole.
  const std::string raw = s.toStdString();
  const QString shown = QString::fromStdString(visibleName(raw, shownChars));
  const QString full = QString::fromStdString(visibleName(raw, 4096));
  return {shown, 0.0, true, shown == full ? QString() : full};
}

}  // namespace cells

using cells::count;
using cells::interval;
using cells::number;

void showResultTable(RecordTableModel& model, ResultTable table) {
  std::vector<std::size_t> order = table.shownOrder;
  if (order.empty()) {
    for (std::size_t k = 0; k < table.columns.size(); ++k) order.push_back(k);
  }
  QStringList headers;
  QStringList tips;
  for (const std::size_t k : order) {
    headers << QString::fromStdString(table.columns[k].label);
    tips << QString::fromStdString(table.columns[k].tip);
  }
  std::vector<std::vector<TableCell>> rows;
  rows.reserve(table.rows.size());
  for (const auto& values : table.rows) {
    std::vector<TableCell> row;
    row.reserve(order.size());
    for (const std::size_t k : order) {
      const TableColumn& c = table.columns[k];
      const TableValue& v = values[k];
      switch (c.kind) {
        case TableColumnKind::Number:
          row.push_back(number(v.number, c.decimals));
          break;
        case TableColumnKind::Count:
          row.push_back(count(static_cast<std::size_t>(v.number)));
          break;
        case TableColumnKind::Interval:
          row.push_back(interval(v.interval, c.decimals));
          break;
        case TableColumnKind::Text:
          row.push_back(cells::text(QString::fromStdString(v.text),
                                    c.shownChars > 0 ? c.shownChars : cells::kShownNameChars));
          break;
        case TableColumnKind::PValue: {
          TableCell p = number(v.number, c.decimals);
          if (!std::isnan(v.number)) p.text = QString::fromStdString(formatPValue(v.number));
          row.push_back(std::move(p));
          break;
        }
      }
    }
    rows.push_back(std::move(row));
  }
  model.setTable(std::move(headers), std::move(tips), std::move(rows));
  model.setSource(std::move(table));
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
