#include "ui/models/table_export.h"

#include <QAbstractItemModel>
#include <QAbstractProxyModel>
#include <QSaveFile>

#include "core/report/csv_text.h"
#include "ui/models/record_table_model.h"

namespace calivera::ui {

namespace {

// The one cell rule of core (quoting and formula neutralisation, core/report/csv_text.h).
QString csvField(const QString& text) {
  return QString::fromStdString(csvCell(text.toStdString()));
}

QString tsvField(const QString& text, QChar separator) {
  return QString::fromStdString(
      csvCell(QString(text).replace(separator, ' ').toStdString(), false));
}

QString joined(const QAbstractItemModel& model, const std::vector<int>& rows, QChar separator,
               bool quote) {
  QString out;
  auto field = [&](const QString& s) { return quote ? csvField(s) : tsvField(s, separator); };
  const int columns = model.columnCount();
  for (int c = 0; c < columns; ++c) {
    if (c > 0) out += separator;
    out += field(model.headerData(c, Qt::Horizontal, Qt::DisplayRole).toString());
  }
  out += QStringLiteral("\r\n");
  auto writeRow = [&](int r) {
    for (int c = 0; c < columns; ++c) {
      if (c > 0) out += separator;
      out += field(model.data(model.index(r, c), Qt::DisplayRole).toString());
    }
    out += QStringLiteral("\r\n");
  };
  if (rows.empty()) {
    for (int r = 0; r < model.rowCount(); ++r) writeRow(r);
  } else {
    for (int r : rows) writeRow(r);
  }
  return out;
}

}  // namespace

const ResultTable* coreTableOf(const QAbstractItemModel& model) {
  const QAbstractItemModel* m = &model;
  while (const auto* proxy = qobject_cast<const QAbstractProxyModel*>(m)) m = proxy->sourceModel();
  const auto* record = dynamic_cast<const RecordTableModel*>(m);
  return record != nullptr ? record->source() : nullptr;
}

QString tableToCsv(const QAbstractItemModel& model) {
  if (const ResultTable* core = coreTableOf(model)) return QString::fromStdString(tableCsv(*core));
  return joined(model, {}, ',', true);
}

QString tableToTsv(const QAbstractItemModel& model, const std::vector<int>& rows) {
  return joined(model, rows, '\t', false);
}

QString writeTableCsv(const QAbstractItemModel& model, const QString& path) {
  QSaveFile file(path);
  if (!file.open(QIODevice::WriteOnly)) return file.errorString();
  file.write(tableToCsv(model).toUtf8());
  if (!file.commit()) return file.errorString();
  return {};
}

}  // namespace calivera::ui
