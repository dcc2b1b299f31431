#include "ui/views/result_table_view.h"

#include <QHeaderView>
#include <QScrollBar>
#include <QSortFilterProxyModel>
#include <QTableView>
#include <algorithm>

#include "ui/models/record_table_model.h"
#include "ui/views/table_context_menu.h"

namespace calivera::ui {

QTableView* makeResultTableView(const QString& objectName, RecordTableModel* model,
                                QSortFilterProxyModel** proxyOut) {
  auto* view = new QTableView;
  auto* proxy = new QSortFilterProxyModel(view);
  proxy->setObjectName(objectName + QStringLiteral("Proxy"));
  proxy->setSourceModel(model);
  proxy->setSortRole(RecordTableModel::kSortRole);
  view->setObjectName(objectName);
  view->setModel(proxy);
  view->setSortingEnabled(true);
  // Rows start in the order they were filled (setSortingEnabled would sort descending by the
  // first column); a click on a header sorts.
  view->horizontalHeader()->setSortIndicator(-1, Qt::AscendingOrder);
  proxy->sort(-1);
  view->setSelectionBehavior(QAbstractItemView::SelectRows);
  view->setSelectionMode(QAbstractItemView::ExtendedSelection);
  view->setAlternatingRowColors(true);
  view->verticalHeader()->setVisible(false);
  view->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
  view->setEditTriggers(QAbstractItemView::NoEditTriggers);
  attachTableContextMenu(view);
  if (proxyOut != nullptr) *proxyOut = proxy;
  return view;
}

void capTableHeight(QTableView* view, int maxRows) {
  const int rows = std::clamp(view->model()->rowCount(), 1, std::max(1, maxRows));
  const int rowHeight = std::max(view->verticalHeader()->defaultSectionSize(),
                                 view->model()->rowCount() > 0 ? view->rowHeight(0) : 0);
  // Before the first show the header may not know its height yet.
  const int header = std::max(view->horizontalHeader()->sizeHint().height(),
                              view->horizontalHeader()->fontMetrics().height() + 10);
  const int height = header + rows * rowHeight + view->horizontalScrollBar()->sizeHint().height() +
                     2 * view->frameWidth() + 2;
  view->setMaximumHeight(height);
}

}  // namespace calivera::ui
