#pragma once
// Settings of the uncertainty run: bootstrap replicates (0 = off), seed, threads (0 = all cores),
// further model files to compare (added through file dialogs) and subgroup columns (offered from
// the cohort's columns that have few enough distinct values to form groups).

#include <QDialog>
#include <string>
#include <vector>

#include "core/data/table.h"
#include "core/study/study.h"

class QComboBox;
class QLabel;
class QLineEdit;
class QListWidget;
class QSpinBox;

namespace calivera::ui {

class UncertaintyDialog : public QDialog {
  Q_OBJECT

 public:
  UncertaintyDialog(const UncertaintySettings& current, const Table& cohort,
                    const std::string& outcomeColumn, QWidget* parent = nullptr);

  UncertaintySettings settings() const;
  // What the file dialog of the Add button does, for tests.
  void addCompareModel(const QString& path);
  void setSubgroupChecked(const QString& column, bool checked);

  // Columns that can form subgroups: text columns with at most kMaxLevels levels and numeric
  // columns with at most kMaxLevels distinct values; not the outcome.
  static constexpr std::size_t kMaxLevels = 30;
  static std::vector<std::string> subgroupCandidates(const Table& table,
                                                     const std::string& outcomeColumn);
  // "0.1, 0.2" -> {0.1, 0.2}; empty text -> none. Error: a message naming the bad entry.
  static std::vector<double> parseThresholds(const QString& text, QString* error);

 private:
  void onAddModel();
  void onRemoveModel();

  std::vector<InputFileRecord> compare_;
  QSpinBox* replicates_ = nullptr;
  QSpinBox* seed_ = nullptr;
  QSpinBox* threads_ = nullptr;
  QLineEdit* sizeThresholds_ = nullptr;
  QLabel* error_ = nullptr;
  QListWidget* models_ = nullptr;
  QListWidget* subgroups_ = nullptr;
  QComboBox* sites_ = nullptr;
};

}  // namespace calivera::ui
