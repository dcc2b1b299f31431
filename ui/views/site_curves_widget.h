#pragma once
// Every site's calibration curve on one set of axes (render/charts/site_curves_plot.h) as a
// widget: the same drawing as the PDF report, scaled to the room it has, with one site
// optionally highlighted against the others.

#include <QWidget>
#include <cstddef>
#include <optional>

#include "core/report/site_curves.h"

namespace calivera::ui {

class SiteCurvesWidget : public QWidget {
  Q_OBJECT

 public:
  explicit SiteCurvesWidget(QWidget* parent = nullptr);
  void setPlot(SiteCurvesPlot plot);
  const SiteCurvesPlot& plot() const { return plot_; }
  // Highlights the curve of site `siteIndex` (SiteAnalysis::sites); none when it has no curve.
  void highlightSite(std::optional<std::size_t> siteIndex);
  std::optional<std::size_t> highlightedCurve() const { return highlight_; }
  QSize sizeHint() const override;

 protected:
  void paintEvent(QPaintEvent* event) override;

 private:
  double unitFor(const QSize& size) const;  // pixels per point
  SiteCurvesPlot plot_;
  std::optional<std::size_t> highlight_;
};

}  // namespace calivera::ui
