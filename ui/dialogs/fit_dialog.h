#pragma once
// Fit a logistic model on the loaded cohort: choose the predictors, optionally Firth's penalized
// likelihood, fit in the background, and read the coefficient table (Wald 95% CIs) with any
// separation, convergence or rank warnings before accepting the model.

#include <QDialog>
#include <memory>
#include <optional>

#include "core/data/table.h"
#include "core/study/study_analysis.h"

class QListWidget;
class QCheckBox;
class QLabel;
class QLineEdit;
class QPushButton;
class QTableView;

namespace calivera::ui {

class BackgroundJob;
class RecordTableModel;

class FitDialog : public QDialog {
  Q_OBJECT

 public:
  FitDialog(std::shared_ptr<const Table> table, ImportSettings import, const FitSettings& initial,
            QWidget* parent = nullptr);

  // Throws InputError when the spline field is not COLUMN=KNOTS, ... (spline_list.h).
  FitSettings fitSettings() const;
  const FittedModel* fitted() const { return fitted_ ? &*fitted_ : nullptr; }
  // The settings the shown fit was made with (the fields may have been edited since).
  const FitSettings& fittedWith() const { return fittedWith_; }
  BackgroundJob* job() const { return job_; }
  void startFit();

 private:
  std::shared_ptr<const Table> table_;
  ImportSettings import_;
  std::optional<FittedModel> fitted_;
  FitSettings fittedWith_;
  QListWidget* predictors_ = nullptr;
  QCheckBox* firth_ = nullptr;
  QCheckBox* profile_ = nullptr;
  QLineEdit* splines_ = nullptr;
  QPushButton* fitButton_ = nullptr;
  QPushButton* accept_ = nullptr;
  QLabel* status_ = nullptr;
  RecordTableModel* coefficients_ = nullptr;
  BackgroundJob* job_ = nullptr;
};

}  // namespace calivera::ui
