#include "ui/views/legend_strip.h"

#include <QPainter>
#include <cmath>

namespace calivera::ui {
namespace {

constexpr int kMargin = 4;

}  // namespace

LegendStrip::LegendStrip(QWidget* parent) : QWidget(parent) {
  setObjectName(QStringLiteral("legendStrip"));
  QFont f = font();
  f.setPointSizeF(8.5);
  setFont(f);
  setSizePolicy(QSizePolicy::Preferred, QSizePolicy::Fixed);
}

void LegendStrip::setChart(const QChart* chart) {
  entries_ = chart != nullptr ? charts::legendEntries(*chart) : std::vector<charts::LegendEntry>{};
  updateGeometry();
  update();
}

QStringList LegendStrip::labels() const {
  QStringList out;
  for (const auto& e : entries_) out << e.label;
  return out;
}

int LegendStrip::rowsForWidth(int width) const {
  return charts::legendRowCount(entries_, font(), width - 2 * kMargin);
}

int LegendStrip::heightForWidth(int width) const {
  if (entries_.empty()) return 0;
  return static_cast<int>(
             std::ceil(charts::legendRowsHeight(entries_, font(), width - 2 * kMargin))) +
         2 * kMargin;
}

QSize LegendStrip::sizeHint() const {
  return {320, heightForWidth(width() > 0 ? width() : 320)};
}

void LegendStrip::paintEvent(QPaintEvent*) {
  QPainter painter(this);
  painter.setRenderHint(QPainter::Antialiasing);
  painter.fillRect(rect(), Qt::white);
  charts::paintLegendRows(painter, entries_,
                          QRectF(rect()).adjusted(kMargin, kMargin, -kMargin, -kMargin), font());
}

}  // namespace calivera::ui
