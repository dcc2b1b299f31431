#include "render/charts/histogram_series.h"

#include <QtCharts/QAreaSeries>
#include <QtCharts/QLineSeries>

namespace calivera::charts {

QAreaSeries* makeHistogramArea(const std::vector<double>& edges,
                               const std::vector<double>& heights) {
  auto* upper = new QLineSeries;
  auto* lower = new QLineSeries;
  QList<QPointF> top;
  for (std::size_t i = 0; i < heights.size() && i + 1 < edges.size(); ++i) {
    top.append(QPointF(edges[i], heights[i]));
    top.append(QPointF(edges[i + 1], heights[i]));
  }
  upper->replace(top);
  if (!top.empty()) {
    lower->append(top.front().x(), 0);
    lower->append(top.back().x(), 0);
  }
  auto* area = new QAreaSeries(upper, lower);
  // The area does not own its boundary lines; parent them so they die with it.
  upper->setParent(area);
  lower->setParent(area);
  return area;
}

}  // namespace calivera::charts
