#include "ui/views/sites_view.h"

#include <QGridLayout>
#include <QHBoxLayout>
#include <QItemSelectionModel>
#include <QLabel>
#include <QScrollArea>
#include <QSortFilterProxyModel>
#include <QTabWidget>
#include <QTableView>
#include <QVBoxLayout>

#include "core/report/site_forest.h"
#include "core/report/site_tables.h"
#include "core/util/shown_text.h"
#include "render/charts/calibration_chart.h"
#include "render/charts/overlay_series.h"
#include "ui/models/record_table_model.h"
#include "ui/models/result_tables.h"
#include "ui/views/chart_panel.h"
#include "ui/views/forest_widget.h"
#include "ui/views/result_table_view.h"

namespace calivera::ui {

SitesView::SitesView(QWidget* parent) : QWidget(parent) {
  setObjectName(QStringLiteral("sitesView"));
  auto* layout = new QVBoxLayout(this);
  note_ = new QLabel;
  note_->setObjectName(QStringLiteral("sitesNote"));
  note_->setWordWrap(true);
  note_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  layout->addWidget(note_);

  // Two pages: the tables with the selected site's calibration, and the forest plots (two per
  // row), so each has the whole width even on a 1366-pixel screen.
  auto* pages = new QTabWidget;
  pages->setObjectName(QStringLiteral("sitesPages"));
  auto* left = new QWidget;
  auto* leftLayout = new QVBoxLayout(left);
  sitesModel_ = new RecordTableModel(this);
  sitesModel_->setObjectName(QStringLiteral("sitesTableModel"));
  sitesTable_ = makeResultTableView(QStringLiteral("sitesTable"), sitesModel_, &sitesProxy_);
  sitesTable_->setSelectionMode(QAbstractItemView::SingleSelection);
  pooledModel_ = new RecordTableModel(this);
  pooledModel_->setObjectName(QStringLiteral("sitesPooledModel"));
  pooledTable_ =
      makeResultTableView(QStringLiteral("sitesPooledTable"), pooledModel_, &pooledProxy_);
  chart_ = new ChartPanel(QStringLiteral("siteCalibrationView"));
  leftLayout->addWidget(sitesTable_);
  leftLayout->addWidget(pooledTable_);
  leftLayout->addWidget(chart_, 1);
  pages->addTab(left, tr("Sites and pooled measures"));

  auto* scroll = new QScrollArea;
  scroll->setObjectName(QStringLiteral("forestScroll"));
  scroll->setWidgetResizable(true);
  auto* forestHost = new QWidget;
  forests_ = new QGridLayout(forestHost);
  scroll->setWidget(forestHost);
  pages->addTab(scroll, tr("Forest plots"));
  layout->addWidget(pages, 1);

  connect(sitesTable_->selectionModel(), &QItemSelectionModel::currentRowChanged, this,
          [this](const QModelIndex& current) {
            if (current.isValid()) showSite(sitesProxy_->mapToSource(current).row());
          });
  connect(chart_, &ChartPanel::thresholdPicked, this, &SitesView::thresholdPicked);
  setResults(nullptr);
}

void SitesView::setResults(const std::shared_ptr<const UncertaintyResults>& results) {
  results_ = results;
  while (QLayoutItem* item = forests_->takeAt(0)) {
    delete item->widget();
    delete item;
  }
  if (!results_ || !results_->sites) {
    sitesModel_->setTable({}, {}, {});
    pooledModel_->setTable({}, {}, {});
    chart_->setLinkedChart(nullptr);
    site_ = -1;
    note_->setText(
        tr("No sites yet. Analysis → Intervals, comparison and subgroups: choose the cohort "
           "column that names each patient's site to validate the model in every site and pool "
           "the results across sites."));
    return;
  }
  const SiteAnalysis& a = *results_->sites;
  showResultTable(*sitesModel_, sitesTable(a));
  capTableHeight(sitesTable_, 8);
  // Up to eight sites and the four measures show every row; the chart takes what is left.
  sitesTable_->setMinimumHeight(sitesTable_->maximumHeight());
  showResultTable(*pooledModel_, pooledSitesTable(a));
  capTableHeight(pooledTable_, 4);
  pooledTable_->setMinimumHeight(pooledTable_->maximumHeight());
  int index = 0;
  for (ForestPlot& plot : forestPlots(a)) {
    forests_->addWidget(new ForestWidget(std::move(plot)), index / 2, index % 2, Qt::AlignTop);
    ++index;
  }
  forests_->setRowStretch((index + 1) / 2, 1);
  note_->setText(
      tr("Each site (column %1) validated on its own patients (%2 sites), then pooled by "
         "random-effects meta-analysis: the prediction interval is where a new, similar site's "
         "value is expected. Evidence for local governance, not an approval. Select a site to "
         "see its calibration.")
          .arg(QString::fromStdString(visibleName(a.column, 60)).toHtmlEscaped())
          .arg(a.sites.size()));
  int first = -1;
  for (std::size_t i = 0; i < a.validations.size() && first < 0; ++i) {
    if (a.validations[i].metrics) first = static_cast<int>(i);
  }
  showSite(first);
}

void SitesView::showSite(int index) {
  site_ = -1;
  if (!results_ || !results_->sites || index < 0 ||
      index >= static_cast<int>(results_->sites->validations.size()) ||
      !results_->sites->validations[static_cast<std::size_t>(index)].metrics) {
    chart_->setLinkedChart(nullptr);
    return;
  }
  site_ = index;
  const std::vector<SubgroupResult>& all = results_->sites->validations;
  const SubgroupResult& r = all[static_cast<std::size_t>(index)];
  auto* chart = new charts::CalibrationChart(r.metrics->calibration, r.metrics->distribution);
  chart->setTitle(QStringLiteral("Site %1: %2")
                      .arg(QString::fromStdString(visibleName(r.level, 30)), chart->title()));
  std::size_t overlays = 0;
  for (std::size_t i = 0; i < all.size() && overlays < charts::kComparisonStyles; ++i) {
    if (static_cast<int>(i) == index || !all[i].metrics) continue;
    chart->addComparison(QString::fromStdString(visibleName(all[i].level, 40)),
                         all[i].metrics->calibration);
    ++overlays;
  }
  chart_->setLinkedChart(chart);
  if (snapshot_) chart->setThreshold(*snapshot_);
  const QModelIndex at = sitesProxy_->mapFromSource(sitesModel_->index(index, 0));
  if (sitesTable_->selectionModel()->currentIndex().row() != at.row()) {
    const QSignalBlocker block(sitesTable_->selectionModel());
    sitesTable_->selectionModel()->setCurrentIndex(
        at, QItemSelectionModel::ClearAndSelect | QItemSelectionModel::Rows);
  }
}

void SitesView::setThreshold(const ThresholdSnapshot& snapshot) {
  snapshot_ = snapshot;
  if (chart_->linkedChart() != nullptr) chart_->linkedChart()->setThreshold(snapshot);
}

}  // namespace calivera::ui
