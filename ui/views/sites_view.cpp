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

#include "core/report/site_curves.h"
#include "core/report/site_forest.h"
#include "core/report/site_tables.h"
#include "core/util/shown_text.h"
#include "render/charts/calibration_chart.h"
#include "render/charts/decision_curve_chart.h"
#include "render/charts/roc_chart.h"
#include "ui/models/record_table_model.h"
#include "ui/models/result_tables.h"
#include "ui/views/chart_panel.h"
#include "ui/views/forest_widget.h"
#include "ui/views/level_calibration.h"
#include "ui/views/result_table_view.h"
#include "ui/views/site_curves_widget.h"

namespace calivera::ui {

SitesView::SitesView(QWidget* parent) : QWidget(parent) {
  setObjectName(QStringLiteral("sitesView"));
  auto* layout = new QVBoxLayout(this);
  note_ = new QLabel;
  note_->setObjectName(QStringLiteral("sitesNote"));
  note_->setTextFormat(Qt::PlainText);  // site column names come from files
  note_->setWordWrap(true);
  note_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  layout->addWidget(note_);

  // Per-site and pooled results on pages of their own: each site with the selected site's linked
  // views, then the pooled measures above their forest plots (two per row), so each has the whole
  // width and the charts their height even on a 1366 x 768 screen.
  auto* pages = pages_ = new QTabWidget;
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
  roc_ = new ChartPanel(QStringLiteral("siteRocView"));
  decision_ = new ChartPanel(QStringLiteral("siteDecisionCurveView"));
  siteCharts_ = new QTabWidget;
  siteCharts_->setObjectName(QStringLiteral("siteCharts"));
  siteCharts_->setDocumentMode(true);
  siteCharts_->addTab(chart_, tr("Calibration"));
  siteCharts_->addTab(roc_, tr("ROC curve"));
  siteCharts_->addTab(decision_, tr("Decision curve"));
  leftLayout->addWidget(sitesTable_);
  leftLayout->addWidget(siteCharts_, 1);
  pages->addTab(left, tr("Each site"));

  auto* pooledPage = new QWidget;
  auto* pooledLayout = new QVBoxLayout(pooledPage);
  pooledLayout->addWidget(pooledTable_);
  auto* scroll = new QScrollArea;
  scroll->setObjectName(QStringLiteral("forestScroll"));
  scroll->setWidgetResizable(true);
  auto* forestHost = new QWidget;
  forests_ = new QGridLayout(forestHost);
  scroll->setWidget(forestHost);
  pooledLayout->addWidget(scroll, 1);
  pages->addTab(pooledPage, tr("Pooled measures and forest plots"));
  allCurves_ = new SiteCurvesWidget;
  pages->addTab(allCurves_, tr("Calibration by site"));
  netBenefitModel_ = new RecordTableModel(this);
  netBenefitModel_->setObjectName(QStringLiteral("sitesNetBenefitModel"));
  pages->addTab(makeResultTableView(QStringLiteral("sitesNetBenefitTable"), netBenefitModel_,
                                    &netBenefitProxy_),
                tr("Net benefit across sites"));
  layout->addWidget(pages, 1);

  connect(sitesTable_->selectionModel(), &QItemSelectionModel::currentRowChanged, this,
          [this](const QModelIndex& current) {
            if (current.isValid()) showSite(sitesProxy_->mapToSource(current).row());
          });
  for (ChartPanel* panel : {chart_, roc_, decision_}) {
    connect(panel, &ChartPanel::thresholdPicked, this, &SitesView::thresholdPicked);
  }
  setResults(nullptr);
}

void SitesView::setResults(const std::shared_ptr<const UncertaintyResults>& results) {
  setAnalysis(results && results->sites
                  ? std::shared_ptr<const SiteAnalysis>(results, &*results->sites)
                  : nullptr,
              tr("No sites yet. Analysis → Intervals, comparison and subgroups: choose the cohort "
                 "column that names each patient's site to validate the model in every site and "
                 "pool the results across sites."));
}

void SitesView::setAnalysis(std::shared_ptr<const SiteAnalysis> analysis,
                            const QString& emptyNote) {
  analysis_ = std::move(analysis);
  while (QLayoutItem* item = forests_->takeAt(0)) {
    delete item->widget();
    delete item;
  }
  if (!analysis_) {
    sitesModel_->setTable({}, {}, {});
    pooledModel_->setTable({}, {}, {});
    netBenefitModel_->setTable({}, {}, {});
    for (ChartPanel* panel : {chart_, roc_, decision_}) panel->setLinkedChart(nullptr);
    allCurves_->setPlot({});
    site_ = -1;
    note_->setText(emptyNote);
    return;
  }
  const SiteAnalysis& a = *analysis_;
  showResultTable(*sitesModel_, sitesTable(a));
  // Up to eight sites and the four measures show every row; the chart takes what is left, and
  // with no chart (sites that sent summaries) the sites table does.
  capTableHeight(sitesTable_, 8);
  sitesTable_->setMinimumHeight(sitesTable_->maximumHeight());
  if (a.validations.empty()) sitesTable_->setMaximumHeight(QWIDGETSIZE_MAX);
  showResultTable(*pooledModel_, pooledSitesTable(a));
  capTableHeight(pooledTable_, 4);
  pooledTable_->setMinimumHeight(pooledTable_->maximumHeight());
  showResultTable(*netBenefitModel_, pooledNetBenefitTable(a));
  int index = 0;
  for (ForestPlot& plot : forestPlots(a)) {
    forests_->addWidget(new ForestWidget(std::move(plot)), index / 2, index % 2, Qt::AlignTop);
    ++index;
  }
  forests_->setRowStretch((index + 1) / 2, 1);
  allCurves_->setPlot(siteCurvesPlot(a));
  // Sites that sent summaries have no patient rows here, so no linked chart of their own: the
  // tables take the page, and a selected site is highlighted under "Calibration by site".
  const bool rows = !a.validations.empty();
  siteCharts_->setVisible(rows);
  const QString how = rows ? tr("Each site (column %1) validated on its own patients (%2 sites)")
                                 .arg(QString::fromStdString(visibleName(a.column, 60)))
                                 .arg(a.sites.size())
                           : tr("Each site validated on its own patients where they are, and "
                                "sent as a summary of aggregates (%1 sites)")
                                 .arg(a.sites.size());
  note_->setText(how + tr(", then pooled by random-effects meta-analysis: the prediction interval "
                          "is where a new, similar site's value is expected. Evidence for local "
                          "governance, not an approval. Select a site to see its calibration%1.")
                           .arg(rows ? QString() : tr(" under Calibration by site")));
  int first = -1;
  for (std::size_t i = 0; i < a.sites.size() && first < 0; ++i) {
    const bool has = rows ? i < a.validations.size() && a.validations[i].metrics.has_value()
                          : a.sites[i].hasMetrics && !a.sites[i].missingLevel;
    if (has) first = static_cast<int>(i);
  }
  showSite(first);
}

void SitesView::showSite(int index) {
  site_ = -1;
  const bool inRange = analysis_ && index >= 0 && index < static_cast<int>(analysis_->sites.size());
  allCurves_->highlightSite(inRange ? std::optional<std::size_t>(index) : std::nullopt);
  if (analysis_ && analysis_->validations.empty()) {
    // A pool of summaries: the site's row and its curve among every site's.
    if (inRange) site_ = index;
    selectRow(index);
    return;
  }
  if (!analysis_ || index < 0 || index >= static_cast<int>(analysis_->validations.size()) ||
      !analysis_->validations[static_cast<std::size_t>(index)].metrics) {
    for (ChartPanel* panel : {chart_, roc_, decision_}) panel->setLinkedChart(nullptr);
    return;
  }
  site_ = index;
  const SubgroupResult& r = analysis_->validations[static_cast<std::size_t>(index)];
  auto* chart = levelCalibrationChart(
      analysis_->validations, static_cast<std::size_t>(index),
      QStringLiteral("Site %1").arg(QString::fromStdString(visibleName(r.level, 30))));
  chart_->setLinkedChart(chart);
  const ValidationResult& m = *r.metrics;
  roc_->setLinkedChart(new charts::RocChart(m.discrimination));
  decision_->setLinkedChart(new charts::DecisionCurveChart(m.decisionCurve, m.cohort));
  const QString site = QString::fromStdString(visibleName(r.level, 30));
  for (ChartPanel* panel : {roc_, decision_}) {
    panel->linkedChart()->setTitle(
        QStringLiteral("Site %1: %2").arg(site, panel->linkedChart()->title()));
  }
  if (snapshot_) {
    for (ChartPanel* panel : {chart_, roc_, decision_})
      panel->linkedChart()->setThreshold(*snapshot_);
  }
  selectRow(index);
}

void SitesView::selectRow(int index) {
  selectSourceRow(sitesTable_, sitesProxy_, index);
}

void SitesView::insertFirstPage(QWidget* page, const QString& title) {
  pages_->insertTab(0, page, title);
  pages_->setCurrentIndex(0);
}

void SitesView::setThreshold(const ThresholdSnapshot& snapshot) {
  snapshot_ = snapshot;
  for (ChartPanel* panel : {chart_, roc_, decision_}) {
    if (panel->linkedChart() != nullptr) panel->linkedChart()->setThreshold(snapshot);
  }
}

}  // namespace calivera::ui
