#pragma once
// Help → Guide, Measures, Keyboard shortcuts, About: one dialog with a page for each.
//   Guide      what each view shows and how to use it;
//   Measures   every scalar measure of the measure catalog (core/present/measures.h): its
//              meaning, the value of a perfect model and its published source, so the screen and
//              the methods file (docs/methods.md) say the same;
//   Keyboard   the window's own actions and their shortcuts, read from the actions themselves;
//   About      version, the libraries' versions, where data goes (nowhere), and the caution.

#include <QString>

class QWidget;

namespace calivera::ui {

enum class HelpPage { Guide, Measures, Keyboard, About };

QString helpGuideHtml();
QString helpMeasuresHtml();
// Every QAction under `window` with a shortcut: its menu text and its key sequence.
QString helpKeyboardHtml(const QWidget& window);
QString helpAboutHtml();

// Modeless; one at a time per window (a second call raises it on `page`).
void showHelpDialog(QWidget* window, HelpPage page);

}  // namespace calivera::ui
