#pragma once
// Small-cell suppression of the counts an audit report publishes (statistical disclosure control
// of aggregate tables). A count from 1 to N-1 is a primary suppression and is printed as "<N".
// Secondary (complementary) suppression then hides further cells so that no hidden count can be
// recomputed from the totals the report prints: every published equation between counts (a row
// with its total, a column adding up to the cohort's events, ...) is a Relation, and no relation
// may hold exactly one hidden cell. Groups are all-or-none: a 2x2 table whose four margins are
// published has one degree of freedom, so hiding any of TP, FP, FN, TN hides all four.
//
// Practice and thresholds: counts below 5, 10 or 11 are commonly suppressed, with complementary
// suppression so a hidden cell cannot be derived from margins (see docs/methods.md,
// "Reporting and disclosure"; the rule "no line of a table with exactly one suppressed cell" is
// the classical necessary condition for two-way tables).
//
// Choice of complement: within a relation holding one hidden cell, the visible cell with the
// smallest positive count is hidden (lowest index on ties), because hiding a zero leaks: a
// residual below N with a zero complement pins the hidden count exactly. A zero is used only when
// the relation has no visible positive cell. Cells marked `keepVisible` (the analysed n, printed
// on every page) are chosen only when no other cell of the relation can be. The greedy repeats
// until every relation has zero or at least two hidden cells; it always terminates because each
// step hides one more cell.
//
// Edge cases: a threshold of 0 or 1 switches suppression off (nothing is hidden); a count of 0 is
// never a primary suppression; a relation of one cell constrains nothing.

#include <cstddef>
#include <string>
#include <vector>

namespace calivera {

enum class CellState { Shown, Primary, Complementary };

class SuppressionProblem {
 public:
  // Returns the cell's index.
  std::size_t addCell(std::size_t count, bool keepVisible = false);
  // The listed cells are tied by one published equation (their sum, or a sum of some minus
  // others, is known to the reader).
  void addRelation(std::vector<std::size_t> cells);
  // Hiding any listed cell hides them all.
  void addAllOrNone(std::vector<std::size_t> cells);

  std::size_t cellCount() const { return counts_.size(); }
  std::size_t count(std::size_t cell) const { return counts_.at(cell); }

  // States per cell for the threshold `below` (counts 1..below-1 are primary).
  std::vector<CellState> solve(std::size_t below) const;

 private:
  std::vector<std::size_t> counts_;
  std::vector<bool> keepVisible_;
  std::vector<std::vector<std::size_t>> relations_;
  std::vector<std::vector<std::size_t>> allOrNone_;
};

// "<N" for a primary cell, "s" for a complementary one, the count otherwise.
std::string formatSuppressedCount(std::size_t count, CellState state, std::size_t below);

// Free text from the analysis (warnings such as "3 of 200 rows excluded") can carry counts too:
// every standalone whole number from 1 to below-1 (not part of a decimal or a longer number) is
// replaced by "<below". Numbers of N and more, decimals and zero are left as written.
std::string suppressSmallNumbersInText(const std::string& text, std::size_t below);

inline bool isHidden(CellState state) {
  return state != CellState::Shown;
}

inline constexpr const char* kComplementaryMark = "s";

}  // namespace calivera
