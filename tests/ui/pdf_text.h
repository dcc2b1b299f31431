#pragma once
// A PDF's text as poppler's pdftotext (an outside reader, Debian poppler-utils) extracts it, with
// -layout so table rows stay on one line.

#include <QProcess>
#include <QString>

namespace calivera::testing {

inline QString pdfText(const QString& path) {
  QProcess process;
  process.start(QStringLiteral("pdftotext"), {QStringLiteral("-layout"), path, QStringLiteral("-")});
  process.waitForFinished(60000);
  return QString::fromUtf8(process.readAllStandardOutput());
}

}  // namespace calivera::testing
