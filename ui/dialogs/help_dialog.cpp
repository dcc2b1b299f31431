#include "ui/dialogs/help_dialog.h"

#include <Eigen/Core>
#include <QAction>
#include <QDialog>
#include <QDialogButtonBox>
#include <QKeySequence>
#include <QTabWidget>
#include <QTextBrowser>
#include <QVBoxLayout>
#include <QVariant>
#include <QtGlobal>
#include <algorithm>
#include <boost/version.hpp>
#include <vector>

#include "core/present/measures.h"
#include "core/util/sha256.h"
#include "ui/views/caution_text.h"

namespace calivera::ui {

namespace {

QString esc(const char* text) {
  return QString::fromUtf8(text).toHtmlEscaped();
}

QString row(const QString& a, const QString& b) {
  return QStringLiteral("<tr><td valign='top'><b>%1</b></td><td>%2</td></tr>").arg(a, b);
}

QString page(const QString& body) {
  return QStringLiteral("<html><body style='font-size:10pt'>%1<hr><p><i>%2</i></p></body></html>")
      .arg(body, cautionText().toHtmlEscaped());
}

}  // namespace

QString helpGuideHtml() {
  QString html = QObject::tr(
      "<h3>What the workstation does</h3>"
      "<p>It measures how a risk model performs on your cohort: how well it separates patients "
      "with and without the event (discrimination), whether its risks match what happened "
      "(calibration), and what acting on it at a threshold would mean (clinical utility). Every "
      "number on screen can be repeated by one command line (Analysis → Reproduce on the command "
      "line).</p>"
      "<p><b>Start:</b> File → Import cohort (CSV, or a SAS, Stata or SPSS file), choose the "
      "outcome column, then Model → Load "
      "model file (or Fit a model on this cohort). The validation runs at once; change the "
      "threshold with the bar above the views, the arrow keys, or a click on a chart.</p>"
      "<h3>Views</h3><table cellspacing='6'>");
  html += row(QObject::tr("Linked views"),
              QObject::tr("ROC curve, calibration, decision curve and the distribution of "
                          "predicted risk, all marking the current threshold. The side panel "
                          "says what the threshold means for 1000 patients like yours, and "
                          "warns when the model's risks are off on this cohort."));
  html += row(QObject::tr("Summary"),
              QObject::tr("Every measure with its 95% interval, a plain reading of each, the "
                          "sample-size assessment and the warnings."));
  html += row(QObject::tr("Tables"),
              QObject::tr("Threshold trade-offs (one row per threshold; click a row to move the "
                          "threshold there), the calibration groups behind Hosmer-Lemeshow, and "
                          "the analysed columns missing together (rows and events per pattern). "
                          "File → Export current table writes the CSV the command line writes."));
  html += row(QObject::tr("Model"),
              QObject::tr("The model's terms, coefficients with Wald intervals and odds ratios, "
                          "and the units it expects."));
  html += row(QObject::tr("Predictor space"),
              QObject::tr("Predicted risk along one predictor, or the threshold boundary over "
                          "two, with the other predictors held at values you choose."));
  html += row(QObject::tr("Comparison"),
              QObject::tr("Further models on the same patients: paired DeLong AUC differences "
                          "and net-benefit differences over your threshold range."));
  html += row(QObject::tr("Subgroups"),
              QObject::tr("The model validated within each level of a column (site, sex, age "
                          "band); small levels are marked."));
  html +=
      row(QObject::tr("Sites"),
          QObject::tr("The model validated in each site of a site column, then each measure "
                      "pooled across sites by random-effects meta-analysis, with the "
                      "prediction interval for a new site and a forest plot per measure. "
                      "Sites that cannot share patient rows use <code>calivera summarize</code>; "
                      "File → Pool site summaries opens their files in a window of its own "
                      "(<code>calivera pool</code> gives the same numbers)."));
  html += QObject::tr(
      "</table><h3>Studies</h3><p>File → Save study keeps the inputs' fingerprints and every "
      "setting; results are recomputed when the study is opened, and a changed input is "
      "reported. <code>calivera run STUDY.cvstudy</code> runs a saved study without the "
      "workstation. Files can be dropped on the window.</p>");
  return page(html);
}

QString helpMeasuresHtml() {
  QString html = QObject::tr(
      "<h3>Measures</h3><p>As every output names them. Methods and the checks behind each "
      "are described in docs/methods.md in the source.</p>"
      "<table cellspacing='6'><tr><th align='left'>Measure</th><th align='left'>Meaning</th>"
      "<th align='left'>Perfect model</th><th align='left'>Source</th></tr>");
  for (const Measure& m : measureCatalog()) {
    html += QStringLiteral(
                "<tr><td valign='top'><b>%1</b></td><td>%2</td><td>%3</td><td>%4</td>"
                "</tr>")
                .arg(esc(m.label), esc(m.meaning), esc(*m.target ? m.target : "—"), esc(m.source));
  }
  html += QStringLiteral("</table>");
  html += QObject::tr(
      "<p><b>Net benefit</b> at threshold t: TP/n − FP/n × t/(1 − t) (Vickers &amp; Elkin, Med "
      "Decis Making 2006). A threshold is a choice of how many unnecessary interventions are "
      "worth one event caught (t/(1 − t) of them); it is yours to choose, not the model's.</p>");
  return page(html);
}

QString helpKeyboardHtml(const QWidget& window) {
  struct Entry {
    QString text;
    QString keys;
  };
  std::vector<Entry> entries;
  for (const QAction* a : window.findChildren<QAction*>()) {
    if (a->shortcuts().isEmpty() || a->text().isEmpty()) continue;
    QStringList keys;
    for (const QKeySequence& k : a->shortcuts()) keys << k.toString(QKeySequence::NativeText);
    // An action whose text changes with the state (Undo names its step) gives a fixed one.
    const QVariant fixed = a->property("helpText");
    QString text = fixed.isValid() ? fixed.toString() : a->text();
    text.remove(QLatin1Char('&')).remove(QStringLiteral("…"));
    entries.push_back({text, keys.join(QStringLiteral(", "))});
  }
  std::sort(entries.begin(), entries.end(),
            [](const Entry& a, const Entry& b) { return a.text < b.text; });
  QString html = QObject::tr("<h3>Keyboard shortcuts</h3><table cellspacing='6'>");
  for (const Entry& e : entries) html += row(e.keys.toHtmlEscaped(), e.text.toHtmlEscaped());
  html += QObject::tr(
      "</table><p>In a chart: Left and Right arrows move the threshold one step of its grid. "
      "In a table: Ctrl+C copies the selected rows. Right-click a table or a chart to copy it or "
      "export it.</p>");
  return page(html);
}

QString helpAboutHtml() {
  QString html = QObject::tr(
                     "<h3>Calivera %1</h3><p>Validation of clinical risk-prediction models on a "
                     "local cohort.</p>")
                     .arg(QStringLiteral(CALIVERA_VERSION));
  html += QObject::tr(
      "<p><b>Your data stay on this machine.</b> The workstation opens no network connection; "
      "reports, exported charts and tables carry aggregates only.</p>");
  html += QObject::tr("<p>Built with Qt %1 (running %2), Eigen %3.%4.%5, Boost %6.%7, %8.</p>")
              .arg(QStringLiteral(QT_VERSION_STR), QString::fromLatin1(qVersion()))
              .arg(EIGEN_WORLD_VERSION)
              .arg(EIGEN_MAJOR_VERSION)
              .arg(EIGEN_MINOR_VERSION)
              .arg(BOOST_VERSION / 100000)
              .arg(BOOST_VERSION / 100 % 1000)
              .arg(QString::fromStdString(hashLibraryVersion()));
  return page(html);
}

void showHelpDialog(QWidget* window, HelpPage which) {
  auto* dialog = window->findChild<QDialog*>(QStringLiteral("helpDialog"));
  if (dialog == nullptr) {
    dialog = new QDialog(window);
    dialog->setObjectName(QStringLiteral("helpDialog"));
    dialog->setWindowTitle(QObject::tr("Calivera help"));
    auto* layout = new QVBoxLayout(dialog);
    auto* tabs = new QTabWidget;
    tabs->setObjectName(QStringLiteral("helpTabs"));
    const auto add = [tabs](const QString& name, const QString& title, const QString& html) {
      auto* text = new QTextBrowser;
      text->setObjectName(name);
      text->setHtml(html);
      tabs->addTab(text, title);
    };
    add(QStringLiteral("helpGuide"), QObject::tr("Guide"), helpGuideHtml());
    add(QStringLiteral("helpMeasures"), QObject::tr("Measures"), helpMeasuresHtml());
    add(QStringLiteral("helpKeyboard"), QObject::tr("Keyboard"), helpKeyboardHtml(*window));
    add(QStringLiteral("helpAbout"), QObject::tr("About"), helpAboutHtml());
    layout->addWidget(tabs);
    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close);
    QObject::connect(buttons, &QDialogButtonBox::rejected, dialog, &QDialog::close);
    layout->addWidget(buttons);
    // Most of a small screen, so the measures table reads without a sideways scroll.
    dialog->resize(std::min(900, window->width() - 40), std::min(640, window->height() - 40));
  }
  dialog->findChild<QTabWidget*>(QStringLiteral("helpTabs"))
      ->setCurrentIndex(static_cast<int>(which));
  dialog->show();
  dialog->raise();
  dialog->activateWindow();
}

}  // namespace calivera::ui
