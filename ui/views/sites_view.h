#pragma once
// Validation across sites (core/sites/site_pooling.h): the workstation's Sites tab, when the study
// names a site column, and the window of pooled site summaries (ui/site_summaries_window.h).
// One page: each site validated alone (table) and, when the sites' patients are here, the
// selected site's own linked views: its calibration with the other sites' curves overlaid, its
// ROC curve and its decision curve, all at the study's threshold. Another page: the pooled
// measures (table) and one forest plot per measure; a third: every site's calibration curve on one
// set of axes, the selected site's highlighted (both the same drawings as the PDF report);
// selecting a site in the table shows it in both; a fourth: net benefit pooled across sites at the
// tabulated thresholds.

#include <QWidget>
#include <memory>
#include <optional>

#include "core/study/threshold_state.h"
#include "core/uncertainty/uncertainty_run.h"

class QLabel;
class QTableView;
class QSortFilterProxyModel;
class QGridLayout;
class QTabWidget;

namespace calivera::ui {

class ChartPanel;
class RecordTableModel;
class SiteCurvesWidget;

class SitesView : public QWidget {
  Q_OBJECT

 public:
  explicit SitesView(QWidget* parent = nullptr);

  void setResults(const std::shared_ptr<const UncertaintyResults>& results);
  // The analysis alone (pooled site summaries); `emptyNote` is shown when it is null.
  void setAnalysis(std::shared_ptr<const SiteAnalysis> analysis, const QString& emptyNote);
  const SiteAnalysis* analysis() const { return analysis_.get(); }
  void setThreshold(const ThresholdSnapshot& snapshot);
  // Shows site `index` (row of the sites table) in the calibration chart.
  void showSite(int index);
  int currentSite() const { return site_; }
  ChartPanel* chartPanel() const { return chart_; }  // the selected site's calibration
  ChartPanel* rocPanel() const { return roc_; }
  ChartPanel* decisionPanel() const { return decision_; }
  // A page of the caller's before the others (the summaries a pool read), shown first.
  void insertFirstPage(QWidget* page, const QString& title);
  SiteCurvesWidget* allSiteCurves() const { return allCurves_; }

 signals:
  void thresholdPicked(double threshold);

 private:
  void selectRow(int index);  // the table's current row, without signalling showSite again
  std::shared_ptr<const SiteAnalysis> analysis_;
  int site_ = -1;
  std::optional<ThresholdSnapshot> snapshot_;
  QLabel* note_ = nullptr;
  RecordTableModel* sitesModel_ = nullptr;
  QSortFilterProxyModel* sitesProxy_ = nullptr;
  QTableView* sitesTable_ = nullptr;
  RecordTableModel* pooledModel_ = nullptr;
  QSortFilterProxyModel* pooledProxy_ = nullptr;
  QTableView* pooledTable_ = nullptr;
  ChartPanel* chart_ = nullptr;
  ChartPanel* roc_ = nullptr;
  ChartPanel* decision_ = nullptr;
  QTabWidget* siteCharts_ = nullptr;  // the selected site's linked views
  SiteCurvesWidget* allCurves_ = nullptr;
  QGridLayout* forests_ = nullptr;
  QTabWidget* pages_ = nullptr;
  RecordTableModel* netBenefitModel_ = nullptr;
  QSortFilterProxyModel* netBenefitProxy_ = nullptr;
};

}  // namespace calivera::ui
