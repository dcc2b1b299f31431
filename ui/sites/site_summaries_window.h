#pragma once
// The workstation's study of site summaries: sites that may not share patient rows each send a
// summary of aggregates (`calivera summarize`), and this window pools them through the same core
// path as `calivera pool` (core/sites/summary_pooling.h): what was read (each file's site,
// counts, suppression and SHA-256), the overall aggregates with the stated bound of the binned
// AUC, and the multi-site views (SitesView: tables, forest plots, calibration by site, net
// benefit). The set of files is saved as a `.cvsites` file (core/sites/summary_set.h) that
// `calivera pool --set` reproduces; the PDF report is `calivera pool --pdf`'s.
//
// Every read, pool and report runs in the background (BackgroundJob) with progress and Cancel;
// a failing file leaves the shown pool as it was and says which file and why.

#include <QMainWindow>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "core/sites/summary_set.h"

class QAction;
class QLabel;
class QTableView;
class QSortFilterProxyModel;

namespace calivera::ui {

class BackgroundJob;
class RecordTableModel;
class SitesView;

class SiteSummariesWindow : public QMainWindow {
  Q_OBJECT

 public:
  explicit SiteSummariesWindow(QWidget* parent = nullptr);

  // Each starts a background job; false when one is already running.
  bool openSet(const QString& path);
  bool addSummaries(const QStringList& paths);
  bool removeSite(int row);  // row of the summaries table
  bool exportReport(const QString& pdfPath);
  // Quick writes, done at once; an empty string on success, else the message shown.
  QString saveSet(const QString& path);
  QString exportTables(const QString& folder);

  // The `calivera pool ...` line that reproduces what the window shows.
  QString reproduceLine() const;
  const PooledSummaries* pooled() const { return pooled_.get(); }
  BackgroundJob* job() const { return job_; }
  SitesView* sitesView() const { return sites_; }
  QString messageText() const;
  bool isModified() const { return modified_; }

 signals:
  void pooledChanged();

 protected:
  void closeEvent(QCloseEvent* event) override;

 private:
  // Reads `entries` (and the set at `setPath`, when given) and pools them in the background; the
  // window changes only when that succeeds.
  bool pool(std::vector<SummarySetEntry> entries, std::optional<QString> setPath);
  void showPooled();
  // The summaries shown, each with the SHA-256 it had when pooled (none before a pool).
  std::vector<SummarySetEntry> entries() const;
  void showMessage(const QString& text, bool error);
  void updateActions();
  void onAdd();
  void onOpenSet();
  void onSaveSet();
  void onExportReport();
  void onExportTables();
  void onRemove();

  BackgroundJob* job_ = nullptr;
  std::shared_ptr<const PooledSummaries> pooled_;
  std::vector<double> thresholds_;
  std::string title_;
  std::optional<QString> setPath_;
  bool modified_ = false;

  QLabel* message_ = nullptr;
  QLabel* overall_ = nullptr;
  RecordTableModel* inputsModel_ = nullptr;
  QSortFilterProxyModel* inputsProxy_ = nullptr;
  QTableView* inputsTable_ = nullptr;
  SitesView* sites_ = nullptr;
  QAction* saveAction_ = nullptr;
  QAction* reportAction_ = nullptr;
  QAction* tablesAction_ = nullptr;
  QAction* removeAction_ = nullptr;
  QAction* copyLineAction_ = nullptr;
};

}  // namespace calivera::ui
