#include "ui/views/threshold_spin_box.h"

#include "core/present/threshold_entry.h"

namespace calivera::ui {

ThresholdSpinBox::ThresholdSpinBox(QWidget* parent) : QDoubleSpinBox(parent) {
  setRange(0.0, 1.0);  // the slider's ends; typed values must lie strictly inside
  setDecimals(4);
  setSingleStep(0.005);
  setKeyboardTracking(false);
  setCorrectionMode(QAbstractSpinBox::CorrectToPreviousValue);
}

QValidator::State ThresholdSpinBox::validate(QString& input, int& /*pos*/) const {
  // Partial text ("1:", "15") stays editable; only a complete, valid entry is accepted.
  return parseThresholdEntry(input.toStdString()).threshold ? QValidator::Acceptable
                                                            : QValidator::Intermediate;
}

double ThresholdSpinBox::valueFromText(const QString& text) const {
  return parseThresholdEntry(text.toStdString()).threshold.value_or(value());
}

void ThresholdSpinBox::fixup(QString& input) const {
  const ThresholdEntry entry = parseThresholdEntry(input.toStdString());
  if (!entry.threshold) {
    // fixup is const in Qt's interface; telling the user is not a change of the box's state.
    emit const_cast<ThresholdSpinBox*>(this)->entryRefused(QString::fromStdString(entry.error));
  }
}

}  // namespace calivera::ui
