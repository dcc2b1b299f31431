#pragma once
// Sample-size warnings as typed codes with one wording each, used for the whole cohort
// (validate), each subgroup, the workstation's summary and the report, so the same shortfall is
// never worded twice. Yardsticks for external validation: at least 100 events and 100 non-events
// (Vergouwe et al., J Clin Epidemiol 2005, memory); 200 or more events for calibration (Collins,
// Ogundimu & Altman, Stat Med 2016, memory); see docs/methods.md.

#include <cstddef>
#include <string>
#include <vector>

namespace calivera {

enum class SizeWarning {
  FewEventsOrNonEvents,     // fewer than 100 events or fewer than 100 non-events
  FewEventsForCalibration,  // fewer than 200 events
};

inline constexpr std::size_t kMinEventsAndNonEvents = 100;
inline constexpr std::size_t kPreferredEvents = 200;

std::vector<SizeWarning> sizeWarningsFor(std::size_t events, std::size_t nonEvents);

// The one wording; `showCounts` false leaves the counts out (small-cell suppression).
std::string sizeWarningText(SizeWarning warning, std::size_t events, std::size_t nonEvents,
                            bool showCounts = true);

// Every warning that applies, worded.
std::vector<std::string> sizeWarningTexts(std::size_t events, std::size_t nonEvents,
                                          bool showCounts = true);

}  // namespace calivera
