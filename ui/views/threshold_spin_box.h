#pragma once
// The threshold's text box: reads a probability, a percentage ("15%") or a harm-to-benefit ratio
// ("1:9") through core's parseThresholdEntry, and refuses anything else with a reason
// (entryRefused) instead of clamping it: typing 15 must not silently mean a threshold of 1.

#include <QDoubleSpinBox>

namespace calivera::ui {

class ThresholdSpinBox : public QDoubleSpinBox {
  Q_OBJECT

 public:
  explicit ThresholdSpinBox(QWidget* parent = nullptr);

 signals:
  void entryRefused(const QString& reason);

 protected:
  QValidator::State validate(QString& input, int& pos) const override;
  double valueFromText(const QString& text) const override;
  void fixup(QString& input) const override;
};

}  // namespace calivera::ui
