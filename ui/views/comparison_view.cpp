#include "ui/views/comparison_view.h"

#include <QLabel>
#include <QTableView>
#include <QVBoxLayout>

#include "core/report/uncertainty_result_tables.h"
#include "render/charts/chart_text.h"
#include "ui/models/record_table_model.h"
#include "ui/models/result_tables.h"
#include "ui/views/result_table_view.h"

namespace calivera::ui {

namespace {

QLabel* heading(const QString& objectName, const QString& text) {
  auto* label = new QLabel(QStringLiteral("<b>%1</b>").arg(text));
  label->setObjectName(objectName);
  return label;
}

}  // namespace

ComparisonView::ComparisonView(QWidget* parent) : QWidget(parent) {
  setObjectName(QStringLiteral("comparisonView"));
  auto* layout = new QVBoxLayout(this);
  note_ = new QLabel;
  note_->setObjectName(QStringLiteral("comparisonNote"));
  note_->setWordWrap(true);
  note_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  models_ = new RecordTableModel(this);
  models_->setObjectName(QStringLiteral("comparisonModelsModel"));
  delong_ = new RecordTableModel(this);
  delong_->setObjectName(QStringLiteral("comparisonDelongModel"));
  netBenefit_ = new RecordTableModel(this);
  netBenefit_->setObjectName(QStringLiteral("comparisonNetBenefitModel"));
  netBenefitHeading_ = heading(QStringLiteral("comparisonNetBenefitHeading"), QString());
  layout->addWidget(note_);
  layout->addWidget(
      heading(QStringLiteral("comparisonModelsHeading"), tr("Models on the comparison patients")));
  modelsTable_ = makeResultTableView(QStringLiteral("comparisonModelsTable"), models_);
  layout->addWidget(modelsTable_);
  layout->addWidget(heading(QStringLiteral("comparisonDelongHeading"),
                            tr("AUC differences: paired DeLong test (DeLong et al. 1988)")));
  delongTable_ = makeResultTableView(QStringLiteral("comparisonDelongTable"), delong_);
  layout->addWidget(delongTable_);
  layout->addWidget(netBenefitHeading_);
  layout->addWidget(makeResultTableView(QStringLiteral("comparisonNetBenefitTable"), netBenefit_),
                    1);
  setResults(nullptr, 0.0, 1.0);
}

void ComparisonView::setResults(const std::shared_ptr<const UncertaintyResults>& results,
                                double reasonableLo, double reasonableHi) {
  netBenefitHeading_->setText(
      tr("<b>Net-benefit difference over your reasonable thresholds (%1 to %2)</b>")
          .arg(fixed(reasonableLo, 3), fixed(reasonableHi, 3)));
  if (!results || !results->comparison) {
    models_->setTable({}, {}, {});
    delong_->setTable({}, {}, {});
    netBenefit_->setTable({}, {}, {});
    capTableHeight(modelsTable_, 1);
    capTableHeight(delongTable_, 1);
    note_->setText(
        tr("No comparison yet. Analysis → Intervals, comparison and subgroups: add one or more "
           "further model files to compare them with this study's model on the same patients."));
    return;
  }
  const ModelComparison& c = *results->comparison;
  showResultTable(*models_, comparedModelsTable(*results));
  showResultTable(*delong_, modelComparisonAucTable(c));
  showResultTable(*netBenefit_, modelComparisonNetBenefitTable(c, reasonableLo, reasonableHi));
  capTableHeight(modelsTable_, 6);
  capTableHeight(delongTable_, 6);
  QString note =
      tr("Compared on %1 patients complete for every model.").arg(results->comparisonRows);
  if (c.bootstrap.replicates > 0) {
    note += tr(" Net-benefit intervals: %1 bootstrap resamples, seed %2, %3 failed.")
                .arg(c.bootstrap.replicates)
                .arg(c.bootstrap.seed)
                .arg(c.bootstrap.failed);
  } else {
    note += tr(" Net-benefit differences have no intervals: set bootstrap replicates to get them.");
  }
  for (const auto& w : c.warnings) {
    note += QStringLiteral("<br><span style='color:#a04000'><b>Note:</b> %1</span>")
                .arg(QString::fromStdString(w).toHtmlEscaped());
  }
  note_->setText(note);
}

}  // namespace calivera::ui
