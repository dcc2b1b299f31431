#pragma once
// The workstation's main window: layout and actions. The caution banner, threshold bar, linked
// views (ROC, calibration, decision curve, risk distribution, confusion matrix and natural
// frequencies), summary, tables and the predictor-space views all observe one StudyController,
// which owns the study, its run and the threshold, and runs every computation in the background;
// results are applied only when a run succeeds, so a failing file never disturbs the current study.
//
// Every widget has an objectName; tests drive the window through them and through controller(),
// whose methods are what the menu actions call.

#include <QMainWindow>
#include <QMessageBox>
#include <QStringList>
#include <functional>
#include <memory>
#include <vector>

#include "ui/study_controller.h"

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
class SitesView;
class SiteSummariesWindow;
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

  // The study, its run and its threshold; every action goes through it (ui/study_controller.h).
  StudyController& controller() const { return *controller_; }

  // Exports every chart as NAME.png and NAME.svg into `folder`; empty string on success.
  QString exportAllCharts(const QString& folder);
  // The lines under every exported chart: the caution, the cohort's and the model's file names
  // and SHA-256, the export time (SOURCE_DATE_EPOCH when set), version, patients and events.
  QStringList exportFooter() const;

  QString messageText() const;
  std::vector<ChartPanel*> chartPanels() const;
  // Milliseconds the last threshold move took to update every linked view (not painting).
  double lastThresholdUpdateMs() const { return lastUpdateMs_; }

  void showMessage(const QString& text, bool error);
  void clearMessage();

  // What to do with unsaved changes before they would be lost (quit, open, new, close):
  // Save, Discard or Cancel. The default asks with a message box; tests replace it.
  using UnsavedChangesPrompt = std::function<QMessageBox::StandardButton(const QString& study)>;
  void setUnsavedChangesPrompt(UnsavedChangesPrompt prompt) { askUnsaved_ = std::move(prompt); }
  // True when the study may be replaced: nothing unsaved, saved now, or discarded by the user.
  bool confirmDiscardChanges();

  // A file dropped on the window (or given by the caller): a study file opens (after the
  // unsaved-changes question), a model file loads into the current study, a CSV or text file
  // opens the import dialog on it. Anything else is refused with a message. False when refused.
  bool openDroppedFile(const QString& path);

  // A window of its own pooling site summaries (ui/sites/site_summaries_window.h): one `.cvsites`
  // set is opened, otherwise every path is added as a summary. The window closes with this one.
  SiteSummariesWindow* openSiteSummaries(const QStringList& paths);

  // Window size, position, toolbar state and splitter positions from the user's settings (the
  // workstation calls this at start; tests do not, so one test's window never sizes another's).
  void restoreWindowState();

 protected:
  void closeEvent(QCloseEvent* event) override;
  void dragEnterEvent(QDragEnterEvent* event) override;
  void dropEvent(QDropEvent* event) override;

 private:
  const StudyState& study() const { return controller_->study(); }
  void buildBanner(QWidget* host);
  void buildMenus();
  void buildToolBar();
  QWidget* buildLinkedViewsTab();
  QWidget* buildTablesTab();
  QWidget* buildModelTab();
  QTableView* makeTableView(const QString& objectName, RecordTableModel* model,
                            QSortFilterProxyModel** proxyOut);

  // Every view from the controller's study, run and uncertainty results, at its threshold.
  void rebuildViews();
  // The settings widgets (threshold bar, groups, development-data box) from the study.
  void showStudySettings();
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
  void onOpenSiteSummaries();
  void importCohortFrom(const QString& path);
  void onLoadModel();
  void onFitModel();
  void onMapVariables();
  void onOpenStudy();
  void onNewStudy();
  void onSaveStudy(bool askPath);
  void onExportCharts();
  void onExportChart(ChartPanel* panel);
  void onCopyChart(ChartPanel* panel);
  void onPrintReport();
  void onUndo();
  void onRedo();
  // The chart's context menu: copy and export, both with exportFooter().
  void connectChartMenu(ChartPanel* panel);
  void onExportTable();
  void onCopyTable();
  void onExportReport();
  void onUncertainty();
  void onMissingData();
  void showMissingData();  // the Missing data table page, from the current run
  QWidget* buildMissingDataPage();
  void onInternalValidation();  // main_window_model_tools.cpp
  void onUpdateModel();

  StudyController* controller_ = nullptr;
  double lastUpdateMs_ = 0.0;

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
  SitesView* sitesView_ = nullptr;
  RecordTableModel* thresholdModel_ = nullptr;
  RecordTableModel* hlModel_ = nullptr;
  RecordTableModel* missingModel_ = nullptr;  // the analysed columns missing together
  RecordTableModel* pooledModel_ = nullptr;   // imputed copies pooled beside complete cases
  QWidget* pooledBox_ = nullptr;
  QLabel* missingNote_ = nullptr;  // how missing values were handled
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
  QAction* actionMissingData_ = nullptr;
  QAction* actionInternal_ = nullptr;
  QAction* actionUpdate_ = nullptr;
  QAction* actionExportCharts_ = nullptr;
  QAction* actionPrintReport_ = nullptr;
  QAction* actionUndo_ = nullptr;
  QAction* actionRedo_ = nullptr;
  QAction* actionExportTable_ = nullptr;
  QAction* actionExportReport_ = nullptr;
  UnsavedChangesPrompt askUnsaved_;
  QMenu* recentMenu_ = nullptr;
};

}  // namespace calivera::ui
