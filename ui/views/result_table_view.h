#pragma once
// The one way result tables are shown: a sort proxy over a RecordTableModel (numbers sort as
// numbers), row selection for Edit → Copy, read-only, columns sized to their contents. File →
// Export current table writes whatever the proxy shows.

#include <QString>

class QSortFilterProxyModel;
class QTableView;

namespace calivera::ui {

class RecordTableModel;

// The proxy is a child of the view and is named objectName + "Proxy".
QTableView* makeResultTableView(const QString& objectName, RecordTableModel* model,
                                QSortFilterProxyModel** proxyOut = nullptr);

// Caps the view's height at its header plus `maxRows` rows (fewer when the model has fewer, at
// least one) and a horizontal scroll bar, so a short table leaves the space to its neighbours.
void capTableHeight(QTableView* view, int maxRows);

}  // namespace calivera::ui
