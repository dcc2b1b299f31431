#pragma once
// The report's charts, built with the workstation's own chart classes (render/charts) from the
// document's chart data (suppressed values when suppression is on) and recorded as vector
// drawings (SVG in memory). Recording needs the GUI thread (QChart lives in a QGraphicsScene);
// replaying SVG with QSvgRenderer into the PDF painter works on any thread, so the dialog records
// on the GUI thread and writes the PDF in the background. (A QPicture replayed into a scaled
// high-resolution painter draws its text at the wrong size; SVG keeps text and lines together.)

#include <QByteArray>
#include <QSizeF>
#include <map>

#include "core/report/audit_report.h"
#include "render/report/report_layout.h"

namespace calivera::report {

// Each chart is laid out at this size in points and printed at about that size, one chart per
// row of the page, so the chart fonts print at their nominal sizes and legends have room.
inline constexpr double kReportChartWidth = 500.0;
inline constexpr double kReportChartHeight = 290.0;

struct RecordedCharts {
  std::map<ChartKind, QByteArray> drawings;  // SVG documents
  QSizeF size;                               // logical size each chart was laid out at (points)
};

// GUI thread only (needs a QApplication).
RecordedCharts recordReportCharts(const AuditDocument& doc);

// Scales each recorded chart into the target rect, keeping its aspect ratio centred.
ChartPainter replayCharts(RecordedCharts charts);

}  // namespace calivera::report
