#pragma once
// Which counts of one audit report are hidden, decided once for the whole report so a count that
// appears in several tables is hidden everywhere or nowhere. Builds a SuppressionProblem
// (audit_suppression.h) with these published equations:
//   rows read = rows excluded + rows analysed;  n = events + non-events;
//   Hosmer-Lemeshow group g: n_g = events_g + non-events_g; the events_g add up to the events,
//   the non-events_g to the non-events, the n_g to n;
//   threshold row: TP + FN = events, FP + TN = non-events, and TP, FP, FN, TN all-or-none
//   (the row's rates publish the margins, leaving one degree of freedom);
//   risk histogram: event bins add up to the events, non-event bins to the non-events.
// The analysed n is kept visible where any other complement exists (it is on every page).
// With the uncertainty layer (DisclosureExtras):
//   subgroup column c, level l: n_cl = events_cl + non-events_cl; over the levels of one column
//   the n_cl add up to n, the events_cl to the events, the non-events_cl to the non-events (the
//   levels, "(missing)" included, partition the analysed patients);
//   comparison: rows compared + rows not compared = n.
//
// Derived figures follow their counts: a proportion, CI or rate computed from a hidden count is
// hidden too (prevalence, O/E, scaled Brier when the events are hidden; a group's observed
// proportion and expected events; a threshold row's rates). Curves are trimmed: ROC points and
// decision-curve points whose confusion counts would include a count from 1 to N-1 are left out
// of the charts (the curve is drawn through the remaining points).

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "core/data/cohort.h"
#include "core/metrics/validation.h"
#include "core/report/audit_suppression.h"

namespace calivera {

struct LevelCount {
  std::size_t n = 0, events = 0;
};

// Counts the uncertainty sections of the report publish beside the validation's own.
struct DisclosureExtras {
  std::vector<std::vector<LevelCount>> subgroups;  // per subgroup column, its levels in order
  std::optional<std::size_t> comparisonRows;       // patients the model comparison rests on
};

class DisclosurePlan {
 public:
  // `tableRows` are the threshold rows the report tabulates.
  DisclosurePlan(const ValidationResult& result, const ExclusionReport& exclusions,
                 const std::vector<ThresholdRow>& tableRows, std::size_t below,
                 const DisclosureExtras& extras = {});

  std::size_t below() const { return below_; }
  bool active() const { return below_ >= 2; }
  bool anyHidden() const;

  std::string rowsRead() const { return text(rowsRead_); }
  std::string rowsExcluded() const { return text(rowsExcluded_); }
  std::string rowsAnalysed() const { return text(rowsAnalysed_); }
  std::string excludedByColumn(std::size_t k) const { return text(byColumn_.at(k)); }
  std::string events() const { return text(events_); }
  std::string nonEvents() const { return text(nonEvents_); }
  bool eventsHidden() const { return hidden(events_) || hidden(nonEvents_); }

  std::string groupN(std::size_t g) const { return text(groups_.at(g).n); }
  std::string groupEvents(std::size_t g) const { return text(groups_.at(g).events); }
  std::string groupNonEvents(std::size_t g) const { return text(groups_.at(g).nonEvents); }
  bool groupSizeHidden(std::size_t g) const { return hidden(groups_.at(g).n); }
  bool groupProportionHidden(std::size_t g) const {
    return hidden(groups_.at(g).n) || hidden(groups_.at(g).events);
  }

  std::string rowTp(std::size_t r) const { return text(rows_.at(r).tp); }
  std::string rowFp(std::size_t r) const { return text(rows_.at(r).fp); }
  std::string rowFn(std::size_t r) const { return text(rows_.at(r).fn); }
  std::string rowTn(std::size_t r) const { return text(rows_.at(r).tn); }
  bool rowHidden(std::size_t r) const { return hidden(rows_.at(r).tp); }

  // Subgroup column c, level l; a level whose n, events or non-events are hidden is hidden, and
  // the report withholds its metrics.
  std::string levelN(std::size_t c, std::size_t l) const { return text(levels_.at(c).at(l).n); }
  std::string levelEvents(std::size_t c, std::size_t l) const {
    return text(levels_.at(c).at(l).events);
  }
  bool levelHidden(std::size_t c, std::size_t l) const {
    const GroupCells& cells = levels_.at(c).at(l);
    return hidden(cells.n) || hidden(cells.events) || hidden(cells.nonEvents);
  }
  // The comparison's patients and how many fewer than n; hidden together.
  std::string comparisonRows() const { return text(comparisonRows_.value()); }
  std::string rowsNotCompared() const { return text(rowsNotCompared_.value()); }
  bool comparisonRowsHidden() const {
    return comparisonRows_ && (hidden(*comparisonRows_) || hidden(*rowsNotCompared_));
  }

  // True when a confusion table with these counts holds a count from 1 to N-1 (charts and
  // net-benefit rows at such a threshold are withheld).
  bool confusionSmall(std::size_t tp, std::size_t fp, std::size_t fn, std::size_t tn) const;

  // The result as the charts may draw it: hidden histogram bins set to 0, hidden groups removed,
  // ROC and decision-curve points with small implied counts removed.
  ValidationResult chartData(const ValidationResult& result) const;
  // How many histogram bins, calibration groups and curve points chartData() left out.
  std::size_t hiddenBins() const;

 private:
  struct GroupCells {
    std::size_t n, events, nonEvents;
  };
  struct RowCells {
    std::size_t tp, fp, fn, tn;
  };

  std::string text(std::size_t cell) const {
    return formatSuppressedCount(problem_.count(cell), states_.at(cell), below_);
  }
  bool hidden(std::size_t cell) const { return isHidden(states_.at(cell)); }
  // Cells of groups partitioning the analysed patients (n = events + non-events each; the
  // groups' n, events and non-events add up to the cohort's).
  std::vector<GroupCells> addPartition(const std::vector<LevelCount>& parts);

  std::size_t below_;
  SuppressionProblem problem_;
  std::vector<CellState> states_;
  std::size_t rowsRead_, rowsExcluded_, rowsAnalysed_, events_, nonEvents_;
  std::vector<std::size_t> byColumn_;
  std::vector<GroupCells> groups_;
  std::vector<RowCells> rows_;
  std::vector<std::size_t> binEvents_, binNonEvents_;
  std::vector<std::vector<GroupCells>> levels_;
  std::optional<std::size_t> comparisonRows_, rowsNotCompared_;
};

}  // namespace calivera
