#pragma once
// The one threshold control: a slider for quick moves and a spin box for a precise value (four
// decimals), kept in step. Also holds the range of clinically reasonable thresholds that the user
// sets for the decision curve. Emits only on user edits, never when set from outside.

#include <QWidget>

class QSlider;
class QDoubleSpinBox;

namespace calivera::ui {

class ThresholdBar : public QWidget {
  Q_OBJECT

 public:
  static constexpr int kSliderSteps = 1000;  // slider resolution 0.001

  explicit ThresholdBar(QWidget* parent = nullptr);

  void setThreshold(double threshold);
  double threshold() const;
  void setReasonableRange(double lo, double hi);

 signals:
  void thresholdEdited(double threshold);
  void reasonableRangeEdited(double lo, double hi);
  // A typed threshold that could not be read (reason in plain words); the threshold is unchanged.
  void entryRefused(const QString& reason);

 private:
  QSlider* slider_ = nullptr;
  QDoubleSpinBox* spin_ = nullptr;
  QDoubleSpinBox* rangeLo_ = nullptr;
  QDoubleSpinBox* rangeHi_ = nullptr;
  bool updating_ = false;
};

}  // namespace calivera::ui
