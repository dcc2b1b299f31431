#include "core/metrics/size_warnings.h"

namespace calivera {

std::vector<SizeWarning> sizeWarningsFor(std::size_t events, std::size_t nonEvents) {
  std::vector<SizeWarning> out;
  if (events < kMinEventsAndNonEvents || nonEvents < kMinEventsAndNonEvents) {
    out.push_back(SizeWarning::FewEventsOrNonEvents);
  }
  if (events < kPreferredEvents) out.push_back(SizeWarning::FewEventsForCalibration);
  return out;
}

std::string sizeWarningText(SizeWarning warning, std::size_t events, std::size_t nonEvents,
                            bool showCounts) {
  switch (warning) {
    case SizeWarning::FewEventsOrNonEvents:
      return "fewer than 100 events or non-events" +
             (showCounts ? " (" + std::to_string(events) + " events, " + std::to_string(nonEvents) +
                               " non-events)"
                         : std::string()) +
             ": estimates are imprecise; at least 100 of each are recommended for an external "
             "validation (Vergouwe et al., J Clin Epidemiol 2005)";
    case SizeWarning::FewEventsForCalibration:
      return "fewer than 200 events" +
             (showCounts ? " (" + std::to_string(events) + ")" : std::string()) +
             ": calibration estimates are imprecise; 200 or more are recommended (Collins, "
             "Ogundimu & Altman, Stat Med 2016)";
  }
  return {};
}

std::vector<std::string> sizeWarningTexts(std::size_t events, std::size_t nonEvents,
                                          bool showCounts) {
  std::vector<std::string> out;
  for (const SizeWarning w : sizeWarningsFor(events, nonEvents)) {
    out.push_back(sizeWarningText(w, events, nonEvents, showCounts));
  }
  return out;
}

}  // namespace calivera
