#include "ui/dialogs/report_export_dialog.h"

#include <QComboBox>
#include <QDialog>
#include <QDialogButtonBox>
#include <QDir>
#include <QFileDialog>
#include <QFileInfo>
#include <QFormLayout>
#include <QFutureWatcher>
#include <QHBoxLayout>
#include <QLabel>
#include <QLineEdit>
#include <QMessageBox>
#include <QPointer>
#include <QPushButton>
#include <QRegularExpression>
#include <QSpinBox>
#include <QVBoxLayout>
#include <QtConcurrent/QtConcurrentRun>
#include <cmath>

#include "core/model/model_io.h"
#include "core/report/audit_format.h"
#include "core/report/audit_run.h"
#include "core/study/limits.h"
#include "core/util/atomic_file.h"
#include "core/util/errors.h"
#include "core/util/sha256.h"
#include "render/report/report_charts.h"

namespace calivera::ui {

ReportExportRequest exportRequestFor(const StudyState& study, const std::string& path) {
  ReportExportRequest request;
  request.path = path;
  request.title = study.report.title;
  request.thresholds = study.report.thresholds;
  request.suppressBelow = study.report.suppressBelow;
  request.paper = report::parsePaperSize(study.report.paper, "report.paper");
  request.analyst = study.report.analyst;
  request.reviewer = study.report.reviewer;
  return request;
}

ReportSettings reportSettingsOf(const ReportExportRequest& request) {
  ReportSettings settings;
  settings.title = request.title;
  settings.thresholds = request.thresholds;
  settings.suppressBelow = request.suppressBelow;
  settings.paper = request.paper == report::PaperSize::Letter ? "letter" : "a4";
  settings.analyst = request.analyst;
  settings.reviewer = request.reviewer;
  return settings;
}

AuditReportInput auditInputFromStudy(const StudyState& study, const ReportExportRequest& request) {
  if (!study.run || !study.result || !study.data || !study.model) {
    throw InputError("no validation result to report yet: load a cohort and a model first");
  }
  // The command line's adapter on the study's own run, so the workstation's PDF states the same
  // performance basis, settings and fingerprints as `calivera validate --pdf` for this study.
  static const UncertaintyResults kNoUncertainty;
  AuditReportInput input =
      auditInputFromRun(*study.run, request.title, request.suppressBelow,
                        study.uncertainty ? *study.uncertainty : kNoUncertainty);
  if (!study.uncertainty) input.uncertainty.reset();
  input.signOff = {request.analyst, request.reviewer};
  input.studyFile = request.studyFile;
  AuditSettings& settings = input.settings;
  settings.tableThresholds = request.thresholds;
  settings.reasonableThresholds =
      Interval{study.analysis.reasonableLo, study.analysis.reasonableHi};
  if (study.modelSource == ModelSource::Fitted) {
    settings.other.emplace_back(
        "Model fitted with", study.fit.firth ? "Firth penalized likelihood" : "maximum likelihood");
  }
  return input;
}

QFuture<QString> exportReport(const StudyState& study, const ReportExportRequest& request) {
  if (request.path.empty()) throw InputError("choose a file for the report");
  AuditReportInput input = auditInputFromStudy(study, request);
  const long long timestamp = reportTimestamp();
  input.createdAt = formatUtcTimestamp(timestamp);
  AuditDocument doc = buildAuditDocument(input);
  report::ChartPainter charts = report::replayCharts(report::recordReportCharts(doc));
  const std::string path = request.path;
  const report::PaperSize paper = request.paper;
  return QtConcurrent::run(
      [doc = std::move(doc), charts = std::move(charts), path, paper, timestamp]() -> QString {
        try {
          const QByteArray pdf = report::renderAuditPdf(doc, paper, charts, timestamp);
          writeFileAtomically(
              path, std::string_view(pdf.constData(), static_cast<std::size_t>(pdf.size())));
          return {};
        } catch (const std::exception& error) {
          return QString::fromStdString(error.what());
        }
      });
}

namespace {

std::vector<double> parseThresholds(const QString& text) {
  std::vector<double> thresholds;
  for (const QString& item :
       text.split(QRegularExpression(QStringLiteral("[,;\\s]+")), Qt::SkipEmptyParts)) {
    bool ok = false;
    const double value = item.toDouble(&ok);
    if (!ok || !std::isfinite(value) || value <= 0.0 || value >= 1.0) {
      throw InputError("threshold '" + item.toStdString() + "' is not a risk between 0 and 1");
    }
    thresholds.push_back(value);
  }
  return thresholds;
}

}  // namespace

void showReportExportDialog(QWidget* parent, const StudyState& study,
                            const std::function<void(const ReportSettings&)>& remember,
                            const std::optional<FileFingerprint>& studyFile) {
  if (!study.result || !study.data || !study.model) {
    QMessageBox::information(parent, QObject::tr("Export report"),
                             QObject::tr("Load a cohort and a model first: the report describes "
                                         "a validation result."));
    return;
  }
  QDialog dialog(parent);
  dialog.setObjectName(QStringLiteral("reportExportDialog"));
  dialog.setWindowTitle(QObject::tr("Export audit report"));
  dialog.setMinimumWidth(560);  // room for the file path
  auto* form = new QFormLayout;

  // Filled from the study's report settings, whose defaults are the command line's.
  const ReportSettings& saved = study.report;
  auto* title = new QLineEdit(&dialog);
  title->setObjectName(QStringLiteral("reportTitleEdit"));
  title->setMaxLength(static_cast<int>(kMaxReportTitleBytes / 4));  // UTF-8: up to 4 bytes each
  title->setText(QString::fromStdString(saved.title));
  title->setPlaceholderText(QString::fromUtf8(kDefaultAuditTitle));
  form->addRow(QObject::tr("Title"), title);

  // Names for the sign-off lines; left empty, the report prints blank lines to sign by hand.
  const auto nameEdit = [&dialog, form](const char* objectName, const QString& label,
                                        const std::string& value) {
    auto* edit = new QLineEdit(&dialog);
    edit->setObjectName(QString::fromLatin1(objectName));
    edit->setMaxLength(static_cast<int>(kMaxSignOffNameBytes / 4));
    edit->setText(QString::fromStdString(value));
    edit->setPlaceholderText(QObject::tr("blank line to sign"));
    form->addRow(label, edit);
    return edit;
  };
  QLineEdit* analyst = nameEdit("reportAnalystEdit", QObject::tr("Analyst"), saved.analyst);
  QLineEdit* reviewer = nameEdit("reportReviewerEdit", QObject::tr("Reviewer"), saved.reviewer);

  auto* thresholds = new QLineEdit(&dialog);
  thresholds->setObjectName(QStringLiteral("reportThresholdsEdit"));
  {
    const std::vector<double> shown = saved.thresholds.empty()
                                          ? defaultTableThresholds(study.result->thresholds)
                                          : saved.thresholds;
    QStringList items;
    for (const double t : shown) items << QString::fromStdString(formatThreshold(t));
    thresholds->setText(items.join(QStringLiteral(", ")));
  }
  thresholds->setToolTip(
      QObject::tr("Risks at which to tabulate sensitivity, specificity and "
                  "predictive values, separated by commas (steps of 0.01)"));
  form->addRow(QObject::tr("Thresholds"), thresholds);

  auto* suppress = new QSpinBox(&dialog);
  suppress->setObjectName(QStringLiteral("reportSuppressSpin"));
  suppress->setRange(1, 1000);
  suppress->setSpecialValueText(QObject::tr("off"));
  suppress->setValue(saved.suppressBelow == 0 ? 1 : static_cast<int>(saved.suppressBelow));
  suppress->setToolTip(
      QObject::tr("Hide counts from 1 to N-1 (shown as <N), with the further "
                  "cells needed so they cannot be recomputed from totals"));
  form->addRow(QObject::tr("Suppress counts below"), suppress);

  auto* paper = new QComboBox(&dialog);
  paper->setObjectName(QStringLiteral("reportPaperCombo"));
  paper->addItem(QObject::tr("A4"));
  paper->addItem(QObject::tr("US Letter"));
  paper->setCurrentIndex(saved.paper == "letter" ? 1 : 0);
  form->addRow(QObject::tr("Paper"), paper);

  auto* path = new QLineEdit(&dialog);
  path->setObjectName(QStringLiteral("reportPathEdit"));
  if (study.data->database) {
    // A database has no folder: the report goes to the working folder, named after the table.
    const std::string stem =
        study.data->database->table.empty() ? "query" : study.data->database->table;
    path->setText(
        QDir::current().filePath(QString::fromStdString(stem) + QStringLiteral("_report.pdf")));
  } else {
    const QFileInfo data(QString::fromStdString(study.data->path));
    path->setText(
        data.absoluteDir().filePath(data.completeBaseName() + QStringLiteral("_report.pdf")));
  }
  auto* browse = new QPushButton(QObject::tr("Browse..."), &dialog);
  browse->setObjectName(QStringLiteral("reportBrowseButton"));
  QObject::connect(browse, &QPushButton::clicked, &dialog, [&dialog, path] {
    const QString chosen = QFileDialog::getSaveFileName(
        &dialog, QObject::tr("Save report"), path->text(), QObject::tr("PDF files (*.pdf)"));
    if (!chosen.isEmpty()) path->setText(chosen);
  });
  auto* pathRow = new QHBoxLayout;
  pathRow->addWidget(path, 1);
  pathRow->addWidget(browse);
  form->addRow(QObject::tr("File"), pathRow);

  auto* note = new QLabel(QObject::tr("The report holds aggregates only and carries the caution "
                                      "statement on every page."),
                          &dialog);
  note->setWordWrap(true);
  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel, &dialog);
  buttons->setObjectName(QStringLiteral("reportButtons"));
  buttons->button(QDialogButtonBox::Ok)->setText(QObject::tr("Export"));
  auto* layout = new QVBoxLayout(&dialog);
  layout->addLayout(form);
  layout->addWidget(note);
  layout->addWidget(buttons);

  ReportExportRequest request;
  QObject::connect(buttons, &QDialogButtonBox::rejected, &dialog, &QDialog::reject);
  QObject::connect(buttons, &QDialogButtonBox::accepted, &dialog, [&] {
    try {
      request.title = title->text().toStdString();
      request.analyst = analyst->text().trimmed().toStdString();
      request.reviewer = reviewer->text().trimmed().toStdString();
      request.studyFile = studyFile;
      request.thresholds = parseThresholds(thresholds->text());
      request.suppressBelow =
          suppress->value() <= 1 ? 0 : static_cast<std::size_t>(suppress->value());
      request.paper =
          paper->currentIndex() == 1 ? report::PaperSize::Letter : report::PaperSize::A4;
      request.path = path->text().toStdString();
      // Check the thresholds now, while the user can still correct them.
      (void)buildAuditDocument(auditInputFromStudy(study, request));
      dialog.accept();
    } catch (const std::exception& error) {
      QMessageBox::warning(&dialog, QObject::tr("Export report"),
                           QString::fromStdString(error.what()));
    }
  });
  if (dialog.exec() != QDialog::Accepted) return;
  if (remember) remember(reportSettingsOf(request));

  QFuture<QString> future;
  try {
    future = exportReport(study, request);
  } catch (const std::exception& error) {
    QMessageBox::warning(parent, QObject::tr("Export report"),
                         QString::fromStdString(error.what()));
    return;
  }
  auto* watcher = new QFutureWatcher<QString>(parent);
  const QString file = QString::fromStdString(request.path);
  QPointer<QWidget> owner(parent);
  QObject::connect(watcher, &QFutureWatcher<QString>::finished, watcher, [watcher, owner, file] {
    const QString error = watcher->result();
    watcher->deleteLater();
    if (error.isEmpty()) {
      QMessageBox::information(owner, QObject::tr("Export report"),
                               QObject::tr("Report written to %1").arg(file));
    } else {
      QMessageBox::warning(owner, QObject::tr("Export report"),
                           QObject::tr("The report could not be written: %1").arg(error));
    }
  });
  watcher->setFuture(future);
}

}  // namespace calivera::ui
