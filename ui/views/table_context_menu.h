#pragma once
// The context menu every result table carries (right-click or the menu key): copy the selected
// rows, copy the whole table (tab-separated, what is shown), and export the table as CSV (the
// same bytes as File → Export current table: a core table exports as `--csv-dir` writes it).

#include <QString>

class QMenu;
class QTableView;
class QWidget;

namespace calivera::ui {

// The file name offered when `view`'s table is exported: the command line's --csv-dir name for a
// core table, else the view's object name + ".csv".
QString suggestedCsvName(const QTableView& view);

// Writes `view`'s table to a CSV chosen in a save dialog (parent: the view's window); tells the
// user the outcome in the window's status bar or a message box. Does nothing when cancelled.
void exportTableInteractively(QTableView* view);

// The menu's actions, named tableMenuCopyRows, tableMenuCopyAll and tableMenuExport.
QMenu* buildTableContextMenu(QTableView* view, QWidget* parent);

// Shows buildTableContextMenu on the view's context-menu request.
void attachTableContextMenu(QTableView* view);

}  // namespace calivera::ui
