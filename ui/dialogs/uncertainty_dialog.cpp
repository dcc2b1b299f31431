#include "ui/dialogs/uncertainty_dialog.h"

#include <QComboBox>
#include <QDialogButtonBox>
#include <QFileDialog>
#include <QFileInfo>
#include <QFormLayout>
#include <QGroupBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QLineEdit>
#include <QListWidget>
#include <QPushButton>
#include <QSpinBox>
#include <QVBoxLayout>
#include <algorithm>
#include <cmath>
#include <filesystem>
#include <set>
#include <thread>

#include "core/study/limits.h"
#include "core/study/study_file.h"

namespace calivera::ui {

std::vector<std::string> UncertaintyDialog::subgroupCandidates(const Table& table,
                                                               const std::string& outcomeColumn) {
  std::vector<std::string> out;
  for (const Column& c : table.columns) {
    if (c.name == outcomeColumn) continue;
    if (c.kind == ColumnKind::Text) {
      if (c.levels.size() <= kMaxLevels) out.push_back(c.name);
      continue;
    }
    std::set<double> distinct;
    for (double v : c.numbers) {
      if (std::isnan(v)) continue;
      distinct.insert(v);
      if (distinct.size() > kMaxLevels) break;
    }
    if (distinct.size() <= kMaxLevels) out.push_back(c.name);
  }
  return out;
}

std::vector<double> UncertaintyDialog::parseThresholds(const QString& text, QString* error) {
  std::vector<double> out;
  for (const QString& part : text.split(QLatin1Char(','), Qt::SkipEmptyParts)) {
    bool ok = false;
    const double t = part.trimmed().toDouble(&ok);
    if (!ok || !(t > 0.0 && t < 1.0)) {
      if (error != nullptr) {
        *error = tr("Sample-size thresholds: \"%1\" is not a number between 0 and 1.")
                     .arg(part.trimmed());
      }
      return {};
    }
    out.push_back(t);
  }
  return out;
}

UncertaintyDialog::UncertaintyDialog(const UncertaintySettings& current, const Table& cohort,
                                     const std::string& outcomeColumn, QWidget* parent)
    : QDialog(parent), compare_(current.compareModels) {
  setObjectName(QStringLiteral("uncertaintyDialog"));
  setWindowTitle(tr("Intervals, comparison and subgroups"));
  auto* layout = new QVBoxLayout(this);
  auto* intro = new QLabel(
      tr("The sample-size assessment is always shown. Percentile bootstrap intervals resample the "
         "patients with replacement; the same seed gives the same intervals on any number of "
         "threads."));
  intro->setObjectName(QStringLiteral("uncertaintyIntro"));
  intro->setWordWrap(true);
  layout->addWidget(intro);

  auto* form = new QFormLayout;
  replicates_ = new QSpinBox;
  replicates_->setObjectName(QStringLiteral("bootstrapReplicatesSpin"));
  replicates_->setRange(0, kMaxBootstrapReplicates);
  replicates_->setSpecialValueText(tr("off"));
  replicates_->setSingleStep(100);
  replicates_->setValue(current.bootstrapReplicates);
  replicates_->setToolTip(tr("0: no bootstrap intervals or bands; 200 to 2000 is usual"));
  seed_ = new QSpinBox;
  seed_->setObjectName(QStringLiteral("bootstrapSeedSpin"));
  seed_->setRange(0, 2147483647);
  seed_->setValue(static_cast<int>(std::min<std::uint64_t>(current.seed, 2147483647)));
  threads_ = new QSpinBox;
  threads_->setObjectName(QStringLiteral("bootstrapThreadsSpin"));
  threads_->setRange(0, static_cast<int>(kThreadsLimit.max));
  threads_->setSpecialValueText(
      tr("all cores (%1)").arg(std::max(1u, std::thread::hardware_concurrency())));
  threads_->setValue(static_cast<int>(current.threads));
  form->addRow(tr("Bootstrap &replicates:"), replicates_);
  form->addRow(tr("&Seed:"), seed_);
  form->addRow(tr("&Threads:"), threads_);
  sizeThresholds_ = new QLineEdit;
  sizeThresholds_->setObjectName(QStringLiteral("sizeThresholdsEdit"));
  sizeThresholds_->setPlaceholderText(tr("none, e.g. 0.1, 0.2"));
  sizeThresholds_->setToolTip(
      tr("Thresholds at which the sample-size check also asks for a precise standardized net "
         "benefit (Riley et al. 2021); its achieved width needs the bootstrap"));
  QStringList thresholds;
  for (double t : current.sizeThresholds) thresholds << QString::number(t, 'g', 6);
  sizeThresholds_->setText(thresholds.join(QStringLiteral(", ")));
  form->addRow(tr("Net-benefit thresholds for the sample-size &check:"), sizeThresholds_);
  layout->addLayout(form);

  auto* compareBox = new QGroupBox(tr("Compare with further model files (same patients)"));
  compareBox->setObjectName(QStringLiteral("compareBox"));
  auto* compareLayout = new QVBoxLayout(compareBox);
  models_ = new QListWidget;
  models_->setObjectName(QStringLiteral("compareModelList"));
  for (const InputFileRecord& m : compare_) {
    models_->addItem(QFileInfo(QString::fromStdString(m.path)).fileName());
  }
  auto* buttons = new QHBoxLayout;
  auto* add = new QPushButton(tr("&Add model file…"));
  add->setObjectName(QStringLiteral("compareAddButton"));
  auto* remove = new QPushButton(tr("Re&move"));
  remove->setObjectName(QStringLiteral("compareRemoveButton"));
  connect(add, &QPushButton::clicked, this, &UncertaintyDialog::onAddModel);
  connect(remove, &QPushButton::clicked, this, &UncertaintyDialog::onRemoveModel);
  buttons->addWidget(add);
  buttons->addWidget(remove);
  buttons->addStretch(1);
  compareLayout->addWidget(models_);
  compareLayout->addLayout(buttons);
  layout->addWidget(compareBox);

  auto* subgroupBox = new QGroupBox(tr("Subgroups (columns with up to %1 values)").arg(kMaxLevels));
  subgroupBox->setObjectName(QStringLiteral("subgroupBox"));
  auto* subgroupLayout = new QVBoxLayout(subgroupBox);
  subgroups_ = new QListWidget;
  subgroups_->setObjectName(QStringLiteral("subgroupColumnList"));
  for (const std::string& name : subgroupCandidates(cohort, outcomeColumn)) {
    auto* item = new QListWidgetItem(QString::fromStdString(name), subgroups_);
    item->setFlags(item->flags() | Qt::ItemIsUserCheckable);
    const bool on = std::find(current.subgroupColumns.begin(), current.subgroupColumns.end(),
                              name) != current.subgroupColumns.end();
    item->setCheckState(on ? Qt::Checked : Qt::Unchecked);
  }
  subgroupLayout->addWidget(subgroups_);
  layout->addWidget(subgroupBox);

  auto* sitesBox = new QGroupBox(tr("Validation across sites"));
  sitesBox->setObjectName(QStringLiteral("sitesBox"));
  auto* sitesLayout = new QFormLayout(sitesBox);
  sites_ = new QComboBox;
  sites_->setObjectName(QStringLiteral("siteColumnCombo"));
  sites_->addItem(tr("(none)"), QString());
  for (const std::string& name : subgroupCandidates(cohort, outcomeColumn)) {
    sites_->addItem(QString::fromStdString(name), QString::fromStdString(name));
  }
  const int chosen = sites_->findData(QString::fromStdString(current.clusterColumn));
  sites_->setCurrentIndex(chosen >= 0 ? chosen : 0);
  sites_->setToolTip(
      tr("Each level of this column is a site: the model is validated in every site and the "
         "results pooled by random-effects meta-analysis (Sites tab)."));
  sitesLayout->addRow(tr("Site &column:"), sites_);
  layout->addWidget(sitesBox);

  auto* box = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel);
  box->setObjectName(QStringLiteral("uncertaintyButtons"));
  box->button(QDialogButtonBox::Ok)->setText(tr("&Run"));
  error_ = new QLabel;
  error_->setObjectName(QStringLiteral("uncertaintyError"));
  error_->setWordWrap(true);
  error_->setStyleSheet(QStringLiteral("color: #a04000"));
  error_->hide();
  layout->addWidget(error_);
  connect(box, &QDialogButtonBox::accepted, this, [this]() {
    QString error;
    parseThresholds(sizeThresholds_->text(), &error);
    if (!error.isEmpty()) {
      error_->setText(error);
      error_->show();
      return;
    }
    accept();
  });
  connect(box, &QDialogButtonBox::rejected, this, &QDialog::reject);
  layout->addWidget(box);
  resize(560, 560);
}

UncertaintySettings UncertaintyDialog::settings() const {
  UncertaintySettings s;
  s.bootstrapReplicates = replicates_->value();
  s.seed = static_cast<std::uint64_t>(seed_->value());
  s.threads = static_cast<unsigned>(threads_->value());
  s.compareModels = compare_;
  s.sizeThresholds = parseThresholds(sizeThresholds_->text(), nullptr);
  s.clusterColumn = sites_->currentData().toString().toStdString();
  for (int i = 0; i < subgroups_->count(); ++i) {
    if (subgroups_->item(i)->checkState() == Qt::Checked) {
      s.subgroupColumns.push_back(subgroups_->item(i)->text().toStdString());
    }
  }
  return s;
}

void UncertaintyDialog::addCompareModel(const QString& path) {
  // The SHA-256 is recorded when the run reads the file.
  compare_.push_back(
      InputFileRecord{std::filesystem::absolute(path.toStdString()).string(), std::string()});
  models_->addItem(QFileInfo(path).fileName());
}

void UncertaintyDialog::setSubgroupChecked(const QString& column, bool checked) {
  for (int i = 0; i < subgroups_->count(); ++i) {
    if (subgroups_->item(i)->text() == column) {
      subgroups_->item(i)->setCheckState(checked ? Qt::Checked : Qt::Unchecked);
    }
  }
}

void UncertaintyDialog::onAddModel() {
  const QStringList paths = QFileDialog::getOpenFileNames(
      this, tr("Model files to compare"), QString(), tr("Calivera model (*.json);;All files (*)"));
  for (const QString& p : paths) addCompareModel(p);
}

void UncertaintyDialog::onRemoveModel() {
  const int row = models_->currentRow();
  if (row < 0 || row >= static_cast<int>(compare_.size())) return;
  compare_.erase(compare_.begin() + row);
  delete models_->takeItem(row);
}

}  // namespace calivera::ui
