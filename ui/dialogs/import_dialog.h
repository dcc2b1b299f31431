#pragma once
// Import a cohort (CSV, a SAS, Stata or SPSS file, or a PostgreSQL table or query): choose the
// source, the delimiter (CSV) and the missing-value tokens, see a live
// preview of the first rows, choose the outcome column and the value that means "event", and read
// a summary of what will be excluded and why. The whole file is read in the background while the
// dialog is open, so the summary counts every row; the loaded table is handed to the caller.

#include <QDialog>
#include <memory>
#include <optional>

#include "core/data/table.h"
#include "core/study/study.h"

class QComboBox;
class QLabel;
class QLineEdit;
class QCheckBox;
class QTableWidget;
class QDialogButtonBox;

namespace calivera::ui {

class BackgroundJob;

class ImportDialog : public QDialog {
  Q_OBJECT

 public:
  static constexpr int kPreviewRows = 20;

  explicit ImportDialog(QWidget* parent = nullptr);

  // `database`: the table or query when `path` is a PostgreSQL URI.
  void setInitial(const QString& path, const ImportSettings& settings,
                  const std::optional<DatabaseSelection>& database = std::nullopt);
  void setPath(const QString& path);  // refreshes preview and starts the full read

  QString path() const;
  // The table or query of a PostgreSQL source; empty for a file (or when none is given yet).
  std::optional<DatabaseSelection> databaseSelection() const;
  ImportSettings settings() const;
  // The fully read table for the current settings; null while reading or after an error.
  std::shared_ptr<const Table> loadedTable() const { return table_; }
  BackgroundJob* job() const { return job_; }
  QString summaryText() const;

 private:
  void refresh();
  void refreshPreview();
  void refreshPackagePreview();  // SAS, Stata and SPSS files: the first records via ReadStat
  void showTablePreview(const Table& t, int rows);  // the first rows and refused columns
  bool isDatabase() const;
  void startFullRead();
  void refreshOutcomeChoices();
  void refreshSummary();

  QLineEdit* path_ = nullptr;
  QComboBox* databaseKind_ = nullptr;  // table or query
  QLineEdit* databaseText_ = nullptr;  // the table's name or the query's text
  QComboBox* delimiter_ = nullptr;
  QCheckBox* emptyIsMissing_ = nullptr;
  QLineEdit* missingTokens_ = nullptr;
  QTableWidget* preview_ = nullptr;
  QLabel* previewNote_ = nullptr;
  QComboBox* outcome_ = nullptr;
  QComboBox* eventValue_ = nullptr;
  QLabel* summary_ = nullptr;
  QDialogButtonBox* buttons_ = nullptr;
  BackgroundJob* job_ = nullptr;
  std::shared_ptr<const Table> table_;
  QString pendingOutcome_;
  QString pendingEvent_;
  bool refreshQueued_ = false;
};

}  // namespace calivera::ui
