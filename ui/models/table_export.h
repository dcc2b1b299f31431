#pragma once
// Any table as text: CSV for files, tab-separated for the clipboard.
//
// A table that shows a core result table (core/report/result_table.h: thresholds, risk groups)
// exports as exactly the file `calivera validate --csv-dir` writes for it: CSV keys as headers,
// full precision, the command line's row order. Other tables export what they show (RFC 4180
// quoting, rows in the order the model presents them, a sort proxy's order when given a proxy).
// The clipboard always gets what is shown, for the selected rows.

#include <QString>
#include <vector>

class QAbstractItemModel;

namespace calivera {
struct ResultTable;
}

namespace calivera::ui {

// The core table behind `model` (through any proxies), or nullptr.
const ResultTable* coreTableOf(const QAbstractItemModel& model);

QString tableToCsv(const QAbstractItemModel& model);
// Only the given rows (model row numbers); all rows when empty.
QString tableToTsv(const QAbstractItemModel& model, const std::vector<int>& rows);
// Writes atomically; empty string on success, otherwise the reason.
QString writeTableCsv(const QAbstractItemModel& model, const QString& path);

}  // namespace calivera::ui
