// calivera validate --data COHORT.csv --outcome COL (--model MODEL.json | --risk COL)
//                   [--groups G] [--thresholds FROM:TO:STEP | T1,T2,...] [--json REPORT.json]
//                   [--csv-dir DIR] [--delimiter C] [--missing LIST] [--event-value V]
//                   [--pdf REPORT.pdf [--title TEXT] [--suppress-below N] [--paper a4|letter]]
// The analysis is core's runValidation(); this file only parses options and writes outputs.
#include "app/cli/validate_command.h"

#include <filesystem>
#include <iostream>
#include <sstream>

#include "app/cli/arguments.h"
#include "app/cli/data_options.h"
#include "app/cli/validate_uncertainty.h"
#include "core/metrics/validation_run.h"
#include "core/report/audit_run.h"
#include "core/report/uncertainty_tables.h"
#include "core/report/validation_json.h"
#include "core/report/validation_summary.h"
#include "core/report/validation_tables.h"
#include "core/study/limits.h"
#include "core/study/reproduce_command.h"
#include "core/util/atomic_file.h"
#include "core/util/errors.h"
#include "core/util/output_transaction.h"
#include "core/util/stage_times.h"
#ifdef CALIVERA_HAVE_PDF
#include "render/report/audit_pdf_writer.h"
#endif

namespace calivera::cli {
namespace {

constexpr const char* kHelp =
    "usage: calivera validate --data COHORT.csv --outcome COL (--model MODEL.json | --risk COL)\n"
    "                         [--map VAR=COLUMN] [--map-level VAR:LEVEL=MODEL_LEVEL]\n"
    "                         [--imputation-column COL |\n"
    "                          --impute M [--impute-iterations K] [--impute-seed S]]\n"
    "                         [--development-data] [--groups G] [--thresholds "
    "FROM:TO:STEP | T1,T2,...]\n"
    "                         [--json REPORT.json] [--csv-dir DIR]\n"
    "                         [--pdf REPORT.pdf [--title TEXT] [--suppress-below N]\n"
    "                          [--paper a4|letter] [--reasonable-range LO:HI]\n"
    "                          [--report-thresholds T1,T2,...]]\n\n"
    "Discrimination, calibration and clinical utility of predicted risks on a cohort.\n\n"
    "  --data FILE          cohort CSV (header row), or a SAS .sas7bdat, Stata .dta or\n"
    "                       SPSS .sav/.zsav file (value labels read as categories)\n"
    "  --outcome COL        outcome column (0/1, or see --event-value)\n"
    "  --model FILE         model file: risks from its linear predictor\n"
    "  --risk COL           or: a column of predicted risks in [0, 1]\n"
    "  --map VAR=COLUMN     read the model variable VAR from the cohort column COLUMN\n"
    "                       (repeatable)\n"
    "  --map-level VAR:LEVEL=MODEL_LEVEL\n"
    "                       read the cohort's LEVEL of the categorical variable VAR as the\n"
    "                       model's MODEL_LEVEL (repeatable; for categories spelled differently)\n"
    "  --development-data   the cohort is the model's development data: performance is\n"
    "                       apparent (Hosmer-Lemeshow on g-2 df) even when the model file's\n"
    "                       fingerprint of its data does not match the cohort file\n"
    "  --imputation-column COL\n"
    "                       the cohort stacks imputed copies numbered by COL (0: the\n"
    "                       original data, required; 1..m: the copies, same patients in the\n"
    "                       same order): results on the original data's complete cases, plus\n"
    "                       every copy's validation pooled by Rubin's rules\n"
    "  --impute M           impute the model's missing predictor values M times (2 to 1000)\n"
    "                       by chained equations (numbers: predictive mean matching;\n"
    "                       categories: logistic or multinomial regression; the outcome and\n"
    "                       every model column in each imputation model; the outcome is never\n"
    "                       imputed), validate every copy and pool by Rubin's rules; --seed S\n"
    "                       (default 1) gives the same copies for any --threads\n"
    "  --impute-iterations K\n"
    "                       cycles through the incomplete columns (default 10)\n"
    "  --impute-seed S      seed of the imputation alone, when it differs from the\n"
    "                       bootstrap's --seed\n"
    "  --groups G           risk groups for Hosmer-Lemeshow and the calibration table (10)\n"
    "  --thresholds T       FROM:TO:STEP or a list T1,T2,... strictly inside (0, 1)\n"
    "                       (0.01:0.99:0.01); a patient is flagged when risk >= threshold\n"
    "  --json FILE          write the full report as JSON instead of the summary on stdout\n"
    "  --csv-dir DIR        also write every table as CSV into DIR (with the sample-size,\n"
    "                       bootstrap, comparison and subgroup tables when computed)\n"
    "  --pdf FILE           also write the audit report as PDF (aggregates only; with\n"
    "                       SOURCE_DATE_EPOCH set, byte-identical for the same inputs)\n"
    "  --title TEXT         the report's title\n"
    "  --analyst NAME, --reviewer NAME\n"
    "                       names on the report's sign-off lines (blank lines to sign when\n"
    "                       not given)\n"
    "  --suppress-below N   in the report, show counts from 1 to N-1 as <N and hide the\n"
    "                       counts that would reveal them (off by default)\n"
    "  --paper SIZE         a4 (default) or letter\n"
    "  --reasonable-range LO:HI\n"
    "                       the clinically reasonable thresholds (your choice, not the\n"
    "                       data's): shaded on the report's decision curve, and the range of\n"
    "                       its net-benefit comparison\n"
    "  --report-thresholds T1,T2,...\n"
    "                       the rows of the report's threshold table, each among the\n"
    "                       computed thresholds (default: 0.05, 0.1, 0.2, 0.3, 0.5, or every\n"
    "                       threshold when at most 12 are computed)\n";

std::vector<double> parseThresholds(const std::string& text) {
  const std::string option = "--thresholds";
  if (text.find(':') != std::string::npos) {
    const std::vector<std::string> parts = [&] {
      std::vector<std::string> p;
      std::size_t start = 0;
      while (true) {
        const std::size_t colon = text.find(':', start);
        p.push_back(text.substr(start, colon == std::string::npos ? colon : colon - start));
        if (colon == std::string::npos) break;
        start = colon + 1;
      }
      return p;
    }();
    if (parts.size() != 3) throw InputError(option + ": '" + text + "' is not FROM:TO:STEP");
    try {
      return thresholdRange(parseNumber(parts[0], option), parseNumber(parts[1], option),
                            parseNumber(parts[2], option));
    } catch (const InputError& error) {
      throw InputError(option + ": " + error.what());
    }
  }
  std::vector<double> values;
  for (const std::string& item : splitList(text, option))
    values.push_back(parseNumber(item, option));
  return values;
}

}  // namespace

std::size_t suppressBelowFrom(const std::string& value) {
  const long long below = parseInteger(value, "--suppress-below");
  if (below < kSuppressBelowLimit.min || below > kSuppressBelowLimit.max) {
    throw InputError("--suppress-below: must be between " +
                     std::to_string(kSuppressBelowLimit.min) + " and " +
                     std::to_string(kSuppressBelowLimit.max));
  }
  return static_cast<std::size_t>(below);
}

void addValidateOptions(OptionSpec& spec) {
  spec.valued.insert({"--data",
                      "--outcome",
                      "--model",
                      "--risk",
                      "--groups",
                      "--thresholds",
                      "--map",
                      "--map-level",
                      "--json",
                      "--csv-dir",
                      "--pdf",
                      "--title",
                      "--analyst",
                      "--reviewer",
                      "--suppress-below",
                      "--paper",
                      "--reasonable-range",
                      "--report-thresholds",
                      "--imputation-column",
                      "--impute",
                      "--impute-iterations",
                      "--impute-seed"});
  spec.flags.insert({"--help", "--development-data"});
  addDataOptions(spec);
  addUncertaintyOptions(spec);  // uncertainty: --bootstrap, --compare, --subgroup, ...
}

ValidateOutputs validateOutputsFrom(const Arguments& arguments) {
  ValidateOutputs out;
  out.jsonPath = arguments.value("--json");
  out.csvDir = arguments.value("--csv-dir");
  out.pdfPath = arguments.value("--pdf");
  if (!out.pdfPath &&
      (arguments.has("--title") || arguments.has("--suppress-below") || arguments.has("--paper") ||
       arguments.has("--reasonable-range") || arguments.has("--report-thresholds") ||
       arguments.has("--analyst") || arguments.has("--reviewer"))) {
    throw InputError(
        "--title, --analyst, --reviewer, --suppress-below, --paper, --reasonable-range and "
        "--report-thresholds need --pdf");
  }
  for (const auto& [option, name] :
       {std::pair{"--analyst", &out.analyst}, std::pair{"--reviewer", &out.reviewer}}) {
    *name = arguments.value(option).value_or("");
    if (name->size() > kMaxSignOffNameBytes) {
      throw InputError(std::string(option) + ": longer than " +
                       std::to_string(kMaxSignOffNameBytes) + " bytes");
    }
  }
  if (const auto list = arguments.value("--report-thresholds")) {
    const std::string option = "--report-thresholds";
    for (const std::string& item : splitList(*list, option)) {
      const double t = parseNumber(item, option);
      if (!(t > 0.0 && t < 1.0)) {
        throw InputError(option + ": " + item + " is not strictly between 0 and 1");
      }
      out.tableThresholds.push_back(t);
    }
  }
  out.title = arguments.value("--title").value_or("");
  if (const auto r = arguments.value("--reasonable-range")) {
    const std::size_t colon = r->find(':');
    if (colon == std::string::npos)
      throw InputError("--reasonable-range: give LO:HI, e.g. 0.05:0.30");
    const double lo = parseNumber(r->substr(0, colon), "--reasonable-range");
    const double hi = parseNumber(r->substr(colon + 1), "--reasonable-range");
    if (!(lo > 0.0 && lo < hi && hi < 1.0)) {
      throw InputError("--reasonable-range: need 0 < LO < HI < 1, got " + *r);
    }
    out.reasonable = Interval{lo, hi};
  }
  if (const auto n = arguments.value("--suppress-below")) out.suppressBelow = suppressBelowFrom(*n);
  out.paper = arguments.value("--paper").value_or("a4");  // checked where the PDF is made
  return out;
}

ValidationRequest validationRequestFrom(const Arguments& arguments) {
  ValidationRequest request;
  request.dataPath = arguments.required("--data");
  request.outcome.column = arguments.required("--outcome");
  request.outcome.eventValue = eventValueFrom(arguments);
  request.csv = csvOptionsFrom(arguments);
  request.database = databaseSelectionFrom(arguments);
  request.modelPath = primaryModelPath(arguments);  // uncertainty: later --model are compared
  request.riskColumn = arguments.value("--risk");
  if (request.modelPath.has_value() == request.riskColumn.has_value()) {
    throw InputError("give exactly one of --model and --risk");
  }
  for (const std::string& item : arguments.values("--map")) {
    const std::size_t eq = item.find('=');
    if (eq == std::string::npos || eq == 0 || eq + 1 == item.size()) {
      throw InputError("--map: '" + item + "' is not VARIABLE=COLUMN");
    }
    if (request.riskColumn) throw InputError("--map: needs --model (a risk column has no terms)");
    const std::string variable = item.substr(0, eq);
    if (request.columnMapping.count(variable) != 0) {
      throw InputError("--map: variable '" + variable + "' is mapped twice");
    }
    request.columnMapping[variable] = item.substr(eq + 1);
  }
  for (const std::string& item : arguments.values("--map-level")) {
    // VARIABLE:LEVEL=MODEL_LEVEL, split at the first ':' and the first '=' after it.
    const std::size_t colon = item.find(':');
    const std::size_t eq = colon == std::string::npos ? colon : item.find('=', colon + 1);
    if (colon == std::string::npos || colon == 0 || eq == std::string::npos) {
      throw InputError("--map-level: '" + item + "' is not VARIABLE:LEVEL=MODEL_LEVEL");
    }
    if (request.riskColumn)
      throw InputError("--map-level: needs --model (a risk column has no terms)");
    const std::string variable = item.substr(0, colon);
    const std::string from = item.substr(colon + 1, eq - colon - 1);
    auto& levels = request.levelMapping[variable];
    if (levels.count(from) != 0) {
      throw InputError("--map-level: level '" + from + "' of '" + variable + "' is mapped twice");
    }
    levels[from] = item.substr(eq + 1);
  }
  request.developmentData = arguments.has("--development-data");
  request.imputationColumn = arguments.value("--imputation-column");
  if (const auto m = arguments.value("--impute")) {
    if (request.imputationColumn) {
      throw InputError(
          "--impute: give --impute (copies made here) or --imputation-column "
          "(copies made elsewhere), not both");
    }
    ChainedEquationsOptions impute;
    const long long copies = parseInteger(*m, "--impute");
    if (copies < kImputeCopiesLimit.min || copies > kImputeCopiesLimit.max) {
      throw InputError("--impute: give " + std::to_string(kImputeCopiesLimit.min) + " to " +
                       std::to_string(kImputeCopiesLimit.max) + " copies");
    }
    impute.copies = static_cast<int>(copies);
    if (const auto k = arguments.value("--impute-iterations")) {
      const long long iterations = parseInteger(*k, "--impute-iterations");
      if (iterations < kImputeIterationsLimit.min || iterations > kImputeIterationsLimit.max) {
        throw InputError("--impute-iterations: give " + std::to_string(kImputeIterationsLimit.min) +
                         " to " + std::to_string(kImputeIterationsLimit.max) + " iterations");
      }
      impute.iterations = static_cast<int>(iterations);
    }
    if (const auto seed = seedOption(arguments)) impute.seed = *seed;
    if (const auto seed = seedOption(arguments, "--impute-seed")) impute.seed = *seed;
    if (const auto threads = threadsOption(arguments)) impute.threads = *threads;
    request.impute = impute;
  } else {
    for (const char* option : {"--impute-iterations", "--impute-seed"}) {
      if (arguments.has(option)) throw InputError(std::string(option) + ": needs --impute M");
    }
  }
  if (const auto threads = threadsOption(arguments)) request.copyThreads = *threads;
  if (const auto g = arguments.value("--groups")) {
    const long long groups = parseInteger(*g, "--groups");
    if (groups < kGroupsLimit.min || groups > kGroupsLimit.max) {
      throw InputError("--groups: must be between " + std::to_string(kGroupsLimit.min) + " and " +
                       std::to_string(kGroupsLimit.max));
    }
    request.options.groups = static_cast<int>(groups);
  }
  if (const auto t = arguments.value("--thresholds")) {
    request.options.thresholds = parseThresholds(*t);
    for (const double v : request.options.thresholds) {
      if (!(v > 0.0 && v < 1.0)) {
        throw InputError("--thresholds: " + std::to_string(v) + " is not strictly between 0 and 1");
      }
    }
  }
  return request;
}

int executeValidation(const ValidationRequest& request, const UncertaintyRequest& uncertaintyWanted,
                      const ValidateOutputs& outputs, const std::string& reproduceLine,
                      const std::function<void(const ValidationRun&)>& afterRun) {
#ifdef CALIVERA_HAVE_PDF
  const report::PaperSize paper = report::parsePaperSize(outputs.paper, "--paper");
#else
  if (outputs.pdfPath) {
    throw InputError("--pdf: this build has no PDF report (built without the UI)");
  }
#endif
  // No output may overwrite an input (the cohort, the model, a compared model), nor another
  // output; checked before any work is done.
  std::vector<std::pair<std::string, std::string>> outputPaths;
  if (outputs.jsonPath) outputPaths.emplace_back("--json", *outputs.jsonPath);
  if (outputs.pdfPath) outputPaths.emplace_back("--pdf", *outputs.pdfPath);
  if (outputs.csvDir) outputPaths.emplace_back("--csv-dir", *outputs.csvDir);
  std::vector<std::pair<std::string, std::string>> inputPaths{{"cohort file", request.dataPath}};
  if (request.modelPath && !request.model)
    inputPaths.emplace_back("model file", *request.modelPath);
  for (const std::string& m : uncertaintyWanted.compareModelPaths) {
    inputPaths.emplace_back("compared model file", m);
  }
  refuseOverwritingInputs(outputPaths, inputPaths);
  // The line that reproduces this run, from the request as given (before the run fills it in).
  const std::string reproduce =
      reproduceLine.empty()
          ? commandLine("validate", validateCommandWords(request, uncertaintyWanted))
          : reproduceLine;
  // Only the columns the analysis reads are parsed and kept (issue 13: time and memory scale with
  // them, not with the file's width); every record's field count is still checked.
  ValidationRequest projected = request;
  std::vector<std::string> groupingColumns = uncertaintyWanted.subgroupColumns;
  if (uncertaintyWanted.clusterColumn) groupingColumns.push_back(*uncertaintyWanted.clusterColumn);
  projected.csv.onlyColumns =
      analysisColumns(request, uncertaintyWanted.compareModelPaths, groupingColumns);
  markStage("arguments read");
  ValidationRun run = runValidation(projected);
  run.request.csv.onlyColumns.clear();  // the run as the user asked for it
  if (afterRun) afterRun(run);
  // uncertainty: sample size (always), bootstrap intervals, comparison, subgroups.
  const UncertaintyRequest& uncertaintyRequest = uncertaintyWanted;
  const UncertaintyResults uncertainty = runUncertainty(run, uncertaintyRequest);
  markStage("uncertainty");
  // Every output is rendered before anything is written; the JSON is written last so a reader
  // that waits for it sees the tables too.
  const std::string jsonText =
      outputs.jsonPath ? validationJsonText(run, uncertainty) : std::string();
  markStage("json rendered");
#ifdef CALIVERA_HAVE_PDF
  std::string pdf;
  if (outputs.pdfPath) {
    AuditReportInput input =
        auditInputFromRun(run, outputs.title, outputs.suppressBelow, uncertainty);
    input.settings.reasonableThresholds = outputs.reasonable;
    input.signOff = {outputs.analyst, outputs.reviewer};
    input.studyFile = outputs.studyFile;
    if (!outputs.tableThresholds.empty()) input.settings.tableThresholds = outputs.tableThresholds;
    pdf = report::renderAuditReportPdf(input, paper);
  }
#endif
  // Every file of the run, all or none (core/util/output_transaction.h); the JSON last.
  OutputTransaction files;
#ifdef CALIVERA_HAVE_PDF
  if (outputs.pdfPath) files.add(*outputs.pdfPath, std::move(pdf));
#endif
  if (outputs.csvDir) {
    for (auto& [name, text] : allValidationTables(run, uncertainty)) {
      files.add((std::filesystem::path(*outputs.csvDir) / name).string(), std::move(text),
                /*createFolder=*/true);
    }
  }
  if (outputs.jsonPath) files.add(*outputs.jsonPath, jsonText);
  files.commit();
  markStage("outputs written");
  if (!outputs.jsonPath) {
    printSampleSizeSummary(std::cout, uncertainty);  // uncertainty: adequacy before results
    std::ostringstream beforeCaution;
    printUncertaintySummary(beforeCaution, uncertainty);
    beforeCaution << "\nReproduce with:\n  " << reproduce << "\n";
    std::cout << validationSummaryText(run, beforeCaution.str());
  }
  return 0;
}

namespace {

int validateBody(const std::vector<std::string>& words) {
  OptionSpec spec;
  addValidateOptions(spec);
  const Arguments arguments(words, spec);
  if (arguments.has("--help")) {
    std::cout << kHelp << kDataOptionsHelp << uncertaintyOptionsHelp();
    return 0;
  }
  if (!arguments.positional().empty()) {
    throw InputError("unexpected argument '" + arguments.positional().front() + "'");
  }
  const ValidationRequest request = validationRequestFrom(arguments);
  const ValidateOutputs outputs = validateOutputsFrom(arguments);
  // `validate --cluster` pools net benefit at the thresholds its report tabulates
  // (--report-thresholds). `calivera run` does not: it pools at the default thresholds, as the
  // workstation does for the same study, whatever the report's own table rows are.
  UncertaintyRequest uncertainty = uncertaintyRequest(arguments);
  if (uncertainty.clusterThresholds.empty())
    uncertainty.clusterThresholds = outputs.tableThresholds;
  return executeValidation(request, uncertainty, outputs);
}

}  // namespace

int runValidateCommand(const std::vector<std::string>& words) {
  return validateBody(words);
}

}  // namespace calivera::cli
