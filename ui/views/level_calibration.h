#pragma once
// What the Subgroups and Sites views show when a row is chosen: the level's own calibration chart
// (with its bootstrap band when computed) and the other levels' smoothed curves overlaid, each in
// its own colour and dash pattern (render/charts/overlay_series.h), up to the overlay styles there
// are; and the table's current row kept in step without signalling again.

#include <QString>
#include <cstddef>
#include <vector>

#include "core/uncertainty/subgroups.h"

class QSortFilterProxyModel;
class QTableView;
class QAbstractItemModel;

namespace calivera::charts {
class CalibrationChart;
}

namespace calivera::ui {

// `levels[selected].metrics` must be present. The title is "`titlePrefix`: <chart title>".
charts::CalibrationChart* levelCalibrationChart(const std::vector<SubgroupResult>& levels,
                                                std::size_t selected, const QString& titlePrefix);

// Makes source row `row` the view's current row (through `proxy`) with its signals blocked.
void selectSourceRow(QTableView* view, QSortFilterProxyModel* proxy, int row);

}  // namespace calivera::ui
