#pragma once
// Updating the study's model on this cohort (core/uncertainty/model_update.h: Steyerberg et al.
// 2004; Janssen et al. 2008): the intercept update, logistic recalibration and a full refit are
// all estimated, the closed testing procedure (Vergouwe et al. 2017) suggests the least update
// the data support, and the chosen update is written as a model file that records what it
// updates, on which data and how. Fits run in the background with progress and Cancel.

#include <QDialog>
#include <memory>
#include <optional>
#include <vector>

#include "core/model/model.h"
#include "core/study/study_analysis.h"
#include "core/uncertainty/model_update.h"

class QCheckBox;
class QComboBox;
class QDoubleSpinBox;
class QLabel;
class QPushButton;

namespace calivera::ui {

class BackgroundJob;
class RecordTableModel;

// Everything one run of the dialog estimates.
struct ModelUpdateSet {
  ClosedTestResult closed;
  std::vector<UpdatedModel> updates;  // intercept, recalibrate, refit
};

class ModelUpdateDialog : public QDialog {
  Q_OBJECT

 public:
  ModelUpdateDialog(Model model, std::shared_ptr<const CohortData> cohort, InputFileRecord data,
                    QWidget* parent = nullptr);

  BackgroundJob* job() const { return job_; }
  const ModelUpdateSet* result() const { return result_ ? &*result_ : nullptr; }
  UpdateMethod chosenMethod() const;
  void chooseMethod(UpdateMethod method);
  void startRun();
  // Writes the chosen update as a model file (atomically); an empty string on success, else the
  // reason. Emits modelSaved(path, useInStudy) on success.
  QString saveChosenModel(const QString& path, bool useInStudy);

 signals:
  void modelSaved(const QString& path, bool useInStudy);

 private:
  void showResult();
  void askAndSave(bool useInStudy);

  Model model_;
  std::shared_ptr<const CohortData> cohort_;
  InputFileRecord data_;
  std::optional<ModelUpdateSet> result_;
  QDoubleSpinBox* alpha_ = nullptr;
  QCheckBox* firth_ = nullptr;
  QPushButton* run_ = nullptr;
  QComboBox* method_ = nullptr;
  QPushButton* save_ = nullptr;
  QPushButton* saveAndUse_ = nullptr;
  QLabel* status_ = nullptr;
  RecordTableModel* closedTable_ = nullptr;
  RecordTableModel* updatesTable_ = nullptr;
  BackgroundJob* job_ = nullptr;
};

}  // namespace calivera::ui
