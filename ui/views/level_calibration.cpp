#include "ui/views/level_calibration.h"

#include <QItemSelectionModel>
#include <QSignalBlocker>
#include <QSortFilterProxyModel>
#include <QTableView>
#include <cassert>

#include "core/util/shown_text.h"
#include "render/charts/calibration_chart.h"
#include "render/charts/overlay_series.h"

namespace calivera::ui {

charts::CalibrationChart* levelCalibrationChart(const std::vector<SubgroupResult>& levels,
                                                std::size_t selected, const QString& titlePrefix) {
  assert(selected < levels.size() && levels[selected].metrics);
  const SubgroupResult& r = levels[selected];
  auto* chart = new charts::CalibrationChart(r.metrics->calibration, r.metrics->distribution);
  chart->setTitle(QStringLiteral("%1: %2").arg(titlePrefix, chart->title()));
  if (r.bootstrap) chart->setCurveBand(r.bootstrap->calibrationCurve);
  std::size_t overlays = 0;
  for (std::size_t i = 0; i < levels.size() && overlays < charts::kComparisonStyles; ++i) {
    if (i == selected || !levels[i].metrics) continue;
    chart->addComparison(QString::fromStdString(visibleName(levels[i].level, 40)),
                         levels[i].metrics->calibration);
    ++overlays;
  }
  return chart;
}

void selectSourceRow(QTableView* view, QSortFilterProxyModel* proxy, int row) {
  if (row < 0) return;
  const QModelIndex at = proxy->mapFromSource(proxy->sourceModel()->index(row, 0));
  if (view->selectionModel()->currentIndex().row() != at.row()) {
    const QSignalBlocker block(view->selectionModel());
    view->selectionModel()->setCurrentIndex(
        at, QItemSelectionModel::ClearAndSelect | QItemSelectionModel::Rows);
  }
}

}  // namespace calivera::ui
