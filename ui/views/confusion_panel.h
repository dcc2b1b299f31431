#pragma once
// The consequences of the current threshold for this cohort: the confusion matrix (counts), the
// proportions derived from it, net benefit, and the natural-frequency reading "of 1000 patients
// like these ...". Everything comes from one ThresholdSnapshot.

#include <QWidget>

#include "core/metrics/validation.h"
#include "core/study/threshold_state.h"

class QLabel;

namespace calivera::ui {

class ConfusionPanel : public QWidget {
  Q_OBJECT

 public:
  explicit ConfusionPanel(QWidget* parent = nullptr);
  // `calibration` (the validation's): says in words when predicted risks are not observed risks
  // on this cohort, with the rates among the flagged patients; null hides that sentence.
  void setSnapshot(const ThresholdSnapshot& snapshot, const Calibration* calibration = nullptr);
  void clear();
  // The sample-size verdict, shown under the counts so nobody reads them without it; an empty
  // text hides the section.
  void setAdequacy(const QString& verdict, bool adequate);

  // The natural-frequency sentence for a snapshot (also used by tests and the report).
  static QString naturalFrequencyText(const ThresholdSnapshot& snapshot);

 private:
  QLabel* cell(const QString& objectName);
  QLabel* tp_ = nullptr;
  QLabel* fp_ = nullptr;
  QLabel* fn_ = nullptr;
  QLabel* tn_ = nullptr;
  QLabel* flagged_ = nullptr;
  QLabel* notFlagged_ = nullptr;
  QLabel* events_ = nullptr;
  QLabel* nonEvents_ = nullptr;
  QLabel* total_ = nullptr;
  QLabel* title_ = nullptr;
  QLabel* rates_ = nullptr;
  QLabel* netBenefit_ = nullptr;
  QLabel* naturalFrequency_ = nullptr;
  QLabel* calibrationNote_ = nullptr;
  QLabel* adequacyHeading_ = nullptr;
  QLabel* adequacy_ = nullptr;
};

}  // namespace calivera::ui
