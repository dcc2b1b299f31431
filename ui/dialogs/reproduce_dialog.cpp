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

QString predictorSpaceCommandText(const StudyState& study) {
  try {
    const auto line = predictorSpaceCommandLine(study);
    return line ? QString::fromStdString(*line) : QString();
  } catch (const InputError&) {
    return {};  // no study command either; the dialog says why
  }
}

namespace {

// A read-only command with its own Copy button.
void addCommand(QDialog& dialog, QVBoxLayout* layout, QDialogButtonBox* buttons,
                const QString& command, const QString& name, const QString& copyLabel) {
  auto* text = new QPlainTextEdit(&dialog);
  text->setObjectName(name);
  text->setReadOnly(true);
  text->setPlainText(command);
  text->setLineWrapMode(QPlainTextEdit::WidgetWidth);
  text->setWordWrapMode(QTextOption::WrapAtWordBoundaryOrAnywhere);
  text->setMinimumSize(560, 110);
  layout->addWidget(text, 1);
  QPushButton* copy = buttons->addButton(copyLabel, QDialogButtonBox::ActionRole);
  copy->setObjectName(name + QStringLiteral("Copy"));
  QObject::connect(copy, &QPushButton::clicked, &dialog,
                   [command]() { QApplication::clipboard()->setText(command); });
}

QLabel* plainLabel(QDialog& dialog, QString text) {
  // Option names keep their two hyphens on one line (U+2011 does not break).
  text.replace(QStringLiteral(" --"), QStringLiteral(" \u2011\u2011"));
  auto* label = new QLabel(text, &dialog);
  label->setTextFormat(Qt::PlainText);
  label->setWordWrap(true);
  return label;
}

}  // namespace

void showReproduceDialog(QWidget* parent, const StudyState& study) {
  bool ok = false;
  const QString command = reproduceCommandText(study, &ok);
  QDialog dialog(parent);
  dialog.setObjectName(QStringLiteral("reproduceDialog"));
  dialog.setWindowTitle(QObject::tr("Reproduce on the command line"));
  auto* layout = new QVBoxLayout(&dialog);
  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close, &dialog);
  layout->addWidget(plainLabel(
      dialog,
      ok ? QObject::tr("This command gives every number shown for this study: the same cohort, "
                       "model, mapping, groups, development-data statement, bootstrap, "
                       "comparison and subgroups. Add --json, --csv-dir or --pdf for files. A "
                       "saved study also runs as: calivera run STUDY.cvstudy")
         : QObject::tr("There is no command yet: %1").arg(command)));
  if (ok) {
    addCommand(dialog, layout, buttons, command, QStringLiteral("reproduceCommandEdit"),
               QObject::tr("&Copy"));
    const QString predictor = predictorSpaceCommandText(study);
    if (!predictor.isEmpty()) {
      layout->addWidget(plainLabel(
          dialog, QObject::tr("The Predictor space tab's current view (curve or boundary, held "
                              "values, threshold); add --json or --csv for files:")));
      addCommand(dialog, layout, buttons, predictor, QStringLiteral("predictorCommandEdit"),
                 QObject::tr("Copy &predictor view"));
    }
  }
  QObject::connect(buttons, &QDialogButtonBox::rejected, &dialog, &QDialog::reject);
  layout->addWidget(buttons);
  dialog.exec();
}

}  // namespace calivera::ui
