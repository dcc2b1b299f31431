#pragma once
// The legend of a chart on screen, drawn under the plot and wrapped onto as many rows as the
// width needs. Qt Charts lays its own legend out on one row and elides every label when they do
// not fit, which on a quarter-window chart left only "Hist…", "Loes…": unreadable. Each entry
// shows the series' own line (colour and dash pattern), area fill or point shape, so no series
// is told apart by colour alone. Entries come from the chart's legend markers, in series order;
// series hidden with charts::hideFromLegend are left out.

#include <QBrush>
#include <QPen>
#include <QString>
#include <QWidget>
#include <vector>

class QChart;

namespace calivera::ui {

class LegendStrip : public QWidget {
  Q_OBJECT

 public:
  enum class Sample { Line, Area, Point };
  struct Entry {
    QString label;
    Sample sample = Sample::Line;
    QPen pen;
    QBrush brush;
    int pointShape = 0;  // QScatterSeries::MarkerShape for Sample::Point
  };

  explicit LegendStrip(QWidget* parent = nullptr);

  void setChart(const QChart* chart);  // nullptr: no entries
  const std::vector<Entry>& entries() const { return entries_; }
  QStringList labels() const;
  int rowsForWidth(int width) const;

  bool hasHeightForWidth() const override { return true; }
  int heightForWidth(int width) const override;
  QSize sizeHint() const override;

 protected:
  void paintEvent(QPaintEvent* event) override;

 private:
  int entryWidth(const Entry& e) const;
  void drawSample(QPainter& painter, const Entry& e, const QRectF& box) const;

  std::vector<Entry> entries_;
};

}  // namespace calivera::ui
