#include "ui/dialogs/mapping_dialog.h"

#include <QComboBox>
#include <QDialogButtonBox>
#include <QHeaderView>
#include <QLabel>
#include <QPushButton>
#include <QTableWidget>
#include <QVBoxLayout>
#include <algorithm>
#include <cmath>

#include "core/model/category_levels.h"
#include "core/study/study_analysis.h"
#include "core/study/unit_check.h"
#include "core/util/shown_text.h"

namespace calivera::ui {

namespace {

std::optional<std::string> unitOf(const Model& model, const std::string& variable) {
  for (const Term& t : model.terms) {
    if (t.variable == variable && t.unit) return t.unit;
    for (const Term& f : t.factors) {
      if (f.variable == variable && f.unit) return f.unit;
    }
  }
  return std::nullopt;
}

QString rangeOf(const Column& c) {
  if (c.kind == ColumnKind::Text) return QObject::tr("%1 levels").arg(c.levels.size());
  double lo = INFINITY, hi = -INFINITY;
  for (double v : c.numbers) {
    if (std::isnan(v)) continue;
    lo = std::min(lo, v);
    hi = std::max(hi, v);
  }
  if (lo > hi) return QObject::tr("all missing");
  return QStringLiteral("%1 to %2").arg(lo, 0, 'g', 6).arg(hi, 0, 'g', 6);
}

}  // namespace

MappingDialog::MappingDialog(const Model& model, const Table& table,
                             const std::map<std::string, std::string>& current,
                             const LevelMapping& levels, QWidget* parent)
    : QDialog(parent),
      model_(model),
      table_(table),
      variables_(modelVariables(model)),
      levels_(levels) {
  setObjectName(QStringLiteral("mappingDialog"));
  setWindowTitle(tr("Map model variables to cohort columns"));
  auto* layout = new QVBoxLayout(this);
  auto* intro =
      new QLabel(tr("Each variable the model uses needs a cohort column holding the same "
                    "quantity, in the unit the model expects."));
  intro->setObjectName(QStringLiteral("mappingIntro"));
  intro->setWordWrap(true);
  layout->addWidget(intro);
  grid_ = new QTableWidget(static_cast<int>(variables_.size()), 5);
  grid_->setObjectName(QStringLiteral("mappingGrid"));
  grid_->setHorizontalHeaderLabels({tr("Model variable"), tr("Unit expected"), tr("Cohort column"),
                                    tr("Cohort values"), tr("Check")});
  grid_->verticalHeader()->setVisible(false);
  for (int row = 0; row < static_cast<int>(variables_.size()); ++row) {
    const std::string& v = variables_[static_cast<std::size_t>(row)];
    grid_->setItem(row, 0, new QTableWidgetItem(QString::fromStdString(v)));
    grid_->setItem(row, 1,
                   new QTableWidgetItem(QString::fromStdString(unitOf(model, v).value_or("—"))));
    auto* combo = new QComboBox;
    combo->setObjectName(QStringLiteral("mappingColumn_%1").arg(QString::fromStdString(v)));
    combo->addItem(tr("(choose a column)"));
    for (const Column& c : table.columns) combo->addItem(QString::fromStdString(c.name));
    std::string preset = v;
    if (auto it = model.columnMapping.find(v); it != model.columnMapping.end()) preset = it->second;
    if (auto it = current.find(v); it != current.end()) preset = it->second;
    const int index = combo->findText(QString::fromStdString(preset));
    combo->setCurrentIndex(index < 0 ? 0 : index);
    connect(combo, &QComboBox::currentIndexChanged, this, &MappingDialog::refreshChecks);
    grid_->setCellWidget(row, 2, combo);
    grid_->setItem(row, 3, new QTableWidgetItem);
    grid_->setItem(row, 4, new QTableWidgetItem);
  }
  grid_->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
  grid_->horizontalHeader()->setStretchLastSection(true);
  layout->addWidget(grid_, 1);
  levelNote_ = new QLabel;
  levelNote_->setObjectName(QStringLiteral("levelMappingNote"));
  levelNote_->setWordWrap(true);
  layout->addWidget(levelNote_);
  levelGrid_ = new QTableWidget(0, 4);
  levelGrid_->setObjectName(QStringLiteral("levelGrid"));
  levelGrid_->setHorizontalHeaderLabels(
      {tr("Model variable"), tr("Level in the cohort"), tr("Rows"), tr("Read as the model's")});
  levelGrid_->verticalHeader()->setVisible(false);
  levelGrid_->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
  levelGrid_->horizontalHeader()->setStretchLastSection(true);
  layout->addWidget(levelGrid_, 1);
  note_ = new QLabel;
  note_->setObjectName(QStringLiteral("mappingNote"));
  note_->setWordWrap(true);
  layout->addWidget(note_);
  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel);
  buttons->setObjectName(QStringLiteral("mappingButtons"));
  buttons->button(QDialogButtonBox::Ok)->setObjectName(QStringLiteral("mappingAccept"));
  buttons->button(QDialogButtonBox::Ok)->setText(tr("Use these pairings and validate"));
  connect(buttons, &QDialogButtonBox::accepted, this, &QDialog::accept);
  connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
  layout->addWidget(buttons);
  resize(820, 560);
  refreshChecks();
}

std::string MappingDialog::pairedColumn(int row) const {
  auto* combo = qobject_cast<QComboBox*>(grid_->cellWidget(row, 2));
  return combo->currentIndex() <= 0 ? std::string() : combo->currentText().toStdString();
}

void MappingDialog::rebuildLevels() {
  // Keep what the user chose before the pairings changed (the first time: the study's mapping).
  if (levelGrid_->rowCount() > 0) levels_ = levelMapping();
  levelGrid_->setRowCount(0);
  const std::map<std::string, std::vector<std::string>> known = indicatorLevels(model_);
  for (int row = 0; row < grid_->rowCount(); ++row) {
    const std::string& variable = variables_[static_cast<std::size_t>(row)];
    const auto modelLevels = known.find(variable);
    const Column* column = table_.find(pairedColumn(row));
    if (modelLevels == known.end() || column == nullptr || column->kind != ColumnKind::Text) {
      continue;
    }
    std::vector<std::string> targets = modelLevels->second;
    if (const auto ref = model_.referenceLevels.find(variable);
        ref != model_.referenceLevels.end()) {
      targets.insert(targets.begin(), ref->second.begin(), ref->second.end());
    }
    std::vector<std::size_t> counts(column->levels.size(), 0);
    for (const std::int32_t code : column->codes) {
      if (code >= 0) ++counts[static_cast<std::size_t>(code)];
    }
    const auto chosen = levels_.find(variable);
    for (std::size_t code = 0; code < column->levels.size(); ++code) {
      const std::string& level = column->levels[code];
      const bool knownLevel = std::find(targets.begin(), targets.end(), level) != targets.end();
      const bool mapped = chosen != levels_.end() && chosen->second.count(level) != 0;
      if (knownLevel && !mapped) continue;  // the model knows it as it is
      const int r = levelGrid_->rowCount();
      levelGrid_->insertRow(r);
      levelGrid_->setItem(r, 0, new QTableWidgetItem(QString::fromStdString(variable)));
      auto* levelItem = new QTableWidgetItem(QString::fromStdString(visibleName(level, 60)));
      levelItem->setData(Qt::UserRole, QString::fromStdString(level));
      levelItem->setToolTip(QString::fromStdString(visibleName(level, 4096)));
      levelGrid_->setItem(r, 1, levelItem);
      levelGrid_->setItem(r, 2, new QTableWidgetItem(QString::number(counts[code])));
      auto* combo = new QComboBox;
      combo->setObjectName(
          QStringLiteral("levelMap_%1_%2")
              .arg(QString::fromStdString(variable), QString::fromStdString(level)));
      combo->addItem(tr("(unknown: stops the validation)"));
      for (const std::string& t : targets) combo->addItem(QString::fromStdString(t));
      if (mapped) {
        const int index = combo->findText(QString::fromStdString(chosen->second.at(level)));
        combo->setCurrentIndex(index < 0 ? 0 : index);
      }
      levelGrid_->setCellWidget(r, 3, combo);
    }
  }
  const bool any = levelGrid_->rowCount() > 0;
  levelGrid_->setVisible(any);
  levelNote_->setText(
      any ? tr("Levels of the paired columns that the model does not know. Read each as one of "
               "the model's levels only when it means the same category; a level left unknown "
               "stops the validation instead of being scored as the reference.")
          : tr("Every level of the paired text columns is one the model knows."));
}

void MappingDialog::refreshChecks() {
  rebuildLevels();
  int unpaired = 0, mismatched = 0;
  for (int row = 0; row < grid_->rowCount(); ++row) {
    auto* combo = qobject_cast<QComboBox*>(grid_->cellWidget(row, 2));
    const std::string& v = variables_[static_cast<std::size_t>(row)];
    if (combo->currentIndex() <= 0) {
      ++unpaired;
      grid_->item(row, 3)->setText(QString());
      grid_->item(row, 4)->setText(tr("not paired"));
      continue;
    }
    const Column* c = table_.find(combo->currentText().toStdString());
    grid_->item(row, 3)->setText(c ? rangeOf(*c) : QString());
    const UnitCheck check = checkUnit(unitOf(model_, v), combo->currentText().toStdString());
    if (check.verdict == UnitVerdict::Differs) ++mismatched;
    grid_->item(row, 4)->setText(QString::fromStdString(check.message));
  }
  QString note;
  if (unpaired > 0) note += tr("%1 variable(s) not paired yet. ").arg(unpaired);
  if (mismatched > 0) {
    note += tr("%1 unit mismatch(es): the validation would be wrong unless the column is "
               "converted first.")
                .arg(mismatched);
  }
  note_->setText(note.isEmpty() ? tr("All variables paired; no unit conflict found.") : note);
}

std::map<std::string, std::string> MappingDialog::mapping() const {
  std::map<std::string, std::string> out;
  for (int row = 0; row < grid_->rowCount(); ++row) {
    auto* combo = qobject_cast<QComboBox*>(grid_->cellWidget(row, 2));
    if (combo->currentIndex() <= 0) continue;
    const std::string column = combo->currentText().toStdString();
    const std::string& v = variables_[static_cast<std::size_t>(row)];
    if (column != v) out[v] = column;
  }
  return out;
}

MappingDialog::LevelMapping MappingDialog::levelMapping() const {
  LevelMapping out;
  for (int row = 0; row < levelGrid_->rowCount(); ++row) {
    auto* combo = qobject_cast<QComboBox*>(levelGrid_->cellWidget(row, 3));
    if (combo == nullptr || combo->currentIndex() <= 0) continue;
    const std::string variable = levelGrid_->item(row, 0)->text().toStdString();
    const std::string level = levelGrid_->item(row, 1)->data(Qt::UserRole).toString().toStdString();
    out[variable][level] = combo->currentText().toStdString();
  }
  return out;
}

}  // namespace calivera::ui
