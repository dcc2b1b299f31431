#include "ui/views/subgroup_view.h"

#include <QComboBox>
#include <QHBoxLayout>
#include <QItemSelectionModel>
#include <QLabel>
#include <QSortFilterProxyModel>
#include <QTableView>
#include <QVBoxLayout>

#include "core/report/uncertainty_result_tables.h"
#include "core/util/shown_text.h"
#include "render/charts/calibration_chart.h"
#include "ui/models/record_table_model.h"
#include "ui/models/result_tables.h"
#include "ui/views/chart_panel.h"
#include "ui/views/level_calibration.h"
#include "ui/views/result_table_view.h"

namespace calivera::ui {

SubgroupView::SubgroupView(QWidget* parent) : QWidget(parent) {
  setObjectName(QStringLiteral("subgroupView"));
  auto* layout = new QVBoxLayout(this);
  auto* top = new QHBoxLayout;
  auto* columnLabel = new QLabel(tr("Subgroups by:"));
  columnLabel->setObjectName(QStringLiteral("subgroupColumnLabel"));
  column_ = new QComboBox;
  column_->setObjectName(QStringLiteral("subgroupColumnCombo"));
  column_->setSizeAdjustPolicy(QComboBox::AdjustToContents);
  top->addWidget(columnLabel);
  top->addWidget(column_);
  top->addStretch(1);
  layout->addLayout(top);
  note_ = new QLabel;
  note_->setObjectName(QStringLiteral("subgroupNote"));
  note_->setWordWrap(true);
  note_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  layout->addWidget(note_);

  model_ = new RecordTableModel(this);
  model_->setObjectName(QStringLiteral("subgroupTableModel"));
  table_ = makeResultTableView(QStringLiteral("subgroupTable"), model_, &proxy_);
  table_->setSelectionMode(QAbstractItemView::SingleSelection);
  chart_ = new ChartPanel(QStringLiteral("subgroupCalibrationView"));
  layout->addWidget(table_);  // as tall as its rows (capTableHeight), the chart takes the rest
  layout->addWidget(chart_, 1);

  connect(column_, &QComboBox::currentIndexChanged, this, &SubgroupView::showColumn);
  connect(table_->selectionModel(), &QItemSelectionModel::currentRowChanged, this,
          [this](const QModelIndex& current) {
            if (current.isValid()) showLevel(proxy_->mapToSource(current).row());
          });
  connect(chart_, &ChartPanel::thresholdPicked, this, &SubgroupView::thresholdPicked);
  setResults(nullptr);
}

const SubgroupAnalysis* SubgroupView::analysis() const {
  const int c = column_->currentIndex();
  if (!results_ || c < 0 || c >= static_cast<int>(results_->subgroups.size())) return nullptr;
  return &results_->subgroups[static_cast<std::size_t>(c)];
}

int SubgroupView::currentColumn() const {
  return column_->currentIndex();
}

void SubgroupView::setResults(const std::shared_ptr<const UncertaintyResults>& results) {
  results_ = results;
  const QSignalBlocker block(column_);
  column_->clear();
  if (results_) {
    for (const SubgroupAnalysis& a : results_->subgroups) {
      column_->addItem(QString::fromStdString(visibleName(a.column, 40)));
      column_->setItemData(column_->count() - 1,
                           QString::fromStdString(visibleName(a.column, 4096)), Qt::ToolTipRole);
    }
  }
  column_->setEnabled(column_->count() > 0);
  showColumn(column_->count() > 0 ? 0 : -1);
}

void SubgroupView::showColumn(int column) {
  if (column != column_->currentIndex()) {
    const QSignalBlocker block(column_);
    column_->setCurrentIndex(column);
  }
  const SubgroupAnalysis* a = analysis();
  if (a == nullptr) {
    model_->setTable({}, {}, {});
    chart_->setLinkedChart(nullptr);
    level_ = -1;
    note_->setText(
        tr("No subgroups yet. Analysis → Intervals, comparison and subgroups: choose one or more "
           "cohort columns (site, sex, age band) to see the model's performance in each level."));
    return;
  }
  showResultTable(*model_, subgroupsTable({*a}));
  capTableHeight(table_, 8);
  int small = 0, first = -1;
  for (std::size_t i = 0; i < a->levels.size(); ++i) {
    if (a->levels[i].tooSmall) ++small;
    if (first < 0 && a->levels[i].metrics) first = static_cast<int>(i);
  }
  QString note = tr("Each level of %1 validated on its own patients (%2 levels).")
                     .arg(QString::fromStdString(visibleName(a->column, 60)).toHtmlEscaped())
                     .arg(a->levels.size());
  if (small > 0) {
    note += tr(" <span style='color:#a04000'><b>%1 of them too small to judge</b> (fewer than "
               "100 events or non-events): read their estimates with their intervals.</span>")
                .arg(small);
  }
  note += tr(" Select a row to see that level's calibration.");
  note_->setText(note);
  showLevel(first);
}

void SubgroupView::showLevel(int level) {
  const SubgroupAnalysis* a = analysis();
  level_ = -1;
  if (a == nullptr || level < 0 || level >= static_cast<int>(a->levels.size()) ||
      !a->levels[static_cast<std::size_t>(level)].metrics) {
    chart_->setLinkedChart(nullptr);
    return;
  }
  level_ = level;
  const SubgroupResult& r = a->levels[static_cast<std::size_t>(level)];
  auto* chart = levelCalibrationChart(
      a->levels, static_cast<std::size_t>(level),
      QStringLiteral("%1 = %2").arg(QString::fromStdString(visibleName(a->column, 30)),
                                    QString::fromStdString(visibleName(r.level, 30))));
  chart_->setLinkedChart(chart);
  if (snapshot_) chart->setThreshold(*snapshot_);
  selectSourceRow(table_, proxy_, level);
}

void SubgroupView::setThreshold(const ThresholdSnapshot& snapshot) {
  snapshot_ = snapshot;
  if (chart_->linkedChart() != nullptr) chart_->linkedChart()->setThreshold(snapshot);
}

}  // namespace calivera::ui
