#pragma once
// A decision threshold as people write it: a probability ("0.15"), a percentage ("15%"), or a
// harm-to-benefit ratio ("1:9", the odds t / (1 - t) at which treating and not treating are
// judged equal, so 1:9 is t = 0.10; Vickers & Elkin, Med Decis Making 2006). A bare number above
// 1 is refused with a hint rather than read as a percentage or clamped to 1: "15" could mean 15%
// or a typo, and a silently wrong threshold changes every number at it.

#include <optional>
#include <string>

namespace calivera {

struct ThresholdEntry {
  std::optional<double> threshold;  // strictly inside (0, 1) when set
  std::string error;                // why not, in plain words, when unset
};

ThresholdEntry parseThresholdEntry(const std::string& text);

}  // namespace calivera
