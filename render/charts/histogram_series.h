#pragma once
// A histogram drawn as a stepped area (Qt Charts has no bar series on a value axis).

#include <vector>

class QAreaSeries;

namespace calivera::charts {

// edges: bins + 1 ascending values; heights: one per bin. The area's upper line owns the steps.
QAreaSeries* makeHistogramArea(const std::vector<double>& edges,
                               const std::vector<double>& heights);

}  // namespace calivera::charts
