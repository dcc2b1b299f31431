#include "ui/dialogs/missing_data_dialog.h"

#include <QButtonGroup>
#include <QComboBox>
#include <QDialogButtonBox>
#include <QFormLayout>
#include <QLabel>
#include <QPushButton>
#include <QRadioButton>
#include <QSpinBox>
#include <QVBoxLayout>
#include <algorithm>
#include <cmath>
#include <map>

#include "core/study/limits.h"

namespace calivera::ui {
namespace {

QString toQ(const std::string& s) {
  return QString::fromStdString(s);
}

}  // namespace

std::vector<std::string> MissingDataDialog::imputationColumnCandidates(
    const Table& table, const std::string& outcomeColumn) {
  std::vector<std::string> out;
  for (const Column& c : table.columns) {
    if (c.name == outcomeColumn || c.kind != ColumnKind::Numeric) continue;
    std::map<double, std::size_t> rowsPerIndex;
    bool whole = !c.numbers.empty();
    for (const double v : c.numbers) {
      if (!(v >= 0.0) || v != std::floor(v)) {  // NaN (missing) fails too
        whole = false;
        break;
      }
      // More indices than copies can be pooled: not an imputation number.
      if (++rowsPerIndex[v] == 1 && rowsPerIndex.size() > kImputeCopiesLimit.max + 1) {
        whole = false;
        break;
      }
    }
    if (!whole || rowsPerIndex.size() < 3 || rowsPerIndex.count(0.0) == 0) continue;
    // Every copy holds the same patients as the original data: as many rows per index.
    const std::size_t rows = rowsPerIndex.begin()->second;
    if (std::all_of(rowsPerIndex.begin(), rowsPerIndex.end(),
                    [rows](const auto& entry) { return entry.second == rows; })) {
      out.push_back(c.name);
    }
  }
  return out;
}

MissingDataDialog::MissingDataDialog(const MissingDataSettings& current, const Table& cohort,
                                     const std::string& outcomeColumn, QWidget* parent)
    : QDialog(parent) {
  setObjectName(QStringLiteral("missingDataDialog"));
  setWindowTitle(tr("Missing values"));
  setMinimumWidth(520);
  auto* layout = new QVBoxLayout(this);
  auto* intro = new QLabel(
      tr("Complete-case results are always shown. With imputed copies, each copy is validated "
         "and the estimates are pooled by Rubin's rules; the pooled table is on the Tables tab "
         "(Missing data) and in the report. The outcome is never imputed."));
  intro->setObjectName(QStringLiteral("missingDataIntro"));
  intro->setWordWrap(true);
  layout->addWidget(intro);

  auto* group = new QButtonGroup(this);
  completeCases_ = new QRadioButton(tr("&Complete cases only"));
  completeCases_->setObjectName(QStringLiteral("completeCasesRadio"));
  stacked_ = new QRadioButton(tr("The cohort &stacks copies imputed elsewhere"));
  stacked_->setObjectName(QStringLiteral("stackedCopiesRadio"));
  impute_ = new QRadioButton(tr("&Impute here by chained equations"));
  impute_->setObjectName(QStringLiteral("imputeHereRadio"));
  for (QRadioButton* b : {completeCases_, stacked_, impute_}) group->addButton(b);
  layout->addWidget(completeCases_);
  layout->addWidget(stacked_);

  auto* stackedForm = new QFormLayout;
  stackedForm->setContentsMargins(24, 0, 0, 0);
  column_ = new QComboBox;
  column_->setObjectName(QStringLiteral("imputationColumnCombo"));
  for (const std::string& name : imputationColumnCandidates(cohort, outcomeColumn)) {
    column_->addItem(toQ(name));
  }
  if (!current.imputationColumn.empty() && column_->findText(toQ(current.imputationColumn)) < 0) {
    column_->addItem(toQ(current.imputationColumn));  // as saved, even if the data changed
  }
  column_->setToolTip(
      tr("Numbers the copies: 0 for the original data with its missing values, 1, 2, … for the "
         "completed copies, the same patients in the same order in each"));
  stackedForm->addRow(tr("Copies numbered by &column:"), column_);
  noColumn_ = new QLabel(tr("No column of this cohort numbers copies (whole numbers from 0)."));
  noColumn_->setObjectName(QStringLiteral("noImputationColumnNote"));
  noColumn_->setWordWrap(true);
  noColumn_->setVisible(column_->count() == 0);
  stackedForm->addRow(noColumn_);
  layout->addLayout(stackedForm);

  layout->addWidget(impute_);
  auto* imputeForm = new QFormLayout;
  imputeForm->setContentsMargins(24, 0, 0, 0);
  copies_ = new QSpinBox;
  copies_->setObjectName(QStringLiteral("imputeCopiesSpin"));
  copies_->setRange(static_cast<int>(kImputeCopiesLimit.min),
                    static_cast<int>(kImputeCopiesLimit.max));
  copies_->setValue(current.imputesHere() ? current.imputeCopies : 20);
  copies_->setToolTip(tr("Imputed copies; about the percentage of incomplete patients is usual"));
  iterations_ = new QSpinBox;
  iterations_->setObjectName(QStringLiteral("imputeIterationsSpin"));
  iterations_->setRange(static_cast<int>(kImputeIterationsLimit.min),
                        static_cast<int>(kImputeIterationsLimit.max));
  iterations_->setValue(current.imputeIterations);
  iterations_->setToolTip(tr("Cycles through the incomplete columns before a copy is kept"));
  seed_ = new QSpinBox;
  seed_->setObjectName(QStringLiteral("imputeSeedSpin"));
  seed_->setRange(0, 2147483647);
  seed_->setValue(static_cast<int>(std::min<std::uint64_t>(current.imputeSeed, 2147483647)));
  seed_->setToolTip(tr("The same seed gives the same copies on any number of threads"));
  imputeForm->addRow(tr("C&opies:"), copies_);
  imputeForm->addRow(tr("Ite&rations:"), iterations_);
  imputeForm->addRow(tr("S&eed:"), seed_);
  auto* methods = new QLabel(
      tr("Numeric columns: predictive mean matching (5 donors). Categorical columns: logistic or "
         "multinomial regression. Every model column and the outcome enter each imputation "
         "model."));
  methods->setObjectName(QStringLiteral("imputeMethodsNote"));
  methods->setWordWrap(true);
  imputeForm->addRow(methods);
  layout->addLayout(imputeForm);

  if (current.imputesHere()) {
    impute_->setChecked(true);
  } else if (!current.imputationColumn.empty()) {
    stacked_->setChecked(true);
    column_->setCurrentText(toQ(current.imputationColumn));
  } else {
    completeCases_->setChecked(true);
  }
  stacked_->setEnabled(column_->count() > 0);
  connect(group, &QButtonGroup::buttonToggled, this, [this]() { updateEnabled(); });
  updateEnabled();

  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel);
  buttons->button(QDialogButtonBox::Ok)->setText(tr("&Validate"));
  connect(buttons, &QDialogButtonBox::accepted, this, &QDialog::accept);
  connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
  layout->addWidget(buttons);
}

void MissingDataDialog::updateEnabled() {
  column_->setEnabled(stacked_->isChecked());
  for (QSpinBox* s : {copies_, iterations_, seed_}) s->setEnabled(impute_->isChecked());
}

MissingDataSettings MissingDataDialog::settings() const {
  MissingDataSettings out;
  out.imputeIterations = iterations_->value();
  out.imputeSeed = static_cast<std::uint64_t>(seed_->value());
  if (stacked_->isChecked() && column_->count() > 0) {
    out.imputationColumn = column_->currentText().toStdString();
  } else if (impute_->isChecked()) {
    out.imputeCopies = copies_->value();
  }
  return out;
}

}  // namespace calivera::ui
