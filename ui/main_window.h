#pragma once
// The workstation's main window: caution banner, threshold bar, linked views (ROC, calibration,
// decision curve, risk distribution, confusion matrix and natural frequencies), summary, tables
// and the predictor-space views. All heavy work runs through one BackgroundJob; results are
// applied only when a run succeeds, so a failing file never disturbs the current study.
//
// Every widget has an objectName; tests drive the window through them and through the public
// methods below, which are what the menu actions call.

#include <QMainWindow>
#include <QStringList>
#include <memory>
#include <vector>

#include "core/study/study.h"
#include "core/study/study_pipeline.h"
#include "core/study/threshold_state.h"

class QAction;
class QLabel;
class QMenu;
class QProgressBar;
class QPushButton;
class QTabWidget;
class QTableView;
class QTextBrowser;
class QSortFilterProxyModel;
class QSpinBox;
class QCheckBox;

namespace calivera::charts {
class CalibrationChart;
class DecisionCurveChart;
class RocChart;
}  // namespace calivera::charts

namespace calivera::ui {

class BackgroundJob;
class ChartPanel;
class ComparisonView;
class ConfusionPanel;
class SubgroupView;
class PredictorView;
class RecordTableModel;
class ThresholdBar;

// True when this build has the PDF report dialog (ui/dialogs/report_export_dialog.h).
bool reportExportAvailable();

class MainWindow : public QMainWindow {
  Q_OBJECT

 public:
  explicit MainWindow(QWidget* parent = nullptr);
  ~MainWindow() override;

  // Starts loading; the result arrives asynchronously (job()->finished()). Return false when the
  // request was refused (a job is running, the file cannot be read), with a message shown.
  bool openStudy(const QString& path);
  bool saveStudy(const QString& path);
  // Cohort and model in one run (the command line's --data/--model); model may be empty.
  bool openInputs(const QString& data, const QString& model, const ImportSettings& settings);
  bool importCohort(const QString& path, const ImportSettings& settings,
                    std::shared_ptr<const Table> loaded = nullptr);
  bool loadModelFile(const QString& path);
  // A model file saved by the update dialog, validated on the same patients: marked apparent,
  // with the study's uncertainty settings run again for it.
  bool validateUpdatedModel(const QString& path);
  bool useFittedModel(const FitSettings& fit, const Model& model,
                      const std::vector<std::string>& warnings);
  bool setColumnMapping(const std::map<std::string, std::string>& mapping);
  bool runValidation();
  // Bootstrap intervals and bands, comparison and subgroups on the current analysis, in the
  // background. Success replaces study().uncertainty and study().uncertaintySettings; cancel or
  // failure keeps the previous results, with a message.
  bool runUncertainty(const UncertaintySettings& settings);
  void setThreshold(double threshold);

  // Exports every chart as NAME.png and NAME.svg into `folder`; empty string on success.
  QString exportAllCharts(const QString& folder);

  const StudyState& study() const { return study_; }
  const ThresholdState& thresholdState() const { return threshold_; }
  std::shared_ptr<const CohortData> cohort() const { return cohort_; }
  std::shared_ptr<const Table> table() const { return table_; }
  BackgroundJob* job() const { return job_; }
  QString messageText() const;
  std::vector<ChartPanel*> chartPanels() const;
  QString studyPath() const { return studyPath_; }
  // Milliseconds the last threshold move took to update every linked view (not painting).
  double lastThresholdUpdateMs() const { return lastUpdateMs_; }

  void showMessage(const QString& text, bool error);
  void clearMessage();

 protected:
  void closeEvent(QCloseEvent* event) override;

 private:
  void buildBanner(QWidget* host);
  void buildMenus();
  void buildToolBar();
  QWidget* buildLinkedViewsTab();
  QWidget* buildTablesTab();
  QWidget* buildModelTab();
  QTableView* makeTableView(const QString& objectName, RecordTableModel* model,
                            QSortFilterProxyModel** proxyOut);

  bool startPipeline(PipelineRequest request, const QString& description,
                     const QString& studyPathOnSuccess);
  void applyPipeline(PipelineOutput& output, const QString& studyPathOnSuccess);
  void rebuildViews();
  // Bootstrap bands and the further models' curves from study_.uncertainty, when present.
  void addUncertaintyLayers(charts::RocChart& roc, charts::CalibrationChart& calibration,
                            charts::DecisionCurveChart& decision) const;
  void applyThreshold();
  void nudgeThreshold(int steps);  // steps of the threshold grid (arrow keys, menu)
  void highlightThresholdRow();
  void updateStatus();
  void updateActions();
  void addRecentStudy(const QString& path);
  void rebuildRecentMenu();

  void onImportCohort();
  void onLoadModel();
  void onFitModel();
  void onMapVariables();
  void onOpenStudy();
  void onSaveStudy(bool askPath);
  void onExportCharts();
  void onExportChart(ChartPanel* panel);
  void onExportTable();
  void onCopyTable();
  void onExportReport();
  void onUncertainty();
  void onInternalValidation();  // main_window_model_tools.cpp
  void onUpdateModel();

  StudyState study_;
  QString studyPath_;
  std::shared_ptr<const Table> table_;
  std::shared_ptr<const CohortData> cohort_;
  ThresholdState threshold_;
  double lastUpdateMs_ = 0.0;

  BackgroundJob* job_ = nullptr;
  QLabel* banner_ = nullptr;
  QWidget* messageBar_ = nullptr;
  QLabel* messageText_ = nullptr;
  QLabel* status_ = nullptr;
  ThresholdBar* thresholdBar_ = nullptr;
  QTabWidget* tabs_ = nullptr;
  ChartPanel* roc_ = nullptr;
  ChartPanel* calibration_ = nullptr;
  ChartPanel* decision_ = nullptr;
  ChartPanel* distribution_ = nullptr;
  ConfusionPanel* confusion_ = nullptr;
  QTextBrowser* summary_ = nullptr;
  PredictorView* predictorView_ = nullptr;
  ComparisonView* comparisonView_ = nullptr;
  SubgroupView* subgroupView_ = nullptr;
  RecordTableModel* thresholdModel_ = nullptr;
  RecordTableModel* hlModel_ = nullptr;
  RecordTableModel* coefficientModel_ = nullptr;
  QSortFilterProxyModel* thresholdProxy_ = nullptr;
  QTableView* thresholdTable_ = nullptr;
  QTableView* hlTable_ = nullptr;
  QTableView* coefficientTable_ = nullptr;
  QLabel* modelInfo_ = nullptr;
  QProgressBar* progress_ = nullptr;
  QSpinBox* groups_ = nullptr;
  QCheckBox* apparent_ = nullptr;

  QAction* actionOpen_ = nullptr;
  QAction* actionSave_ = nullptr;
  QAction* actionSaveAs_ = nullptr;
  QAction* actionImport_ = nullptr;
  QAction* actionLoadModel_ = nullptr;
  QAction* actionFit_ = nullptr;
  QAction* actionMap_ = nullptr;
  QAction* actionRun_ = nullptr;
  QAction* actionCancel_ = nullptr;
  QAction* actionUncertainty_ = nullptr;
  QAction* actionInternal_ = nullptr;
  QAction* actionUpdate_ = nullptr;
  QAction* actionExportCharts_ = nullptr;
  QAction* actionExportTable_ = nullptr;
  QAction* actionExportReport_ = nullptr;
  QMenu* recentMenu_ = nullptr;
};

}  // namespace calivera::ui
