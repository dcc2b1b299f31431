// The README's workstation study (resources/sample_study_full.cvstudy) opens with every input
// unchanged since it was saved and runs its saved uncertainty settings by itself: bootstrap
// intervals, the comparison with the rival model and the subgroups by site. Guards the demo
// (its SHA-256 records and paths), not a statistic: the numbers are checked elsewhere.
#include <QtTest>

#include "ui/async/background_job.h"
#include "ui/main_window.h"

using namespace calivera;
using namespace calivera::ui;

class SampleStudyTest : public QObject {
  Q_OBJECT

 private slots:
  void fullSampleStudyOpensAndRunsItsUncertainty() {
    MainWindow w;
    QVERIFY(
        w.controller().openStudy(QStringLiteral(CALIVERA_SOURCE_DIR "/resources/sample_study_full.cvstudy")));
    QTRY_VERIFY_WITH_TIMEOUT(w.controller().study().uncertainty != nullptr, 120000);
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 120000);
    QVERIFY2(!w.messageText().contains("changed", Qt::CaseInsensitive),
             qPrintable(w.messageText()));
    const auto& u = *w.controller().study().uncertainty;
    QVERIFY(u.bootstrap.has_value());
    QCOMPARE(u.bootstrap->run.replicates, 200);
    QVERIFY(u.comparison.has_value());
    QCOMPARE(u.comparison->models.size(), std::size_t{2});
    QCOMPARE(u.subgroups.size(), std::size_t{1});
    QCOMPARE(u.subgroups[0].column, std::string("site"));
    QCOMPARE(u.subgroups[0].levels.size(), std::size_t{4});
  }
};

QTEST_MAIN(SampleStudyTest)
#include "sample_study_test.moc"
