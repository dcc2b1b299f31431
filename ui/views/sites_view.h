#pragma once
// The Sites tab: validation across sites (core/sites/site_pooling.h), when the study names a
// site column. One page: each site validated alone and the pooled measures (tables), and the
// calibration chart of the selected site with the other sites' curves overlaid; selecting a site
// in the table shows its own calibration. Another page: one forest plot per measure (the same
// drawing as the PDF report).

#include <QWidget>
#include <memory>
#include <optional>

#include "core/study/threshold_state.h"
#include "core/uncertainty/uncertainty_run.h"

class QLabel;
class QTableView;
class QSortFilterProxyModel;
class QGridLayout;

namespace calivera::ui {

class ChartPanel;
class RecordTableModel;

class SitesView : public QWidget {
  Q_OBJECT

 public:
  explicit SitesView(QWidget* parent = nullptr);

  void setResults(const std::shared_ptr<const UncertaintyResults>& results);
  void setThreshold(const ThresholdSnapshot& snapshot);
  // Shows site `index` (row of the sites table) in the calibration chart.
  void showSite(int index);
  int currentSite() const { return site_; }
  ChartPanel* chartPanel() const { return chart_; }

 signals:
  void thresholdPicked(double threshold);

 private:
  std::shared_ptr<const UncertaintyResults> results_;
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
  QGridLayout* forests_ = nullptr;
};

}  // namespace calivera::ui
