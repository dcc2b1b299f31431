#include "core/util/strict_json.h"

#include <set>
#include <vector>

#include "core/util/errors.h"

namespace calivera {

nlohmann::json parseStrictJson(const std::string& text, const std::string& source,
                               bool allowComments) {
  using Json = nlohmann::json;
  std::vector<std::set<std::string>> keysPerObject;  // one set per object being parsed
  std::string problem;
  const Json::parser_callback_t check = [&](int depth, Json::parse_event_t event, Json& parsed) {
    if (depth > kMaxJsonDepth && problem.empty()) {
      problem = "nested deeper than " + std::to_string(kMaxJsonDepth) + " levels";
    }
    switch (event) {
      case Json::parse_event_t::object_start:
        keysPerObject.emplace_back();
        break;
      case Json::parse_event_t::object_end:
        if (!keysPerObject.empty()) keysPerObject.pop_back();
        break;
      case Json::parse_event_t::key:
        if (!keysPerObject.empty() && parsed.is_string() &&
            !keysPerObject.back().insert(parsed.get<std::string>()).second && problem.empty()) {
          problem = "the key '" + parsed.get<std::string>().substr(0, 60) +
                    "' appears twice in one object";
        }
        break;
      default:
        break;
    }
    return problem.empty();  // stop keeping values once something is wrong
  };
  Json root;
  try {
    root = Json::parse(text, check, true, allowComments);
  } catch (const Json::parse_error& error) {
    if (!problem.empty()) throw InputError(source + ": " + problem);
    throw InputError(source + ": not valid JSON: malformed at byte " + std::to_string(error.byte) +
                     " (" + error.what() + ")");
  } catch (const Json::out_of_range& error) {
    // A number beyond the double range (1e999): the only way JSON can spell a non-finite value.
    throw InputError(source + ": a number is not finite (" + std::string(error.what()) + ")");
  }
  if (!problem.empty()) throw InputError(source + ": " + problem);
  return root;
}

}  // namespace calivera
