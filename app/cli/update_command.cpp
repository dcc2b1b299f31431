// calivera update: updates an existing model on local data (intercept update, logistic
// recalibration or full refit; Steyerberg et al. 2004), writes the updated model file with its
// provenance, and reports the closed testing procedure's suggestion (Vergouwe et al. 2017).
#include "app/cli/update_command.h"

#include <iostream>
#include <nlohmann/json.hpp>

#include "app/cli/arguments.h"
#include "app/cli/data_options.h"
#include "app/cli/local_cohort.h"
#include "core/model/model_io.h"
#include "core/present/caution.h"
#include "core/present/number_text.h"
#include "core/report/model_tool_tables.h"
#include "core/uncertainty/model_update.h"
#include "core/uncertainty/uncertainty_json.h"
#include "core/util/errors.h"
#include "core/util/output_transaction.h"

namespace calivera::cli {
namespace {

void printHelp() {
  std::cout
      << "usage: calivera update --data FILE --outcome COLUMN --model MODEL.json\n"
         "                       --method intercept|recalibrate|refit --out NEW.json\n"
         "                       [--event-value V] [--missing TOKEN] [--delimiter C] [--firth] "
         "[--alpha A]\n"
         "                       [--json FILE]\n\n"
         "  intercept     re-estimate the intercept only (linear predictor as offset)\n"
         "  recalibrate   logit p = a + b * LP; intercept a + b * intercept, coefficients * b\n"
         "  refit         re-estimate every coefficient on the local data (--firth: Firth)\n"
         "The closed testing procedure (likelihood-ratio tests at level --alpha, default 0.05)\n"
         "suggests the least update the data support; --json writes the details.\n";
}

}  // namespace

int runUpdateCommand(const std::vector<std::string>& words) {
  OptionSpec spec{{"--data", "--outcome", "--model", "--method", "--out", "--alpha", "--json"},
                  {"--firth", "--help"}};
  addDataOptions(spec);
  const Arguments args(words, spec);
  if (args.has("--help")) {
    printHelp();
    return 0;
  }
  const std::string methodText = args.required("--method");
  const auto method = parseUpdateMethod(methodText);
  if (!method) {
    throw InputError("--method: '" + methodText + "' is not one of intercept, recalibrate, refit");
  }
  const std::string out = args.required("--out");
  const double alpha =
      args.value("--alpha") ? parseNumber(*args.value("--alpha"), "--alpha") : 0.05;
  if (!(alpha > 0.0 && alpha < 1.0)) throw InputError("--alpha: must lie between 0 and 1");
  const std::string modelPath = args.required("--model");
  {
    std::vector<std::pair<std::string, std::string>> outputs{{"--out", out}};
    if (const auto j = args.value("--json")) outputs.emplace_back("--json", *j);
    refuseOverwritingInputs(outputs,
                            {{"model file", modelPath}, {"cohort file", args.required("--data")}});
  }
  const Model model = readModelFile(modelPath);
  const CohortData cohort = loadLocalCohort(args, modelPath);
  const UpdateData data = updateDataOf(cohort);
  UpdateOptions options;
  options.firth = args.has("--firth");
  const ClosedTestResult closed = closedTest(model, data, alpha, options);
  const UpdatedModel updated = updateModel(model, data, *method, options);
  // The model file and the JSON report: all or none (core/util/output_transaction.h).
  OutputTransaction files;
  files.add(out, modelToJson(updated.model));

  if (const auto jsonPath = args.value("--json")) {
    nlohmann::json report = {{"model", modelPath},
                             {"data", cohort.run->request.dataPath},
                             {"data_sha256", cohort.run->dataSha256},
                             {"n", cohort.rows().size()},
                             {"events", cohort.run->result.cohort.events},
                             {"method", updateMethodName(*method)},
                             {"recalibration_intercept", updated.recalibrationIntercept},
                             {"recalibration_slope", updated.recalibrationSlope},
                             {"deviance", updated.deviance},
                             {"out", out},
                             {"closed_test", toJson(closed)},
                             {"warnings", updated.warnings}};
    files.add(*jsonPath, report.dump(2) + "\n");
  }
  files.commit();

  printExclusions(std::cout, cohort);
  std::cout << "model: " << modelPath << "\nmethod: " << updateMethodName(*method);
  if (*method != UpdateMethod::Refit) {
    std::cout << " (a = " << formatNumber(updated.recalibrationIntercept, 3)
              << ", b = " << formatNumber(updated.recalibrationSlope, 3) << ")";
  }
  std::cout << "\ndeviance on the local data: " << formatNumber(updated.deviance, 2)
            << "\nclosed test (alpha " << alpha << "):\n"
            << tableText(closedTestTable(closed));
  std::cout << "suggested update: " << updateMethodName(closed.suggested) << '\n';
  if (closed.suggested != *method) {
    std::cout << "note: the data support '" << updateMethodName(closed.suggested)
              << "'; you chose '" << updateMethodName(*method) << "'\n";
  }
  for (const auto& w : updated.warnings) std::cout << "warning: " << w << '\n';
  std::cout << "wrote " << out << '\n';
  std::cout << '\n' << kCautionText << '\n';
  return 0;
}

}  // namespace calivera::cli
