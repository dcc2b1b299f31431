// calivera internal: internal validation of a model fitted on this data by bootstrap optimism
// correction (Efron 1983; Harrell, Lee & Mark 1996). Every replicate refits the model's terms
// (with Firth when the model was fitted so, or with --firth) on a resample; the corrected
// calibration slope is offered as a uniform shrinkage factor (--shrunk-out).
#include "app/cli/internal_command.h"

#include <iostream>
#include <nlohmann/json.hpp>

#include "app/cli/arguments.h"
#include "app/cli/data_options.h"
#include "app/cli/local_cohort.h"
#include "core/model/model_io.h"
#include "core/present/caution.h"
#include "core/present/number_text.h"
#include "core/report/model_tool_tables.h"
#include "core/uncertainty/internal_validation.h"
#include "core/uncertainty/uncertainty_json.h"
#include "core/util/errors.h"
#include "core/util/output_transaction.h"

namespace calivera::cli {
namespace {

void printHelp() {
  std::cout
      << "usage: calivera internal --data FILE --outcome COLUMN --model FITTED.json\n"
         "                         [--bootstrap B] [--seed S] [--threads N] [--firth]\n"
         "                         [--shrunk-out FILE] [--json FILE] [--no-ici]\n"
         "                         [--development-data]\n"
         "                         [--event-value V] [--missing TOKEN] [--delimiter C]\n\n"
         "Bootstrap optimism correction of AUC, calibration slope and intercept, Brier and ICI\n"
         "for a model fitted on FILE (e.g. by 'calivera fit'). B resamples (default 200) with\n"
         "seed S (default 1) on N threads (default all); same seed, same result for any N.\n"
         "--shrunk-out writes the model with coefficients times the corrected slope and the\n"
         "intercept re-estimated so that mean predicted risk equals the observed proportion.\n"
         "The model must have been fitted on FILE: its file's record of its development data\n"
         "(SHA-256, as 'calivera fit' writes it) must match, or --development-data states it.\n"
         "A published model is validated with 'calivera validate' instead.\n";
}

}  // namespace

int runInternalCommand(const std::vector<std::string>& words) {
  OptionSpec spec{{"--data", "--outcome", "--model", "--bootstrap", "--seed", "--threads",
                   "--shrunk-out", "--json"},
                  {"--firth", "--no-ici", "--development-data", "--help"}};
  addDataOptions(spec);
  const Arguments args(words, spec);
  if (args.has("--help")) {
    printHelp();
    return 0;
  }
  OptimismOptions options;
  if (const auto b = args.value("--bootstrap")) {
    const long long replicates = parseInteger(*b, "--bootstrap");
    if (replicates < 1 || replicates > 100000) {
      throw InputError("--bootstrap: give 1 to 100000 replicates");
    }
    options.bootstrap.replicates = static_cast<int>(replicates);
  }
  if (const auto s = args.value("--seed")) {
    const long long seed = parseInteger(*s, "--seed");
    if (seed < 0) throw InputError("--seed: give a non-negative whole number");
    options.bootstrap.seed = static_cast<std::uint64_t>(seed);
  }
  if (const auto t = args.value("--threads")) {
    const long long threads = parseInteger(*t, "--threads");
    if (threads < 1 || threads > 1024) throw InputError("--threads: give 1 to 1024");
    options.bootstrap.threads = static_cast<unsigned>(threads);
  }
  options.includeIci = !args.has("--no-ici");

  const std::string modelPath = args.required("--model");
  {
    std::vector<std::pair<std::string, std::string>> outputs;
    if (const auto s = args.value("--shrunk-out")) outputs.emplace_back("--shrunk-out", *s);
    if (const auto j = args.value("--json")) outputs.emplace_back("--json", *j);
    refuseOverwritingInputs(outputs,
                            {{"model file", modelPath}, {"cohort file", args.required("--data")}});
  }
  const Model model = readModelFile(modelPath);
  const CohortData cohort = loadLocalCohort(args, modelPath, args.has("--development-data"));
  options.fit.firth = args.has("--firth");
  const UpdateData data = updateDataOf(cohort);
  const InternalValidation internal =
      internalValidation(model, data, options, args.has("--development-data"));
  const OptimismResult& result = internal.optimism;
  const std::vector<std::string>& warnings = internal.warnings;

  printExclusions(std::cout, cohort);
  std::cout << "model: " << modelPath << (internal.firth ? " (refitted with Firth)" : "")
            << "\nbootstrap: " << result.run.replicates << " replicates, seed " << result.run.seed
            << ", " << result.run.threads << " threads, " << result.run.failed << " failed\n";
  std::cout << tableText(optimismTable(result));
  std::cout << "shrinkage factor (the calibration slope on new patients): "
            << formatNumber(result.shrinkageFactor, 3) << '\n';
  for (const auto& w : warnings) std::cout << "warning: " << w << '\n';

  nlohmann::json report = toJson(result);
  report["model"] = modelPath;
  report["data"] = cohort.run->request.dataPath;
  report["data_sha256"] = cohort.run->dataSha256;
  report["warnings"] = warnings;
  // The shrunk model and the JSON report: all or none (core/util/output_transaction.h).
  OutputTransaction files;
  if (const auto shrunkPath = args.value("--shrunk-out")) {
    const Model shrunk = shrunkModel(model, data, result.shrinkageFactor, internal.firth);
    files.add(*shrunkPath, modelToJson(shrunk));
    report["shrunk_model"] = *shrunkPath;
  }
  if (const auto jsonPath = args.value("--json")) files.add(*jsonPath, report.dump(2) + "\n");
  files.commit();
  if (const auto shrunkPath = args.value("--shrunk-out"))
    std::cout << "wrote " << *shrunkPath << '\n';
  std::cout << '\n' << kCautionText << '\n';
  return 0;
}

}  // namespace calivera::cli
