#include "core/study/limits.h"

#include <cmath>

namespace calivera {

const char* integerProblem(double value, const IntegerLimit& limit) {
  if (!std::isfinite(value) || std::floor(value) != value) return "must be a whole number";
  if (value < static_cast<double>(limit.min) || value > static_cast<double>(limit.max)) {
    return "is outside its allowed range";
  }
  return "";
}

}  // namespace calivera
