#include "core/report/audit_suppression.h"

#include <limits>
#include <stdexcept>
#include <tuple>
#include <utility>

namespace calivera {

std::size_t SuppressionProblem::addCell(std::size_t count, bool keepVisible) {
  counts_.push_back(count);
  keepVisible_.push_back(keepVisible);
  return counts_.size() - 1;
}

void SuppressionProblem::addRelation(std::vector<std::size_t> cells) {
  for (const std::size_t cell : cells) {
    if (cell >= counts_.size()) throw std::out_of_range("suppression relation names no cell");
  }
  if (cells.size() > 1) relations_.push_back(std::move(cells));
}

void SuppressionProblem::addAllOrNone(std::vector<std::size_t> cells) {
  for (const std::size_t cell : cells) {
    if (cell >= counts_.size()) throw std::out_of_range("suppression group names no cell");
  }
  if (cells.size() > 1) allOrNone_.push_back(std::move(cells));
}

namespace {

// The visible cell of `relation` to hide next: smallest positive count, then zero, with cells the
// report wants visible last; std::nullopt-like sentinel when none is visible.
constexpr std::size_t kNone = std::numeric_limits<std::size_t>::max();

std::size_t chooseComplement(const std::vector<std::size_t>& relation,
                             const std::vector<std::size_t>& counts,
                             const std::vector<bool>& keepVisible,
                             const std::vector<CellState>& states) {
  std::size_t best = kNone;
  auto rank = [&](std::size_t cell) {
    // Lower is better: (keepVisible, zero, count, index).
    return std::tuple(keepVisible[cell] ? 1 : 0, counts[cell] == 0 ? 1 : 0, counts[cell], cell);
  };
  for (const std::size_t cell : relation) {
    if (isHidden(states[cell])) continue;
    if (best == kNone || rank(cell) < rank(best)) best = cell;
  }
  return best;
}

}  // namespace

std::vector<CellState> SuppressionProblem::solve(std::size_t below) const {
  std::vector<CellState> states(counts_.size(), CellState::Shown);
  if (below <= 1) return states;
  for (std::size_t cell = 0; cell < counts_.size(); ++cell) {
    if (counts_[cell] >= 1 && counts_[cell] < below) states[cell] = CellState::Primary;
  }
  bool changed = true;
  while (changed) {
    changed = false;
    for (const auto& group : allOrNone_) {
      bool anyHidden = false;
      for (const std::size_t cell : group) anyHidden = anyHidden || isHidden(states[cell]);
      if (!anyHidden) continue;
      for (const std::size_t cell : group) {
        if (!isHidden(states[cell])) {
          states[cell] = CellState::Complementary;
          changed = true;
        }
      }
    }
    for (const auto& relation : relations_) {
      std::size_t hidden = 0;
      for (const std::size_t cell : relation) hidden += isHidden(states[cell]) ? 1 : 0;
      if (hidden != 1) continue;
      const std::size_t cell = chooseComplement(relation, counts_, keepVisible_, states);
      if (cell == kNone) continue;  // unreachable: a relation has at least two cells
      states[cell] = CellState::Complementary;
      changed = true;
    }
  }
  return states;
}

std::string formatSuppressedCount(std::size_t count, CellState state, std::size_t below) {
  switch (state) {
    case CellState::Primary: {
      // Appending (rather than "<" + ...) avoids a GCC 12 -Wrestrict false positive.
      std::string text = "<";
      text += std::to_string(below);
      return text;
    }
    case CellState::Complementary:
      return kComplementaryMark;
    case CellState::Shown:
      break;
  }
  return std::to_string(count);
}

std::string suppressSmallNumbersInText(const std::string& text, std::size_t below) {
  if (below <= 1) return text;
  auto isDigit = [](char c) { return c >= '0' && c <= '9'; };
  std::string out;
  std::size_t i = 0;
  while (i < text.size()) {
    if (!isDigit(text[i])) {
      out += text[i++];
      continue;
    }
    std::size_t j = i;
    while (j < text.size() && isDigit(text[j])) ++j;
    // Part of a decimal ("0.05", "1.5") or a grouped number ("12,000")? Keep as written.
    const bool decimalBefore =
        i >= 2 && (text[i - 1] == '.' || text[i - 1] == ',') && isDigit(text[i - 2]);
    const bool decimalAfter =
        j + 1 < text.size() && (text[j] == '.' || text[j] == ',') && isDigit(text[j + 1]);
    const std::string number = text.substr(i, j - i);
    bool small = !decimalBefore && !decimalAfter && number.size() <= 6;
    if (small) {
      const std::size_t value = std::stoul(number);
      small = value >= 1 && value < below;
    }
    if (small) {
      out += '<';
      out += std::to_string(below);
    } else {
      out += number;
    }
    i = j;
  }
  return out;
}

}  // namespace calivera
