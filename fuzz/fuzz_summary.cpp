// libFuzzer target: the site summary reader (`calivera pool`'s input from other sites) on
// arbitrary bytes, with the content fingerprint check skipped so every field check is reachable;
// and the reader of a saved set of summaries (.cvsites) on the same bytes.
#include <cstddef>
#include <cstdint>
#include <string>

#include "core/sites/site_summary.h"
#include "core/sites/summary_set.h"
#include "core/util/errors.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  try {
    (void)calivera::parseSiteSummary(text, "fuzz.cvsummary",
                                     calivera::IntegrityCheck::SkippedForFuzzing);
  } catch (const calivera::InputError&) {
  } catch (const calivera::AnalysisError&) {
  }
  try {
    (void)calivera::parseSummarySet(text, "fuzz.cvsites");
  } catch (const calivera::InputError&) {
  }
  return 0;
}
