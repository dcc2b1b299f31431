#pragma once
// How the study handles missing values of the model's columns: complete cases only, imputed
// copies stacked in the cohort (numbered by a column), or copies imputed here by chained
// equations (core/imputation/). The complete-case results stay in every view either way; the
// pooled ones are added on the Missing data table page and in the report.

#include <QDialog>
#include <string>
#include <vector>

#include "core/data/table.h"
#include "core/study/study.h"

class QComboBox;
class QLabel;
class QRadioButton;
class QSpinBox;

namespace calivera::ui {

class MissingDataDialog : public QDialog {
  Q_OBJECT

 public:
  MissingDataDialog(const MissingDataSettings& current, const Table& cohort,
                    const std::string& outcomeColumn, QWidget* parent = nullptr);

  MissingDataSettings settings() const;

  // Columns that can number stacked copies: numeric, not the outcome, every value a whole
  // number >= 0, with 0 (the original data) and at least two other indices, each on as many
  // rows. The run checks the rest (core/imputation/stacked_imputations.h).
  static std::vector<std::string> imputationColumnCandidates(const Table& table,
                                                             const std::string& outcomeColumn);

 private:
  void updateEnabled();

  QRadioButton* completeCases_ = nullptr;
  QRadioButton* stacked_ = nullptr;
  QRadioButton* impute_ = nullptr;
  QComboBox* column_ = nullptr;
  QSpinBox* copies_ = nullptr;
  QSpinBox* iterations_ = nullptr;
  QSpinBox* seed_ = nullptr;
  QLabel* noColumn_ = nullptr;
};

}  // namespace calivera::ui
