// Help (issue 12): the guide names every tab of the window, the measures page lists every measure
// of the catalog with its meaning and source (so Help and every output agree), the keyboard page
// is read from the window's own actions, and every page ends with the caution.
#include "ui/dialogs/help_dialog.h"

#include <QAction>
#include <QTabWidget>
#include <QTextBrowser>
#include <QtTest>

#include "core/present/measures.h"
#include "ui/main_window.h"
#include "ui/views/caution_text.h"

using namespace calivera;
using namespace calivera::ui;

namespace {

QString plain(const QString& html) {
  QTextDocument doc;
  doc.setHtml(html);
  return doc.toPlainText();
}

}  // namespace

class HelpDialogTest : public QObject {
  Q_OBJECT

 private slots:
  void guideNamesEveryTab() {
    MainWindow w;
    auto* tabs = w.findChild<QTabWidget*>("mainTabs");
    QVERIFY(tabs != nullptr);
    const QString guide = plain(helpGuideHtml());
    for (int i = 0; i < tabs->count(); ++i) {
      const QString name = tabs->tabText(i).remove('&');
      QVERIFY2(guide.contains(name), qPrintable(name));
    }
  }

  void measuresPageListsTheCatalog() {
    const QString page = plain(helpMeasuresHtml());
    for (const Measure& m : measureCatalog()) {
      QVERIFY2(*m.source != '\0', m.key);  // every measure names where it is defined
      QVERIFY2(page.contains(QString::fromUtf8(m.label)), m.key);
      QVERIFY2(page.contains(QString::fromUtf8(m.meaning)), m.key);
      QVERIFY2(page.contains(QString::fromUtf8(m.source)), m.key);
    }
  }

  void keyboardPageComesFromTheActions() {
    MainWindow w;
    const QString page = plain(helpKeyboardHtml(w));
    auto* open = w.findChild<QAction*>("actionOpenStudy");
    QVERIFY(open != nullptr);
    QVERIFY(page.contains("Open study"));
    QVERIFY(page.contains(open->shortcut().toString(QKeySequence::NativeText)));
    QVERIFY(!page.contains('&'));  // menu accelerators removed
  }

  void everyPageEndsWithTheCaution() {
    MainWindow w;
    for (const QString& html :
         {helpGuideHtml(), helpMeasuresHtml(), helpKeyboardHtml(w), helpAboutHtml()}) {
      QVERIFY(plain(html).trimmed().endsWith(cautionText().trimmed()));
    }
    QVERIFY(plain(helpAboutHtml()).contains(QStringLiteral(CALIVERA_VERSION)));
  }

  // The menu opens one dialog, on the page asked for.
  void menuOpensThePage() {
    MainWindow w;
    w.show();
    w.findChild<QAction*>("actionHelpMeasures")->trigger();
    auto* dialog = w.findChild<QDialog*>("helpDialog");
    QVERIFY(dialog != nullptr && dialog->isVisible());
    auto* tabs = dialog->findChild<QTabWidget*>("helpTabs");
    QCOMPARE(tabs->currentWidget()->objectName(), QString("helpMeasures"));
    w.findChild<QAction*>("actionHelpAbout")->trigger();
    QCOMPARE(w.findChildren<QDialog*>("helpDialog").size(), 1);
    QCOMPARE(tabs->currentWidget()->objectName(), QString("helpAbout"));
  }
};

QTEST_MAIN(HelpDialogTest)
#include "help_dialog_test.moc"
