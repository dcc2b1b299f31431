#pragma once
// Words that state evidence, never permission: one wording for each recurring status, used by
// the text summary, the workstation and the report alike. A sample-size rule "reached" says the
// cohort has that many patients or events; it does not say the model may be used.

#include <string>

namespace calivera {

// A sample-size rule or precision criterion against this cohort.
inline const char* sizeCriterionText(bool reached) {
  return reached ? "reached by this cohort" : "not reached by this cohort";
}

// A subgroup level: is it large enough for its estimates to be read?
inline const char* subgroupSizeText(bool tooSmall, bool hasMetrics, std::size_t events) {
  if (tooSmall) return "too few patients";
  if (!hasMetrics) return "no estimates";
  return events < 200 ? "estimates imprecise (< 200 events)" : "estimates shown";
}

// A reporting-checklist item: stated in this report, or for the analyst to add.
inline const char* checklistStatusText(bool statedHere) {
  return statedHere ? "[stated here]" : "[to add]";
}

}  // namespace calivera
