#include "ui/views/confusion_panel.h"

#include <QFrame>
#include <QGridLayout>
#include <QLabel>
#include <QVBoxLayout>
#include <cmath>

#include "core/present/threshold_reading.h"
#include "render/charts/chart_text.h"

namespace calivera::ui {

namespace {

QLabel* heading(const QString& text, const QString& objectName) {
  auto* label = new QLabel(text);
  label->setObjectName(objectName);
  QFont f = label->font();
  f.setBold(true);
  label->setFont(f);
  return label;
}

QString per1000(double v) {
  return std::isnan(v) ? QStringLiteral("—") : QString::number(std::lround(v));
}

}  // namespace

QLabel* ConfusionPanel::cell(const QString& objectName) {
  auto* label = new QLabel(QStringLiteral("—"));
  label->setObjectName(objectName);
  label->setAlignment(Qt::AlignCenter);
  label->setFrameShape(QFrame::StyledPanel);
  label->setMinimumWidth(70);
  label->setTextInteractionFlags(Qt::TextSelectableByMouse);
  return label;
}

ConfusionPanel::ConfusionPanel(QWidget* parent) : QWidget(parent) {
  setObjectName(QStringLiteral("confusionPanel"));
  auto* layout = new QVBoxLayout(this);
  title_ = heading(tr("At threshold —"), QStringLiteral("confusionTitle"));
  layout->addWidget(title_);

  auto* grid = new QGridLayout;
  grid->setObjectName(QStringLiteral("confusionGrid"));
  grid->addWidget(heading(tr("With event"), QStringLiteral("confusionHeadEvent")), 0, 1,
                  Qt::AlignCenter);
  grid->addWidget(heading(tr("Without event"), QStringLiteral("confusionHeadNoEvent")), 0, 2,
                  Qt::AlignCenter);
  grid->addWidget(heading(tr("Total"), QStringLiteral("confusionHeadTotal")), 0, 3,
                  Qt::AlignCenter);
  grid->addWidget(heading(tr("Flagged"), QStringLiteral("confusionHeadFlagged")), 1, 0);
  grid->addWidget(heading(tr("Not flagged"), QStringLiteral("confusionHeadNotFlagged")), 2, 0);
  grid->addWidget(heading(tr("Total"), QStringLiteral("confusionHeadColumnTotal")), 3, 0);
  tp_ = cell(QStringLiteral("confusionTp"));
  fp_ = cell(QStringLiteral("confusionFp"));
  fn_ = cell(QStringLiteral("confusionFn"));
  tn_ = cell(QStringLiteral("confusionTn"));
  flagged_ = cell(QStringLiteral("confusionFlagged"));
  notFlagged_ = cell(QStringLiteral("confusionNotFlagged"));
  events_ = cell(QStringLiteral("confusionEvents"));
  nonEvents_ = cell(QStringLiteral("confusionNonEvents"));
  total_ = cell(QStringLiteral("confusionTotal"));
  tp_->setToolTip(tr("True positives: flagged and had the event"));
  fp_->setToolTip(tr("False positives: flagged but did not have the event"));
  fn_->setToolTip(tr("False negatives: not flagged but had the event"));
  tn_->setToolTip(tr("True negatives: not flagged and did not have the event"));
  grid->addWidget(tp_, 1, 1);
  grid->addWidget(fp_, 1, 2);
  grid->addWidget(flagged_, 1, 3);
  grid->addWidget(fn_, 2, 1);
  grid->addWidget(tn_, 2, 2);
  grid->addWidget(notFlagged_, 2, 3);
  grid->addWidget(events_, 3, 1);
  grid->addWidget(nonEvents_, 3, 2);
  grid->addWidget(total_, 3, 3);
  layout->addLayout(grid);

  rates_ = new QLabel;
  rates_->setObjectName(QStringLiteral("confusionRates"));
  rates_->setWordWrap(true);
  rates_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  layout->addWidget(rates_);
  netBenefit_ = new QLabel;
  netBenefit_->setObjectName(QStringLiteral("netBenefitText"));
  netBenefit_->setWordWrap(true);
  layout->addWidget(netBenefit_);

  layout->addWidget(
      heading(tr("Of 1000 patients like these"), QStringLiteral("naturalFrequencyHeading")));
  naturalFrequency_ = new QLabel;
  naturalFrequency_->setObjectName(QStringLiteral("naturalFrequencyText"));
  naturalFrequency_->setWordWrap(true);
  naturalFrequency_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  layout->addWidget(naturalFrequency_);
  calibrationNote_ = new QLabel;
  calibrationNote_->setObjectName(QStringLiteral("calibrationAtThresholdText"));
  calibrationNote_->setWordWrap(true);
  calibrationNote_->setTextFormat(Qt::PlainText);
  calibrationNote_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  calibrationNote_->setAlignment(Qt::AlignLeft | Qt::AlignTop);
  layout->addWidget(calibrationNote_);
  adequacyHeading_ = heading(tr("Is the cohort large enough?"), QStringLiteral("adequacyHeading"));
  layout->addWidget(adequacyHeading_);
  adequacy_ = new QLabel;
  adequacy_->setObjectName(QStringLiteral("adequacyText"));
  adequacy_->setWordWrap(true);
  adequacy_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  layout->addWidget(adequacy_);
  setAdequacy({}, false);
  // Reserve the wrapped height explicitly: word-wrapped labels in a side panel otherwise get one
  // line's height and overlap their neighbours.
  const int line = fontMetrics().lineSpacing();
  rates_->setMinimumHeight(2 * line + 4);
  netBenefit_->setMinimumHeight(3 * line + 4);
  naturalFrequency_->setMinimumHeight(6 * line + 4);
  // ...and top-aligned, so the reserved height does not open a gap under each heading.
  adequacy_->setMinimumHeight(4 * line + 4);
  for (QLabel* l : {rates_, netBenefit_, naturalFrequency_, adequacy_}) {
    l->setAlignment(Qt::AlignLeft | Qt::AlignTop);
  }
  layout->addStretch(1);
  clear();
}

QString ConfusionPanel::naturalFrequencyText(const ThresholdSnapshot& s) {
  if (s.n == 0) return tr("No cohort analysed yet.");
  const double eventsPer1000 = 1000.0 * static_cast<double>(s.events) / static_cast<double>(s.n);
  return tr("About %1 have the event. At this threshold %2 are flagged: %3 events are caught, "
            "%4 events are missed, and %5 are flagged without having the event.")
      .arg(per1000(eventsPer1000), per1000(s.flaggedPer1000), per1000(s.eventsCaughtPer1000),
           per1000(s.eventsMissedPer1000), per1000(s.flaggedWithoutEventPer1000));
}

void ConfusionPanel::setSnapshot(const ThresholdSnapshot& s, const Calibration* calibration) {
  const std::string note =
      calibration ? calibrationAtThresholdText(s, *calibration) : std::string();
  calibrationNote_->setText(QString::fromStdString(note));
  calibrationNote_->setVisible(!note.empty());
  // A miscalibrated cohort is said in words first; the colour only repeats it.
  calibrationNote_->setStyleSheet(note.find("is not an observed") != std::string::npos
                                      ? QStringLiteral("color: #8a3b00;")
                                      : QString());
  const ConfusionCounts& c = s.counts;
  title_->setText(tr("At threshold %1 (flag when risk ≥ %1)").arg(fixed(s.threshold, 4)));
  tp_->setText(QString::number(c.tp));
  fp_->setText(QString::number(c.fp));
  fn_->setText(QString::number(c.fn));
  tn_->setText(QString::number(c.tn));
  flagged_->setText(QString::number(c.tp + c.fp));
  notFlagged_->setText(QString::number(c.fn + c.tn));
  events_->setText(QString::number(s.events));
  nonEvents_->setText(QString::number(s.n - s.events));
  total_->setText(QString::number(s.n));
  rates_->setText(
      tr("Sensitivity %1 · Specificity %2\nPPV %3 · NPV %4")
          .arg(fixed(s.sensitivity, 3), fixed(s.specificity, 3), fixed(s.ppv, 3), fixed(s.npv, 3)));
  netBenefit_->setText(tr("Net benefit %1 (treat everyone: %2, treat no one: 0)")
                           .arg(fixed(s.netBenefit, 4), fixed(s.netBenefitTreatAll, 4)));
  naturalFrequency_->setText(naturalFrequencyText(s));
}

void ConfusionPanel::setAdequacy(const QString& verdict, bool adequate) {
  adequacyHeading_->setVisible(!verdict.isEmpty());
  adequacy_->setVisible(!verdict.isEmpty());
  // Not met is said in words first; the colour only repeats it.
  adequacy_->setText(verdict.isEmpty()
                         ? QString()
                         : (adequate ? QString() : tr("<b>Not for every measure.</b> ")) +
                               verdict.toHtmlEscaped() + tr(" Details: the Summary tab."));
  adequacy_->setStyleSheet(adequate ? QString() : QStringLiteral("color: #8a3b00;"));
}

void ConfusionPanel::clear() {
  for (QLabel* l : {tp_, fp_, fn_, tn_, flagged_, notFlagged_, events_, nonEvents_, total_}) {
    l->setText(QStringLiteral("—"));
  }
  title_->setText(tr("At threshold —"));
  rates_->clear();
  netBenefit_->clear();
  naturalFrequency_->setText(naturalFrequencyText({}));
  calibrationNote_->clear();
  calibrationNote_->hide();
}

}  // namespace calivera::ui
