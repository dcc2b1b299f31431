#include "ui/dialogs/reproduce_dialog.h"

#include <QApplication>
#include <QClipboard>
#include <QDialog>
#include <QDialogButtonBox>
#include <QLabel>
#include <QPlainTextEdit>
#include <QPushButton>
#include <QVBoxLayout>

#include "core/study/reproduce_command.h"
#include "core/util/errors.h"

namespace calivera::ui {

QString reproduceCommandText(const StudyState& study, bool* ok) {
  try {
    const QString text = QString::fromStdString(reproduceCommandLine(study));
    if (ok) *ok = true;
    return text;
  } catch (const InputError& error) {
    if (ok) *ok = false;
    return QString::fromStdString(error.what());
  }
}

void showReproduceDialog(QWidget* parent, const StudyState& study) {
  bool ok = false;
  const QString command = reproduceCommandText(study, &ok);
  QDialog dialog(parent);
  dialog.setObjectName(QStringLiteral("reproduceDialog"));
  dialog.setWindowTitle(QObject::tr("Reproduce on the command line"));
  auto* layout = new QVBoxLayout(&dialog);
  auto* intro = new QLabel(
      ok ? QObject::tr("This command gives every number shown for this study: the same cohort, "
                       "model, mapping, groups, development-data statement, bootstrap, "
                       "comparison and subgroups. Add --json, --csv-dir or --pdf for files. A "
                       "saved study also runs as: calivera run STUDY.cvstudy")
         : QObject::tr("There is no command yet: %1").arg(command),
      &dialog);
  intro->setTextFormat(Qt::PlainText);
  intro->setWordWrap(true);
  layout->addWidget(intro);
  auto* text = new QPlainTextEdit(&dialog);
  text->setObjectName(QStringLiteral("reproduceCommandEdit"));
  text->setReadOnly(true);
  text->setPlainText(ok ? command : QString());
  text->setLineWrapMode(QPlainTextEdit::WidgetWidth);
  text->setWordWrapMode(QTextOption::WrapAtWordBoundaryOrAnywhere);
  text->setMinimumSize(560, 140);
  text->setVisible(ok);
  layout->addWidget(text, 1);
  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close, &dialog);
  if (ok) {
    QPushButton* copy = buttons->addButton(QObject::tr("&Copy"), QDialogButtonBox::ActionRole);
    copy->setObjectName(QStringLiteral("reproduceCopyButton"));
    QObject::connect(copy, &QPushButton::clicked, &dialog,
                     [command]() { QApplication::clipboard()->setText(command); });
  }
  QObject::connect(buttons, &QDialogButtonBox::rejected, &dialog, &QDialog::reject);
  layout->addWidget(buttons);
  dialog.exec();
}

}  // namespace calivera::ui
