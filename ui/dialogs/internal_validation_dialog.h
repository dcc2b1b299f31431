#pragma once
// Internal validation of the study's model on its own cohort by bootstrap optimism correction
// (core/uncertainty/internal_validation.h: Efron 1983; Harrell, Lee & Mark 1996): every
// replicate refits the model's terms on a resample. Shows apparent, mean optimism and corrected
// AUC, calibration slope and intercept, Brier and ICI, and offers the uniformly shrunk model
// (coefficients times the corrected slope) as a model file. The bootstrap runs in the
// background with its own progress bar and Cancel button.

#include <QDialog>
#include <memory>
#include <optional>

#include "core/model/model.h"
#include "core/study/study_analysis.h"
#include "core/uncertainty/internal_validation.h"

class QCheckBox;
class QLabel;
class QPushButton;
class QSpinBox;

namespace calivera::ui {

class BackgroundJob;
class RecordTableModel;

class InternalValidationDialog : public QDialog {
  Q_OBJECT

 public:
  InternalValidationDialog(Model model, std::shared_ptr<const CohortData> cohort,
                           InputFileRecord data, QWidget* parent = nullptr);

  BackgroundJob* job() const { return job_; }
  const InternalValidation* result() const { return result_ ? &*result_ : nullptr; }
  void startRun();
  // Refits, shrinks and writes the model file (atomically) in the background; emits
  // modelSaved(path) on success, shows the reason in the dialog on failure. False when refused
  // (no result yet, or a job is running).
  bool startSaveShrunkModel(const QString& path);

 signals:
  void modelSaved(const QString& path);

 private:
  void showResult();

  Model model_;
  std::shared_ptr<const CohortData> cohort_;
  InputFileRecord data_;
  std::optional<InternalValidation> result_;
  QSpinBox* replicates_ = nullptr;
  QSpinBox* seed_ = nullptr;
  QSpinBox* threads_ = nullptr;
  QCheckBox* ici_ = nullptr;
  QCheckBox* firth_ = nullptr;
  QPushButton* run_ = nullptr;
  QPushButton* save_ = nullptr;
  QLabel* status_ = nullptr;
  RecordTableModel* table_ = nullptr;
  BackgroundJob* job_ = nullptr;
};

}  // namespace calivera::ui
