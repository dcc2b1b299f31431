#pragma once
// The Comparison tab: the study's model against the further model files on the same patients
// (core/uncertainty/model_comparison.h). Shows each model's AUC and calibration on the comparison
// rows, the paired DeLong tests, and the net-benefit differences with bootstrap intervals over the
// clinically reasonable thresholds; a note says when the comparison rests on fewer patients than
// the validation. The curves themselves are overlaid on the linked views.

#include <QWidget>
#include <memory>

#include "core/uncertainty/uncertainty_run.h"

class QLabel;
class QTableView;

namespace calivera::ui {

class RecordTableModel;

class ComparisonView : public QWidget {
  Q_OBJECT

 public:
  explicit ComparisonView(QWidget* parent = nullptr);

  // null or no comparison: an explanation of how to ask for one.
  void setResults(const std::shared_ptr<const UncertaintyResults>& results, double reasonableLo,
                  double reasonableHi);

 private:
  QLabel* note_ = nullptr;
  QLabel* netBenefitHeading_ = nullptr;
  RecordTableModel* models_ = nullptr;
  RecordTableModel* delong_ = nullptr;
  RecordTableModel* netBenefit_ = nullptr;
  QTableView* modelsTable_ = nullptr;
  QTableView* delongTable_ = nullptr;
};

}  // namespace calivera::ui
