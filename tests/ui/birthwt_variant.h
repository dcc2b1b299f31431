#pragma once
// MASS::birthwt (Debian r-cran-mass, tests/reference/data) with hostile or re-spelled text, for
// the workstation's tests: the file's text with `edit` applied, written to `path`.

#include <QByteArray>
#include <QFile>
#include <QString>
#include <functional>
#include <stdexcept>

namespace calivera::testing {

inline QString writeBirthwtVariant(const QString& path,
                                   const std::function<void(QByteArray&)>& edit) {
  QFile in(QStringLiteral(CALIVERA_SOURCE_DIR "/tests/reference/data/birthwt.csv"));
  if (!in.open(QIODevice::ReadOnly)) throw std::runtime_error("birthwt.csv missing");
  QByteArray text = in.readAll();
  edit(text);
  QFile out(path);
  if (!out.open(QIODevice::WriteOnly) || out.write(text) != text.size()) {
    throw std::runtime_error("cannot write " + path.toStdString());
  }
  return path;
}

}  // namespace calivera::testing
