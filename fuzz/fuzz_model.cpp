// libFuzzer target: the model file reader on arbitrary bytes, then writing the model back (the
// round trip must hold for anything the reader accepts).
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <string>

#include "core/model/model_io.h"
#include "core/util/errors.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  try {
    const calivera::Model model = calivera::parseModelJson(text, "fuzz.json");
    std::string written;
    try {
      written = calivera::modelToJson(model);
    } catch (const calivera::AnalysisError&) {
      return 0;  // a non-finite coefficient cannot be written: refused, as documented
    }
    const calivera::Model again = calivera::parseModelJson(written, "fuzz-roundtrip.json");
    if (calivera::modelToJson(again) != written) std::abort();  // the round trip must be exact
  } catch (const calivera::InputError&) {
  } catch (const calivera::AnalysisError&) {
  }
  return 0;
}
