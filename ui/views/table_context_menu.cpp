#include "ui/views/table_context_menu.h"

#include <QAction>
#include <QApplication>
#include <QClipboard>
#include <QFileDialog>
#include <QMainWindow>
#include <QMenu>
#include <QMessageBox>
#include <QStatusBar>
#include <QTableView>
#include <set>
#include <vector>

#include "core/report/result_table.h"
#include "ui/models/table_export.h"

namespace calivera::ui {

namespace {

std::vector<int> selectedRows(const QTableView& view) {
  std::set<int> rows;
  if (view.selectionModel() != nullptr) {
    for (const QModelIndex& i : view.selectionModel()->selectedIndexes()) rows.insert(i.row());
  }
  return {rows.begin(), rows.end()};
}

void tell(QTableView* view, const QString& text, bool error) {
  auto* window = qobject_cast<QMainWindow*>(view->window());
  if (error || window == nullptr) {
    if (error) QMessageBox::warning(view->window(), QObject::tr("Export table"), text);
    return;
  }
  window->statusBar()->showMessage(text, 8000);
}

}  // namespace

QString suggestedCsvName(const QTableView& view) {
  const ResultTable* core = view.model() != nullptr ? coreTableOf(*view.model()) : nullptr;
  return core != nullptr ? QString::fromStdString(core->fileName) : view.objectName() + ".csv";
}

void exportTableInteractively(QTableView* view) {
  const QString path =
      QFileDialog::getSaveFileName(view->window(), QObject::tr("Export table as CSV"),
                                   suggestedCsvName(*view), QObject::tr("CSV (*.csv)"));
  if (path.isEmpty()) return;
  const QString error = writeTableCsv(*view->model(), path);
  if (error.isEmpty()) {
    tell(view, QObject::tr("Table saved to %1").arg(path), false);
  } else {
    tell(view, QObject::tr("Export failed: %1").arg(error), true);
  }
}

QMenu* buildTableContextMenu(QTableView* view, QWidget* parent) {
  auto* menu = new QMenu(parent);
  const std::vector<int> rows = selectedRows(*view);
  QAction* copyRows = menu->addAction(QObject::tr("Copy selected rows"));
  copyRows->setObjectName(QStringLiteral("tableMenuCopyRows"));
  copyRows->setEnabled(!rows.empty());
  QObject::connect(copyRows, &QAction::triggered, view, [view, rows] {
    QApplication::clipboard()->setText(tableToTsv(*view->model(), rows));
  });
  QAction* copyAll = menu->addAction(QObject::tr("Copy whole table"));
  copyAll->setObjectName(QStringLiteral("tableMenuCopyAll"));
  QObject::connect(copyAll, &QAction::triggered, view,
                   [view] { QApplication::clipboard()->setText(tableToTsv(*view->model(), {})); });
  menu->addSeparator();
  QAction* exportCsv = menu->addAction(QObject::tr("Export table as CSV…"));
  exportCsv->setObjectName(QStringLiteral("tableMenuExport"));
  QObject::connect(exportCsv, &QAction::triggered, view,
                   [view] { exportTableInteractively(view); });
  return menu;
}

void attachTableContextMenu(QTableView* view) {
  view->setContextMenuPolicy(Qt::CustomContextMenu);
  QObject::connect(view, &QWidget::customContextMenuRequested, view, [view](const QPoint& at) {
    QMenu* menu = buildTableContextMenu(view, view);
    menu->setAttribute(Qt::WA_DeleteOnClose);
    menu->popup(view->viewport()->mapToGlobal(at));
  });
}

}  // namespace calivera::ui
