#include "core/study/study_file.h"

#include <cmath>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>

#include "core/data/database_source.h"
#include "core/metrics/validation.h"
#include "core/model/model_io.h"
#include "core/study/limits.h"
#include "core/util/atomic_file.h"
#include "core/util/errors.h"
#include "core/util/input_file.h"
#include "core/util/sha256.h"
#include "core/util/strict_json.h"

namespace calivera {

namespace fs = std::filesystem;
using nlohmann::json;

namespace {

json fileRecord(const InputFileRecord& r, const std::string& studyPath) {
  json j;
  if (r.database) {
    // A database source: the URI (never a password: checkDatabaseUri refused any), what was read
    // and the result's fingerprint.
    j["uri"] = r.path;
    if (!r.database->table.empty()) j["table"] = r.database->table;
    if (!r.database->query.empty()) j["query"] = r.database->query;
    j["sha256"] = r.sha256;
    return j;
  }
  j["path"] = r.path;
  std::error_code ec;
  const fs::path folder = fs::absolute(studyPath).parent_path();
  const fs::path relative = fs::relative(r.path, folder, ec);
  j["relativePath"] = ec ? r.path : relative.generic_string();
  j["sha256"] = r.sha256;
  return j;
}

std::string delimiterName(char d) {
  switch (d) {
    case 0:
      return "auto";
    case '\t':
      return "\t";
    default:
      return std::string(1, d);
  }
}

// Reads fields with messages that name the file and the JSON path of the field.
class Reader {
 public:
  Reader(std::string source, std::vector<std::string>* pathNotes)
      : source_(std::move(source)), pathNotes_(pathNotes) {}

  [[noreturn]] void fail(const std::string& field, const std::string& what) const {
    throw InputError(source_ + ": field '" + field + "': " + what);
  }
  const json& object(const json& parent, const std::string& key, const std::string& path) const {
    if (!parent.contains(key)) fail(path, "missing");
    const json& v = parent.at(key);
    if (!v.is_object()) fail(path, "expected an object");
    return v;
  }
  template <class T>
  T get(const json& parent, const std::string& key, const std::string& path, T fallback) const {
    if (!parent.contains(key) || parent.at(key).is_null()) return fallback;
    try {
      return parent.at(key).get<T>();
    } catch (const json::exception&) {
      fail(path, "has the wrong type");
    }
  }
  // A whole number within `limit` (core/study/limits.h), checked before any conversion.
  long long integer(const json& parent, const std::string& key, const std::string& path,
                    long long fallback, const IntegerLimit& limit) const {
    if (!parent.contains(key) || parent.at(key).is_null()) return fallback;
    const json& v = parent.at(key);
    if (!v.is_number()) fail(path, "has the wrong type (expected a number)");
    const double value = v.get<double>();
    const std::string problem = integerProblem(value, limit);
    if (!problem.empty()) {
      fail(path, problem + " (" + limit.what + ": " + std::to_string(limit.min) + " to " +
                     std::to_string(limit.max) + ")");
    }
    return static_cast<long long>(value);
  }
  double probability(const json& parent, const std::string& key, const std::string& path,
                     double fallback, bool open) const {
    const double v = get<double>(parent, key, path, fallback);
    if (!std::isfinite(v) || (open ? !(v > 0.0 && v < 1.0) : !(v >= 0.0 && v <= 1.0))) {
      fail(path, open ? "must lie strictly between 0 and 1" : "must lie between 0 and 1");
    }
    return v;
  }
  InputFileRecord file(const json& j, const std::string& path, const fs::path& folder) const {
    if (!j.is_object()) fail(path, "expected an object");
    InputFileRecord r;
    r.path = get<std::string>(j, "path", path + ".path", "");
    r.sha256 = get<std::string>(j, "sha256", path + ".sha256", "");
    const std::string relative = get<std::string>(j, "relativePath", path + ".relativePath", "");
    if (r.path.empty() && relative.empty()) fail(path + ".path", "missing");
    // A study moved together with its inputs (or shipped with relative paths only) still opens.
    std::error_code ec;
    if ((r.path.empty() || !fs::exists(r.path, ec)) && !relative.empty() &&
        (r.path.empty() || fs::exists(folder / relative, ec))) {
      r.path = fs::absolute(folder / relative).lexically_normal().string();
      const fs::path within = fs::path(r.path).lexically_relative(folder);
      if (pathNotes_ && (within.empty() || *within.begin() == "..")) {
        pathNotes_->push_back("The " + path + " file was found through its relative path '" +
                              relative + "', which leaves the study file's folder: " + r.path +
                              ".");
      }
    }
    return r;
  }

 private:
  std::string source_;
  std::vector<std::string>* pathNotes_ = nullptr;
};

}  // namespace

std::string studyToJson(const StudyState& study, const std::string& studyPath) {
  json j;
  j["format"] = kStudyFormatId;
  if (study.data) j["data"] = fileRecord(*study.data, studyPath);
  json import;
  import["delimiter"] = delimiterName(study.import.delimiter);
  import["missingTokens"] = study.import.missingTokens;
  import["outcome"] = study.import.outcomeColumn;
  import["eventValue"] = study.import.eventValue ? json(*study.import.eventValue) : json(nullptr);
  j["import"] = import;
  json model;
  switch (study.modelSource) {
    case ModelSource::None:
      model["source"] = "none";
      break;
    case ModelSource::File:
      model["source"] = "file";
      break;
    case ModelSource::Fitted:
      model["source"] = "fitted";
      break;
  }
  if (study.modelFile) model["file"] = fileRecord(*study.modelFile, studyPath);
  model["predictors"] = study.fit.predictors;
  model["firth"] = study.fit.firth;
  model["splineKnots"] = study.fit.splineKnots;
  model["profileIntervals"] = study.fit.profileIntervals;
  model["fitted"] = (study.modelSource == ModelSource::Fitted && study.model)
                        ? json::parse(modelToJson(*study.model))
                        : json(nullptr);
  j["model"] = model;
  j["columnMapping"] = study.columnMapping;
  j["levelMapping"] = study.levelMapping;
  j["analysis"] = {{"threshold", study.analysis.threshold},
                   {"reasonableLo", study.analysis.reasonableLo},
                   {"reasonableHi", study.analysis.reasonableHi},
                   {"groups", study.analysis.groups},
                   {"apparent", study.analysis.apparent}};
  j["predictorView"] = {{"predictors", study.predictorView}, {"held", study.heldValues}};
  const UncertaintySettings& u = study.uncertaintySettings;
  json compare = json::array();
  for (const InputFileRecord& m : u.compareModels) compare.push_back(fileRecord(m, studyPath));
  j["uncertainty"] = {{"bootstrap", u.bootstrapReplicates},
                      {"seed", u.seed},
                      {"threads", u.threads},
                      {"compareModels", compare},
                      {"subgroups", u.subgroupColumns},
                      {"sites", u.clusterColumn},
                      {"sizeThresholds", u.sizeThresholds}};
  const MissingDataSettings& md = study.missingData;
  j["missingData"] = {{"imputationColumn", md.imputationColumn},
                      {"imputeCopies", md.imputeCopies},
                      {"imputeIterations", md.imputeIterations},
                      {"imputeSeed", md.imputeSeed}};
  j["report"] = {{"title", study.report.title},
                 {"thresholds", study.report.thresholds},
                 {"suppressBelow", study.report.suppressBelow},
                 {"paper", study.report.paper},
                 {"analyst", study.report.analyst},
                 {"reviewer", study.report.reviewer}};
  return j.dump(2) + "\n";
}

StudyState parseStudyJson(const std::string& text, const std::string& studyPath) {
  // Duplicate keys and deep nesting are refused here (core/util/strict_json.h).
  const json j = parseStrictJson(text, studyPath, /*allowComments=*/false);
  StudyState s;
  const Reader in(studyPath, &s.pathNotes);
  if (!j.is_object()) in.fail("(top level)", "expected an object");
  if (in.get<std::string>(j, "format", "format", "") != kStudyFormatId) {
    in.fail("format", std::string("expected \"") + kStudyFormatId + "\"");
  }
  const fs::path folder = fs::absolute(studyPath).parent_path();
  if (j.contains("data") && !j.at("data").is_null()) {
    const json& data = j.at("data");
    if (data.is_object() && data.contains("uri")) {
      InputFileRecord r;
      r.path = in.get<std::string>(data, "uri", "data.uri", "");
      r.sha256 = in.get<std::string>(data, "sha256", "data.sha256", "");
      r.database = DatabaseSelection{in.get<std::string>(data, "table", "data.table", ""),
                                     in.get<std::string>(data, "query", "data.query", "")};
      try {
        checkDatabaseUri(r.path, "");
        checkDatabaseSelection(*r.database);
      } catch (const InputError& e) {
        in.fail("data", e.what());
      }
      s.data = std::move(r);
    } else {
      s.data = in.file(data, "data", folder);
    }
  }

  const json& import = in.object(j, "import", "import");
  const std::string delimiter =
      in.get<std::string>(import, "delimiter", "import.delimiter", "auto");
  if (delimiter == "auto") {
    s.import.delimiter = 0;
  } else if (delimiter.size() == 1 && (delimiter == "," || delimiter == ";" || delimiter == "\t")) {
    s.import.delimiter = delimiter[0];
  } else {
    in.fail("import.delimiter", "expected \"auto\", \",\", \";\" or a tab");
  }
  s.import.missingTokens =
      in.get<std::vector<std::string>>(import, "missingTokens", "import.missingTokens", {"", "NA"});
  s.import.outcomeColumn = in.get<std::string>(import, "outcome", "import.outcome", "");
  if (import.contains("eventValue") && !import.at("eventValue").is_null()) {
    s.import.eventValue = in.get<std::string>(import, "eventValue", "import.eventValue", "");
  }

  const json& model = in.object(j, "model", "model");
  const std::string source = in.get<std::string>(model, "source", "model.source", "none");
  if (source == "none") {
    s.modelSource = ModelSource::None;
  } else if (source == "file") {
    s.modelSource = ModelSource::File;
  } else if (source == "fitted") {
    s.modelSource = ModelSource::Fitted;
  } else {
    in.fail("model.source", "expected \"none\", \"file\" or \"fitted\"");
  }
  if (model.contains("file") && !model.at("file").is_null()) {
    s.modelFile = in.file(model.at("file"), "model.file", folder);
  }
  if (s.modelSource == ModelSource::File && !s.modelFile) in.fail("model.file", "missing");
  s.fit.predictors = in.get<std::vector<std::string>>(model, "predictors", "model.predictors", {});
  s.fit.firth = in.get<bool>(model, "firth", "model.firth", false);
  s.fit.profileIntervals = in.get<bool>(model, "profileIntervals", "model.profileIntervals", false);
  s.fit.splineKnots =
      in.get<std::map<std::string, int>>(model, "splineKnots", "model.splineKnots", {});
  if (model.contains("fitted") && !model.at("fitted").is_null()) {
    s.model = parseModelJson(model.at("fitted").dump(), studyPath + " (model.fitted)");
  }
  s.columnMapping =
      in.get<std::map<std::string, std::string>>(j, "columnMapping", "columnMapping", {});
  s.levelMapping = in.get<std::map<std::string, std::map<std::string, std::string>>>(
      j, "levelMapping", "levelMapping", {});
  const json& a = in.object(j, "analysis", "analysis");
  s.analysis.threshold = in.probability(a, "threshold", "analysis.threshold", 0.1, false);
  s.analysis.reasonableLo = in.probability(a, "reasonableLo", "analysis.reasonableLo", 0.05, true);
  s.analysis.reasonableHi = in.probability(a, "reasonableHi", "analysis.reasonableHi", 0.3, true);
  if (!(s.analysis.reasonableLo < s.analysis.reasonableHi)) {
    in.fail("analysis.reasonableLo", "must be below analysis.reasonableHi");
  }
  s.analysis.groups =
      static_cast<int>(in.integer(a, "groups", "analysis.groups", 10, kGroupsLimit));
  s.analysis.apparent = in.get<bool>(a, "apparent", "analysis.apparent", false);
  if (j.contains("predictorView") && j.at("predictorView").is_object()) {
    const json& pv = j.at("predictorView");
    s.predictorView =
        in.get<std::vector<std::string>>(pv, "predictors", "predictorView.predictors", {});
    s.heldValues = in.get<std::map<std::string, std::string>>(pv, "held", "predictorView.held", {});
  }
  if (j.contains("uncertainty") && !j.at("uncertainty").is_null()) {
    const json& u = in.object(j, "uncertainty", "uncertainty");
    UncertaintySettings& out = s.uncertaintySettings;
    out.bootstrapReplicates =
        static_cast<int>(in.integer(u, "bootstrap", "uncertainty.bootstrap", 0, kBootstrapLimit));
    out.seed = static_cast<std::uint64_t>(in.integer(u, "seed", "uncertainty.seed", 1, kSeedLimit));
    out.threads =
        static_cast<unsigned>(in.integer(u, "threads", "uncertainty.threads", 0, kThreadsLimit));
    if (u.contains("compareModels") && !u.at("compareModels").is_null()) {
      const json& list = u.at("compareModels");
      if (!list.is_array()) in.fail("uncertainty.compareModels", "expected an array");
      for (std::size_t i = 0; i < list.size(); ++i) {
        out.compareModels.push_back(
            in.file(list.at(i), "uncertainty.compareModels[" + std::to_string(i) + "]", folder));
      }
    }
    out.subgroupColumns =
        in.get<std::vector<std::string>>(u, "subgroups", "uncertainty.subgroups", {});
    out.clusterColumn = in.get<std::string>(u, "sites", "uncertainty.sites", {});
    out.sizeThresholds =
        in.get<std::vector<double>>(u, "sizeThresholds", "uncertainty.sizeThresholds", {});
    for (double t : out.sizeThresholds) {
      if (!(t > 0.0 && t < 1.0)) in.fail("uncertainty.sizeThresholds", "each must lie in (0, 1)");
    }
  }
  if (j.contains("missingData") && !j.at("missingData").is_null()) {
    const json& md = in.object(j, "missingData", "missingData");
    MissingDataSettings& out = s.missingData;
    out.imputationColumn =
        in.get<std::string>(md, "imputationColumn", "missingData.imputationColumn", "");
    const long long copies = in.integer(md, "imputeCopies", "missingData.imputeCopies", 0,
                                        IntegerLimit{"imputed copies", 0, kImputeCopiesLimit.max});
    if (copies == 1) in.fail("missingData.imputeCopies", "0 (none) or 2 to 1000 copies");
    out.imputeCopies = static_cast<int>(copies);
    out.imputeIterations = static_cast<int>(in.integer(
        md, "imputeIterations", "missingData.imputeIterations", 10, kImputeIterationsLimit));
    out.imputeSeed = static_cast<std::uint64_t>(
        in.integer(md, "imputeSeed", "missingData.imputeSeed", 1, kSeedLimit));
    if (out.imputesHere() && !out.imputationColumn.empty()) {
      in.fail("missingData",
              "imputeCopies and imputationColumn: copies are either made here or "
              "read from the cohort, not both");
    }
  }
  if (j.contains("report") && !j.at("report").is_null()) {
    const json& r = in.object(j, "report", "report");
    ReportSettings& out = s.report;
    out.title = in.get<std::string>(r, "title", "report.title", "");
    if (out.title.size() > kMaxReportTitleBytes) {
      in.fail("report.title", "longer than " + std::to_string(kMaxReportTitleBytes) + " bytes");
    }
    for (const auto& [key, name] :
         {std::pair{"analyst", &out.analyst}, std::pair{"reviewer", &out.reviewer}}) {
      const std::string field = std::string("report.") + key;
      *name = in.get<std::string>(r, key, field, "");
      if (name->size() > kMaxSignOffNameBytes) {
        in.fail(field, "longer than " + std::to_string(kMaxSignOffNameBytes) + " bytes");
      }
    }
    out.thresholds = in.get<std::vector<double>>(r, "thresholds", "report.thresholds", {});
    if (out.thresholds.size() > kMaxThresholdCount) {
      in.fail("report.thresholds", "more than " + std::to_string(kMaxThresholdCount) + " values");
    }
    for (double t : out.thresholds) {
      if (!(t > 0.0 && t < 1.0)) in.fail("report.thresholds", "each must lie in (0, 1)");
    }
    // 0 is "off"; anything else within the command line's --suppress-below limit.
    const long long below = in.integer(r, "suppressBelow", "report.suppressBelow", 0,
                                       {kSuppressBelowLimit.what, 0, kSuppressBelowLimit.max});
    if (below != 0 && below < kSuppressBelowLimit.min) {
      in.fail("report.suppressBelow", "must be 0 (off) or from " +
                                          std::to_string(kSuppressBelowLimit.min) + " to " +
                                          std::to_string(kSuppressBelowLimit.max));
    }
    out.suppressBelow = static_cast<std::size_t>(below);
    out.paper = in.get<std::string>(r, "paper", "report.paper", "a4");
    if (out.paper != "a4" && out.paper != "letter") {
      in.fail("report.paper", "expected \"a4\" or \"letter\"");
    }
  }
  return s;
}

void writeStudyFile(const std::string& path, const StudyState& study) {
  writeFileAtomically(path, studyToJson(study, path));
}

StudyState readStudyFile(const std::string& path) {
  return parseStudyJson(readSmallFile(path, "study file", kMaxStudyFileBytes), path);
}

std::vector<InputCheck> checkInputs(const StudyState& study, const std::string& cohortSha256) {
  std::vector<InputCheck> out;
  auto check = [&](const std::optional<InputFileRecord>& r, const char* role,
                   const std::string& known = {}) {
    if (!r) return;
    if (r->database && known.empty()) return;  // read by the pipeline, which passes `known`
    std::error_code ec;
    if (known.empty() && !fs::exists(r->path, ec)) {
      out.push_back({role, r->path, "missing"});
      return;
    }
    try {
      if ((known.empty() ? sha256OfFile(r->path) : known) != r->sha256) {
        out.push_back({role, r->path, "changed since the study was saved"});
      }
    } catch (const InputError&) {
      out.push_back({role, r->path, "cannot be read"});
    }
  };
  check(study.data, "cohort data", cohortSha256);
  if (study.modelSource == ModelSource::File) check(study.modelFile, "model file");
  for (const InputFileRecord& m : study.uncertaintySettings.compareModels) {
    check(m, "compared model file");
  }
  return out;
}

}  // namespace calivera
