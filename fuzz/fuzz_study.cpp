// libFuzzer target: the study file reader on arbitrary bytes (paths resolve against a folder that
// does not exist, so nothing on disk is touched beyond existence checks).
#include <cstddef>
#include <cstdint>
#include <string>

#include "core/study/study_file.h"
#include "core/util/errors.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  try {
    (void)calivera::parseStudyJson(text, "/nonexistent-fuzz-folder/fuzz.cvstudy");
  } catch (const calivera::InputError&) {
  } catch (const calivera::AnalysisError&) {
  }
  return 0;
}
