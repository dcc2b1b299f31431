// Workstation table models and chart text, without widgets: numeric sorting and CSV export of a
// table model, the nearest threshold row, the subgroup table, and signless rounded zeros.
#include <QSortFilterProxyModel>
#include <QtTest>
#include <cmath>

#include "core/report/uncertainty_result_tables.h"
#include "render/charts/chart_text.h"
#include "ui/models/record_table_model.h"
#include "ui/models/result_tables.h"
#include "ui/models/table_export.h"

using namespace calivera;
using namespace calivera::ui;

class TableModelsTest : public QObject {
  Q_OBJECT

 private slots:
  void roundedNegativeZeroHasNoSign() {
    QCOMPARE(fixed(-0.00001, 4), QString("0.0000"));
    QCOMPARE(fixed(-0.4, 0), QString("0"));
    QCOMPARE(fixed(-0.00005, 4), QString("-0.0001"));
    QCOMPARE(fixed(-12.5, 1), QString("-12.5"));
  }

  void tableSortsNumbersAsNumbersAndExportsCsv() {
    RecordTableModel model;
    model.setTable({"Name", "Value"}, {},
                   {{{"a, with comma", 0}, {"10", 10}}, {{"b \"quoted\"", 0}, {"9", 9}}});
    QSortFilterProxyModel proxy;
    proxy.setSourceModel(&model);
    proxy.setSortRole(RecordTableModel::kSortRole);
    proxy.sort(1, Qt::AscendingOrder);
    QCOMPARE(proxy.index(0, 1).data().toString(), QString("9"));
    QCOMPARE(tableToCsv(proxy),
             QString("Name,Value\r\n\"b \"\"quoted\"\"\",9\r\n\"a, with comma\",10\r\n"));
    QCOMPARE(tableToTsv(proxy, {1}), QString("Name\tValue\r\na, with comma\t10\r\n"));
  }

  void nearestRowPicksTheClosestThreshold() {
    std::vector<ThresholdRow> rows(3);
    rows[0].threshold = 0.1;
    rows[1].threshold = 0.2;
    rows[2].threshold = 0.3;
    QCOMPARE(nearestThresholdRow(rows, 0.0), 0);
    QCOMPARE(nearestThresholdRow(rows, 0.16), 1);
    QCOMPARE(nearestThresholdRow(rows, 0.14), 0);
    QCOMPARE(nearestThresholdRow(rows, 0.9), 2);
    QCOMPARE(nearestThresholdRow({}, 0.5), -1);
  }

  // A level without metrics (one outcome class) keeps its counts, shows "not defined" for every
  // measure and says why; bootstrap columns appear only when some level has a bootstrap.
  void subgroupTableShowsLevelsWithoutMetrics() {
    SubgroupAnalysis a;
    a.column = "site";
    SubgroupResult level;
    level.level = "North";
    level.n = 12;
    level.events = 0;
    level.tooSmall = true;
    level.warnings = {"no metrics: one outcome class"};
    a.levels.push_back(level);
    RecordTableModel model;
    showResultTable(model, subgroupsTable({a}));
    QCOMPARE(model.rowCount(), 1);
    QCOMPARE(model.columnCount(), 16);  // one analysis: the column's name is left out
    QCOMPARE(model.cell(0, 0).text, QString("North"));
    QCOMPARE(model.cell(0, 1).text, QString("12"));
    QCOMPARE(model.cell(0, 3).text, QString("0.0000"));
    QCOMPARE(model.cell(0, 4).text, QString("not defined"));
    QCOMPARE(model.cell(0, 14).text, QString("too few patients"));
    QCOMPARE(model.cell(0, 15).text, QString("no metrics: one outcome class"));
  }
};

QTEST_MAIN(TableModelsTest)
#include "table_models_test.moc"
