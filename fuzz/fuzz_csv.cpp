// libFuzzer target: the CSV cohort reader on arbitrary bytes. Bad input must end in InputError
// (exit 2 at the command line), never a crash, a hang or undefined behaviour.
#include <cstddef>
#include <cstdint>
#include <string_view>

#include "core/data/csv_reader.h"
#include "core/util/errors.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  calivera::CsvOptions options;
  options.threads = 1 + (size % 2);  // both the sequential and the parallel parser
  try {
    (void)calivera::parseCsv(text, "fuzz.csv", options);
  } catch (const calivera::InputError&) {
  } catch (const calivera::AnalysisError&) {
  }
  return 0;
}
