#include "render/report/audit_pdf_writer.h"

#include <QApplication>
#include <QBuffer>
#include <QHashSeed>
#include <QPageLayout>
#include <QPageSize>
#include <QPdfWriter>
#include <algorithm>
#include <cctype>
#include <cstdlib>
#include <ctime>
#include <filesystem>
#include <memory>
#include <string>
#include <utility>

#include "core/util/atomic_file.h"
#include "core/util/errors.h"
#include "render/report/report_charts.h"

namespace calivera::report {
namespace {

constexpr int kResolution = 1200;  // device units per inch: fine text positioning

// Qt wants a private runtime directory and warns on stderr when XDG_RUNTIME_DIR is unset (as in
// a root shell or a CI job); the command line gets a fresh 0700 one for the duration instead.
class RuntimeDirScope {
 public:
  RuntimeDirScope() {
    if (std::getenv("XDG_RUNTIME_DIR") != nullptr) return;
    std::string pattern = (std::filesystem::temp_directory_path() / "calivera-qt-XXXXXX").string();
    if (mkdtemp(pattern.data()) == nullptr) return;  // Qt then falls back and says so itself
    path_ = pattern;
    setenv("XDG_RUNTIME_DIR", path_.c_str(), 1);
  }
  ~RuntimeDirScope() {
    if (path_.empty()) return;
    unsetenv("XDG_RUNTIME_DIR");
    std::error_code ignored;
    std::filesystem::remove_all(path_, ignored);
  }
  RuntimeDirScope(const RuntimeDirScope&) = delete;
  RuntimeDirScope& operator=(const RuntimeDirScope&) = delete;

 private:
  std::string path_;
};

// A QApplication for processes that have none (the command line). QChart needs the widgets
// application; without a display the offscreen platform serves fonts and painting.
class ApplicationScope {
 public:
  ApplicationScope() {
    if (QCoreApplication::instance() != nullptr) {
      if (qobject_cast<QApplication*>(QCoreApplication::instance()) == nullptr) {
        throw AnalysisError(
            "the PDF report needs a QApplication, but another Qt application "
            "object exists");
      }
      return;
    }
    const bool display =
        std::getenv("DISPLAY") != nullptr || std::getenv("WAYLAND_DISPLAY") != nullptr;
    if (std::getenv("QT_QPA_PLATFORM") == nullptr && !display) {
      setenv("QT_QPA_PLATFORM", "offscreen", 0);
    }
    runtimeDir_ = std::make_unique<RuntimeDirScope>();
    owned_ = std::make_unique<QApplication>(argc_, argv_);
  }

 private:
  static inline char name_[] = "calivera";
  static inline char* argvStorage_[] = {name_, nullptr};
  int argc_ = 1;
  char** argv_ = argvStorage_;
  std::unique_ptr<RuntimeDirScope> runtimeDir_;  // outlives the application
  std::unique_ptr<QApplication> owned_;
};

}  // namespace

PaperSize parsePaperSize(const std::string& text, const std::string& option) {
  std::string lower = text;
  std::transform(lower.begin(), lower.end(), lower.begin(),
                 [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  if (lower == "a4") return PaperSize::A4;
  if (lower == "letter") return PaperSize::Letter;
  throw InputError(option + ": '" + text + "' is not a paper size (use a4 or letter)");
}

bool setPdfCreationDate(QByteArray& pdf, long long creationTime) {
  const QByteArray key = "/CreationDate (D:";
  const qsizetype start = pdf.indexOf(key);
  if (start < 0) return false;
  const qsizetype valueStart = start + key.size();
  const qsizetype end = pdf.indexOf(')', valueStart);
  if (end < 0) return false;
  const qsizetype length = end - valueStart;
  const std::time_t time = static_cast<std::time_t>(creationTime);
  std::tm utc{};
  gmtime_r(&time, &utc);
  char stamp[32];
  std::strftime(stamp, sizeof stamp, "%Y%m%d%H%M%S", &utc);
  // Qt writes "YYYYMMDDHHmmSS" then "Z" (UTC) or "+HH'mm'" (local offset): keep the length.
  QByteArray value(stamp);
  if (length == value.size() + 1) {
    value += 'Z';
  } else if (length == value.size() + 7) {
    value += "+00'00'";
  } else {
    return false;
  }
  pdf.replace(valueStart, length, value);
  return true;
}

QByteArray renderAuditPdf(const AuditDocument& doc, PaperSize paper, const ChartPainter& charts,
                          long long creationTime) {
  // Qt's PDF engine writes its embedded fonts in QHash order, which follows the per-process random
  // hash seed: a fixed seed while the writer exists makes the object order, and so the bytes,
  // repeat. (Qt 6.4 reads the global seed when a hash is created; other hashes are unaffected.)
  QHashSeed::setDeterministicGlobalSeed();
  QByteArray bytes;
  {
    QBuffer buffer(&bytes);
    buffer.open(QIODevice::WriteOnly);
    QPdfWriter writer(&buffer);
    writer.setResolution(kResolution);
    writer.setTitle(QString::fromStdString(doc.title));
    writer.setCreator(QStringLiteral("Calivera " CALIVERA_VERSION));
    const QPageSize size(paper == PaperSize::A4 ? QPageSize::A4 : QPageSize::Letter);
    writer.setPageLayout(
        QPageLayout(size, QPageLayout::Portrait, QMarginsF(50, 44, 50, 36), QPageLayout::Point));
    paintAuditDocument(doc, writer, charts);
  }
  QHashSeed::resetRandomGlobalSeed();
  if (bytes.isEmpty()) throw AnalysisError("the PDF engine produced no output");
  if (!setPdfCreationDate(bytes, creationTime)) {
    throw AnalysisError("the PDF engine wrote no creation date in the expected format");
  }
  return bytes;
}

std::string renderAuditReportPdf(AuditReportInput input, PaperSize paper) {
  const long long timestamp = reportTimestamp();
  if (input.createdAt.empty()) input.createdAt = formatUtcTimestamp(timestamp);
  if (input.softwareVersion.empty()) input.softwareVersion = CALIVERA_VERSION;
  const AuditDocument doc = buildAuditDocument(input);
  const ApplicationScope application;
  const ChartPainter charts = replayCharts(recordReportCharts(doc));
  const QByteArray pdf = renderAuditPdf(doc, paper, charts, timestamp);
  return std::string(pdf.constData(), static_cast<std::size_t>(pdf.size()));
}

std::string renderDocumentPdf(const AuditDocument& doc, PaperSize paper) {
  const long long timestamp = reportTimestamp();
  const ApplicationScope application;
  const QByteArray pdf = renderAuditPdf(doc, paper, ChartPainter{}, timestamp);
  return std::string(pdf.constData(), static_cast<std::size_t>(pdf.size()));
}

void writeAuditReportPdf(AuditReportInput input, const std::string& path, PaperSize paper) {
  writeFileAtomically(path, renderAuditReportPdf(std::move(input), paper));
}

}  // namespace calivera::report
