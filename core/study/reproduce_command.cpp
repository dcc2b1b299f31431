#include "core/study/reproduce_command.h"

#include <filesystem>

#include "core/data/csv_reader.h"
#include "core/study/study_analysis.h"
#include "core/study/study_uncertainty.h"
#include "core/util/errors.h"
#include "core/util/number_format.h"

namespace calivera {
namespace {

std::string joined(const std::vector<std::string>& items) {
  std::string out;
  for (const std::string& item : items) out += (out.empty() ? "" : ",") + item;
  return out;
}

std::string numberList(const std::vector<double>& values) {
  std::vector<std::string> items;
  items.reserve(values.size());
  for (const double v : values) items.push_back(formatShortest(v));
  return joined(items);
}

void addImportWords(std::vector<std::string>& w, const CsvOptions& csv,
                    const OutcomeSpec& outcome) {
  w.insert(w.end(), {"--outcome", outcome.column});
  if (outcome.eventValue) w.insert(w.end(), {"--event-value", *outcome.eventValue});
  if (csv.delimiter == '\t') {
    w.insert(w.end(), {"--delimiter", "tab"});
  } else if (csv.delimiter != 0) {
    w.insert(w.end(), {"--delimiter", std::string(1, csv.delimiter)});
  }
  // --missing adds to the tokens that are always missing (the empty field and NA).
  const std::vector<std::string> always = CsvOptions{}.missingTokens;
  for (const std::string& token : always) {
    if (std::find(csv.missingTokens.begin(), csv.missingTokens.end(), token) ==
        csv.missingTokens.end()) {
      throw InputError("missing-value tokens: the command line always treats '" + token +
                       "' as missing, so a study that does not cannot be written as a command");
    }
  }
  for (const std::string& token : csv.missingTokens) {
    if (std::find(always.begin(), always.end(), token) == always.end()) {
      w.insert(w.end(), {"--missing", token});
    }
  }
}

void addLevelMappingWords(std::vector<std::string>& w,
                          const std::map<std::string, std::map<std::string, std::string>>& m) {
  for (const auto& [variable, levels] : m) {
    for (const auto& [from, to] : levels) {
      w.insert(w.end(), {"--map-level", variable + ":" + from + "=" + to});
    }
  }
}

}  // namespace

namespace {

// --table or --query after --data for a database source.
void addDatabaseWords(std::vector<std::string>& w, const std::optional<DatabaseSelection>& db) {
  if (!db) return;
  if (!db->table.empty()) w.insert(w.end(), {"--table", db->table});
  if (!db->query.empty()) w.insert(w.end(), {"--query", db->query});
}

}  // namespace

std::vector<std::string> validateCommandWords(const ValidationRequest& validation,
                                              const UncertaintyRequest& uncertainty) {
  std::vector<std::string> w{"--data", validation.dataPath};
  addDatabaseWords(w, validation.database);
  addImportWords(w, validation.csv, validation.outcome);
  if (validation.model) {
    w.insert(w.end(), {"--model", kFittedModelFile});
  } else if (validation.modelPath) {
    w.insert(w.end(), {"--model", *validation.modelPath});
  } else if (validation.riskColumn) {
    w.insert(w.end(), {"--risk", *validation.riskColumn});
  }
  for (const auto& [variable, column] : validation.columnMapping) {
    w.insert(w.end(), {"--map", variable + "=" + column});
  }
  addLevelMappingWords(w, validation.levelMapping);
  if (validation.developmentData) w.push_back("--development-data");
  if (validation.imputationColumn) {
    w.insert(w.end(), {"--imputation-column", *validation.imputationColumn});
  }
  const ValidationOptions defaults;
  if (validation.options.groups != defaults.groups) {
    w.insert(w.end(), {"--groups", std::to_string(validation.options.groups)});
  }
  const std::vector<double>& t = validation.options.thresholds;
  if (!t.empty() && t != thresholdRange(0.01, 0.99, 0.01)) {
    w.insert(w.end(), {"--thresholds", numberList(t)});
  }
  const UncertaintyRequest none;
  if (uncertainty.bootstrapReplicates > 0) {
    w.insert(w.end(), {"--bootstrap", std::to_string(uncertainty.bootstrapReplicates)});
    // The seed fixes every resample whatever the thread count, so threads are not written.
    w.insert(w.end(), {"--seed", std::to_string(uncertainty.seed)});
  }
  if (validation.impute) {
    // Copies, iterations and the seed fix every imputed value whatever the thread count.
    w.insert(w.end(), {"--impute", std::to_string(validation.impute->copies), "--impute-iterations",
                       std::to_string(validation.impute->iterations)});
    if (uncertainty.bootstrapReplicates <= 0) {
      w.insert(w.end(), {"--seed", std::to_string(validation.impute->seed)});
    } else if (uncertainty.seed != validation.impute->seed) {
      w.insert(w.end(), {"--impute-seed", std::to_string(validation.impute->seed)});
    }
  }
  for (const std::string& path : uncertainty.compareModelPaths) {
    w.insert(w.end(), {"--compare", path});
  }
  for (const std::string& column : uncertainty.subgroupColumns) {
    w.insert(w.end(), {"--subgroup", column});
  }
  if (uncertainty.clusterColumn) w.insert(w.end(), {"--cluster", *uncertainty.clusterColumn});
  if (!uncertainty.sampleSize.netBenefitThresholds.empty()) {
    w.insert(w.end(),
             {"--size-thresholds", numberList(uncertainty.sampleSize.netBenefitThresholds)});
  }
  return w;
}

std::optional<std::vector<std::string>> fitCommandWords(const StudyState& study) {
  if (study.modelSource != ModelSource::Fitted || !study.data) return std::nullopt;
  std::vector<std::string> w{"--data", study.data->path};
  addDatabaseWords(w, study.data->database);
  addImportWords(w, csvOptionsFor(study.import),
                 OutcomeSpec{study.import.outcomeColumn, study.import.eventValue});
  w.insert(w.end(), {"--predictors", joined(study.fit.predictors)});
  for (const auto& [column, knots] : study.fit.splineKnots) {
    w.insert(w.end(), {"--spline", column + "=" + std::to_string(knots)});
  }
  if (study.fit.firth) w.push_back("--firth");
  if (study.model && !study.model->name.empty()) w.insert(w.end(), {"--name", study.model->name});
  w.insert(w.end(), {"--out", kFittedModelFile});
  return w;
}

StudyRequests studyRequests(const StudyState& study) {
  if (!study.data) throw InputError("the study has no cohort file");
  if (study.import.outcomeColumn.empty()) throw InputError("the study has no outcome column");
  StudyRequests out;
  ValidationRequest& v = out.validation;
  v.dataPath = study.data->path;
  v.database = study.data->database;
  v.csv = csvOptionsFor(study.import);
  v.outcome = OutcomeSpec{study.import.outcomeColumn, study.import.eventValue};
  switch (study.modelSource) {
    case ModelSource::None:
      throw InputError("the study has no model: load a model file or fit one");
    case ModelSource::File:
      if (!study.modelFile) throw InputError("the study has no model file");
      v.modelPath = study.modelFile->path;
      break;
    case ModelSource::Fitted:
      if (!study.model) throw InputError("the study's fitted model is not saved in it");
      v.model = *study.model;
      break;
  }
  v.columnMapping = study.columnMapping;
  v.levelMapping = study.levelMapping;
  // A model fitted in the workstation is judged on the data it was fitted on (as the pipeline).
  v.developmentData = study.analysis.apparent || study.modelSource == ModelSource::Fitted;
  v.options.groups = study.analysis.groups;
  v.options.thresholds = thresholdRange(0.01, 0.99, 0.01);
  out.uncertainty = uncertaintyRequest(study.uncertaintySettings, nullptr);
  const MissingDataSettings& missing = study.missingData;
  if (!missing.isValid()) throw InputError("the study's missing-data settings are out of range");
  v.copyThreads = study.uncertaintySettings.threads;
  if (!missing.imputationColumn.empty()) v.imputationColumn = missing.imputationColumn;
  if (missing.imputesHere()) {
    ChainedEquationsOptions impute;
    impute.copies = missing.imputeCopies;
    impute.iterations = missing.imputeIterations;
    impute.seed = missing.imputeSeed;
    impute.threads = study.uncertaintySettings.threads;
    v.impute = impute;
  }
  return out;
}

std::string shellQuoted(const std::string& word) {
  if (!word.empty() && word.find_first_not_of("abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ"
                                              "0123456789-_./:=,+@%") == std::string::npos) {
    return word;
  }
  std::string out = "'";
  for (const char c : word) {
    if (c == '\'') {
      out += "'\\''";
    } else {
      out += c;
    }
  }
  return out + "'";
}

std::vector<std::string> poolCommandWords(const std::optional<std::string>& setPath,
                                          const std::vector<std::string>& summaryPaths,
                                          const std::vector<double>& netBenefitThresholds) {
  std::vector<std::string> w = summaryPaths;
  if (setPath) w.insert(w.begin(), {"--set", *setPath});
  if (!netBenefitThresholds.empty()) {
    w.insert(w.end(), {"--report-thresholds", numberList(netBenefitThresholds)});
  }
  return w;
}

std::string commandLine(const std::string& command, const std::vector<std::string>& words) {
  std::string line = "calivera " + command;
  for (const std::string& word : words) line += " " + shellQuoted(word);
  return line;
}

std::string reproduceCommandLine(const StudyState& study) {
  const StudyRequests requests = studyRequests(study);
  std::string line =
      commandLine("validate", validateCommandWords(requests.validation, requests.uncertainty));
  if (const auto fit = fitCommandWords(study)) line = commandLine("fit", *fit) + " && " + line;
  return line;
}

std::optional<std::string> predictorSpaceCommandLine(const StudyState& study) {
  if (study.predictorView.empty()) return std::nullopt;
  const StudyRequests requests = studyRequests(study);
  const ValidationRequest& v = requests.validation;
  if (!v.model && !v.modelPath) return std::nullopt;  // a risk column has no predictors
  std::vector<std::string> w{"--data", v.dataPath};
  addImportWords(w, v.csv, v.outcome);
  w.insert(w.end(), {"--model", v.model ? std::string(kFittedModelFile) : *v.modelPath});
  for (const auto& [variable, column] : v.columnMapping) {
    w.insert(w.end(), {"--map", variable + "=" + column});
  }
  addLevelMappingWords(w, v.levelMapping);
  for (const std::string& variable : study.predictorView) {
    w.insert(w.end(), {"--predictor", variable});
  }
  for (const auto& [variable, value] : study.heldValues) {
    w.insert(w.end(), {"--hold", variable + "=" + value});
  }
  w.insert(w.end(), {"--threshold", formatShortest(study.analysis.threshold)});
  std::string line = commandLine("predictor-space", w);
  if (const auto fit = fitCommandWords(study)) line = commandLine("fit", *fit) + " && " + line;
  return line;
}

}  // namespace calivera
