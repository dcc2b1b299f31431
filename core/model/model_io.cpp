#include "core/model/model_io.h"

#include <cmath>
#include <fstream>
#include <initializer_list>
#include <nlohmann/json.hpp>
#include <set>
#include <sstream>

#include "core/util/atomic_file.h"
#include "core/util/errors.h"
#include "core/util/input_file.h"
#include "core/util/number_format.h"
#include "core/util/sha256.h"
#include "core/util/strict_json.h"

namespace calivera {
namespace {

using Json = nlohmann::ordered_json;

// Where in the file a value sits, for messages: "model.json: term 2 ('age'): field 'scale'".
struct Context {
  std::string file;
  std::string where;  // "" at the top level, else "term 2 ('age')" and the like

  [[noreturn]] void fail(const std::string& message) const {
    throw InputError(file + ": " + (where.empty() ? "" : where + ": ") + message);
  }
  Context within(const std::string& part) const {
    return {file, where.empty() ? part : where + ", " + part};
  }
};

void rejectUnknownFields(const Json& object, std::initializer_list<const char*> known,
                         const Context& context) {
  const std::set<std::string> allowed(known.begin(), known.end());
  for (const auto& item : object.items()) {
    if (!allowed.count(item.key())) context.fail("unknown field '" + item.key() + "'");
  }
}

const Json& requireField(const Json& object, const char* key, const Context& context) {
  const auto found = object.find(key);
  if (found == object.end()) context.fail(std::string("missing field '") + key + "'");
  return *found;
}

const Json& requireObject(const Json& value, const std::string& what, const Context& context) {
  if (!value.is_object()) context.fail("'" + what + "' must be an object");
  return value;
}

std::string readString(const Json& object, const char* key, const Context& context) {
  const Json& value = requireField(object, key, context);
  if (!value.is_string()) context.fail(std::string("field '") + key + "' must be text");
  return value.get<std::string>();
}

std::optional<std::string> optionalString(const Json& object, const char* key,
                                          const Context& context) {
  if (!object.contains(key)) return std::nullopt;
  return readString(object, key, context);
}

double toFinite(const Json& value, const std::string& key, const Context& context) {
  if (!value.is_number()) context.fail("field '" + key + "' must be a number");
  const double number = value.get<double>();
  if (!std::isfinite(number)) context.fail("field '" + key + "' is not finite");
  return number;
}

double readNumber(const Json& object, const char* key, const Context& context) {
  return toFinite(requireField(object, key, context), key, context);
}

double numberOr(const Json& object, const char* key, double fallback, const Context& context) {
  return object.contains(key) ? readNumber(object, key, context) : fallback;
}

std::optional<long long> optionalCount(const Json& object, const char* key,
                                       const Context& context) {
  if (!object.contains(key)) return std::nullopt;
  const Json& value = object.at(key);
  if (!value.is_number_integer() || value.get<long long>() < 0) {
    context.fail(std::string("field '") + key + "' must be a whole number >= 0");
  }
  return value.get<long long>();
}

Estimate readEstimate(const Json& value, const std::string& what, const Context& context) {
  const Context here = context.within(what);
  requireObject(value, what, context);
  rejectUnknownFields(value, {"coefficient", "se"}, here);
  Estimate estimate;
  // JSON cannot spell NaN or infinity, but a number too large for a double reads as infinity.
  estimate.coefficient = readNumber(value, "coefficient", here);
  if (value.contains("se")) {
    estimate.se = readNumber(value, "se", here);
    if (*estimate.se < 0) here.fail("field 'se' must be >= 0");
  }
  return estimate;
}

TransformKind parseKind(const std::string& text, const Context& context) {
  if (text == "linear") return TransformKind::Linear;
  if (text == "log") return TransformKind::Log;
  if (text == "power") return TransformKind::Power;
  if (text == "indicator") return TransformKind::Indicator;
  if (text == "spline") return TransformKind::Spline;
  if (text == "product") return TransformKind::Product;
  context.fail("unknown transform '" + text +
               "' (known: linear, log, power, indicator, spline, product)");
}

const char* kindName(TransformKind kind) {
  switch (kind) {
    case TransformKind::Linear:
      return "linear";
    case TransformKind::Log:
      return "log";
    case TransformKind::Power:
      return "power";
    case TransformKind::Indicator:
      return "indicator";
    case TransformKind::Spline:
      return "spline";
    case TransformKind::Product:
      return "product";
  }
  return "linear";
}

std::string levelText(const Json& value, const Context& context) {
  if (value.is_string()) return value.get<std::string>();
  if (value.is_number()) {
    std::ostringstream out;
    out.precision(17);
    out << toFinite(value, "level", context);
    return out.str();
  }
  context.fail("field 'level' must be text or a number");
}

// The transformation fields of a term or of a product factor (`isFactor`: no estimate, no
// nested name requirement).
Term readTransformed(const Json& object, const Context& context, bool isFactor) {
  Term term;
  const std::string transform = readString(object, "transform", context);
  term.kind = parseKind(transform, context);
  std::initializer_list<const char*> common = {"name", "transform", "unit", "variable", "estimate"};
  std::vector<const char*> known(common);
  switch (term.kind) {
    case TransformKind::Linear:
      known.insert(known.end(), {"center", "scale"});
      break;
    case TransformKind::Power:
      known.push_back("power");
      break;
    case TransformKind::Indicator:
      known.push_back("level");
      break;
    case TransformKind::Spline:
      known.insert(known.end(), {"knots", "basis", "scaling"});
      break;
    case TransformKind::Product:
      known.push_back("factors");
      break;
    case TransformKind::Log:
      break;
  }
  const std::set<std::string> allowed(known.begin(), known.end());
  for (const auto& item : object.items()) {
    if (!allowed.count(item.key())) {
      context.fail("unknown field '" + item.key() + "' for transform '" + transform + "'");
    }
  }
  if (isFactor && object.contains("estimate")) context.fail("a factor has no 'estimate'");
  if (term.kind != TransformKind::Product) term.variable = readString(object, "variable", context);
  if (term.kind == TransformKind::Product && object.contains("variable")) {
    context.fail("a product term names its variables in 'factors', not 'variable'");
  }
  term.unit = optionalString(object, "unit", context);
  switch (term.kind) {
    case TransformKind::Linear:
      term.center = numberOr(object, "center", 0.0, context);
      term.scale = numberOr(object, "scale", 1.0, context);
      // A zero or subnormal scale would blow (x - center) / scale up to infinity inside the fit,
      // far from this file; refused here, naming the term and the field.
      if (!std::isnormal(term.scale)) {
        context.fail("field 'scale' must not be 0 or subnormal (got " + formatShortest(term.scale) +
                     ")");
      }
      break;
    case TransformKind::Power:
      term.power = readNumber(object, "power", context);
      break;
    case TransformKind::Indicator:
      term.level = levelText(requireField(object, "level", context), context);
      break;
    case TransformKind::Spline: {
      const Json& knots = requireField(object, "knots", context);
      if (!knots.is_array() || knots.size() < 3) {
        context.fail("field 'knots' must be an array of at least 3 numbers");
      }
      for (const Json& knot : knots) term.knots.push_back(toFinite(knot, "knots", context));
      for (std::size_t i = 1; i < term.knots.size(); ++i) {
        if (!(term.knots[i] > term.knots[i - 1])) {
          context.fail("field 'knots' must be strictly ascending");
        }
      }
      const Json& basis = requireField(object, "basis", context);
      const long long last = static_cast<long long>(term.knots.size()) - 2;
      if (!basis.is_number_integer() || basis.get<long long>() < 0 ||
          basis.get<long long>() > last) {
        context.fail("field 'basis' must be a whole number from 0 to " + std::to_string(last));
      }
      term.basisIndex = basis.get<int>();
      if (object.contains("scaling")) {
        const std::string scaling = readString(object, "scaling", context);
        if (scaling == "knot-range-squared") {
          term.splineScaled = true;
        } else if (scaling == "none") {
          term.splineScaled = false;
        } else {
          context.fail("field 'scaling' must be \"knot-range-squared\" or \"none\"");
        }
      }
      break;
    }
    case TransformKind::Product: {
      const Json& factors = requireField(object, "factors", context);
      if (!factors.is_array() || factors.size() != 2) {
        context.fail("field 'factors' must be an array of exactly two factors");
      }
      for (std::size_t i = 0; i < 2; ++i) {
        const Context here = context.within("factor " + std::to_string(i + 1));
        requireObject(factors[i], "factors", context);
        term.factors.push_back(readTransformed(factors[i], here, true));
      }
      break;
    }
    case TransformKind::Log:
      break;
  }
  if (object.contains("name")) term.name = readString(object, "name", context);
  return term;
}

Term readTerm(const Json& object, std::size_t index, const Context& file) {
  std::string label = "term " + std::to_string(index + 1);
  if (object.is_object() && object.contains("name") && object.at("name").is_string()) {
    label += " ('" + object.at("name").get<std::string>() + "')";
  }
  const Context context = file.within(label);
  if (!object.is_object()) context.fail("must be an object");
  Term term = readTransformed(object, context, false);
  if (!object.contains("name")) context.fail("missing field 'name'");
  if (term.name.empty()) context.fail("field 'name' must not be empty");
  term.estimate = readEstimate(requireField(object, "estimate", context), "estimate", context);
  return term;
}

DevelopmentRecord readDevelopment(const Json& object, const Context& file) {
  const Context context = file.within("development");
  requireObject(object, "development", file);
  rejectUnknownFields(
      object,
      {"n", "events", "data_sha256", "analysed_data_sha256", "software", "method", "description"},
      context);
  DevelopmentRecord record;
  record.n = optionalCount(object, "n", context);
  record.events = optionalCount(object, "events", context);
  if (record.n && record.events && *record.events > *record.n) {
    context.fail("field 'events' exceeds 'n'");
  }
  const auto digest = [&](const char* field) {
    std::optional<std::string> hex = optionalString(object, field, context);
    if (hex && !isSha256Hex(*hex)) {
      context.fail(std::string("field '") + field + "' must be 64 lowercase hex digits");
    }
    return hex;
  };
  record.dataSha256 = digest("data_sha256");
  record.analysedSha256 = digest("analysed_data_sha256");
  record.software = optionalString(object, "software", context);
  record.method = optionalString(object, "method", context);
  record.description = optionalString(object, "description", context);
  return record;
}

Json estimateJson(const Estimate& estimate) {
  // JSON cannot hold NaN or infinity; a model with one is not a model to keep.
  if (!std::isfinite(estimate.coefficient) || (estimate.se && !std::isfinite(*estimate.se))) {
    throw AnalysisError("cannot write a model with a non-finite coefficient or SE");
  }
  Json out;
  out["coefficient"] = estimate.coefficient;
  if (estimate.se) out["se"] = *estimate.se;
  return out;
}

Json transformedJson(const Term& term, bool isFactor) {
  Json out;
  if (!isFactor || !term.name.empty()) out["name"] = term.name;
  if (term.kind != TransformKind::Product) out["variable"] = term.variable;
  if (term.unit) out["unit"] = *term.unit;
  out["transform"] = kindName(term.kind);
  switch (term.kind) {
    case TransformKind::Linear:
      out["center"] = term.center;
      out["scale"] = term.scale;
      break;
    case TransformKind::Power:
      out["power"] = term.power;
      break;
    case TransformKind::Indicator:
      out["level"] = term.level;
      break;
    case TransformKind::Spline:
      out["knots"] = term.knots;
      out["basis"] = term.basisIndex;
      out["scaling"] = term.splineScaled ? "knot-range-squared" : "none";
      break;
    case TransformKind::Product:
      out["factors"] = Json::array();
      for (const Term& factor : term.factors)
        out["factors"].push_back(transformedJson(factor, true));
      break;
    case TransformKind::Log:
      break;
  }
  if (!isFactor) out["estimate"] = estimateJson(term.estimate);
  return out;
}

}  // namespace

Model parseModelJson(const std::string& text, const std::string& sourceName) {
  const Context file{sourceName, ""};
  // Duplicate keys and deep nesting are refused here (core/util/strict_json.h).
  const Json root = parseStrictJson(text, sourceName, /*allowComments=*/true);
  if (!root.is_object()) file.fail("the model file must hold one JSON object");
  rejectUnknownFields(root,
                      {"format", "name", "outcome", "intercept", "terms", "development",
                       "column_mapping", "reference_levels", "provenance"},
                      file);
  const std::string format = readString(root, "format", file);
  if (format != kModelFormatId) {
    file.fail("field 'format' is '" + format + "', expected '" + kModelFormatId + "'");
  }
  Model model;
  model.name = readString(root, "name", file);
  model.outcome = readString(root, "outcome", file);
  model.intercept = readEstimate(requireField(root, "intercept", file), "intercept", file);
  const Json& terms = requireField(root, "terms", file);
  if (!terms.is_array()) file.fail("field 'terms' must be an array");
  std::set<std::string> names;
  for (std::size_t i = 0; i < terms.size(); ++i) {
    Term term = readTerm(terms[i], i, file);
    if (!names.insert(term.name).second) {
      file.fail("term " + std::to_string(i + 1) + ": the name '" + term.name +
                "' is used by an earlier term");
    }
    model.terms.push_back(std::move(term));
  }
  if (root.contains("development")) model.development = readDevelopment(root["development"], file);
  if (root.contains("column_mapping")) {
    const Json& mapping = requireObject(root["column_mapping"], "column_mapping", file);
    for (const auto& item : mapping.items()) {
      if (!item.value().is_string() || item.value().get<std::string>().empty()) {
        file.fail("column_mapping: '" + item.key() + "' must map to a column name");
      }
      model.columnMapping[item.key()] = item.value().get<std::string>();
    }
  }
  if (root.contains("reference_levels")) {
    const Json& references = requireObject(root["reference_levels"], "reference_levels", file);
    for (const auto& item : references.items()) {
      std::vector<std::string>& levels = model.referenceLevels[item.key()];
      if (item.value().is_string()) {
        levels.push_back(item.value().get<std::string>());
        continue;
      }
      if (!item.value().is_array() || item.value().empty()) {
        file.fail("reference_levels: '" + item.key() +
                  "' must map to a level or a non-empty list of levels (text)");
      }
      for (const Json& level : item.value()) {
        if (!level.is_string()) {
          file.fail("reference_levels: '" + item.key() + "' lists a level that is not text");
        }
        levels.push_back(level.get<std::string>());
      }
    }
  }
  model.provenance = optionalString(root, "provenance", file);
  return model;
}

Model readModelFile(const std::string& path) {
  Model model = parseModelJson(readSmallFile(path, "model file", kMaxModelFileBytes), path);
  model.sourcePath = path;
  return model;
}

std::string modelToJson(const Model& model) {
  Json root;
  root["format"] = kModelFormatId;
  root["name"] = model.name;
  root["outcome"] = model.outcome;
  root["intercept"] = estimateJson(model.intercept);
  root["terms"] = Json::array();
  for (const Term& term : model.terms) root["terms"].push_back(transformedJson(term, false));
  const DevelopmentRecord& dev = model.development;
  Json development = Json::object();
  if (dev.n) development["n"] = *dev.n;
  if (dev.events) development["events"] = *dev.events;
  if (dev.dataSha256) development["data_sha256"] = *dev.dataSha256;
  if (dev.analysedSha256) development["analysed_data_sha256"] = *dev.analysedSha256;
  if (dev.software) development["software"] = *dev.software;
  if (dev.method) development["method"] = *dev.method;
  if (dev.description) development["description"] = *dev.description;
  if (!development.empty()) root["development"] = development;
  if (!model.columnMapping.empty()) root["column_mapping"] = model.columnMapping;
  if (!model.referenceLevels.empty()) {
    Json references = Json::object();
    for (const auto& [variable, levels] : model.referenceLevels) {
      references[variable] = levels.size() == 1 ? Json(levels.front()) : Json(levels);
    }
    root["reference_levels"] = references;
  }
  if (model.provenance) root["provenance"] = *model.provenance;
  // nlohmann writes doubles in the shortest form that parses back to the same value.
  return root.dump(2) + "\n";
}

void writeModelFile(const std::string& path, const Model& model) {
  writeFileAtomically(path, modelToJson(model));
}

}  // namespace calivera
