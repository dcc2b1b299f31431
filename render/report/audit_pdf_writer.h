#pragma once
// Writing the audit report as PDF with Qt's own PDF engine (QPdfWriter + QPainter), from the
// Qt-free document of core/report/audit_report.h.
//
// Reproducibility: Qt writes no random document id; what varies is the Info dictionary's
// /CreationDate, taken from the clock, and the order of the embedded fonts, which follows the
// process's random QHash seed (fixed to Qt's deterministic seed while the PDF is rendered). The PDF
// is rendered into memory and that date is rewritten, with the same byte length so the
// cross-reference offsets stay valid, to the report's own timestamp: SOURCE_DATE_EPOCH when set
// (reproducible-builds.org convention), else the current time. The same inputs, settings and
// timestamp give byte-identical files.
//
// Integrity: the bytes go to a temporary file in the target folder that is renamed into place
// (writeFileAtomically), so a failure leaves no partial PDF.

#include <QByteArray>
#include <string>

#include "core/report/audit_report.h"
#include "render/report/report_layout.h"

namespace calivera::report {

enum class PaperSize { A4, Letter };

// "a4" or "letter" (case-insensitive); anything else is an InputError naming `option`.
PaperSize parsePaperSize(const std::string& text, const std::string& option);

// Renders every page in memory. Any thread; `charts` must be safe to call on it.
QByteArray renderAuditPdf(const AuditDocument& doc, PaperSize paper, const ChartPainter& charts,
                          long long creationTime);

// Sets /CreationDate to `creationTime` (UTC) in place, keeping the byte length. Returns false
// when the PDF holds no creation date in Qt's format.
bool setPdfCreationDate(QByteArray& pdf, long long creationTime);

// The PDF bytes of `input` for the command line, which writes them with its other outputs: fills
// in input.createdAt from reportTimestamp() when empty, builds the document, records the charts
// and renders. Creates an offscreen QApplication when the process has none (and no display).
// Call on the main thread. Throws InputError (SOURCE_DATE_EPOCH, a threshold not computed) or
// AnalysisError.
std::string renderAuditReportPdf(AuditReportInput input, PaperSize paper);

// The PDF bytes of a document without the single-cohort charts (the report of `calivera pool`),
// dated by reportTimestamp(). Same threading rules as renderAuditReportPdf.
std::string renderDocumentPdf(const AuditDocument& doc, PaperSize paper);

// The same, written to `path`: fills in input.createdAt from reportTimestamp() when
// empty, builds the document, records the charts, renders and writes `path` atomically. Creates
// an offscreen QApplication when the process has none (and no display). Call on the main thread.
// Throws InputError (bad path, SOURCE_DATE_EPOCH) or AnalysisError.
void writeAuditReportPdf(AuditReportInput input, const std::string& path, PaperSize paper);

}  // namespace calivera::report
