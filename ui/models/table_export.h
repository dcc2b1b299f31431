#pragma once
// Any table as text: CSV (RFC 4180 quoting) for files, tab-separated for the clipboard. Rows are
// written in the order the model presents them (a sort proxy's order when given a proxy).

#include <QString>
#include <vector>

class QAbstractItemModel;

namespace calivera::ui {

QString tableToCsv(const QAbstractItemModel& model);
// Only the given rows (model row numbers); all rows when empty.
QString tableToTsv(const QAbstractItemModel& model, const std::vector<int>& rows);
// Writes atomically; empty string on success, otherwise the reason.
QString writeTableCsv(const QAbstractItemModel& model, const QString& path);

}  // namespace calivera::ui
