#pragma once
// The scale a measure is pooled on across sites (core/sites/site_pooling.h): where its
// between-site distribution is closest to normal (logit for the c-statistic, log for O/E,
// identity for calibration intercept and slope), and the way back to the measure's own scale.

#include "core/metrics/validation.h"

namespace calivera {

enum class PoolingScale { Logit, Log, Identity };

const char* poolingScaleName(PoolingScale scale);  // "logit", "log", "identity"
double toNaturalScale(PoolingScale scale, double value);
// Both ends of an interval (the transforms are increasing, so the order is kept).
Interval toNaturalScale(PoolingScale scale, const Interval& interval);

}  // namespace calivera
