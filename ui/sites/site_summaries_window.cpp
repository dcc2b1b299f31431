#include "ui/sites/site_summaries_window.h"

#include <QAction>
#include <QApplication>
#include <QClipboard>
#include <QCloseEvent>
#include <QFileDialog>
#include <QFileInfo>
#include <QHeaderView>
#include <QLabel>
#include <QMenuBar>
#include <QMessageBox>
#include <QSortFilterProxyModel>
#include <QTableView>
#include <QToolBar>
#include <QVBoxLayout>

#include "core/report/audit_sites.h"
#include "core/report/csv_text.h"
#include "core/report/site_tables.h"
#include "core/study/reproduce_command.h"
#include "core/util/output_transaction.h"
#include "core/util/shown_text.h"
#include "render/report/audit_pdf_writer.h"
#include "ui/async/background_job.h"
#include "ui/async/job_progress_row.h"
#include "ui/models/record_table_model.h"
#include "ui/models/result_tables.h"
#include "ui/views/caution_text.h"
#include "ui/views/result_table_view.h"
#include "ui/views/sites_view.h"

namespace calivera::ui {
namespace {

std::string utf8(const QString& s) {
  return s.toUtf8().toStdString();
}

struct PoolOutcome {
  std::shared_ptr<const PooledSummaries> pooled;
  std::optional<SummarySet> set;
};

}  // namespace

SiteSummariesWindow::SiteSummariesWindow(QWidget* parent) : QMainWindow(parent) {
  setObjectName(QStringLiteral("siteSummariesWindow"));
  setWindowTitle(tr("Site summaries — Calivera"));
  job_ = new BackgroundJob(this);

  auto* central = new QWidget;
  auto* layout = new QVBoxLayout(central);
  layout->setContentsMargins(0, 0, 0, 0);
  layout->addWidget(makeCautionBanner(central));

  message_ = new QLabel;
  message_->setObjectName(QStringLiteral("siteSummariesMessage"));
  message_->setWordWrap(true);
  message_->setTextFormat(Qt::PlainText);  // file names and messages are never markup
  message_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  message_->setContentsMargins(8, 4, 8, 4);
  message_->hide();
  layout->addWidget(message_);
  layout->addWidget(new JobProgressRow(job_, QStringLiteral("siteSummaries")));

  overall_ = new QLabel;
  overall_->setObjectName(QStringLiteral("summaryOverall"));
  overall_->setWordWrap(true);
  overall_->setTextFormat(Qt::PlainText);
  overall_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  overall_->setContentsMargins(8, 4, 8, 0);
  layout->addWidget(overall_);

  // What was read is the first page beside the multi-site views, so the views keep their room
  // on a 768-pixel screen.
  inputsModel_ = new RecordTableModel(this);
  inputsModel_->setObjectName(QStringLiteral("summaryInputsModel"));
  inputsTable_ =
      makeResultTableView(QStringLiteral("summaryInputsTable"), inputsModel_, &inputsProxy_);
  inputsTable_->setSelectionMode(QAbstractItemView::SingleSelection);
  sites_ = new SitesView;
  sites_->insertFirstPage(inputsTable_, tr("Summaries read"));
  layout->addWidget(sites_, 1);
  setCentralWidget(central);

  QMenu* file = menuBar()->addMenu(tr("&Summaries"));
  QToolBar* bar = addToolBar(tr("Site summaries"));
  bar->setObjectName(QStringLiteral("siteSummariesToolBar"));
  bar->setMovable(false);
  const auto add = [&](const QString& name, const QString& text,
                       void (SiteSummariesWindow::*slot)(), bool onBar) {
    QAction* a = file->addAction(text);
    a->setObjectName(name);
    connect(a, &QAction::triggered, this, slot);
    if (onBar) bar->addAction(a);
    return a;
  };
  add(QStringLiteral("actionAddSummaries"), tr("&Add site summaries…"), &SiteSummariesWindow::onAdd,
      true);
  removeAction_ = add(QStringLiteral("actionRemoveSummary"), tr("&Remove selected site"),
                      &SiteSummariesWindow::onRemove, true);
  file->addSeparator();
  add(QStringLiteral("actionOpenSummarySet"), tr("&Open set…"), &SiteSummariesWindow::onOpenSet,
      false);
  saveAction_ = add(QStringLiteral("actionSaveSummarySet"), tr("&Save set as…"),
                    &SiteSummariesWindow::onSaveSet, true);
  file->addSeparator();
  reportAction_ = add(QStringLiteral("actionSummariesReport"), tr("Export PDF &report…"),
                      &SiteSummariesWindow::onExportReport, true);
  tablesAction_ = add(QStringLiteral("actionSummariesTables"), tr("Export &tables (CSV)…"),
                      &SiteSummariesWindow::onExportTables, false);
  copyLineAction_ = file->addAction(tr("&Copy command line"));
  copyLineAction_->setObjectName(QStringLiteral("actionCopyPoolLine"));
  connect(copyLineAction_, &QAction::triggered, this, [this]() {
    QApplication::clipboard()->setText(reproduceLine());
    showMessage(tr("Copied: %1").arg(reproduceLine()), false);
  });
  bar->addAction(copyLineAction_);
  file->addSeparator();
  QAction* close = file->addAction(tr("&Close"));
  close->setObjectName(QStringLiteral("actionCloseSummaries"));
  connect(close, &QAction::triggered, this, &QWidget::close);

  connect(job_, &BackgroundJob::failed, this,
          [this](const QString& error) { showMessage(error, true); });
  connect(job_, &BackgroundJob::cancelled, this,
          [this]() { showMessage(tr("Cancelled; nothing changed."), false); });
  connect(job_, &BackgroundJob::started, this, [this]() { updateActions(); });
  connect(job_, &BackgroundJob::finished, this, [this]() { updateActions(); });
  connect(inputsTable_->selectionModel(), &QItemSelectionModel::currentRowChanged, this,
          [this]() { updateActions(); });
  showPooled();
}

bool SiteSummariesWindow::openSet(const QString& path) {
  return pool({}, path);
}

bool SiteSummariesWindow::addSummaries(const QStringList& paths) {
  std::vector<SummarySetEntry> entries = this->entries();
  for (const QString& p : paths) entries.push_back({utf8(p), ""});
  return pool(std::move(entries), std::nullopt);
}

bool SiteSummariesWindow::removeSite(int row) {
  std::vector<SummarySetEntry> entries = this->entries();
  if (row < 0 || row >= static_cast<int>(entries.size())) return false;
  entries.erase(entries.begin() + row);
  return pool(std::move(entries), std::nullopt);
}

bool SiteSummariesWindow::pool(std::vector<SummarySetEntry> entries,
                               std::optional<QString> setPath) {
  std::vector<double> thresholds = thresholds_;
  const std::optional<std::string> setFile =
      setPath ? std::optional<std::string>(utf8(*setPath)) : std::nullopt;
  const bool started = job_->start<PoolOutcome>(
      setPath ? tr("Opening the set of site summaries") : tr("Pooling the site summaries"),
      [entries = std::move(entries), thresholds, setFile](const ProgressCallback& progress) {
        PoolOutcome out;
        std::vector<SummarySetEntry> read = entries;
        std::vector<double> at = thresholds;
        if (setFile) {
          out.set = readSummarySet(*setFile);
          read = out.set->summaries;
          at = out.set->netBenefitThresholds;
        }
        if (read.size() < 2) {
          throw InputError("pooling needs at least two site summaries; add another site's");
        }
        out.pooled =
            std::make_shared<PooledSummaries>(poolSummaries(loadSummaryFiles(read, progress), at));
        return out;
      },
      [this, setPath](PoolOutcome& out) {
        pooled_ = out.pooled;
        if (out.set) {
          thresholds_ = out.set->netBenefitThresholds;
          title_ = out.set->title;
          setPath_ = setPath;
          modified_ = false;
        } else {
          modified_ = true;
        }
        message_->hide();
        showPooled();
        emit pooledChanged();
      });
  if (!started) showMessage(tr("Wait for the running task to finish, or cancel it."), true);
  return started;
}

std::vector<SummarySetEntry> SiteSummariesWindow::entries() const {
  std::vector<SummarySetEntry> out;
  if (pooled_) {
    for (const SummaryFile& f : pooled_->inputs) out.push_back({f.path, f.sha256});
  }
  return out;
}

void SiteSummariesWindow::showPooled() {
  if (!pooled_) {
    inputsModel_->setTable({}, {}, {});
    overall_->setText(
        tr("No site summaries yet. Each site runs `calivera summarize` on its own patients and "
           "sends the .cvsummary file it writes (aggregates only). Add two or more here to pool "
           "them."));
    sites_->setAnalysis(nullptr, tr("The pooled sites appear here."));
    updateActions();
    return;
  }
  const PooledSummaries& p = *pooled_;
  showResultTable(*inputsModel_, summaryInputsTable(p));
  QString overall = QString::fromStdString(pooledOverallText(p));
  for (const std::string& w : p.warnings) {
    overall +=
        QStringLiteral("\n") + tr("Warning: %1").arg(QString::fromStdString(shownText(w, 400)));
  }
  overall_->setText(overall);
  sites_->setAnalysis(std::shared_ptr<const SiteAnalysis>(pooled_, &pooled_->analysis), {});
  const QString name = setPath_ ? QFileInfo(*setPath_).fileName() : tr("unsaved set");
  setWindowTitle(tr("Site summaries: %1%2 — Calivera")
                     .arg(name, modified_ ? QStringLiteral(" *") : QString()));
  updateActions();
}

QString SiteSummariesWindow::saveSet(const QString& path) {
  if (!pooled_) return tr("Nothing to save: pool two or more site summaries first.");
  SummarySet set;
  set.summaries = entries();
  set.netBenefitThresholds = thresholds_;
  set.title = title_;
  try {
    OutputTransaction transaction;
    transaction.add(utf8(path), summarySetText(set, utf8(path)));
    transaction.commit();
  } catch (const std::exception& e) {
    return QString::fromStdString(e.what());
  }
  setPath_ = path;
  modified_ = false;
  showPooled();
  return {};
}

QString SiteSummariesWindow::exportTables(const QString& folder) {
  if (!pooled_) return tr("Nothing to export: pool two or more site summaries first.");
  try {
    OutputTransaction transaction;
    for (const ResultTable& table :
         {sitesTable(pooled_->analysis), pooledSitesTable(pooled_->analysis),
          pooledNetBenefitTable(pooled_->analysis), summaryInputsTable(*pooled_)}) {
      transaction.add((std::filesystem::path(utf8(folder)) / table.fileName).string(),
                      tableCsv(table), /*createFolder=*/true);
    }
    transaction.commit();
  } catch (const std::exception& e) {
    return QString::fromStdString(e.what());
  }
  return {};
}

bool SiteSummariesWindow::exportReport(const QString& pdfPath) {
  if (!pooled_) return false;
  const std::shared_ptr<const PooledSummaries> pooled = pooled_;
  const std::string title = title_;
  const std::string path = utf8(pdfPath);
  return job_->start<bool>(
      tr("Writing the PDF report"),
      [pooled, title, path](const ProgressCallback&) {
        const AuditDocument doc =
            buildPooledSitesDocument(*pooled, title, formatUtcTimestamp(reportTimestamp()));
        OutputTransaction transaction;
        transaction.add(path, report::renderDocumentPdf(doc, report::PaperSize::A4));
        transaction.commit();
        return true;
      },
      [this, pdfPath](bool&) { showMessage(tr("Report written: %1").arg(pdfPath), false); });
}

QString SiteSummariesWindow::reproduceLine() const {
  // A saved, unchanged set is its own reproducing input; otherwise every summary is named.
  const std::optional<std::string> set =
      setPath_ && !modified_ ? std::optional<std::string>(utf8(*setPath_)) : std::nullopt;
  std::vector<std::string> paths;
  if (!set) {
    for (const SummarySetEntry& e : entries()) paths.push_back(e.path);
  }
  return QString::fromStdString(
      commandLine("pool", poolCommandWords(set, paths, set ? std::vector<double>{} : thresholds_)));
}

QString SiteSummariesWindow::messageText() const {
  return message_->isHidden() ? QString() : message_->text();
}

void SiteSummariesWindow::showMessage(const QString& text, bool error) {
  message_->setText(text);
  message_->setStyleSheet(error ? QStringLiteral("background: #fde2e1; color: #000;")
                                : QStringLiteral("background: #e3f1e6; color: #000;"));
  message_->show();
}

void SiteSummariesWindow::updateActions() {
  const bool idle = !job_->isRunning();
  const bool have = pooled_ != nullptr;
  saveAction_->setEnabled(idle && have);
  reportAction_->setEnabled(idle && have);
  tablesAction_->setEnabled(idle && have);
  copyLineAction_->setEnabled(have);
  removeAction_->setEnabled(idle && have && pooled_->inputs.size() > 2 &&
                            inputsTable_->selectionModel()->currentIndex().isValid());
}

void SiteSummariesWindow::onAdd() {
  const QStringList paths = QFileDialog::getOpenFileNames(
      this, tr("Add site summaries"), QString(), tr("Site summaries (*.cvsummary);;All files (*)"));
  if (!paths.isEmpty()) addSummaries(paths);
}

void SiteSummariesWindow::onOpenSet() {
  const QString path =
      QFileDialog::getOpenFileName(this, tr("Open a set of site summaries"), QString(),
                                   tr("Sets of site summaries (*.cvsites)"));
  if (!path.isEmpty()) openSet(path);
}

void SiteSummariesWindow::onSaveSet() {
  QString path = QFileDialog::getSaveFileName(this, tr("Save the set of site summaries"),
                                              setPath_.value_or(QString()),
                                              tr("Sets of site summaries (*.cvsites)"));
  if (path.isEmpty()) return;
  if (QFileInfo(path).suffix().isEmpty()) path += QStringLiteral(".cvsites");
  const QString error = saveSet(path);
  showMessage(error.isEmpty() ? tr("Saved: %1").arg(path) : error, !error.isEmpty());
}

void SiteSummariesWindow::onExportReport() {
  QString path =
      QFileDialog::getSaveFileName(this, tr("Export PDF report"), QString(), tr("PDF (*.pdf)"));
  if (path.isEmpty()) return;
  if (QFileInfo(path).suffix().isEmpty()) path += QStringLiteral(".pdf");
  exportReport(path);
}

void SiteSummariesWindow::onExportTables() {
  const QString folder = QFileDialog::getExistingDirectory(this, tr("Export tables to folder"));
  if (folder.isEmpty()) return;
  const QString error = exportTables(folder);
  showMessage(error.isEmpty() ? tr("Tables written to %1").arg(folder) : error, !error.isEmpty());
}

void SiteSummariesWindow::onRemove() {
  const QModelIndex current = inputsTable_->selectionModel()->currentIndex();
  if (current.isValid()) removeSite(inputsProxy_->mapToSource(current).row());
}

void SiteSummariesWindow::closeEvent(QCloseEvent* event) {
  if (job_->isRunning()) {
    job_->cancel();
    job_->waitForFinished();
  }
  if (modified_ && pooled_ && isVisible() &&
      QMessageBox::question(this, tr("Close site summaries"),
                            tr("This set of site summaries has not been saved. Close anyway?"),
                            QMessageBox::Close | QMessageBox::Cancel) != QMessageBox::Close) {
    event->ignore();
    return;
  }
  event->accept();
}

}  // namespace calivera::ui
