#include "ui/dialogs/report_print.h"

#include <QFutureWatcher>
#include <QMessageBox>
#include <QPageLayout>
#include <QPainter>
#include <QPointer>
#include <QPrintDialog>
#include <QPrinter>
#include <QtConcurrent/QtConcurrentRun>

#include "core/report/audit_format.h"
#include "core/report/audit_report.h"
#include "core/util/errors.h"
#include "render/report/report_charts.h"
#include "render/report/report_layout.h"
#include "ui/dialogs/report_export_dialog.h"

namespace calivera::ui {

namespace {

// The PDF's page geometry (render/report/audit_pdf_writer.cpp), so a printed page breaks where
// the file's does.
QPageLayout reportPageLayout(report::PaperSize paper) {
  const QPageSize size(paper == report::PaperSize::A4 ? QPageSize::A4 : QPageSize::Letter);
  return QPageLayout(size, QPageLayout::Portrait, QMarginsF(50, 44, 50, 36), QPageLayout::Point);
}

}  // namespace

QFuture<QString> printReport(const StudyState& study, std::shared_ptr<QPrinter> printer,
                             const std::optional<FileFingerprint>& studyFile, bool keepPaper) {
  ReportExportRequest request = exportRequestFor(study, {});
  request.studyFile = studyFile;
  AuditReportInput input = auditInputFromStudy(study, request);
  input.createdAt = formatUtcTimestamp(reportTimestamp());
  AuditDocument doc = buildAuditDocument(input);
  report::ChartPainter charts = report::replayCharts(report::recordReportCharts(doc));
  QPageLayout layout = reportPageLayout(request.paper);
  if (keepPaper) layout.setPageSize(printer->pageLayout().pageSize());
  printer->setPageLayout(layout);
  printer->setDocName(QString::fromStdString(doc.title));
  return QtConcurrent::run([doc = std::move(doc), charts = std::move(charts),
                            printer = std::move(printer)]() -> QString {
    try {
      if (report::paintAuditDocument(doc, *printer, charts) <= 0) {
        return QObject::tr("the printer took no pages");
      }
      return {};
    } catch (const std::exception& error) {
      return QString::fromStdString(error.what());
    }
  });
}

void showPrintReportDialog(QWidget* parent, const StudyState& study,
                           const std::optional<FileFingerprint>& studyFile) {
  if (!study.result || !study.data || !study.model) {
    QMessageBox::information(parent, QObject::tr("Print report"),
                             QObject::tr("Load a cohort and a model first: the report describes "
                                         "a validation result."));
    return;
  }
  auto printer = std::make_shared<QPrinter>(QPrinter::HighResolution);
  printer->setPageLayout(
      reportPageLayout(report::parsePaperSize(study.report.paper, "report.paper")));
  QPrintDialog dialog(printer.get(), parent);
  dialog.setObjectName(QStringLiteral("printReportDialog"));
  dialog.setWindowTitle(QObject::tr("Print report"));
  if (dialog.exec() != QDialog::Accepted) return;
  QFuture<QString> future;
  try {
    // The paper chosen in the print dialog wins; margins stay the report's.
    future = printReport(study, printer, studyFile, /*keepPaper=*/true);
  } catch (const std::exception& error) {
    QMessageBox::warning(parent, QObject::tr("Print report"), QString::fromStdString(error.what()));
    return;
  }
  auto* watcher = new QFutureWatcher<QString>(parent);
  QPointer<QWidget> owner(parent);
  QObject::connect(watcher, &QFutureWatcher<QString>::finished, watcher, [watcher, owner] {
    const QString error = watcher->result();
    watcher->deleteLater();
    if (!error.isEmpty()) {
      QMessageBox::warning(owner, QObject::tr("Print report"),
                           QObject::tr("The report could not be printed: %1").arg(error));
    }
  });
  watcher->setFuture(future);
}

}  // namespace calivera::ui
