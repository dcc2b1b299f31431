#include "ui/views/caution_text.h"

#include <QCoreApplication>
#include <QLabel>

#include "core/present/caution.h"

namespace calivera::ui {

QString cautionText() {
  return QCoreApplication::translate("calivera", "Caution: %1")
      .arg(QString::fromUtf8(kCautionText));
}

QLabel* makeCautionBanner(QWidget* parent) {
  auto* banner = new QLabel(cautionText(), parent);
  banner->setObjectName(QStringLiteral("cautionBanner"));
  banner->setWordWrap(true);
  banner->setTextFormat(Qt::PlainText);
  banner->setContentsMargins(10, 6, 10, 6);
  // Not dismissible: no close button, and nothing hides it for the session.
  banner->setStyleSheet(QStringLiteral(
      "QLabel#cautionBanner { background: #fff4cc; color: #000; border-bottom: 2px solid #b08800; "
      "font-weight: 600; }"));
  return banner;
}

}  // namespace calivera::ui
