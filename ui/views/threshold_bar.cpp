#include "ui/views/threshold_bar.h"

#include <QDoubleSpinBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QSignalBlocker>
#include <QSlider>
#include <cmath>

#include "ui/views/threshold_spin_box.h"

namespace calivera::ui {

namespace {

QDoubleSpinBox* makeProbabilityBox(const QString& objectName, int decimals, double step) {
  auto* box = new QDoubleSpinBox;
  box->setObjectName(objectName);
  box->setRange(0.0, 1.0);
  box->setDecimals(decimals);
  box->setSingleStep(step);
  box->setKeyboardTracking(false);
  return box;
}

}  // namespace

ThresholdBar::ThresholdBar(QWidget* parent) : QWidget(parent) {
  setObjectName(QStringLiteral("thresholdBar"));
  auto* layout = new QHBoxLayout(this);
  layout->setContentsMargins(8, 4, 8, 4);

  auto* label = new QLabel(tr("Risk &threshold (flag when predicted risk ≥):"));
  label->setObjectName(QStringLiteral("thresholdLabel"));
  slider_ = new QSlider(Qt::Horizontal);
  slider_->setObjectName(QStringLiteral("thresholdSlider"));
  slider_->setRange(0, kSliderSteps);
  slider_->setSingleStep(5);
  slider_->setPageStep(50);
  slider_->setToolTip(tr("Drag, or use the arrow keys (Page Up/Down for larger steps)"));
  slider_->setMinimumWidth(240);
  auto* entry = new ThresholdSpinBox;
  entry->setObjectName(QStringLiteral("thresholdSpin"));
  entry->setToolTip(
      tr("Exact threshold: a probability (0.15), a percentage (15%) or a "
         "harm-to-benefit ratio (1:9 means a threshold of 0.10)"));
  connect(entry, &ThresholdSpinBox::entryRefused, this, &ThresholdBar::entryRefused);
  spin_ = entry;
  label->setBuddy(spin_);

  auto* rangeLabel = new QLabel(tr("Thresholds you consider reasonable:"));
  rangeLabel->setObjectName(QStringLiteral("reasonableRangeLabel"));
  rangeLo_ = makeProbabilityBox(QStringLiteral("reasonableLoSpin"), 3, 0.01);
  rangeHi_ = makeProbabilityBox(QStringLiteral("reasonableHiSpin"), 3, 0.01);
  rangeLo_->setToolTip(
      tr("Lowest threshold a clinician would consider (shaded on the decision curve)"));
  rangeHi_->setToolTip(tr("Highest threshold a clinician would consider"));
  auto* to = new QLabel(tr("to"));
  to->setObjectName(QStringLiteral("reasonableRangeTo"));

  layout->addWidget(label);
  layout->addWidget(slider_, 1);
  layout->addWidget(spin_);
  layout->addSpacing(16);
  layout->addWidget(rangeLabel);
  layout->addWidget(rangeLo_);
  layout->addWidget(to);
  layout->addWidget(rangeHi_);

  connect(slider_, &QSlider::valueChanged, this, [this](int value) {
    if (updating_) return;
    const double t = static_cast<double>(value) / kSliderSteps;
    {
      const QSignalBlocker block(spin_);
      spin_->setValue(t);
    }
    emit thresholdEdited(t);
  });
  connect(spin_, &QDoubleSpinBox::valueChanged, this, [this](double t) {
    if (updating_) return;
    {
      const QSignalBlocker block(slider_);
      slider_->setValue(static_cast<int>(std::lround(t * kSliderSteps)));
    }
    emit thresholdEdited(t);
  });
  auto rangeChanged = [this]() {
    if (updating_) return;
    emit reasonableRangeEdited(std::min(rangeLo_->value(), rangeHi_->value()),
                               std::max(rangeLo_->value(), rangeHi_->value()));
  };
  connect(rangeLo_, &QDoubleSpinBox::valueChanged, this, rangeChanged);
  connect(rangeHi_, &QDoubleSpinBox::valueChanged, this, rangeChanged);
}

void ThresholdBar::setThreshold(double threshold) {
  updating_ = true;
  spin_->setValue(threshold);
  slider_->setValue(static_cast<int>(std::lround(threshold * kSliderSteps)));
  updating_ = false;
}

double ThresholdBar::threshold() const {
  return spin_->value();
}

void ThresholdBar::setReasonableRange(double lo, double hi) {
  updating_ = true;
  rangeLo_->setValue(lo);
  rangeHi_->setValue(hi);
  updating_ = false;
}

}  // namespace calivera::ui
