#include "render/report/report_layout.h"

#include <QFont>
#include <QFontMetricsF>
#include <QPageLayout>
#include <QPagedPaintDevice>
#include <QPainter>
#include <algorithm>

#include "render/charts/forest_plot.h"
#include "render/charts/site_curves_plot.h"
#include "render/report/report_charts.h"

namespace calivera::report {
namespace {

constexpr double kChartAspect = kReportChartHeight / kReportChartWidth;

// The report's look: one sans family throughout, a monospaced face for fingerprints, a slate
// accent for structure and an amber rule for the caution statement.
const QColor kInk{30, 34, 40};
const QColor kMuted{96, 104, 112};
const QColor kAccent{38, 70, 83};
const QColor kHeaderFill{226, 233, 237};
const QColor kStripe{246, 248, 249};
const QColor kRule{188, 196, 202};
const QColor kCautionFill{253, 246, 227};
const QColor kCautionRule{196, 142, 26};
const char* const kSans = "DejaVu Sans";
const char* const kMono = "DejaVu Sans Mono";

QFont makeFont(const char* family, double points, bool bold = false, bool italic = false) {
  QFont font(QString::fromLatin1(family));
  font.setPointSizeF(points);
  font.setBold(bold);
  font.setItalic(italic);
  font.setKerning(true);
  // No ligatures: "fi" stays two letters that text extraction and search find.
  font.setStyleStrategy(QFont::PreferNoShaping);
  // Hinting depends on the screen; print layout must not.
  font.setHintingPreference(QFont::PreferNoHinting);
  return font;
}

QString q(const std::string& text) {
  return QString::fromStdString(text);
}

class PageComposer {
 public:
  PageComposer(const AuditDocument& doc, QPagedPaintDevice& writer, QPainter* painter,
               int totalPages, const ChartPainter& charts)
      : doc_(doc), writer_(writer), painter_(painter), totalPages_(totalPages), charts_(charts) {
    const QPageLayout layout = writer.pageLayout();
    // QPdfWriter's and QPrinter's logical resolution is the one they were given.
    const int dpi = writer.logicalDpiY();
    unit_ = dpi / 72.0;
    const QRectF paint = layout.paintRectPixels(dpi);
    page_ = QRectF(0, 0, paint.width(), paint.height());
    body_ = page_.adjusted(0, pt(22), 0, -footerHeight());
    y_ = body_.top();
  }

  int run() {
    pageNumber_ = 1;
    beginPage();
    titleBlock();
    for (const ReportBlock& block : doc_.blocks) {
      switch (block.kind) {
        case ReportBlock::Kind::Heading:
          heading(block);
          break;
        case ReportBlock::Kind::Paragraph:
          paragraph(block.text);
          break;
        case ReportBlock::Kind::Caution:
          caution(block.text);
          break;
        case ReportBlock::Kind::Table:
          table(block.table);
          break;
        case ReportBlock::Kind::ChartPair:
          chartPair(block);
          break;
        case ReportBlock::Kind::PageBreak:
          breakPage();
          break;
        case ReportBlock::Kind::Forest:
          forest(block);
          break;
        case ReportBlock::Kind::SiteCurves:
          siteCurves(block);
          break;
      }
    }
    endPage();
    return pageNumber_;
  }

 private:
  double pt(double points) const { return points * unit_; }

  QFontMetricsF metrics(const QFont& font) const { return QFontMetricsF(font, &writer_); }

  double textHeight(const QFont& font, double width, const QString& text,
                    int flags = Qt::TextWordWrap) const {
    return metrics(font).boundingRect(QRectF(0, 0, width, 1e9), flags, text).height();
  }

  void drawText(const QRectF& rect, const QFont& font, const QColor& color, const QString& text,
                int flags = Qt::TextWordWrap | Qt::AlignLeft | Qt::AlignTop) {
    if (painter_ == nullptr) return;
    painter_->setFont(font);
    painter_->setPen(color);
    painter_->drawText(rect, flags, text);
  }

  double footerHeight() const {
    const QFont small = makeFont(kSans, 6.5);
    const QFont mono = makeFont(kMono, 6.2);
    return pt(10) + textHeight(small, page_.width() - pt(60), q(doc_.caution)) +
           2 * metrics(mono).lineSpacing() + pt(4);
  }

  void beginPage() {
    y_ = body_.top();
    if (painter_ == nullptr) return;
    if (pageNumber_ > 1) {
      const QFont header = makeFont(kSans, 7);
      drawText(QRectF(0, 0, page_.width(), pt(12)), header, kMuted,
               q(doc_.title) + QStringLiteral("  |  audit report"));
      painter_->setPen(QPen(kRule, pt(0.5)));
      painter_->drawLine(QPointF(0, pt(12)), QPointF(page_.width(), pt(12)));
    }
  }

  void endPage() {
    if (painter_ == nullptr) return;
    const double top = page_.bottom() - footerHeight() + pt(6);
    painter_->setPen(QPen(kAccent, pt(0.8)));
    painter_->drawLine(QPointF(0, top), QPointF(page_.width(), top));
    const QFont small = makeFont(kSans, 6.5);
    const QFont mono = makeFont(kMono, 6.2);
    const double textWidth = page_.width() - pt(60);
    double y = top + pt(3);
    const double cautionHeight = textHeight(small, textWidth, q(doc_.caution));
    drawText(QRectF(0, y, textWidth, cautionHeight), small, kInk, q(doc_.caution));
    const QString pageText = QStringLiteral("Page %1 of %2").arg(pageNumber_).arg(totalPages_);
    drawText(QRectF(page_.width() - pt(58), y, pt(58), pt(10)), makeFont(kSans, 7, true), kAccent,
             pageText, Qt::AlignRight | Qt::AlignTop);
    y += cautionHeight + pt(1);
    const double line = metrics(mono).lineSpacing();
    for (const std::string& fingerprint : doc_.footer) {
      drawText(QRectF(0, y, page_.width(), line), mono, kMuted, q(fingerprint),
               Qt::AlignLeft | Qt::AlignTop);
      y += line;
    }
  }

  void breakPage() {
    endPage();
    if (painter_ != nullptr) writer_.newPage();
    ++pageNumber_;
    beginPage();
  }

  // Starts a new page unless `height` fits below the current position.
  void ensure(double height) {
    if (y_ + height > body_.bottom() && y_ > body_.top()) breakPage();
  }

  void titleBlock() {
    const QFont title = makeFont(kSans, 18, true);
    const QFont kicker = makeFont(kSans, 8, true);
    const QFont sub = makeFont(kSans, 8.5);
    drawText(QRectF(0, y_, body_.width(), pt(12)), kicker, kAccent,
             QStringLiteral("PREDICTION MODEL VALIDATION  |  AUDIT REPORT"));
    y_ += pt(14);
    const double h = textHeight(title, body_.width(), q(doc_.title));
    drawText(QRectF(0, y_, body_.width(), h), title, kInk, q(doc_.title));
    y_ += h + pt(3);
    const double s = textHeight(sub, body_.width(), q(doc_.subtitle));
    drawText(QRectF(0, y_, body_.width(), s), sub, kMuted, q(doc_.subtitle));
    y_ += s + pt(6);
    if (painter_ != nullptr) {
      painter_->setPen(QPen(kAccent, pt(1.5)));
      painter_->drawLine(QPointF(0, y_), QPointF(body_.width(), y_));
    }
    y_ += pt(10);
  }

  void heading(const ReportBlock& block) {
    const bool section = block.level <= 1;
    const QFont font = makeFont(kSans, section ? 12.5 : 9.5, true);
    const double indent = section ? pt(8) : 0;
    const double h = textHeight(font, body_.width() - indent, q(block.text));
    const double before = section ? pt(10) : pt(6);
    // Keep a heading with at least a few lines of what follows.
    ensure(before + h + pt(section ? 80 : 40));
    if (y_ > body_.top()) y_ += before;
    if (section && painter_ != nullptr) {
      painter_->fillRect(QRectF(0, y_ + pt(1), pt(3), h - pt(2)), kAccent);
    }
    drawText(QRectF(indent, y_, body_.width() - indent, h), font, section ? kAccent : kInk,
             q(block.text));
    y_ += h + pt(section ? 6 : 2);
  }

  void paragraph(const std::string& text) {
    const QFont font = makeFont(kSans, 8.5);
    const QString body = q(text);
    const double h = textHeight(font, body_.width(), body);
    ensure(h);
    drawText(QRectF(0, y_, body_.width(), h), font, kInk, body);
    y_ += h + pt(5);
  }

  void caution(const std::string& text) {
    const QFont label = makeFont(kSans, 8, true);
    const QFont font = makeFont(kSans, 9.5);
    const double pad = pt(8);
    const double width = body_.width() - 2 * pad - pt(4);
    const double h = pt(12) + textHeight(font, width, q(text)) + 2 * pad;
    ensure(h);
    if (painter_ != nullptr) {
      painter_->fillRect(QRectF(0, y_, body_.width(), h), kCautionFill);
      painter_->fillRect(QRectF(0, y_, pt(4), h), kCautionRule);
    }
    drawText(QRectF(pt(4) + pad, y_ + pad, width, pt(12)), label, kCautionRule.darker(140),
             QStringLiteral("CAUTION"));
    drawText(QRectF(pt(4) + pad, y_ + pad + pt(12), width, h), font, kInk, q(text));
    y_ += h + pt(10);
  }

  struct TableGeometry {
    std::vector<double> x, width;
  };

  TableGeometry geometry(const ReportTable& t) const {
    TableGeometry g;
    double total = 0;
    for (std::size_t c = 0; c < t.header.size(); ++c)
      total += c < t.widths.size() ? t.widths[c] : 1;
    double x = 0;
    for (std::size_t c = 0; c < t.header.size(); ++c) {
      const double w = body_.width() * (c < t.widths.size() ? t.widths[c] : 1) / total;
      g.x.push_back(x);
      g.width.push_back(w);
      x += w;
    }
    return g;
  }

  // Word wrap; breaking inside words only when one word (a fingerprint) is wider than the cell.
  int wrapFlags(const QFont& font, double width, const QString& text) const {
    const QFontMetricsF m = metrics(font);
    for (const QString& word : text.split(QChar(' '), Qt::SkipEmptyParts)) {
      if (m.horizontalAdvance(word) > width) return Qt::TextWordWrap | Qt::TextWrapAnywhere;
    }
    return Qt::TextWordWrap;
  }

  double rowHeight(const std::vector<std::string>& cells, const TableGeometry& g,
                   const QFont& font) const {
    double h = metrics(font).lineSpacing();
    for (std::size_t c = 0; c < cells.size() && c < g.width.size(); ++c) {
      const QString text = q(cells[c]);
      h = std::max(
          h, textHeight(font, g.width[c] - pt(6), text, wrapFlags(font, g.width[c] - pt(6), text)));
    }
    return h + pt(5);
  }

  void drawRow(const std::vector<std::string>& cells, const TableGeometry& g, const QFont& font,
               const ReportTable& t, double h) {
    for (std::size_t c = 0; c < cells.size() && c < g.width.size(); ++c) {
      const bool right = c < t.align.size() && t.align[c] == CellAlign::Right;
      const QString text = q(cells[c]);
      const int flags = wrapFlags(font, g.width[c] - pt(6), text) | Qt::AlignTop |
                        (right ? Qt::AlignRight : Qt::AlignLeft);
      drawText(QRectF(g.x[c] + pt(3), y_ + pt(2.5), g.width[c] - pt(6), h), font, kInk, text,
               flags);
    }
  }

  void tableHeader(const ReportTable& t, const TableGeometry& g, bool continued) {
    const QFont captionFont = makeFont(kSans, 8.5, true);
    const QFont headFont = makeFont(kSans, 7.5, true);
    const QString caption = q(t.caption) + (continued ? QStringLiteral(" (continued)") : QString());
    const double ch = textHeight(captionFont, body_.width(), caption);
    drawText(QRectF(0, y_, body_.width(), ch), captionFont, kInk, caption);
    y_ += ch + pt(3);
    const double hh = rowHeight(t.header, g, headFont);
    if (painter_ != nullptr) {
      painter_->fillRect(QRectF(0, y_, body_.width(), hh), kHeaderFill);
      painter_->setPen(QPen(kAccent, pt(0.8)));
      painter_->drawLine(QPointF(0, y_ + hh), QPointF(body_.width(), y_ + hh));
    }
    drawRow(t.header, g, headFont, t, hh);
    y_ += hh;
  }

  double tableHeaderHeight(const ReportTable& t, const TableGeometry& g) const {
    const QFont captionFont = makeFont(kSans, 8.5, true);
    const QFont headFont = makeFont(kSans, 7.5, true);
    return textHeight(captionFont, body_.width(), q(t.caption) + QStringLiteral(" (continued)")) +
           pt(3) + rowHeight(t.header, g, headFont);
  }

  void table(const ReportTable& t) {
    const TableGeometry g = geometry(t);
    const QFont font = makeFont(kSans, 7.5);
    const double firstRow = t.rows.empty() ? 0 : rowHeight(t.rows.front(), g, font);
    ensure(tableHeaderHeight(t, g) + firstRow);
    tableHeader(t, g, false);
    for (std::size_t r = 0; r < t.rows.size(); ++r) {
      const double h = rowHeight(t.rows[r], g, font);
      if (y_ + h > body_.bottom()) {
        // Never split a row: continue on a new page under a repeated header.
        breakPage();
        tableHeader(t, g, true);
      }
      if (painter_ != nullptr) {
        if (r % 2 == 1) painter_->fillRect(QRectF(0, y_, body_.width(), h), kStripe);
        painter_->setPen(QPen(kRule, pt(0.4)));
        painter_->drawLine(QPointF(0, y_ + h), QPointF(body_.width(), y_ + h));
      }
      drawRow(t.rows[r], g, font, t, h);
      y_ += h;
    }
    y_ += pt(4);
    if (!t.note.empty()) {
      const QFont noteFont = makeFont(kSans, 7, false, true);
      const double nh = textHeight(noteFont, body_.width(), q(t.note));
      ensure(nh);
      drawText(QRectF(0, y_, body_.width(), nh), noteFont, kMuted, q(t.note));
      y_ += nh;
    }
    y_ += pt(8);
  }

  void forest(const ReportBlock& block) {
    if (!block.forest) return;
    const double height = pt(charts::forestPlotHeightPoints(*block.forest));
    ensure(height + pt(8));
    if (painter_ != nullptr) {
      charts::paintForestPlot(*painter_, QRectF(body_.left(), y_, body_.width(), height),
                              *block.forest, unit_);
    }
    y_ += height + pt(8);
  }

  void siteCurves(const ReportBlock& block) {
    if (!block.siteCurves) return;
    const double height =
        pt(charts::siteCurvesPlotHeightPoints(*block.siteCurves, body_.width() / unit_));
    ensure(height + pt(8));
    if (painter_ != nullptr) {
      charts::paintSiteCurvesPlot(*painter_, QRectF(body_.left(), y_, body_.width(), height),
                                  *block.siteCurves, unit_);
    }
    y_ += height + pt(8);
  }

  void chartPair(const ReportBlock& block) {
    const std::size_t count = std::max<std::size_t>(1, block.charts.size());
    const double gap = pt(14);
    const double width = (body_.width() - gap * double(count - 1)) / double(count);
    // The height the chart code laid the chart out for (report_charts.h), at this width.
    const double chartHeight = width * kChartAspect;
    const QFont captionFont = makeFont(kSans, 7.5, false, true);
    double captionHeight = 0;
    for (const std::string& caption : block.captions) {
      captionHeight = std::max(captionHeight, textHeight(captionFont, width, q(caption)));
    }
    ensure(chartHeight + captionHeight + pt(6));
    for (std::size_t i = 0; i < block.charts.size(); ++i) {
      const QRectF target(double(i) * (width + gap), y_, width, chartHeight);
      if (painter_ != nullptr) {
        painter_->setPen(QPen(kRule, pt(0.5)));
        painter_->drawRect(target);
        if (charts_) {
          painter_->save();
          charts_(*painter_, target.adjusted(pt(2), pt(2), -pt(2), -pt(2)), block.charts[i]);
          painter_->restore();
        }
      }
      if (i < block.captions.size()) {
        drawText(QRectF(target.left(), y_ + chartHeight + pt(3), width, captionHeight), captionFont,
                 kMuted, q(block.captions[i]));
      }
    }
    y_ += chartHeight + captionHeight + pt(12);
  }

  const AuditDocument& doc_;
  QPagedPaintDevice& writer_;
  QPainter* painter_;
  int totalPages_;
  const ChartPainter& charts_;
  double unit_ = 1.0;
  QRectF page_, body_;
  double y_ = 0;
  int pageNumber_ = 1;
};

}  // namespace

int paintAuditDocument(const AuditDocument& doc, QPagedPaintDevice& writer,
                       const ChartPainter& charts) {
  // Pass 1 measures (no painter) to know "of n"; pass 2 paints the same layout.
  const int pages = PageComposer(doc, writer, nullptr, 0, charts).run();
  QPainter painter(&writer);
  painter.setRenderHint(QPainter::Antialiasing);
  PageComposer(doc, writer, &painter, pages, charts).run();
  painter.end();
  return pages;
}

}  // namespace calivera::report
