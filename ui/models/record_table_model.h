#pragma once
// A read-only table of precomputed cells for the result tables (threshold trade-offs,
// Hosmer-Lemeshow groups, coefficients). Each cell carries its display text and a numeric sort
// key (Qt::UserRole) so a QSortFilterProxyModel sorts numbers as numbers. No widgets: testable
// on its own.

#include <QAbstractTableModel>
#include <QString>
#include <QStringList>
#include <optional>
#include <vector>

#include "core/report/result_table.h"

namespace calivera::ui {

struct TableCell {
  QString text;
  double sortKey = 0.0;
  bool textual = false;  // sort by the text instead of sortKey
  QString tip = {};      // tooltip: the full text of a name cut for the cell; may be empty
};

class RecordTableModel : public QAbstractTableModel {
 public:
  static constexpr int kSortRole = Qt::UserRole;

  explicit RecordTableModel(QObject* parent = nullptr) : QAbstractTableModel(parent) {}

  void setTable(QStringList headers, QStringList headerTips,
                std::vector<std::vector<TableCell>> rows);

  int rowCount(const QModelIndex& parent = {}) const override;
  int columnCount(const QModelIndex& parent = {}) const override;
  QVariant data(const QModelIndex& index, int role) const override;
  QVariant headerData(int section, Qt::Orientation orientation, int role) const override;

  const TableCell& cell(int row, int column) const { return rows_[row][column]; }

  // The core table this model shows, when it shows one (ui/models/result_tables.h): export writes
  // it as the command line does. Cleared by setTable().
  void setSource(ResultTable table) { source_ = std::move(table); }
  const ResultTable* source() const { return source_ ? &*source_ : nullptr; }

 private:
  std::optional<ResultTable> source_;
  QStringList headers_;
  QStringList headerTips_;
  std::vector<std::vector<TableCell>> rows_;
};

}  // namespace calivera::ui
