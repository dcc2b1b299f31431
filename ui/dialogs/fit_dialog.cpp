#include "ui/dialogs/fit_dialog.h"

#include <QCheckBox>
#include <QDialogButtonBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QLineEdit>
#include <QListWidget>
#include <QPushButton>
#include <QTableView>
#include <QVBoxLayout>
#include <algorithm>

#include "core/study/spline_list.h"
#include "ui/async/background_job.h"
#include "ui/models/record_table_model.h"
#include "ui/models/result_tables.h"
#include "ui/views/table_context_menu.h"

namespace calivera::ui {

FitDialog::FitDialog(std::shared_ptr<const Table> table, ImportSettings import,
                     const FitSettings& initial, QWidget* parent)
    : QDialog(parent), table_(std::move(table)), import_(std::move(import)) {
  setObjectName(QStringLiteral("fitDialog"));
  setWindowTitle(tr("Fit a logistic model on this cohort"));
  job_ = new BackgroundJob(this);
  auto* layout = new QHBoxLayout(this);

  auto* left = new QVBoxLayout;
  auto* pick =
      new QLabel(tr("Predictors (text columns enter as indicators of each level "
                    "against the first):"));
  pick->setObjectName(QStringLiteral("fitPredictorsLabel"));
  pick->setWordWrap(true);
  left->addWidget(pick);
  predictors_ = new QListWidget;
  predictors_->setObjectName(QStringLiteral("fitPredictors"));
  for (const Column& c : table_->columns) {
    if (c.name == import_.outcomeColumn) continue;
    auto* item = new QListWidgetItem(QString::fromStdString(c.name), predictors_);
    const bool chosen = std::find(initial.predictors.begin(), initial.predictors.end(), c.name) !=
                        initial.predictors.end();
    item->setCheckState(chosen ? Qt::Checked : Qt::Unchecked);
  }
  left->addWidget(predictors_, 1);
  firth_ = new QCheckBox(tr("Firth's penalized likelihood (for separation or rare events)"));
  firth_->setObjectName(QStringLiteral("fitFirth"));
  firth_->setChecked(initial.firth);
  left->addWidget(firth_);
  profile_ = new QCheckBox(tr("Profile-likelihood intervals too (maximum likelihood; slower)"));
  profile_->setObjectName(QStringLiteral("fitProfile"));
  profile_->setChecked(initial.profileIntervals);
  profile_->setToolTip(
      tr("Intervals that follow the likelihood's shape; they differ from the "
         "Wald intervals in small samples and for large coefficients"));
  left->addWidget(profile_);
  auto* splineLabel = new QLabel(tr("Restricted cubic splines (COLUMN=KNOTS, 3 to 7 knots):"));
  splineLabel->setObjectName(QStringLiteral("fitSplinesLabel"));
  splineLabel->setWordWrap(true);
  left->addWidget(splineLabel);
  splines_ = new QLineEdit(QString::fromStdString(formatSplineList(initial.splineKnots)));
  splines_->setObjectName(QStringLiteral("fitSplines"));
  splines_->setPlaceholderText(tr("e.g. age=4, bmi=3"));
  splines_->setToolTip(
      tr("Numeric predictors to enter as a restricted cubic spline instead of linearly; knots "
         "at Harrell's default quantiles of this cohort"));
  splineLabel->setBuddy(splines_);
  left->addWidget(splines_);
  fitButton_ = new QPushButton(tr("&Fit"));
  fitButton_->setObjectName(QStringLiteral("fitRun"));
  left->addWidget(fitButton_);
  layout->addLayout(left, 1);

  auto* right = new QVBoxLayout;
  status_ = new QLabel(tr("Choose predictors and press Fit."));
  status_->setObjectName(QStringLiteral("fitStatus"));
  status_->setWordWrap(true);
  status_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  right->addWidget(status_);
  coefficients_ = new RecordTableModel(this);
  auto* view = new QTableView;
  view->setObjectName(QStringLiteral("fitCoefficientTable"));
  view->setModel(coefficients_);
  view->verticalHeader()->setVisible(false);
  view->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
  attachTableContextMenu(view);
  right->addWidget(view, 1);
  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel);
  buttons->setObjectName(QStringLiteral("fitButtons"));
  accept_ = buttons->button(QDialogButtonBox::Ok);
  accept_->setObjectName(QStringLiteral("fitAccept"));
  accept_->setText(tr("Take into the study"));
  accept_->setEnabled(false);
  right->addWidget(buttons);
  layout->addLayout(right, 2);

  connect(buttons, &QDialogButtonBox::accepted, this, &QDialog::accept);
  connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
  connect(fitButton_, &QPushButton::clicked, this, &FitDialog::startFit);
  connect(job_, &BackgroundJob::failed, this, [this](const QString& message) {
    status_->setText(tr("<b>The fit failed:</b> %1").arg(message.toHtmlEscaped()));
  });
  connect(job_, &BackgroundJob::finished, this, [this]() { fitButton_->setEnabled(true); });
  resize(980, 560);
}

FitSettings FitDialog::fitSettings() const {
  FitSettings s;
  for (int i = 0; i < predictors_->count(); ++i) {
    if (predictors_->item(i)->checkState() == Qt::Checked) {
      s.predictors.push_back(predictors_->item(i)->text().toStdString());
    }
  }
  s.firth = firth_->isChecked();
  s.profileIntervals = profile_->isChecked();
  s.splineKnots = parseSplineList(splines_->text().toStdString());
  return s;
}

void FitDialog::startFit() {
  fitted_.reset();
  accept_->setEnabled(false);
  coefficients_->setTable({}, {}, {});
  FitSettings settings;
  try {
    settings = fitSettings();
  } catch (const std::exception& e) {
    status_->setText(QString::fromStdString(e.what()).toHtmlEscaped());
    return;
  }
  if (settings.predictors.empty()) {
    status_->setText(tr("Choose at least one predictor."));
    return;
  }
  fitButton_->setEnabled(false);
  status_->setText(tr("Fitting…"));
  std::function<FittedModel(const ProgressCallback&)> work =
      [table = table_, import = import_, settings](const ProgressCallback& progress) {
        return fitModel(*table, import, settings, progress);
      };
  std::function<void(FittedModel&)> done = [this, settings](FittedModel& result) {
    fitted_ = std::move(result);
    fittedWith_ = settings;
    fillCoefficientTable(*coefficients_, fitted_->model,
                         fitted_->profile ? &fitted_->profile->ci : nullptr);
    QString text = tr("Fitted on %1 patients (%2 events), %3 iterations, deviance %4.")
                       .arg(fitted_->exclusions.rowsAnalysed)
                       .arg(fitted_->model.development.events.value_or(0))
                       .arg(fitted_->fit.iterations)
                       .arg(fitted_->fit.deviance, 0, 'f', 2);
    if (fitted_->exclusions.rowsExcluded > 0) {
      text += tr(" %1 rows excluded for missing values.").arg(fitted_->exclusions.rowsExcluded);
    }
    for (const auto& w : fitted_->warnings) {
      text += tr("<br><span style='color:#a04000'><b>Warning:</b> %1</span>")
                  .arg(QString::fromStdString(w).toHtmlEscaped());
    }
    status_->setText(text);
    accept_->setEnabled(true);
  };
  job_->start<FittedModel>(tr("Fitting"), work, done);
}

}  // namespace calivera::ui
