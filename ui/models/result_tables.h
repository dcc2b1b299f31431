#pragma once
// Fills RecordTableModels from core: any core result table (the threshold trade-off table, the
// Hosmer-Lemeshow groups, the comparison and subgroup tables of
// core/report/uncertainty_result_tables.h), and the coefficient table.

#include <vector>

#include "core/fit/profile_ci.h"
#include "core/metrics/validation.h"
#include "core/model/model.h"
#include "ui/models/record_table_model.h"

namespace calivera::ui {

// Cells with numeric sort keys, formatted as every result table formats them. NaN shows as
// "not defined" and sorts first.
namespace cells {
TableCell number(double v, int decimals);
TableCell count(std::size_t v);
TableCell interval(const Interval& ci, int decimals);  // "lo to hi", sorted by lo
// Sorts alphabetically; long or hostile names are cut (kShownNameChars) with the whole name in
// the tooltip.
inline constexpr std::size_t kShownNameChars = 60;
TableCell text(const QString& s, std::size_t shownChars = kShownNameChars);
}  // namespace cells

// A core result table (core/report/result_table.h) on screen: its labels, its tooltips, values
// rounded to each column's decimals. The model keeps the table, so "Export table" writes the
// command line's CSV for it (ui/models/table_export.h).
void showResultTable(RecordTableModel& model, ResultTable table);
// Wald 95% CI coefficient +/- 1.96 SE and the odds ratio exp(coefficient) per term; with
// `profile` ([0] the intercept, then each term) two more columns, the profile-likelihood CI.
void fillCoefficientTable(RecordTableModel& model, const Model& riskModel,
                          const std::vector<ProfileBounds>* profile = nullptr);

// Index of the row whose threshold is nearest to t (rows ascending by threshold); -1 when empty.
int nearestThresholdRow(const std::vector<ThresholdRow>& rows, double t);

}  // namespace calivera::ui
