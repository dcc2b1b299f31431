#include "core/sites/pooling_scale.h"

#include <cmath>

namespace calivera {

const char* poolingScaleName(PoolingScale scale) {
  switch (scale) {
    case PoolingScale::Logit:
      return "logit";
    case PoolingScale::Log:
      return "log";
    case PoolingScale::Identity:
      return "identity";
  }
  return "identity";
}

double toNaturalScale(PoolingScale scale, double value) {
  switch (scale) {
    case PoolingScale::Logit:
      return 1.0 / (1.0 + std::exp(-value));
    case PoolingScale::Log:
      return std::exp(value);
    case PoolingScale::Identity:
      return value;
  }
  return value;
}

Interval toNaturalScale(PoolingScale scale, const Interval& interval) {
  return {toNaturalScale(scale, interval.lo), toNaturalScale(scale, interval.hi)};
}

}  // namespace calivera
