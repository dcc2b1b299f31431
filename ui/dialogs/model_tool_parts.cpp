#include "ui/dialogs/model_tool_parts.h"

#include <QBoxLayout>
#include <QLabel>
#include <filesystem>

#include "ui/async/background_job.h"

namespace calivera::ui {

QLabel* addIntroText(QBoxLayout* layout, const QString& text, const QString& objectName) {
  auto* label = new QLabel(text);
  label->setObjectName(objectName);
  label->setWordWrap(true);
  layout->addWidget(label);
  return label;
}

QLabel* addJobStatus(QBoxLayout* layout, BackgroundJob* job, const QString& initialText,
                     const QString& objectName) {
  auto* status = new QLabel(initialText);
  status->setObjectName(objectName);
  status->setWordWrap(true);
  status->setTextInteractionFlags(Qt::TextSelectableByMouse);
  layout->addWidget(status);
  QObject::connect(job, &BackgroundJob::failed, status, [status](const QString& message) {
    status->setText(QObject::tr("<b>Stopped:</b> %1").arg(message.toHtmlEscaped()));
  });
  QObject::connect(job, &BackgroundJob::cancelled, status, [status]() {
    status->setText(QObject::tr("Cancelled; the previous result (if any) is kept."));
  });
  return status;
}

}  // namespace calivera::ui
