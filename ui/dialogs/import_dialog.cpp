#include "ui/dialogs/import_dialog.h"

#include <QCheckBox>
#include <QComboBox>
#include <QDialogButtonBox>
#include <QFile>
#include <QFileDialog>
#include <QFormLayout>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>
#include <QTableWidget>
#include <QVBoxLayout>
#include <cmath>
#include <set>

#include "core/data/cohort.h"
#include "core/data/csv_reader.h"
#include "core/data/database_source.h"
#include "core/data/package_file_reader.h"
#include "core/study/study_analysis.h"
#include "ui/async/background_job.h"

namespace calivera::ui {

namespace {

constexpr qint64 kPreviewBytes = 64 * 1024;
const char* const kZeroOne = "(column holds 0 and 1)";

QString levelText(const Column& c, std::size_t row) {
  if (c.isMissing(row)) return QStringLiteral("·missing·");
  if (c.kind == ColumnKind::Text) {
    const auto level = static_cast<std::size_t>(c.codes[row]);
    const QString label = QString::fromStdString(c.levels[level]);
    // A value label is shown with the code stored in the file.
    return c.levelCodes.empty()
               ? label
               : QStringLiteral("%1 = %2").arg(label, QString::fromStdString(c.levelCodes[level]));
  }
  return QString::number(c.numbers[row], 'g', 10);
}

QString kindText(const Column& c) {
  if (c.kind == ColumnKind::Numeric) return ImportDialog::tr("number");
  return c.levelCodes.empty() ? ImportDialog::tr("text") : ImportDialog::tr("labelled categories");
}

bool isPackageFile(const QString& path) {
  PackageFormat format{};
  return packageFormatOf(path.toStdString(), format);
}

}  // namespace

ImportDialog::ImportDialog(QWidget* parent) : QDialog(parent) {
  setObjectName(QStringLiteral("importDialog"));
  setWindowTitle(tr("Import cohort"));
  job_ = new BackgroundJob(this);
  auto* layout = new QVBoxLayout(this);
  auto* form = new QFormLayout;

  auto* pathRow = new QHBoxLayout;
  path_ = new QLineEdit;
  path_->setObjectName(QStringLiteral("importPath"));
  auto* browse = new QPushButton(tr("&Browse…"));
  browse->setObjectName(QStringLiteral("importBrowse"));
  pathRow->addWidget(path_, 1);
  pathRow->addWidget(browse);
  path_->setPlaceholderText(tr("a cohort file, or postgresql://HOST:PORT/DATABASE"));
  path_->setToolTip(
      tr("A CSV, SAS, Stata or SPSS file, or a PostgreSQL database as a URI without a password "
         "(postgresql://HOST:PORT/DATABASE, or postgresql:///DATABASE?service=NAME). The "
         "password comes from ~/.pgpass, PGPASSFILE or the service file, never from here."));
  // A row holding a layout gets no buddy of its own: without one the '&' would show literally.
  auto* fileLabel = new QLabel(tr("&File or database:"));
  fileLabel->setBuddy(path_);
  form->addRow(fileLabel, pathRow);

  auto* databaseRow = new QHBoxLayout;
  databaseKind_ = new QComboBox;
  databaseKind_->setObjectName(QStringLiteral("importDatabaseKind"));
  databaseKind_->addItem(tr("Table"));
  databaseKind_->addItem(tr("Query"));
  databaseText_ = new QLineEdit;
  databaseText_->setObjectName(QStringLiteral("importDatabaseText"));
  databaseText_->setPlaceholderText(tr("schema.table, or one SELECT statement"));
  databaseText_->setToolTip(
      tr("Read only: a table or view (NAME or SCHEMA.NAME), or one SELECT statement. Rows are "
         "read in a read-only transaction."));
  databaseRow->addWidget(databaseKind_);
  databaseRow->addWidget(databaseText_, 1);
  auto* databaseLabel = new QLabel(tr("&Rows from:"));
  databaseLabel->setBuddy(databaseText_);
  form->addRow(databaseLabel, databaseRow);

  delimiter_ = new QComboBox;
  delimiter_->setObjectName(QStringLiteral("importDelimiter"));
  delimiter_->addItem(tr("Detect from the header"), 0);
  delimiter_->addItem(tr("Comma ,"), int(','));
  delimiter_->addItem(tr("Semicolon ;"), int(';'));
  delimiter_->addItem(tr("Tab"), int('\t'));
  form->addRow(tr("&Delimiter:"), delimiter_);

  auto* missingRow = new QHBoxLayout;
  emptyIsMissing_ = new QCheckBox(tr("Empty field"));
  emptyIsMissing_->setObjectName(QStringLiteral("importEmptyIsMissing"));
  emptyIsMissing_->setChecked(true);
  missingTokens_ = new QLineEdit(QStringLiteral("NA"));
  missingTokens_->setObjectName(QStringLiteral("importMissingTokens"));
  missingTokens_->setToolTip(tr("Other texts that mean 'missing', separated by commas"));
  missingRow->addWidget(emptyIsMissing_);
  missingRow->addWidget(new QLabel(tr("and these texts:")));
  missingRow->addWidget(missingTokens_, 1);
  form->addRow(tr("Missing values:"), missingRow);
  layout->addLayout(form);

  previewNote_ = new QLabel;
  previewNote_->setTextFormat(Qt::PlainText);  // names and messages from the file, shown as is
  previewNote_->setObjectName(QStringLiteral("importPreviewNote"));
  previewNote_->setWordWrap(true);
  layout->addWidget(previewNote_);
  preview_ = new QTableWidget;
  preview_->setObjectName(QStringLiteral("importPreview"));
  preview_->setEditTriggers(QAbstractItemView::NoEditTriggers);
  preview_->setMinimumHeight(200);
  layout->addWidget(preview_, 1);

  auto* outcomeForm = new QFormLayout;
  outcome_ = new QComboBox;
  outcome_->setObjectName(QStringLiteral("importOutcome"));
  eventValue_ = new QComboBox;
  eventValue_->setObjectName(QStringLiteral("importEventValue"));
  outcomeForm->addRow(tr("&Outcome column:"), outcome_);
  outcomeForm->addRow(tr("&Value that means the event:"), eventValue_);
  layout->addLayout(outcomeForm);

  summary_ = new QLabel;
  summary_->setObjectName(QStringLiteral("importSummary"));
  summary_->setWordWrap(true);
  summary_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  layout->addWidget(summary_);

  buttons_ = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel);
  buttons_->setObjectName(QStringLiteral("importButtons"));
  buttons_->button(QDialogButtonBox::Ok)->setObjectName(QStringLiteral("importAccept"));
  buttons_->button(QDialogButtonBox::Ok)->setText(tr("&Import"));
  layout->addWidget(buttons_);
  connect(buttons_, &QDialogButtonBox::accepted, this, &QDialog::accept);
  connect(buttons_, &QDialogButtonBox::rejected, this, &QDialog::reject);

  connect(browse, &QPushButton::clicked, this, [this]() {
    const QString p = QFileDialog::getOpenFileName(
        this, tr("Cohort file"), path_->text(),
        tr("Cohort files (*.csv *.tsv *.txt *.sas7bdat *.dta *.sav *.zsav);;"
           "CSV files (*.csv *.tsv *.txt);;SAS, Stata and SPSS files (*.sas7bdat *.dta *.sav "
           "*.zsav);;All files (*)"));
    if (!p.isEmpty()) setPath(p);
  });
  connect(path_, &QLineEdit::editingFinished, this, &ImportDialog::refresh);
  connect(databaseKind_, &QComboBox::currentIndexChanged, this, &ImportDialog::refresh);
  connect(databaseText_, &QLineEdit::editingFinished, this, &ImportDialog::refresh);
  connect(delimiter_, &QComboBox::currentIndexChanged, this, &ImportDialog::refresh);
  connect(emptyIsMissing_, &QCheckBox::toggled, this, &ImportDialog::refresh);
  connect(missingTokens_, &QLineEdit::editingFinished, this, &ImportDialog::refresh);
  connect(outcome_, &QComboBox::currentIndexChanged, this, [this]() {
    pendingOutcome_ = outcome_->currentText();
    refreshOutcomeChoices();
  });
  connect(eventValue_, &QComboBox::currentIndexChanged, this, &ImportDialog::refreshSummary);
  connect(job_, &BackgroundJob::failed, this, [this](const QString& message) {
    summary_->setText((isDatabase() ? tr("<b>The rows cannot be imported:</b> %1")
                                    : tr("<b>The file cannot be imported:</b> %1"))
                          .arg(message.toHtmlEscaped()));
  });
  connect(job_, &BackgroundJob::finished, this, [this]() {
    if (refreshQueued_) {
      refreshQueued_ = false;
      startFullRead();
    }
  });
  resize(900, 640);
  refresh();
}

void ImportDialog::setInitial(const QString& path, const ImportSettings& settings,
                              const std::optional<DatabaseSelection>& database) {
  if (database) {
    databaseKind_->setCurrentIndex(database->table.empty() ? 1 : 0);
    databaseText_->setText(
        QString::fromStdString(database->table.empty() ? database->query : database->table));
  }
  const int d = delimiter_->findData(int(settings.delimiter));
  delimiter_->setCurrentIndex(d < 0 ? 0 : d);
  QStringList others;
  bool empty = false;
  for (const auto& t : settings.missingTokens) {
    if (t.empty()) {
      empty = true;
    } else {
      others << QString::fromStdString(t);
    }
  }
  emptyIsMissing_->setChecked(empty);
  missingTokens_->setText(others.join(QStringLiteral(", ")));
  pendingOutcome_ = QString::fromStdString(settings.outcomeColumn);
  pendingEvent_ = settings.eventValue ? QString::fromStdString(*settings.eventValue) : QString();
  setPath(path);
}

void ImportDialog::setPath(const QString& path) {
  path_->setText(path);
  refresh();
}

QString ImportDialog::path() const {
  return path_->text().trimmed();
}

bool ImportDialog::isDatabase() const {
  return isDatabaseUri(path().toStdString());
}

std::optional<DatabaseSelection> ImportDialog::databaseSelection() const {
  const QString text = databaseText_->text().trimmed();
  if (!isDatabase() || text.isEmpty()) return std::nullopt;
  DatabaseSelection selection;
  (databaseKind_->currentIndex() == 0 ? selection.table : selection.query) = text.toStdString();
  return selection;
}

ImportSettings ImportDialog::settings() const {
  ImportSettings s;
  // A statistical-package file has no delimiter.
  s.delimiter = isPackageFile(path()) || isDatabase()
                    ? char(0)
                    : static_cast<char>(delimiter_->currentData().toInt());
  s.missingTokens.clear();
  if (emptyIsMissing_->isChecked()) s.missingTokens.emplace_back();
  for (const QString& t : missingTokens_->text().split(',', Qt::SkipEmptyParts)) {
    if (!t.trimmed().isEmpty()) s.missingTokens.push_back(t.trimmed().toStdString());
  }
  s.outcomeColumn = outcome_->currentText().toStdString();
  if (eventValue_->currentIndex() > 0) s.eventValue = eventValue_->currentText().toStdString();
  return s;
}

QString ImportDialog::summaryText() const {
  return summary_->text();
}

void ImportDialog::refresh() {
  refreshPreview();
  startFullRead();
}

void ImportDialog::refreshPreview() {
  preview_->clear();
  preview_->setRowCount(0);
  preview_->setColumnCount(0);
  databaseKind_->setEnabled(isDatabase());
  databaseText_->setEnabled(isDatabase());
  if (path().isEmpty()) {
    previewNote_->setText(
        tr("Choose a cohort file with one row per patient: CSV with a header "
           "row, or a SAS (.sas7bdat), Stata (.dta) or SPSS (.sav, .zsav) "
           "file. Or give a PostgreSQL database as postgresql://HOST:PORT/DATABASE and a "
           "table or query."));
    return;
  }
  delimiter_->setEnabled(!isPackageFile(path()) && !isDatabase());
  if (isDatabase()) {
    // No connection on this thread: the rows are read in the background, and the preview shows
    // the first of them when the read ends.
    previewNote_->setText(
        databaseSelection()
            ? tr("Reading from the database in the background; the first rows show here when "
                 "the read ends.")
            : tr("Give the table (NAME or SCHEMA.NAME) or one SELECT statement to read."));
    return;
  }
  if (isPackageFile(path())) {
    refreshPackagePreview();
    return;
  }
  QFile file(path());
  if (!file.open(QIODevice::ReadOnly)) {
    previewNote_->setText(tr("Cannot open %1: %2").arg(path(), file.errorString()));
    return;
  }
  QByteArray head = file.read(kPreviewBytes);
  if (!file.atEnd()) head.truncate(head.lastIndexOf('\n') + 1);  // whole lines only
  try {
    const CsvReadResult r = parseCsv(std::string_view(head.constData(), std::size_t(head.size())),
                                     path().toStdString(), csvOptionsFor(settings()));
    const Table& t = r.table;
    const int rows = static_cast<int>(std::min<std::size_t>(t.rowCount, kPreviewRows));
    preview_->setColumnCount(static_cast<int>(t.columns.size()));
    preview_->setRowCount(rows);
    QStringList headers;
    for (const Column& c : t.columns) {
      headers << QStringLiteral("%1\n(%2)").arg(QString::fromStdString(c.name), kindText(c));
    }
    preview_->setHorizontalHeaderLabels(headers);
    for (int row = 0; row < rows; ++row) {
      for (std::size_t col = 0; col < t.columns.size(); ++col) {
        preview_->setItem(row, int(col), new QTableWidgetItem(levelText(t.columns[col], row)));
      }
    }
    preview_->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    const QString delim = r.delimiter == '\t' ? tr("tab") : QString(QChar(r.delimiter));
    previewNote_->setText(tr("First %1 rows, delimiter %2%3. Column types are judged from these "
                             "rows; the full read below decides.")
                              .arg(rows)
                              .arg(delim, r.delimiterDetected ? tr(" (detected)") : QString()));
  } catch (const std::exception& e) {
    previewNote_->setText(tr("Preview not available: %1").arg(QString::fromStdString(e.what())));
  }
}

void ImportDialog::refreshPackagePreview() {
  PackageFormat format{};
  packageFormatOf(path().toStdString(), format);
  try {
    PackageReadOptions options;
    options.missingTokens = settings().missingTokens;
    options.rowLimit = kPreviewRows;
    const Table t = readPackageFile(path().toStdString(), format, options);
    const int rows = static_cast<int>(std::min<std::size_t>(t.rowCount, kPreviewRows));
    showTablePreview(t, rows);
    const int refused = static_cast<int>(t.refusedColumns.size());
    QString note = tr("First %1 records of the %2 file. Value labels are read as categories "
                      "(shown with their codes), and the file's own missing values (system, "
                      "tagged and user-defined) as missing.")
                       .arg(rows)
                       .arg(QString::fromStdString(packageFormatName(format)));
    if (refused > 0) {
      QStringList names;
      for (const RefusedColumn& r : t.refusedColumns) {
        names << QString::fromStdString(r.name);
      }
      note += QLatin1Char(' ') +
              tr("Not usable in an analysis (dates, times or ambiguous labels; hover the "
                 "header for the reason): %1.")
                  .arg(names.join(QStringLiteral(", ")));
    }
    previewNote_->setText(note);
  } catch (const std::exception& e) {
    previewNote_->setText(tr("Preview not available: %1").arg(QString::fromStdString(e.what())));
  }
}

void ImportDialog::showTablePreview(const Table& t, int rows) {
  const int read = static_cast<int>(t.columns.size());
  const int refused = static_cast<int>(t.refusedColumns.size());
  preview_->setColumnCount(read + refused);
  preview_->setRowCount(rows);
  QStringList headers;
  for (const Column& c : t.columns) {
    headers << QStringLiteral("%1\n(%2)").arg(QString::fromStdString(c.name), kindText(c));
  }
  for (const RefusedColumn& r : t.refusedColumns) {
    headers << QStringLiteral("%1\n(%2)").arg(QString::fromStdString(r.name), tr("not used"));
  }
  preview_->setHorizontalHeaderLabels(headers);
  for (int k = 0; k < refused; ++k) {
    const QString reason = QString::fromStdString(t.refusedColumns[std::size_t(k)].reason);
    preview_->horizontalHeaderItem(read + k)->setToolTip(reason);
  }
  for (int row = 0; row < rows; ++row) {
    for (int col = 0; col < read; ++col) {
      preview_->setItem(row, col,
                        new QTableWidgetItem(levelText(t.columns[std::size_t(col)], row)));
    }
  }
  preview_->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
}

void ImportDialog::startFullRead() {
  table_.reset();
  buttons_->button(QDialogButtonBox::Ok)->setEnabled(false);
  if (path().isEmpty()) return;
  if (job_->isRunning()) {
    job_->cancel();
    refreshQueued_ = true;
    return;
  }
  const std::optional<DatabaseSelection> database = databaseSelection();
  if (isDatabase() && !database) {
    summary_->setText(tr("Give a table or a query to read from the database."));
    return;
  }
  summary_->setText(isDatabase() ? tr("Reading the rows from the database…")
                                 : tr("Reading the whole file…"));
  const InputFileRecord source{path().toStdString(), {}, database};
  const ImportSettings s = settings();
  std::function<std::shared_ptr<const Table>(const ProgressCallback&)> work =
      [source, s](const ProgressCallback& progress) {
        return loadCohort(source, s, progress).table;
      };
  std::function<void(std::shared_ptr<const Table>&)> done =
      [this](std::shared_ptr<const Table>& t) {
        table_ = t;
        if (table_->database) {
          const int rows = static_cast<int>(std::min<std::size_t>(table_->rowCount, kPreviewRows));
          showTablePreview(*table_, rows);
          previewNote_->setText(
              tr("First %1 of %2 rows from database %3 on %4 (read only). Types follow the "
                 "database's column types.")
                  .arg(rows)
                  .arg(table_->rowCount)
                  .arg(QString::fromStdString(table_->database->database),
                       QString::fromStdString(table_->database->server)));
        }
        const QString keep = pendingOutcome_;
        outcome_->blockSignals(true);
        outcome_->clear();
        for (const Column& c : table_->columns) outcome_->addItem(QString::fromStdString(c.name));
        const int i = outcome_->findText(keep);
        outcome_->setCurrentIndex(i >= 0 ? i : -1);
        outcome_->blockSignals(false);
        refreshOutcomeChoices();
      };
  job_->start<std::shared_ptr<const Table>>(tr("Reading"), work, done);
}

void ImportDialog::refreshOutcomeChoices() {
  const QString keep = pendingEvent_;
  eventValue_->blockSignals(true);
  eventValue_->clear();
  eventValue_->addItem(tr(kZeroOne));
  if (table_ != nullptr) {
    if (const Column* c = table_->find(outcome_->currentText().toStdString())) {
      if (c->kind == ColumnKind::Text) {
        for (const auto& level : c->levels) eventValue_->addItem(QString::fromStdString(level));
      } else {
        std::set<double> values;
        for (double v : c->numbers) {
          if (!std::isnan(v)) values.insert(v);
          if (values.size() > 20) break;
        }
        if (values.size() <= 20) {
          for (double v : values) eventValue_->addItem(QString::number(v, 'g', 10));
        }
      }
    }
  }
  const int i = keep.isEmpty() ? 0 : eventValue_->findText(keep);
  eventValue_->setCurrentIndex(i >= 0 ? i : 0);
  eventValue_->blockSignals(false);
  refreshSummary();
}

void ImportDialog::refreshSummary() {
  pendingEvent_ = eventValue_->currentIndex() > 0 ? eventValue_->currentText() : QString();
  if (table_ == nullptr) return;
  QString text =
      tr("<b>%1 rows, %2 columns read.</b>").arg(table_->rowCount).arg(table_->columns.size());
  if (!table_->refusedColumns.empty()) {
    QStringList names;
    for (const RefusedColumn& r : table_->refusedColumns) {
      names << QString::fromStdString(r.name).toHtmlEscaped();
    }
    text += QLatin1Char(' ') + tr("Not usable: %1.").arg(names.join(QStringLiteral(", ")));
  }
  const ImportSettings s = settings();
  const bool ok = !s.outcomeColumn.empty();
  buttons_->button(QDialogButtonBox::Ok)->setEnabled(ok);
  if (!ok) {
    summary_->setText(text + tr(" Choose the outcome column."));
    return;
  }
  try {
    const AnalysisRows rows = selectCompleteCases(*table_, {s.outcomeColumn});
    const std::vector<double> y =
        outcomeValues(*table_, OutcomeSpec{s.outcomeColumn, s.eventValue}, rows.rows);
    std::size_t events = 0;
    for (double v : y) events += v > 0.5 ? 1 : 0;
    text += tr(" Outcome '%1': %2 events among %3 rows with a recorded outcome.")
                .arg(QString::fromStdString(s.outcomeColumn))
                .arg(events)
                .arg(y.size());
    text += tr("<br><b>Excluded:</b> %1 rows without a recorded outcome.")
                .arg(rows.exclusions.rowsExcluded);
    QStringList missing;
    for (const Column& c : table_->columns) {
      if (c.missingCount > 0 && c.name != s.outcomeColumn) {
        missing << tr("%1 (%2 missing)").arg(QString::fromStdString(c.name)).arg(c.missingCount);
      }
    }
    if (!missing.isEmpty()) {
      text += tr(" Rows missing a value in a column the model uses are excluded too (complete "
                 "cases); columns with missing values: %1.")
                  .arg(missing.join(QStringLiteral(", ")));
    } else {
      text += tr(" No other column has missing values.");
    }
  } catch (const std::exception& e) {
    buttons_->button(QDialogButtonBox::Ok)->setEnabled(false);
    text += tr("<br><b>Problem:</b> %1").arg(QString::fromStdString(e.what()).toHtmlEscaped());
  }
  summary_->setText(text);
}

}  // namespace calivera::ui
