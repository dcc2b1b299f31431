// MainWindow: studies, background runs, and keeping every linked view in step with the threshold.
#include <QApplication>
#include <QCheckBox>
#include <QClipboard>
#include <QDir>
#include <QElapsedTimer>
#include <QFileDialog>
#include <QFileInfo>
#include <QItemSelectionModel>
#include <QLabel>
#include <QMenu>
#include <QSettings>
#include <QSortFilterProxyModel>
#include <QSpinBox>
#include <QTabWidget>
#include <QTableView>
#include <QTextBrowser>
#include <filesystem>
#include <set>

#include "core/model/model_io.h"
#include "core/study/study_file.h"
#include "core/study/study_uncertainty.h"
#include "core/util/errors.h"
#include "core/util/shown_text.h"
#include "render/charts/charts.h"
#include "ui/async/background_job.h"
#include "ui/dialogs/fit_dialog.h"
#include "ui/dialogs/import_dialog.h"
#include "ui/dialogs/mapping_dialog.h"
#include "ui/dialogs/uncertainty_dialog.h"
#include "ui/main_window.h"
#include "ui/models/record_table_model.h"
#include "ui/models/result_tables.h"
#include "ui/models/table_export.h"
#include "ui/views/chart_panel.h"
#include "ui/views/comparison_view.h"
#include "ui/views/confusion_panel.h"
#include "ui/views/predictor_view.h"
#include "ui/views/subgroup_view.h"
#include "ui/views/summary_html.h"
#include "ui/views/threshold_bar.h"

#if __has_include("ui/dialogs/report_export_dialog.h")
#include "ui/dialogs/report_export_dialog.h"
#define CALIVERA_HAVE_REPORT_DIALOG 1
#endif

namespace calivera::ui {

namespace {

constexpr int kMaxRecent = 8;
const char* const kRecentKey = "recentStudies";

QString toQ(const std::string& s) {
  return QString::fromStdString(s);
}

}  // namespace

bool reportExportAvailable() {
#ifdef CALIVERA_HAVE_REPORT_DIALOG
  return true;
#else
  return false;
#endif
}

bool MainWindow::startPipeline(PipelineRequest request, const QString& description,
                               const QString& studyPathOnSuccess) {
  if (job_->isRunning()) {
    showMessage(tr("Another computation is still running; wait for it or cancel it."), true);
    return false;
  }
  std::function<PipelineOutput(const ProgressCallback&)> work =
      [request = std::move(request)](const ProgressCallback& progress) {
        return runPipeline(request, progress);
      };
  std::function<void(PipelineOutput&)> done = [this, studyPathOnSuccess](PipelineOutput& out) {
    applyPipeline(out, studyPathOnSuccess);
  };
  return job_->start<PipelineOutput>(description, work, done);
}

void MainWindow::applyPipeline(PipelineOutput& output, const QString& studyPathOnSuccess) {
  study_ = std::move(output.study);
  table_ = output.table;
  cohort_ = output.cohort;
  if (!studyPathOnSuccess.isEmpty()) {
    studyPath_ = studyPathOnSuccess;
    addRecentStudy(studyPath_);
  }
  if (cohort_) {
    threshold_.setData(cohort_->risk(), cohort_->outcome());
  } else {
    threshold_.clear();
  }
  threshold_.setThreshold(study_.analysis.threshold);
  thresholdBar_->setThreshold(threshold_.threshold());
  thresholdBar_->setReasonableRange(study_.analysis.reasonableLo, study_.analysis.reasonableHi);
  groups_->setValue(study_.analysis.groups);
  apparent_->setChecked(study_.analysis.apparent);
  rebuildViews();
  updateStatus();
  updateActions();
  QString text;
  for (const auto& w : output.inputWarnings) text += (text.isEmpty() ? "" : "\n") + toQ(w);
  if (!text.isEmpty()) text += tr("\nResults are recomputed from the files as they are now.");
  for (const auto& n : output.notes) text += (text.isEmpty() ? "" : "\n") + toQ(n);
  if (!text.isEmpty()) {
    showMessage(text, !output.inputWarnings.empty());
  } else if (study_.result) {
    clearMessage();
  }
}

void MainWindow::rebuildViews() {
  const ValidationResult* r = study_.result.get();
  if (r == nullptr) {
    for (ChartPanel* p : {roc_, calibration_, decision_, distribution_}) p->setLinkedChart(nullptr);
    thresholdModel_->setTable({}, {}, {});
    hlModel_->setTable({}, {}, {});
    confusion_->clear();
  } else {
    auto* roc = new charts::RocChart(r->discrimination);
    auto* calibration = new charts::CalibrationChart(r->calibration, r->distribution);
    auto* decision = new charts::DecisionCurveChart(r->decisionCurve, r->cohort);
    decision->setReasonableRange(study_.analysis.reasonableLo, study_.analysis.reasonableHi);
    addUncertaintyLayers(*roc, *calibration, *decision);
    roc_->setLinkedChart(roc);
    calibration_->setLinkedChart(calibration);
    decision_->setLinkedChart(decision);
    distribution_->setLinkedChart(new charts::DistributionChart(r->distribution));
    fillThresholdTable(*thresholdModel_, r->thresholds, r->decisionCurve);
    fillHosmerLemeshowTable(*hlModel_, r->hosmerLemeshow);
  }
  if (study_.model) {
    fillCoefficientTable(*coefficientModel_, *study_.model);
    // Names from files: escaped, invisible controls written out, long ones cut so a word-wrapped
    // label cannot widen the window; the tooltip holds them in full.
    const auto shown = [](const std::string& text, std::size_t chars) {
      return toQ(visibleName(text, chars)).toHtmlEscaped();
    };
    QString info = tr("<b>%1</b>").arg(shown(study_.model->name, 80));
    if (!study_.model->outcome.empty()) {
      info += tr(" — predicts %1").arg(shown(study_.model->outcome, 80));
    }
    info +=
        study_.modelSource == ModelSource::Fitted
            ? tr("<br>Fitted here by %1.")
                  .arg(study_.fit.firth ? tr("Firth's penalized likelihood")
                                        : tr("maximum likelihood"))
            : tr("<br>Read from %1.")
                  .arg(
                      study_.modelFile
                          ? shown(std::filesystem::path(study_.modelFile->path).filename().string(),
                                  60)
                          : QString());
    modelInfo_->setToolTip(
        toQ(visibleName(study_.model->name, 4096)) +
        (study_.modelFile ? "\n" + toQ(visibleName(study_.modelFile->path, 4096)) : QString()));
    if (study_.model->development.n) {
      info += tr(" Development data: %1 patients").arg(*study_.model->development.n);
      if (study_.model->development.events) {
        info += tr(", %1 events").arg(*study_.model->development.events);
      }
      info += QStringLiteral(".");
    }
    for (const auto& w : study_.modelWarnings) {
      info += tr("<br><span style='color:#a04000'><b>Warning:</b> %1</span>")
                  .arg(toQ(w).toHtmlEscaped());
    }
    info += tr("<br>Confidence intervals are Wald intervals (coefficient ± 1.96 SE).");
    modelInfo_->setText(info);
  } else {
    coefficientModel_->setTable({}, {}, {});
    modelInfo_->setText(
        tr("No model yet: load a model file (Model → Load model file) or fit one "
           "on the cohort (Model → Fit a model)."));
  }
  summary_->setHtml(summaryHtml(study_));
  if (study_.uncertainty && study_.result) {
    confusion_->setAdequacy(toQ(study_.uncertainty->sampleSize.verdict),
                            study_.uncertainty->sampleSize.adequate);
  } else {
    confusion_->setAdequacy({}, false);
  }
  comparisonView_->setResults(study_.uncertainty, study_.analysis.reasonableLo,
                              study_.analysis.reasonableHi);
  subgroupView_->setResults(study_.uncertainty);
  predictorView_->setData(study_.model ? &*study_.model : nullptr, cohort_, study_.columnMapping,
                          study_.predictorView, study_.heldValues);
  applyThreshold();
}

void MainWindow::addUncertaintyLayers(charts::RocChart& roc, charts::CalibrationChart& calibration,
                                      charts::DecisionCurveChart& decision) const {
  const UncertaintyResults* u = study_.uncertainty.get();
  if (u == nullptr) return;
  if (u->bootstrap) {
    calibration.setCurveBand(u->bootstrap->calibrationCurve);
    decision.setNetBenefitBand(u->bootstrap->netBenefit);
  }
  if (!u->comparison) return;
  // Further models only (the study's own model is the main curve); comparedResults[0] is the
  // study's model on the comparison rows.
  const bool fewer = study_.result && u->comparisonRows < study_.result->cohort.n;
  for (std::size_t m = 1; m < u->comparedResults.size() && m < u->comparison->models.size(); ++m) {
    QString name = toQ(u->comparison->models[m]);
    if (fewer) name += tr(" (on %1 patients)").arg(u->comparisonRows);
    const ValidationResult& other = u->comparedResults[m];
    roc.addComparison(name, other.discrimination);
    calibration.addComparison(name, other.calibration);
    decision.addComparison(name, other.decisionCurve);
  }
}

void MainWindow::setThreshold(double threshold) {
  threshold_.setThreshold(threshold);
  study_.analysis.threshold = threshold_.threshold();
  thresholdBar_->setThreshold(threshold_.threshold());
  applyThreshold();
}

void MainWindow::applyThreshold() {
  QElapsedTimer timer;
  timer.start();
  if (threshold_.hasData()) {
    const ThresholdSnapshot snapshot = threshold_.snapshot();
    for (ChartPanel* p : {roc_, calibration_, decision_, distribution_}) {
      if (p->linkedChart() != nullptr) p->linkedChart()->setThreshold(snapshot);
    }
    confusion_->setSnapshot(snapshot, study_.result ? &study_.result->calibration : nullptr);
    subgroupView_->setThreshold(snapshot);
    predictorView_->setThreshold(snapshot);
    highlightThresholdRow();
  }
  lastUpdateMs_ = static_cast<double>(timer.nsecsElapsed()) / 1e6;
}

void MainWindow::highlightThresholdRow() {
  if (!study_.result) return;
  const int row = nearestThresholdRow(study_.result->thresholds, threshold_.threshold());
  if (row < 0) return;
  const QModelIndex index = thresholdProxy_->mapFromSource(thresholdModel_->index(row, 0));
  thresholdTable_->selectionModel()->setCurrentIndex(
      index, QItemSelectionModel::ClearAndSelect | QItemSelectionModel::Rows);
  thresholdTable_->scrollTo(index);
}

void MainWindow::updateStatus() {
  // Names from files are shown plain (the label is plain text), with invisible and bidirectional
  // controls written out and long names cut; the tooltip holds them in full.
  const auto name = [](const std::string& text, std::size_t chars) {
    return toQ(visibleName(text, chars));
  };
  QStringList parts;
  QStringList full;
  if (study_.data) {
    const std::string file = std::filesystem::path(study_.data->path).filename().string();
    parts << tr("Cohort: %1 (%2 rows)").arg(name(file, 40)).arg(table_ ? table_->rowCount : 0);
    full << tr("Cohort: %1").arg(name(study_.data->path, 4096));
  } else {
    parts << tr("No cohort: File → Import cohort CSV");
  }
  if (study_.model) {
    parts << tr("Model: %1").arg(name(study_.model->name, 50));
    full << tr("Model: %1").arg(name(study_.model->name, 4096));
  }
  status_->setToolTip(full.join('\n'));
  if (study_.result) {
    parts << tr("%1 patients analysed, %2 events")
                 .arg(study_.result->cohort.n)
                 .arg(study_.result->cohort.events);
  }
  if (!studyPath_.isEmpty()) parts << tr("Study: %1").arg(QFileInfo(studyPath_).fileName());
  status_->setText(parts.join(QStringLiteral("  ·  ")));
  setWindowTitle(studyPath_.isEmpty()
                     ? tr("Calivera workstation")
                     : tr("%1 — Calivera workstation").arg(QFileInfo(studyPath_).fileName()));
}

bool MainWindow::openStudy(const QString& path) {
  StudyState candidate;
  try {
    candidate = readStudyFile(path.toStdString());
  } catch (const std::exception& e) {
    showMessage(tr("Could not open the study: %1").arg(toQ(e.what())), true);
    return false;
  }
  PipelineRequest request;
  request.study = candidate;
  request.withUncertainty = true;      // recompute what the study's uncertainty settings ask for
  request.checkRecordedInputs = true;  // hashed on the worker, reported with the results
  return startPipeline(request, tr("Opening study"), path);
}

bool MainWindow::saveStudy(const QString& path) {
  try {
    writeStudyFile(path.toStdString(), study_);
  } catch (const std::exception& e) {
    showMessage(tr("Could not save the study: %1").arg(toQ(e.what())), true);
    return false;
  }
  studyPath_ = path;
  addRecentStudy(path);
  updateStatus();
  showMessage(tr("Study saved to %1").arg(path), false);
  return true;
}

bool MainWindow::importCohort(const QString& path, const ImportSettings& settings,
                              std::shared_ptr<const Table> loaded) {
  PipelineRequest request;
  request.study = study_;
  request.study.data = InputFileRecord{std::filesystem::absolute(path.toStdString()).string(), {}};
  request.study.import = settings;
  request.table = loaded;
  if (request.study.modelSource == ModelSource::Fitted) {
    request.study.modelSource = ModelSource::None;  // a fit belongs to its own cohort
    request.study.model.reset();
  }
  return startPipeline(request, tr("Reading cohort"), {});
}

bool MainWindow::openInputs(const QString& data, const QString& model,
                            const ImportSettings& settings) {
  PipelineRequest request;
  request.study.data = InputFileRecord{std::filesystem::absolute(data.toStdString()).string(), {}};
  request.study.import = settings;
  if (!model.isEmpty()) {
    request.study.modelSource = ModelSource::File;
    request.study.modelFile = InputFileRecord{model.toStdString(), {}};
  }
  return startPipeline(request, tr("Opening cohort and model"), {});
}

bool MainWindow::loadModelFile(const QString& path) {
  if (!study_.data) {
    showMessage(tr("Import a cohort first (File → Import cohort CSV), then load the model."), true);
    return false;
  }
  PipelineRequest request;
  request.study = study_;
  request.study.modelSource = ModelSource::File;
  request.study.modelFile = InputFileRecord{path.toStdString(), {}};
  request.study.model.reset();
  request.study.columnMapping.clear();
  request.table = table_;
  return startPipeline(request, tr("Loading model and validating"), {});
}

bool MainWindow::useFittedModel(const FitSettings& fit, const Model& model,
                                const std::vector<std::string>& warnings) {
  PipelineRequest request;
  request.study = study_;
  request.study.modelSource = ModelSource::Fitted;
  request.study.fit = fit;
  request.study.model = model;
  request.study.modelWarnings = warnings;
  request.study.modelFile.reset();
  request.study.columnMapping.clear();
  request.table = table_;
  return startPipeline(request, tr("Validating the fitted model"), {});
}

bool MainWindow::setColumnMapping(const std::map<std::string, std::string>& mapping) {
  PipelineRequest request;
  request.study = study_;
  request.study.columnMapping = mapping;
  request.table = table_;
  return startPipeline(request, tr("Validating"), {});
}

bool MainWindow::runValidation() {
  if (!study_.data) {
    showMessage(tr("Import a cohort first (File → Import cohort CSV)."), true);
    return false;
  }
  PipelineRequest request;
  request.study = study_;
  request.table = table_;
  return startPipeline(request, tr("Validating"), {});
}

bool MainWindow::runUncertainty(const UncertaintySettings& settings) {
  if (job_->isRunning()) {
    showMessage(tr("Another computation is still running; wait for it or cancel it."), true);
    return false;
  }
  if (!study_.result || !cohort_) {
    showMessage(tr("Run the validation first (Analysis → Run validation)."), true);
    return false;
  }
  std::function<UncertaintyResults(const ProgressCallback&)> work =
      [cohort = cohort_, result = study_.result, settings](const ProgressCallback& progress) {
        return computeUncertainty(*cohort, *result, settings, progress);
      };
  std::function<void(UncertaintyResults&)> done =
      [this, settings, basis = validationBasis(study_)](UncertaintyResults& results) {
        study_.uncertaintySettings = withComparedHashes(settings, results);
        study_.uncertaintyBasis = basis;
        study_.uncertainty = std::make_shared<const UncertaintyResults>(std::move(results));
        rebuildViews();
        clearMessage();
      };
  return job_->start<UncertaintyResults>(tr("Intervals, comparison and subgroups"), work, done);
}

QString MainWindow::exportAllCharts(const QString& folder) {
  if (!QDir().mkpath(folder)) return tr("cannot create the folder %1").arg(folder);
  for (ChartPanel* p : chartPanels()) {
    if (p->linkedChart() == nullptr) continue;
    const QString stem = QDir(folder).filePath(p->linkedChart()->exportName());
    if (QString e = p->exportPng(stem + ".png"); !e.isEmpty()) return e;
    if (QString e = p->exportSvg(stem + ".svg"); !e.isEmpty()) return e;
  }
  return {};
}

void MainWindow::onImportCohort() {
  ImportDialog dialog(this);
  if (study_.data) dialog.setInitial(toQ(study_.data->path), study_.import);
  if (dialog.exec() != QDialog::Accepted) return;
  importCohort(dialog.path(), dialog.settings(), dialog.loadedTable());
}

void MainWindow::onLoadModel() {
  const QString path = QFileDialog::getOpenFileName(this, tr("Load model file"), QString(),
                                                    tr("Calivera model (*.json);;All files (*)"));
  if (!path.isEmpty()) loadModelFile(path);
}

void MainWindow::onFitModel() {
  if (!table_ || study_.import.outcomeColumn.empty()) {
    showMessage(tr("Import a cohort and choose its outcome column before fitting a model."), true);
    return;
  }
  FitDialog dialog(table_, study_.import, study_.fit, this);
  if (dialog.exec() != QDialog::Accepted || !dialog.fitted()) return;
  useFittedModel(dialog.fittedWith(), dialog.fitted()->model, dialog.fitted()->warnings);
}

void MainWindow::onMapVariables() {
  if (!study_.model || !table_) return;
  MappingDialog dialog(*study_.model, *table_, study_.columnMapping, this);
  if (dialog.exec() != QDialog::Accepted) return;
  setColumnMapping(dialog.mapping());
}

void MainWindow::onUncertainty() {
  if (!study_.result || !table_) return;
  UncertaintyDialog dialog(study_.uncertaintySettings, *table_, study_.import.outcomeColumn, this);
  if (dialog.exec() != QDialog::Accepted) return;
  runUncertainty(dialog.settings());
}

void MainWindow::onOpenStudy() {
  const QString path = QFileDialog::getOpenFileName(
      this, tr("Open study"), QString(), tr("Calivera study (*.cvstudy *.json);;All files (*)"));
  if (!path.isEmpty()) openStudy(path);
}

void MainWindow::onSaveStudy(bool askPath) {
  QString path = studyPath_;
  if (askPath || path.isEmpty()) {
    path = QFileDialog::getSaveFileName(this, tr("Save study"), path,
                                        tr("Calivera study (*.cvstudy)"));
  }
  if (!path.isEmpty()) saveStudy(path);
}

void MainWindow::onExportCharts() {
  const QString folder = QFileDialog::getExistingDirectory(this, tr("Export charts to folder"));
  if (folder.isEmpty()) return;
  const QString error = exportAllCharts(folder);
  if (error.isEmpty()) {
    showMessage(tr("Charts exported as PNG and SVG to %1").arg(folder), false);
  } else {
    showMessage(tr("Export failed: %1").arg(error), true);
  }
}

void MainWindow::onExportChart(ChartPanel* panel) {
  if (panel->linkedChart() == nullptr) return;
  const QString path = QFileDialog::getSaveFileName(this, tr("Export chart"),
                                                    panel->linkedChart()->exportName() + ".png",
                                                    tr("PNG image (*.png)"));
  if (path.isEmpty()) return;
  QString stem = path;
  if (stem.endsWith(".png", Qt::CaseInsensitive)) stem.chop(4);
  QString error = panel->exportPng(stem + ".png");
  if (error.isEmpty()) error = panel->exportSvg(stem + ".svg");
  if (error.isEmpty()) {
    showMessage(tr("Chart saved as %1.png and %1.svg").arg(stem), false);
  } else {
    showMessage(tr("Export failed: %1").arg(error), true);
  }
}

namespace {

// The table the user is looking at: the visible table in the Tables or Model tab, or the
// threshold table otherwise.
QTableView* currentTable(QTabWidget* tabs, QTableView* fallback) {
  QWidget* page = tabs->currentWidget();
  if (auto* inner = qobject_cast<QTabWidget*>(page)) page = inner->currentWidget();
  if (auto* view = qobject_cast<QTableView*>(page)) return view;
  if (page != nullptr) {
    // A page with several tables (Comparison): the one with the keyboard focus, else the first.
    QWidget* focus = QApplication::focusWidget();
    for (QTableView* view : page->findChildren<QTableView*>()) {
      if (focus != nullptr && (view == focus || view->isAncestorOf(focus))) return view;
    }
    if (auto* view = page->findChild<QTableView*>()) return view;
  }
  return fallback;
}

}  // namespace

void MainWindow::onExportTable() {
  QTableView* view = currentTable(tabs_, thresholdTable_);
  const QString path = QFileDialog::getSaveFileName(this, tr("Export table as CSV"),
                                                    view->objectName() + ".csv", tr("CSV (*.csv)"));
  if (path.isEmpty()) return;
  const QString error = writeTableCsv(*view->model(), path);
  if (error.isEmpty()) {
    showMessage(tr("Table saved to %1").arg(path), false);
  } else {
    showMessage(tr("Export failed: %1").arg(error), true);
  }
}

void MainWindow::onCopyTable() {
  QTableView* view = currentTable(tabs_, thresholdTable_);
  std::set<int> rows;
  for (const QModelIndex& i : view->selectionModel()->selectedIndexes()) rows.insert(i.row());
  QApplication::clipboard()->setText(
      tableToTsv(*view->model(), std::vector<int>(rows.begin(), rows.end())));
}

void MainWindow::onExportReport() {
#ifdef CALIVERA_HAVE_REPORT_DIALOG
  showReportExportDialog(this, study_);
#else
  showMessage(tr("The PDF report export is not available in this build."), true);
#endif
}

void MainWindow::addRecentStudy(const QString& path) {
  QSettings settings;
  QStringList recent = settings.value(kRecentKey).toStringList();
  const QString absolute = QFileInfo(path).absoluteFilePath();
  recent.removeAll(absolute);
  recent.prepend(absolute);
  while (recent.size() > kMaxRecent) recent.removeLast();
  settings.setValue(kRecentKey, recent);
  rebuildRecentMenu();
}

void MainWindow::rebuildRecentMenu() {
  recentMenu_->clear();
  const QStringList recent = QSettings().value(kRecentKey).toStringList();
  for (int i = 0; i < recent.size(); ++i) {
    QAction* a = recentMenu_->addAction(QStringLiteral("&%1 %2").arg(i + 1).arg(recent[i]));
    a->setObjectName(QStringLiteral("actionRecentStudy%1").arg(i + 1));
    connect(a, &QAction::triggered, this, [this, path = recent[i]]() { openStudy(path); });
  }
  recentMenu_->setEnabled(!recent.isEmpty());
}

}  // namespace calivera::ui
