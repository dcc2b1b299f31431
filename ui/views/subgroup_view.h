#pragma once
// The Subgroups tab: performance per level of each subgroup column the user chose
// (core/uncertainty/subgroups.h): a table per column (n, events, prevalence, AUC, calibration
// intercept and slope with CIs, O/E, ICI, warnings when a level is too small to judge) and the
// calibration chart of the selected level (its bootstrap band when there is one), with the other
// levels' smoothed curves overlaid (at most charts::kComparisonStyles of them).

#include <QWidget>
#include <memory>
#include <optional>

#include "core/study/threshold_state.h"
#include "core/uncertainty/uncertainty_run.h"

class QComboBox;
class QLabel;
class QTableView;
class QSortFilterProxyModel;

namespace calivera::ui {

class ChartPanel;
class RecordTableModel;

class SubgroupView : public QWidget {
  Q_OBJECT

 public:
  explicit SubgroupView(QWidget* parent = nullptr);

  void setResults(const std::shared_ptr<const UncertaintyResults>& results);
  // Moves the chart's threshold marker (cheap; nothing is recomputed).
  void setThreshold(const ThresholdSnapshot& snapshot);

  // Shows the analysis of column index `column` and the chart of its level `level`.
  void showColumn(int column);
  void showLevel(int level);
  int currentColumn() const;
  int currentLevel() const { return level_; }
  ChartPanel* chartPanel() const { return chart_; }

 signals:
  void thresholdPicked(double threshold);

 private:
  const SubgroupAnalysis* analysis() const;

  std::shared_ptr<const UncertaintyResults> results_;
  int level_ = -1;
  std::optional<ThresholdSnapshot> snapshot_;
  QComboBox* column_ = nullptr;
  QLabel* note_ = nullptr;
  RecordTableModel* model_ = nullptr;
  QSortFilterProxyModel* proxy_ = nullptr;
  QTableView* table_ = nullptr;
  ChartPanel* chart_ = nullptr;
};

}  // namespace calivera::ui
