#include "ui/models/record_table_model.h"

namespace calivera::ui {

void RecordTableModel::setTable(QStringList headers, QStringList headerTips,
                                std::vector<std::vector<TableCell>> rows) {
  beginResetModel();
  headers_ = std::move(headers);
  headerTips_ = std::move(headerTips);
  rows_ = std::move(rows);
  source_.reset();
  endResetModel();
}

int RecordTableModel::rowCount(const QModelIndex& parent) const {
  return parent.isValid() ? 0 : static_cast<int>(rows_.size());
}

int RecordTableModel::columnCount(const QModelIndex& parent) const {
  return parent.isValid() ? 0 : static_cast<int>(headers_.size());
}

QVariant RecordTableModel::data(const QModelIndex& index, int role) const {
  if (!index.isValid() || index.row() >= rowCount() || index.column() >= columnCount()) return {};
  const TableCell& c =
      rows_[static_cast<std::size_t>(index.row())][static_cast<std::size_t>(index.column())];
  switch (role) {
    case Qt::DisplayRole:
      return c.text;
    case Qt::ToolTipRole:
      return c.tip.isEmpty() ? QVariant() : QVariant(c.tip);
    case kSortRole:
      return c.textual ? QVariant(c.text) : QVariant(c.sortKey);
    case Qt::TextAlignmentRole:
      // Words read from the left, numbers line up on the right.
      return index.column() == 0 || c.textual ? QVariant(Qt::AlignLeft | Qt::AlignVCenter)
                                              : QVariant(Qt::AlignRight | Qt::AlignVCenter);
    default:
      return {};
  }
}

QVariant RecordTableModel::headerData(int section, Qt::Orientation orientation, int role) const {
  if (orientation != Qt::Horizontal || section < 0 || section >= headers_.size()) {
    return QAbstractTableModel::headerData(section, orientation, role);
  }
  if (role == Qt::DisplayRole) return headers_[section];
  if (role == Qt::ToolTipRole && section < headerTips_.size()) return headerTips_[section];
  return {};
}

}  // namespace calivera::ui
