// MainWindow: the views drawn from the controller's study and run, kept in step with its threshold,
// and the menu actions that open dialogs and hand their choices to the controller.
#include <QApplication>
#include <QCheckBox>
#include <QClipboard>
#include <QDateTime>
#include <QDir>
#include <QDragEnterEvent>
#include <QDropEvent>
#include <QElapsedTimer>
#include <QFile>
#include <QFileDialog>
#include <QFileInfo>
#include <QItemSelectionModel>
#include <QLabel>
#include <QMenu>
#include <QMimeData>
#include <QSettings>
#include <QSortFilterProxyModel>
#include <QSpinBox>
#include <QTabWidget>
#include <QTableView>
#include <QTextBrowser>
#include <QTimer>
#include <QUrl>
#include <filesystem>
#include <set>

#include "core/data/package_file_reader.h"
#include "core/model/model_io.h"
#include "core/report/audit_report.h"
#include "core/report/missing_table.h"
#include "core/study/study_file.h"
#include "core/study/study_uncertainty.h"
#include "core/util/errors.h"
#include "core/util/shown_text.h"
#include "render/charts/charts.h"
#include "ui/async/background_job.h"
#include "ui/dialogs/fit_dialog.h"
#include "ui/dialogs/import_dialog.h"
#include "ui/dialogs/mapping_dialog.h"
#include "ui/dialogs/missing_data_dialog.h"
#include "ui/dialogs/report_print.h"
#include "ui/dialogs/uncertainty_dialog.h"
#include "ui/main_window.h"
#include "ui/models/record_table_model.h"
#include "ui/models/result_tables.h"
#include "ui/models/table_export.h"
#include "ui/sites/site_summaries_window.h"
#include "ui/views/caution_text.h"
#include "ui/views/chart_panel.h"
#include "ui/views/comparison_view.h"
#include "ui/views/confusion_panel.h"
#include "ui/views/predictor_view.h"
#include "ui/views/sites_view.h"
#include "ui/views/subgroup_view.h"
#include "ui/views/summary_html.h"
#include "ui/views/table_context_menu.h"
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

void MainWindow::rebuildViews() {
  const ValidationResult* r = study().result.get();
  if (r == nullptr) {
    for (ChartPanel* p : {roc_, calibration_, decision_, distribution_}) p->setLinkedChart(nullptr);
    thresholdModel_->setTable({}, {}, {});
    hlModel_->setTable({}, {}, {});
    missingModel_->setTable({}, {}, {});
    pooledModel_->setTable({}, {}, {});
    pooledBox_->setVisible(false);
    missingNote_->clear();
    confusion_->clear();
  } else {
    auto* roc = new charts::RocChart(r->discrimination);
    auto* calibration = new charts::CalibrationChart(r->calibration, r->distribution);
    auto* decision = new charts::DecisionCurveChart(r->decisionCurve, r->cohort);
    decision->setReasonableRange(study().analysis.reasonableLo, study().analysis.reasonableHi);
    addUncertaintyLayers(*roc, *calibration, *decision);
    roc_->setLinkedChart(roc);
    calibration_->setLinkedChart(calibration);
    decision_->setLinkedChart(decision);
    distribution_->setLinkedChart(new charts::DistributionChart(r->distribution));
    showResultTable(*thresholdModel_, thresholdTable(*r));
    showResultTable(*hlModel_, hosmerLemeshowTable(r->hosmerLemeshow));
    showMissingData();
  }
  if (study().model) {
    fillCoefficientTable(*coefficientModel_, *study().model);
    // Names from files: escaped, invisible controls written out, long ones cut so a word-wrapped
    // label cannot widen the window; the tooltip holds them in full.
    const auto shown = [](const std::string& text, std::size_t chars) {
      return toQ(visibleName(text, chars)).toHtmlEscaped();
    };
    QString info = tr("<b>%1</b>").arg(shown(study().model->name, 80));
    if (!study().model->outcome.empty()) {
      info += tr(" — predicts %1").arg(shown(study().model->outcome, 80));
    }
    info +=
        study().modelSource == ModelSource::Fitted
            ? tr("<br>Fitted here by %1.")
                  .arg(study().fit.firth ? tr("Firth's penalized likelihood")
                                         : tr("maximum likelihood"))
            : tr("<br>Read from %1.")
                  .arg(study().modelFile
                           ? shown(
                                 std::filesystem::path(study().modelFile->path).filename().string(),
                                 60)
                           : QString());
    modelInfo_->setToolTip(
        toQ(visibleName(study().model->name, 4096)) +
        (study().modelFile ? "\n" + toQ(visibleName(study().modelFile->path, 4096)) : QString()));
    if (study().model->development.n) {
      info += tr(" Development data: %1 patients").arg(*study().model->development.n);
      if (study().model->development.events) {
        info += tr(", %1 events").arg(*study().model->development.events);
      }
      info += QStringLiteral(".");
    }
    for (const auto& w : study().modelWarnings) {
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
  summary_->setHtml(summaryHtml(study()));
  if (study().uncertainty && study().result) {
    confusion_->setAdequacy(toQ(study().uncertainty->sampleSize.verdict),
                            study().uncertainty->sampleSize.adequate);
  } else {
    confusion_->setAdequacy({}, false);
  }
  comparisonView_->setResults(study().uncertainty, study().analysis.reasonableLo,
                              study().analysis.reasonableHi);
  subgroupView_->setResults(study().uncertainty);
  sitesView_->setResults(study().uncertainty);
  predictorView_->setData(study().model ? &*study().model : nullptr, controller_->cohort(),
                          study().columnMapping, study().predictorView, study().heldValues);
  applyThreshold();
}

void MainWindow::addUncertaintyLayers(charts::RocChart& roc, charts::CalibrationChart& calibration,
                                      charts::DecisionCurveChart& decision) const {
  const UncertaintyResults* u = study().uncertainty.get();
  if (u == nullptr) return;
  if (u->bootstrap) {
    calibration.setCurveBand(u->bootstrap->calibrationCurve);
    decision.setNetBenefitBand(u->bootstrap->netBenefit);
  }
  if (!u->comparison) return;
  // Further models only (the study's own model is the main curve); comparedResults[0] is the
  // study's model on the comparison rows.
  const bool fewer = study().result && u->comparisonRows < study().result->cohort.n;
  for (std::size_t m = 1; m < u->comparedResults.size() && m < u->comparison->models.size(); ++m) {
    QString name = toQ(visibleName(u->comparison->models[m], 40));
    if (fewer) name += tr(" (on %1 patients)").arg(u->comparisonRows);
    const ValidationResult& other = u->comparedResults[m];
    roc.addComparison(name, other.discrimination);
    calibration.addComparison(name, other.calibration);
    decision.addComparison(name, other.decisionCurve);
  }
}

void MainWindow::showStudySettings() {
  const AnalysisSettings& analysis = study().analysis;
  thresholdBar_->setThreshold(controller_->thresholdState().threshold());
  thresholdBar_->setReasonableRange(analysis.reasonableLo, analysis.reasonableHi);
  // Setting the widgets sends the same values back to the controller: harmless, no run starts.
  groups_->setValue(analysis.groups);
  apparent_->setChecked(analysis.apparent);
}

void MainWindow::applyThreshold() {
  QElapsedTimer timer;
  timer.start();
  if (controller_->thresholdState().hasData()) {
    const ThresholdSnapshot snapshot = controller_->thresholdState().snapshot();
    for (ChartPanel* p : {roc_, calibration_, decision_, distribution_}) {
      if (p->linkedChart() != nullptr) p->linkedChart()->setThreshold(snapshot);
    }
    confusion_->setSnapshot(snapshot, study().result ? &study().result->calibration : nullptr);
    subgroupView_->setThreshold(snapshot);
    sitesView_->setThreshold(snapshot);
    predictorView_->setThreshold(snapshot);
    highlightThresholdRow();
  }
  lastUpdateMs_ = static_cast<double>(timer.nsecsElapsed()) / 1e6;
}

void MainWindow::highlightThresholdRow() {
  if (!study().result) return;
  const int row =
      nearestThresholdRow(study().result->thresholds, controller_->thresholdState().threshold());
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
  if (study().data) {
    const std::string file = cohortShortLabel(*study().data);
    parts << tr("Cohort: %1 (%2 rows)")
                 .arg(name(file, 40))
                 .arg(controller_->table() ? controller_->table()->rowCount : 0);
    full << tr("Cohort: %1").arg(name(study().data->path, 4096));
  } else {
    parts << tr("No cohort: File → Import cohort");
  }
  if (study().model) {
    parts << tr("Model: %1").arg(name(study().model->name, 50));
    full << tr("Model: %1").arg(name(study().model->name, 4096));
  }
  status_->setToolTip(full.join('\n'));
  if (study().result) {
    parts << tr("%1 patients analysed, %2 events")
                 .arg(study().result->cohort.n)
                 .arg(study().result->cohort.events);
  }
  if (!controller_->studyPath().isEmpty())
    parts << tr("Study: %1").arg(QFileInfo(controller_->studyPath()).fileName());
  status_->setText(parts.join(QStringLiteral("  ·  ")));
  // "[*]": Qt shows an asterisk there while the study has unsaved changes (setWindowModified).
  setWindowTitle(
      controller_->studyPath().isEmpty()
          ? tr("Calivera workstation[*]")
          : tr("%1[*] — Calivera workstation").arg(QFileInfo(controller_->studyPath()).fileName()));
}

QStringList MainWindow::exportFooter() const {
  // Plain text drawn by the painter (never markup); file names without folders, as in reports.
  const auto name = [](const std::string& text) {
    return toQ(visibleName(std::filesystem::path(text).filename().string(), 80));
  };
  QStringList lines{cautionText()};
  if (study().data) {
    lines << tr("Cohort %1  SHA-256 %2")
                 .arg(toQ(visibleName(cohortShortLabel(*study().data), 80)),
                      toQ(study().data->sha256));
  }
  if (study().model) {
    QString model = tr("Model %1").arg(toQ(visibleName(study().model->name, 80)));
    if (study().modelSource == ModelSource::File && study().modelFile) {
      model += tr(", file %1  SHA-256 %2")
                   .arg(name(study().modelFile->path), toQ(study().modelFile->sha256));
    } else if (study().modelSource == ModelSource::Fitted) {
      model += tr(", fitted on this cohort in the workstation");
    }
    lines << model;
  }
  long long when = 0;
  try {
    when = reportTimestamp();  // SOURCE_DATE_EPOCH when set, for reproducible exports
  } catch (const InputError&) {
    when = QDateTime::currentSecsSinceEpoch();  // a malformed variable must not stop an export
  }
  QString exported = tr("Exported %1  ·  Calivera %2")
                         .arg(toQ(formatUtcTimestamp(when)), QStringLiteral(CALIVERA_VERSION));
  if (study().result) {
    exported += tr("  ·  %1 patients analysed, %2 events")
                    .arg(study().result->cohort.n)
                    .arg(study().result->cohort.events);
  }
  lines << exported;
  return lines;
}

QString MainWindow::exportAllCharts(const QString& folder) {
  if (!QDir().mkpath(folder)) return tr("cannot create the folder %1").arg(folder);
  const QStringList footer = exportFooter();
  for (ChartPanel* p : chartPanels()) {
    if (p->linkedChart() == nullptr) continue;
    const QString stem = QDir(folder).filePath(p->linkedChart()->exportName());
    if (QString e = p->exportPng(stem + ".png", footer); !e.isEmpty()) return e;
    if (QString e = p->exportSvg(stem + ".svg", footer); !e.isEmpty()) return e;
  }
  return {};
}

void MainWindow::onImportCohort() {
  importCohortFrom(study().data ? toQ(study().data->path) : QString());
}

void MainWindow::importCohortFrom(const QString& path) {
  ImportDialog dialog(this);
  if (!path.isEmpty()) {
    // The study's own source (a database's table or query too) when re-importing it.
    const bool same = study().data && toQ(study().data->path) == path;
    dialog.setInitial(path, study().import, same ? study().data->database : std::nullopt);
  }
  if (dialog.exec() != QDialog::Accepted) return;
  controller_->importCohort(dialog.path(), dialog.settings(), dialog.loadedTable(),
                            dialog.databaseSelection());
}

namespace {

// The dropped-file kinds, by name and, for .json (a study or a model), by the study format id
// near the start of the file.
enum class DroppedKind { Study, Model, Cohort, SiteSummaries, Unknown };

DroppedKind droppedKind(const QString& path) {
  const QString suffix = QFileInfo(path).suffix().toLower();
  if (suffix == QLatin1String("cvstudy")) return DroppedKind::Study;
  if (suffix == QLatin1String("cvsummary") || suffix == QLatin1String("cvsites")) {
    return DroppedKind::SiteSummaries;
  }
  PackageFormat package{};
  if (suffix == QLatin1String("csv") || suffix == QLatin1String("tsv") ||
      suffix == QLatin1String("txt") || packageFormatOf(path.toStdString(), package)) {
    return DroppedKind::Cohort;
  }
  if (suffix != QLatin1String("json")) return DroppedKind::Unknown;
  QFile file(path);
  if (!QFileInfo(path).isFile() || !file.open(QIODevice::ReadOnly)) return DroppedKind::Model;
  const QByteArray head = file.read(4096);  // the study writer puts "format" first
  return head.contains(kStudyFormatId) ? DroppedKind::Study : DroppedKind::Model;
}

}  // namespace

bool MainWindow::openDroppedFile(const QString& path) {
  switch (droppedKind(path)) {
    case DroppedKind::Study:
      return confirmDiscardChanges() && controller_->openStudy(path);
    case DroppedKind::Model:
      return controller_->loadModelFile(path);
    case DroppedKind::Cohort:
      importCohortFrom(path);
      return true;
    case DroppedKind::SiteSummaries:
      openSiteSummaries({path});
      return true;
    case DroppedKind::Unknown:
      break;
  }
  showMessage(tr("Not opened: %1. Drop a study (.cvstudy), a model file (.json), a cohort "
                 "(.csv, .tsv, .txt, .sas7bdat, .dta, .sav, .zsav) or site summaries (.cvsummary, "
                 ".cvsites).")
                  .arg(QFileInfo(path).fileName()),
              true);
  return false;
}

namespace {

// Several files dropped at once are accepted only as site summaries, pooled together.
bool allSiteSummaries(const QList<QUrl>& urls) {
  for (const QUrl& url : urls) {
    if (!url.isLocalFile() ||
        QFileInfo(url.toLocalFile()).suffix().toLower() != QLatin1String("cvsummary")) {
      return false;
    }
  }
  return urls.size() > 1;
}

}  // namespace

void MainWindow::dragEnterEvent(QDragEnterEvent* event) {
  const QList<QUrl> urls = event->mimeData()->urls();
  if ((urls.size() == 1 && urls.front().isLocalFile() && !controller_->job()->isRunning()) ||
      allSiteSummaries(urls)) {
    event->acceptProposedAction();
  }
}

void MainWindow::dropEvent(QDropEvent* event) {
  const QList<QUrl> urls = event->mimeData()->urls();
  if (allSiteSummaries(urls)) {
    event->acceptProposedAction();
    QStringList paths;
    for (const QUrl& url : urls) paths << url.toLocalFile();
    QTimer::singleShot(0, this, [this, paths]() { openSiteSummaries(paths); });
    return;
  }
  if (urls.size() != 1 || !urls.front().isLocalFile()) return;
  event->acceptProposedAction();
  const QString path = urls.front().toLocalFile();
  // After the drop returns: the import dialog and the unsaved-changes question are modal.
  QTimer::singleShot(0, this, [this, path]() { openDroppedFile(path); });
}

SiteSummariesWindow* MainWindow::openSiteSummaries(const QStringList& paths) {
  auto* window = new SiteSummariesWindow(this);
  window->setWindowFlag(Qt::Window);
  window->setAttribute(Qt::WA_DeleteOnClose);
  window->resize(size());
  window->show();
  if (paths.size() == 1 &&
      QFileInfo(paths.front()).suffix().toLower() == QLatin1String("cvsites")) {
    window->openSet(paths.front());
  } else if (!paths.isEmpty()) {
    window->addSummaries(paths);
  }
  return window;
}

void MainWindow::onOpenSiteSummaries() {
  const QStringList paths = QFileDialog::getOpenFileNames(
      this, tr("Pool site summaries"), QString(),
      tr("Site summaries or a set of them (*.cvsummary *.cvsites);;All files (*)"));
  if (!paths.isEmpty()) openSiteSummaries(paths);
}

void MainWindow::onLoadModel() {
  const QString path = QFileDialog::getOpenFileName(this, tr("Load model file"), QString(),
                                                    tr("Calivera model (*.json);;All files (*)"));
  if (!path.isEmpty()) controller_->loadModelFile(path);
}

void MainWindow::onFitModel() {
  if (!controller_->table() || study().import.outcomeColumn.empty()) {
    showMessage(tr("Import a cohort and choose its outcome column before fitting a model."), true);
    return;
  }
  FitDialog dialog(controller_->table(), study().import, study().fit, this);
  if (dialog.exec() != QDialog::Accepted || !dialog.fitted()) return;
  controller_->useFittedModel(dialog.fittedWith(), dialog.fitted()->model,
                              dialog.fitted()->warnings);
}

void MainWindow::onMapVariables() {
  if (!study().model || !controller_->table()) return;
  MappingDialog dialog(*study().model, *controller_->table(), study().columnMapping,
                       study().levelMapping, this);
  if (dialog.exec() != QDialog::Accepted) return;
  controller_->setColumnMapping(dialog.mapping(), dialog.levelMapping());
}

void MainWindow::onUncertainty() {
  if (!study().result || !controller_->table()) return;
  UncertaintyDialog dialog(study().uncertaintySettings, *controller_->table(),
                           study().import.outcomeColumn, this);
  if (dialog.exec() != QDialog::Accepted) return;
  controller_->runUncertainty(dialog.settings());
}

void MainWindow::showMissingData() {
  const ValidationRun* run = study().run.get();
  if (run == nullptr) return;
  showResultTable(*missingModel_, missingPatternsTable(run->missingPatterns));
  const ExclusionReport& exclusions = run->cohort.exclusions;
  QString note = exclusions.rowsExcluded == 0
                     ? tr("Complete cases: no row lacks a value the analysis uses.")
                     : tr("Complete cases: %1 of %2 rows are left out of every view but this "
                          "one for a missing value.")
                           .arg(exclusions.rowsExcluded)
                           .arg(exclusions.rowsRead);
  if (run->imputed) {
    note += QLatin1Char(' ') + toQ(imputedCopiesSentence(*run->imputed)) +
            tr(". The charts and other tables show the complete cases.");
    showResultTable(*pooledModel_, pooledImputationsTable(*run->imputed, run->result));
  } else {
    note +=
        tr(" Analysis → Missing values and imputation… adds results pooled over imputed "
           "copies.");
    pooledModel_->setTable({}, {}, {});
  }
  missingNote_->setText(note);
  pooledBox_->setVisible(run->imputed != nullptr);
}

void MainWindow::onMissingData() {
  if (!controller_->table()) return;
  MissingDataDialog dialog(study().missingData, *controller_->table(), study().import.outcomeColumn,
                           this);
  if (dialog.exec() != QDialog::Accepted) return;
  controller_->setMissingData(dialog.settings());
}

void MainWindow::onOpenStudy() {
  const QString path = QFileDialog::getOpenFileName(
      this, tr("Open study"), QString(), tr("Calivera study (*.cvstudy *.json);;All files (*)"));
  if (!path.isEmpty() && confirmDiscardChanges()) controller_->openStudy(path);
}

void MainWindow::onSaveStudy(bool askPath) {
  QString path = controller_->studyPath();
  if (askPath || path.isEmpty()) {
    path = QFileDialog::getSaveFileName(this, tr("Save study"), path,
                                        tr("Calivera study (*.cvstudy)"));
  }
  if (!path.isEmpty()) controller_->saveStudy(path);
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
  const QStringList footer = exportFooter();
  QString error = panel->exportPng(stem + ".png", footer);
  if (error.isEmpty()) error = panel->exportSvg(stem + ".svg", footer);
  if (error.isEmpty()) {
    showMessage(tr("Chart saved as %1.png and %1.svg").arg(stem), false);
  } else {
    showMessage(tr("Export failed: %1").arg(error), true);
  }
}

void MainWindow::onCopyChart(ChartPanel* panel) {
  if (panel->copyImage(exportFooter())) {
    showMessage(tr("Chart copied as an image, with the caution and the inputs' fingerprints."),
                false);
  }
}

void MainWindow::connectChartMenu(ChartPanel* panel) {
  connect(panel, &ChartPanel::exportRequested, this, &MainWindow::onExportChart);
  connect(panel, &ChartPanel::copyRequested, this, &MainWindow::onCopyChart);
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
  exportTableInteractively(currentTable(tabs_, thresholdTable_));
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
  showReportExportDialog(
      this, study(),
      [this](const ReportSettings& report) { controller_->setReportSettings(report); },
      controller_->savedStudyFile());
#else
  showMessage(tr("The PDF report export is not available in this build."), true);
#endif
}

void MainWindow::onUndo() {
  controller_->undo();
}

void MainWindow::onRedo() {
  controller_->redo();
}

void MainWindow::onPrintReport() {
  showPrintReportDialog(this, study(), controller_->savedStudyFile());
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
    connect(a, &QAction::triggered, this, [this, path = recent[i]]() {
      if (confirmDiscardChanges()) controller_->openStudy(path);
    });
  }
  recentMenu_->setEnabled(!recent.isEmpty());
}

}  // namespace calivera::ui
