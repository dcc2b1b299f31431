#include "ui/views/predictor_view.h"

#include <QComboBox>
#include <QFormLayout>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QPushButton>
#include <QTableWidget>
#include <QVBoxLayout>

#include "core/util/shown_text.h"
#include "render/charts/predictor_charts.h"
#include "ui/views/chart_panel.h"

namespace calivera::ui {

namespace {
QString q(const std::string& s) {
  return QString::fromStdString(s);
}
}  // namespace

PredictorView::PredictorView(QWidget* parent) : QWidget(parent) {
  setObjectName(QStringLiteral("predictorView"));
  auto* layout = new QHBoxLayout(this);
  auto* controls = new QWidget;
  controls->setObjectName(QStringLiteral("predictorControls"));
  controls->setMaximumWidth(340);
  auto* side = new QVBoxLayout(controls);
  auto* form = new QFormLayout;
  first_ = new QComboBox;
  first_->setObjectName(QStringLiteral("predictorFirst"));
  second_ = new QComboBox;
  second_->setObjectName(QStringLiteral("predictorSecond"));
  form->addRow(tr("x axis:"), first_);
  form->addRow(tr("y axis:"), second_);
  side->addLayout(form);
  auto* heldLabel = new QLabel(tr("Other predictors are held at these values (edit to change):"));
  heldLabel->setObjectName(QStringLiteral("predictorHeldLabel"));
  heldLabel->setWordWrap(true);
  side->addWidget(heldLabel);
  heldTable_ = new QTableWidget(0, 2);
  heldTable_->setObjectName(QStringLiteral("predictorHeld"));
  heldTable_->setHorizontalHeaderLabels({tr("Predictor"), tr("Held at")});
  heldTable_->verticalHeader()->setVisible(false);
  heldTable_->horizontalHeader()->setStretchLastSection(true);
  side->addWidget(heldTable_, 1);
  auto* reset = new QPushButton(tr("Reset to medians / reference levels"));
  reset->setObjectName(QStringLiteral("predictorReset"));
  side->addWidget(reset);
  note_ = new QLabel;
  note_->setObjectName(QStringLiteral("predictorNote"));
  note_->setWordWrap(true);
  side->addWidget(note_);
  layout->addWidget(controls);
  panel_ = new ChartPanel(QStringLiteral("predictorChartView"));
  connect(panel_, &ChartPanel::thresholdPicked, this, &PredictorView::thresholdPicked);
  layout->addWidget(panel_, 1);

  auto changed = [this]() {
    if (updating_) return;
    rebuildChart();
  };
  connect(first_, &QComboBox::currentIndexChanged, this, changed);
  connect(second_, &QComboBox::currentIndexChanged, this, changed);
  connect(heldTable_, &QTableWidget::cellChanged, this, [this](int row, int column) {
    if (updating_ || column != 1 || row < 0 || row >= static_cast<int>(predictors_.size())) return;
    // The row's predictor by position: the name cell shows a cut name.
    held_[predictors_[static_cast<std::size_t>(row)].variable] =
        heldTable_->item(row, 1)->text().trimmed().toStdString();
    rebuildChart();
  });
  connect(reset, &QPushButton::clicked, this, [this]() {
    held_.clear();
    rebuildHeldTable();
    rebuildChart();
  });
}

std::vector<ChartPanel*> PredictorView::chartPanels() const {
  return {panel_};
}

void PredictorView::setData(const Model* model, std::shared_ptr<const CohortData> cohort,
                            const std::map<std::string, std::string>& mapping,
                            const std::vector<std::string>& chosen,
                            const std::map<std::string, std::string>& held) {
  updating_ = true;
  model_ = model ? std::optional<Model>(*model) : std::nullopt;
  cohort_ = std::move(cohort);
  mapping_ = mapping;
  held_ = held;
  predictors_.clear();
  if (model_ && cohort_) predictors_ = describePredictors(*model_, mapping_, *cohort_);
  first_->clear();
  second_->clear();
  second_->addItem(tr("(none: risk curve)"));
  for (const PredictorInfo& p : predictors_) {
    if (!p.numeric) continue;
    // Names from the model file: shown with controls written out and cut, kept whole as the
    // item's data (what the view computes with) and in its tooltip.
    const QString shown = q(visibleName(p.variable, 40));
    const QString whole = q(visibleName(p.variable, 4096));
    for (QComboBox* combo : {first_, second_}) {
      combo->addItem(shown, q(p.variable));
      combo->setItemData(combo->count() - 1, whole, Qt::ToolTipRole);
    }
  }
  if (!chosen.empty()) first_->setCurrentIndex(std::max(0, first_->findData(q(chosen[0]))));
  second_->setCurrentIndex(chosen.size() > 1 ? std::max(0, second_->findData(q(chosen[1]))) : 0);
  updating_ = false;
  rebuildHeldTable();
  rebuildChart(false);  // the study's own choices: nothing for the study to record
}

void PredictorView::choose(const QString& first, const QString& second) {
  updating_ = true;
  first_->setCurrentIndex(std::max(0, first_->findData(first)));
  second_->setCurrentIndex(second.isEmpty() ? 0 : std::max(0, second_->findData(second)));
  updating_ = false;
  rebuildChart();
}

void PredictorView::rebuildHeldTable() {
  updating_ = true;
  heldTable_->setRowCount(static_cast<int>(predictors_.size()));
  for (int row = 0; row < static_cast<int>(predictors_.size()); ++row) {
    const PredictorInfo& p = predictors_[static_cast<std::size_t>(row)];
    auto* name = new QTableWidgetItem(q(visibleName(p.variable, 40)));
    name->setFlags(name->flags() & ~Qt::ItemIsEditable);
    QString tip = p.numeric ? tr("Cohort range %1 to %2, median %3")
                                  .arg(p.lo, 0, 'g', 6)
                                  .arg(p.hi, 0, 'g', 6)
                                  .arg(p.median, 0, 'g', 6)
                            : tr("Levels: %1").arg(q([&] {
                                std::string s;
                                for (const auto& l : p.levels) s += (s.empty() ? "" : ", ") + l;
                                return s;
                              }()));
    name->setToolTip(q(visibleName(p.variable, 4096)) + QStringLiteral("\n") + tip);
    const auto it = held_.find(p.variable);
    auto* value = new QTableWidgetItem(q(it == held_.end() ? p.defaultValue : it->second));
    value->setToolTip(tip);
    heldTable_->setItem(row, 0, name);
    heldTable_->setItem(row, 1, value);
  }
  heldTable_->resizeColumnToContents(0);
  updating_ = false;
}

std::map<std::string, std::string> PredictorView::heldValues() const {
  std::map<std::string, std::string> out;
  for (const PredictorInfo& p : predictors_) {
    const auto it = held_.find(p.variable);
    out[p.variable] = it == held_.end() ? p.defaultValue : it->second;
  }
  return out;
}

void PredictorView::rebuildChart(bool userChoice) {
  if (!model_ || !cohort_ || first_->count() == 0) {
    panel_->setLinkedChart(nullptr);
    note_->setText(model_ && cohort_ ? tr("The model has no numeric predictor to plot.")
                                     : tr("Load a model and run the validation first."));
    return;
  }
  const std::string x = first_->currentData().toString().toStdString();
  const std::string y =
      second_->currentIndex() > 0 ? second_->currentData().toString().toStdString() : "";
  std::vector<std::string> chosen{x};
  if (!y.empty()) chosen.push_back(y);
  // Only the predictors that are held are listed as held: the axis variables vary.
  for (int row = 0; row < heldTable_->rowCount(); ++row) {
    const std::string& variable = predictors_[static_cast<std::size_t>(row)].variable;
    heldTable_->setRowHidden(row, variable == x || variable == y);
  }
  try {
    charts::LinkedChart* chart = nullptr;
    if (y.empty() || y == x) {
      chart = new charts::RiskCurveChart(
          riskCurve(*model_, mapping_, *cohort_, predictors_, x, heldValues()));
      note_->setText(tr("Dashed vertical lines mark where the risk curve crosses the threshold."));
    } else {
      chart = new charts::BoundaryChart(
          riskSurface(*model_, mapping_, *cohort_, predictors_, x, y, heldValues()));
      note_->setText(
          tr("The thick line is where predicted risk equals the threshold, from a "
             "60 × 60 grid evaluation of the model."));
    }
    panel_->setLinkedChart(chart);
    if (hasSnapshot_) chart->setThreshold(snapshot_);
    if (userChoice) emit settingsChanged(chosen, held_);
  } catch (const std::exception& e) {
    panel_->setLinkedChart(nullptr);
    note_->setText(tr("<b>Cannot draw:</b> %1").arg(q(e.what()).toHtmlEscaped()));
  }
}

void PredictorView::setThreshold(const ThresholdSnapshot& snapshot) {
  snapshot_ = snapshot;
  hasSnapshot_ = true;
  if (panel_->linkedChart() != nullptr) panel_->linkedChart()->setThreshold(snapshot);
}

}  // namespace calivera::ui
