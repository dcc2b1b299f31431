#pragma once
// File → Print report: the same audit document as the PDF export (report_export_dialog.h, the
// study's saved report settings: title, thresholds, suppression, sign-off), laid out by the same
// code (render/report/report_layout.h) on a printer chosen in the platform's print dialog. The
// document is built and the charts are recorded on the GUI thread (milliseconds, QChart needs
// it); the pages are painted on a worker thread, as for the PDF. Qt's printers paint into a PDF
// spool that is handed to the print system when painting ends.

#include <QFuture>
#include <QString>
#include <memory>
#include <optional>

#include "core/report/audit_report.h"
#include "core/study/study.h"

class QPrinter;
class QWidget;

namespace calivera::ui {

// Paints the study's report on `printer` (kept alive by the future). Its page size and margins
// are set to the report's own (the paper from the study's report settings, unless `keepPaper`).
// The future's value is empty on success, else the reason. Throws InputError when the study has
// no result yet.
QFuture<QString> printReport(const StudyState& study, std::shared_ptr<QPrinter> printer,
                             const std::optional<FileFingerprint>& studyFile = {},
                             bool keepPaper = false);

// Shows the print dialog (modal to `parent`) and prints; tells the user the outcome. Explains and
// does nothing when the study has no result yet.
void showPrintReportDialog(QWidget* parent, const StudyState& study,
                           const std::optional<FileFingerprint>& studyFile = {});

}  // namespace calivera::ui
