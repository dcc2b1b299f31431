#pragma once
// File -> Export report: a dialog for the report's title, the thresholds to tabulate, small-cell
// suppression and paper size, then the PDF is written in the background. The document is built
// and the charts are recorded on the GUI thread (QChart needs it; both take milliseconds); the
// page layout, PDF rendering and the atomic file write run on a worker thread.
//
// Thresholds must be among those the study's validation computed (by default every 0.01 from 0.01
// to 0.99); the dialog refuses others with a message instead of recomputing metrics.

#include <QFuture>
#include <QString>
#include <cstddef>
#include <functional>
#include <string>
#include <vector>

#include "core/report/audit_report.h"
#include "core/study/study.h"
#include "render/report/audit_pdf_writer.h"

class QWidget;

namespace calivera::ui {

struct ReportExportRequest {
  std::string path;  // the PDF to write
  std::string title;
  std::vector<double> thresholds;  // rows of the threshold table
  std::size_t suppressBelow = 0;   // 0: off
  report::PaperSize paper = report::PaperSize::A4;
  std::string analyst;  // sign-off lines; empty: blank lines to sign
  std::string reviewer;
  // The saved, unchanged study file this export describes (StudyController::savedStudyFile).
  std::optional<FileFingerprint> studyFile;
};

// The request the study's saved report settings (StudyState::report) stand for, writing to `path`;
// and back. `calivera run STUDY --pdf` reads the same settings, so the two PDFs agree.
ReportExportRequest exportRequestFor(const StudyState& study, const std::string& path);
ReportSettings reportSettingsOf(const ReportExportRequest& request);

// The report input for a study that holds a result. Throws InputError when the study has no
// result or data record.
AuditReportInput auditInputFromStudy(const StudyState& study, const ReportExportRequest& request);

// Builds the document and records the charts now (GUI thread), then renders and writes the PDF on
// a worker thread. The future's value is empty on success, else the error message (no file is
// left behind on failure). Throws InputError for a bad request before anything starts.
QFuture<QString> exportReport(const StudyState& study, const ReportExportRequest& request);

// Opens the dialog (modal to `parent`), filled from the study's report settings; on OK hands the
// chosen settings to `remember` (so a saved study's `calivera run --pdf` writes the same report),
// starts exportReport and tells the user the outcome when it finishes. Does nothing but explain
// when the study has no result yet.
void showReportExportDialog(QWidget* parent, const StudyState& study,
                            const std::function<void(const ReportSettings&)>& remember,
                            const std::optional<FileFingerprint>& studyFile = {});

}  // namespace calivera::ui
