#include "core/report/audit_disclosure.h"

#include <algorithm>
#include <cmath>

namespace calivera {

DisclosurePlan::DisclosurePlan(const ValidationResult& result, const ExclusionReport& exclusions,
                               const std::vector<ThresholdRow>& tableRows, std::size_t below,
                               const DisclosureExtras& extras)
    : below_(below) {
  const std::size_t n = result.cohort.n;
  const std::size_t events = result.cohort.events;
  rowsRead_ = problem_.addCell(exclusions.rowsRead);
  rowsExcluded_ = problem_.addCell(exclusions.rowsExcluded);
  rowsAnalysed_ = problem_.addCell(n, /*keepVisible=*/true);
  problem_.addRelation({rowsRead_, rowsExcluded_, rowsAnalysed_});
  for (const ColumnExclusion& column : exclusions.byColumn) {
    // A row can be missing in several columns, so these counts add up to nothing published.
    byColumn_.push_back(problem_.addCell(column.rowsMissing));
  }

  events_ = problem_.addCell(events);
  nonEvents_ = problem_.addCell(n - events);
  problem_.addRelation({events_, nonEvents_, rowsAnalysed_});

  std::vector<LevelCount> hlGroups;
  for (const CalibrationGroup& group : result.hosmerLemeshow.groups) {
    hlGroups.push_back({group.n, group.observed});
  }
  groups_ = addPartition(hlGroups);

  for (const ThresholdRow& row : tableRows) {
    RowCells cells{problem_.addCell(row.tp), problem_.addCell(row.fp), problem_.addCell(row.fn),
                   problem_.addCell(row.tn)};
    problem_.addRelation({cells.tp, cells.fn, events_});
    problem_.addRelation({cells.fp, cells.tn, nonEvents_});
    problem_.addAllOrNone({cells.tp, cells.fp, cells.fn, cells.tn});
    rows_.push_back(cells);
  }

  std::vector<std::size_t> binEventRelation{events_}, binNonEventRelation{nonEvents_};
  for (std::size_t b = 0; b < result.distribution.eventCounts.size(); ++b) {
    binEvents_.push_back(problem_.addCell(result.distribution.eventCounts[b]));
    binEventRelation.push_back(binEvents_.back());
  }
  for (std::size_t b = 0; b < result.distribution.nonEventCounts.size(); ++b) {
    binNonEvents_.push_back(problem_.addCell(result.distribution.nonEventCounts[b]));
    binNonEventRelation.push_back(binNonEvents_.back());
  }
  problem_.addRelation(binEventRelation);
  problem_.addRelation(binNonEventRelation);

  for (const std::vector<LevelCount>& column : extras.subgroups) {
    levels_.push_back(addPartition(column));
  }
  if (extras.comparisonRows) {
    comparisonRows_ = problem_.addCell(*extras.comparisonRows);
    rowsNotCompared_ = problem_.addCell(n - std::min(n, *extras.comparisonRows));
    problem_.addRelation({*comparisonRows_, *rowsNotCompared_, rowsAnalysed_});
  }

  states_ = problem_.solve(below_);
}

std::vector<DisclosurePlan::GroupCells> DisclosurePlan::addPartition(
    const std::vector<LevelCount>& parts) {
  std::vector<GroupCells> cells;
  std::vector<std::size_t> sizes{rowsAnalysed_}, events{events_}, nonEvents{nonEvents_};
  for (const LevelCount& part : parts) {
    const GroupCells c{problem_.addCell(part.n), problem_.addCell(part.events),
                       problem_.addCell(part.n - part.events)};
    problem_.addRelation({c.n, c.events, c.nonEvents});
    sizes.push_back(c.n);
    events.push_back(c.events);
    nonEvents.push_back(c.nonEvents);
    cells.push_back(c);
  }
  if (!cells.empty()) {
    problem_.addRelation(events);
    problem_.addRelation(nonEvents);
    problem_.addRelation(sizes);
  }
  return cells;
}

bool DisclosurePlan::anyHidden() const {
  return std::any_of(states_.begin(), states_.end(), [](CellState s) { return isHidden(s); });
}

bool DisclosurePlan::confusionSmall(std::size_t tp, std::size_t fp, std::size_t fn,
                                    std::size_t tn) const {
  if (!active()) return false;
  for (const std::size_t count : {tp, fp, fn, tn}) {
    if (count >= 1 && count < below_) return true;
  }
  return false;
}

ValidationResult DisclosurePlan::chartData(const ValidationResult& result) const {
  ValidationResult chart = result;
  if (!active()) return chart;
  for (std::size_t b = 0; b < binEvents_.size(); ++b) {
    if (hidden(binEvents_[b])) chart.distribution.eventCounts[b] = 0;
  }
  for (std::size_t b = 0; b < binNonEvents_.size(); ++b) {
    if (hidden(binNonEvents_[b])) chart.distribution.nonEventCounts[b] = 0;
  }
  std::vector<CalibrationGroup> groups;
  for (std::size_t g = 0; g < groups_.size(); ++g) {
    if (!groupProportionHidden(g)) groups.push_back(result.hosmerLemeshow.groups[g]);
  }
  chart.hosmerLemeshow.groups = groups;
  if (chart.calibration.groups.size() == result.hosmerLemeshow.groups.size()) {
    chart.calibration.groups = groups;
  }

  const std::size_t events = result.cohort.events;
  const std::size_t nonEvents = result.cohort.n - events;
  std::vector<RocPoint> roc;
  for (std::size_t i = 0; i < result.discrimination.roc.size(); ++i) {
    const RocPoint& point = result.discrimination.roc[i];
    const bool endpoint = i == 0 || i + 1 == result.discrimination.roc.size();
    const auto tp = static_cast<std::size_t>(std::llround(point.tpr * double(events)));
    const auto fp = static_cast<std::size_t>(std::llround(point.fpr * double(nonEvents)));
    if (endpoint || !confusionSmall(tp, fp, events - std::min(tp, events),
                                    nonEvents - std::min(fp, nonEvents))) {
      roc.push_back(point);
    }
  }
  chart.discrimination.roc = roc;

  std::vector<DecisionCurvePoint> curve;
  for (const DecisionCurvePoint& point : result.decisionCurve) {
    const auto row = std::find_if(
        result.thresholds.begin(), result.thresholds.end(),
        [&](const ThresholdRow& r) { return std::abs(r.threshold - point.threshold) < 1e-12; });
    if (row == result.thresholds.end() || !confusionSmall(row->tp, row->fp, row->fn, row->tn)) {
      curve.push_back(point);
    }
  }
  chart.decisionCurve = curve;
  return chart;
}

std::size_t DisclosurePlan::hiddenBins() const {
  std::size_t count = 0;
  for (const std::size_t cell : binEvents_) count += hidden(cell) ? 1 : 0;
  for (const std::size_t cell : binNonEvents_) count += hidden(cell) ? 1 : 0;
  return count;
}

}  // namespace calivera
