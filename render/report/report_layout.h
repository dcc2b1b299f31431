#pragma once
// Page layout of the audit report on any QPagedPaintDevice (QPdfWriter in practice): a title
// block, flowing headings and paragraphs, tables that never split a row and repeat their header
// row (and caption, marked "continued") on a new page, pairs of charts side by side, and on every
// page a running header, the caution statement, both input fingerprints and "Page i of n".
//
// Layout works in device units; sizes are given in points and converted with the device's
// resolution, so the same document lays out identically at any resolution. Pages are counted in
// a first pass that measures without painting.

#include <QRectF>
#include <functional>

#include "core/report/audit_report.h"

class QPainter;
class QPagedPaintDevice;

namespace calivera::report {

// Paints chart `kind` into `target` (device units of the painter).
using ChartPainter = std::function<void(QPainter& painter, const QRectF& target, ChartKind kind)>;

// Paints every page of `doc` on `writer` (a QPdfWriter, or a QPrinter for File → Print; it must
// not have a painter yet). Returns the number
// of pages. `charts` may be empty: chart areas then stay blank with their captions.
int paintAuditDocument(const AuditDocument& doc, QPagedPaintDevice& writer,
                       const ChartPainter& charts);

}  // namespace calivera::report
