#pragma once
// One visual vocabulary for every chart on screen and in the PDF report. Colours come from the
// Okabe & Ito colour-blind-safe palette (Okabe & Ito, "Color Universal Design", 2008); colour is
// never the only cue: every series also has its own line style or marker shape and a legend label.

#include <QColor>
#include <QFont>
#include <QPen>
#include <QString>
#include <string>
#include <vector>

class QChart;
class QPainter;
class QRectF;
class QValueAxis;
class QAbstractSeries;
class QAbstractAxis;

namespace calivera::charts {

namespace palette {
inline const QColor kBlack{0, 0, 0};
inline const QColor kOrange{230, 159, 0};
inline const QColor kSkyBlue{86, 180, 233};
inline const QColor kBluishGreen{0, 158, 115};
inline const QColor kYellow{240, 228, 66};
inline const QColor kBlue{0, 114, 178};
inline const QColor kVermillion{213, 94, 0};
inline const QColor kReddishPurple{204, 121, 167};
inline const QColor kGrey{110, 110, 110};
}  // namespace palette

// What a series shows; each role has a fixed colour, line style and width.
enum class SeriesRole {
  Model,      // the model's own curve: blue, solid, thick
  Reference,  // ideal / chance line: grey, dash-dot
  TreatAll,   // vermillion, dashed
  TreatNone,  // black, dotted
  Threshold,  // reddish purple, solid: the cut line / operating point
  Events,     // orange, solid (patients with the event)
  NonEvents,  // sky blue, dashed (patients without the event)
  Groups,     // black: grouped observed proportions with their CIs
  Range,      // bluish green: clinically reasonable threshold range
};

QColor roleColor(SeriesRole role);

// The sans-serif font of the painter-drawn plots (forest plots, calibration by site) at `points`
// points, `unit` device units per point.
QFont painterFont(double points, double unit, bool bold = false);

// The title line of a painter-drawn plot, black in `font`, across the top of `target`; returns
// the y below it.
double paintPlotTitle(QPainter& painter, const QFont& font, const QRectF& target, double height,
                      const std::string& title);

// One line per entry, "Left out: ...", elided to `width`, from `top` down in the painter's current
// font and pen (the sites a painter-drawn plot could not show); returns the y below the last.
double paintLeftOutLines(QPainter& painter, const std::vector<std::string>& leftOut, double left,
                         double top, double width, double lineHeight);
QPen rolePen(SeriesRole role);

// Bottom or left value axis with a title and a fixed label format ("%.1f" style).
QValueAxis* makeAxis(const QString& title, double min, double max, const QString& format,
                     int tickCount);

// Title font, margins, legend placement and white background shared by all charts.
void applyChartStyle(QChart* chart, const QString& title);

// Adds the series to the chart and attaches it to both axes.
void addOnAxes(QChart* chart, QAbstractSeries* series, QAbstractAxis* x, QAbstractAxis* y);

// Hides the legend entry of a helper series (error bars, hit areas).
void hideFromLegend(QChart* chart, QAbstractSeries* series);
bool isHiddenFromLegend(const QAbstractSeries* series);
// Takes `series` off the chart (with its legend entry) and deletes it; nullptr does nothing.
void discardSeries(QChart* chart, QAbstractSeries* series);

}  // namespace calivera::charts
