#include "app/cli/predictor_space_command.h"

#include <iostream>
#include <map>
#include <memory>

#include "app/cli/arguments.h"
#include "app/cli/data_options.h"
#include "app/cli/validate_command.h"
#include "core/model/model_io.h"
#include "core/report/predictor_space_output.h"
#include "core/study/predictor_space.h"
#include "core/study/study_analysis.h"
#include "core/util/errors.h"
#include "core/util/output_transaction.h"

namespace calivera::cli {
namespace {

constexpr const char* kHelp =
    "usage: calivera predictor-space --data COHORT.csv --outcome COL --model MODEL.json\n"
    "                                --predictor VAR [--predictor VAR2] [--hold VAR=VALUE]\n"
    "                                [--threshold T] [--points N] [--grid N] [--map VAR=COLUMN]\n"
    "                                [--map-level VAR:LEVEL=MODEL_LEVEL]\n"
    "                                [--json FILE] [--csv FILE]\n\n"
    "The model's predicted risk against one predictor, or over two, with every other predictor\n"
    "held fixed: the numbers of the workstation's Predictor space tab. Held values default to the\n"
    "median of the analysed patients (numeric) or the reference level (text). With one predictor\n"
    "it prints where the risk crosses the threshold; with two, the boundary where it equals it.\n\n"
    "  --predictor VAR      model variable for the horizontal axis; give it twice for a surface\n"
    "  --hold VAR=VALUE     hold VAR at VALUE instead of its default (repeatable)\n"
    "  --threshold T        the threshold, strictly inside (0, 1) (0.10)\n"
    "  --points N           curve points (200)\n"
    "  --grid N             surface grid points per axis (60)\n"
    "  --map VAR=COLUMN     read the model variable VAR from the cohort column COLUMN\n"
    "  --map-level VAR:LEVEL=MODEL_LEVEL\n"
    "                       read the cohort's LEVEL of VAR as the model's MODEL_LEVEL\n"
    "  --json FILE          the curve or the grid and its boundary, as JSON\n"
    "  --csv FILE           the curve (value, risk) or the grid (x_value, y_value, risk), as CSV\n"
    "Only the model evaluated on a grid and aggregates are written, never a patient's values.\n";

constexpr long long kMaxCurvePoints = 10000;
constexpr long long kMaxGridPoints = 500;

int boundedCount(const Arguments& arguments, const std::string& option, int fallback,
                 long long most) {
  const auto text = arguments.value(option);
  if (!text) return fallback;
  const long long n = parseInteger(*text, option);
  if (n < 2 || n > most) {
    throw InputError(option + ": must be between 2 and " + std::to_string(most));
  }
  return static_cast<int>(n);
}

}  // namespace

int runPredictorSpaceCommand(const std::vector<std::string>& words) {
  OptionSpec spec;
  spec.valued = {"--map-level", "--data",      "--outcome", "--model", "--map",  "--predictor",
                 "--hold",      "--threshold", "--points",  "--grid",  "--json", "--csv"};
  spec.flags = {"--help"};
  addDataOptions(spec);
  const Arguments arguments(words, spec);
  if (arguments.has("--help")) {
    std::cout << kHelp;
    return 0;
  }
  if (arguments.values("--model").size() > 1) throw InputError("--model: give one model file");
  const std::vector<std::string> chosen = arguments.values("--predictor");
  if (chosen.empty() || chosen.size() > 2) {
    throw InputError("--predictor: give one predictor (a curve) or two (a surface)");
  }
  std::map<std::string, std::string> held;
  for (const std::string& item : arguments.values("--hold")) {
    const std::size_t eq = item.find('=');
    if (eq == std::string::npos || eq == 0) {
      throw InputError("--hold: '" + item + "' is not VARIABLE=VALUE");
    }
    held[item.substr(0, eq)] = item.substr(eq + 1);
  }
  double threshold = 0.10;
  if (const auto t = arguments.value("--threshold")) {
    threshold = parseNumber(*t, "--threshold");
    if (!(threshold > 0.0 && threshold < 1.0)) {
      throw InputError("--threshold: must lie strictly between 0 and 1");
    }
  }
  const int points = boundedCount(arguments, "--points", 200, kMaxCurvePoints);
  const int grid = boundedCount(arguments, "--grid", 60, kMaxGridPoints);

  const ValidationRequest request = validationRequestFrom(arguments);
  std::vector<std::pair<std::string, std::string>> outputs;
  if (const auto p = arguments.value("--json")) outputs.emplace_back("--json", *p);
  if (const auto p = arguments.value("--csv")) outputs.emplace_back("--csv", *p);
  refuseOverwritingInputs(
      outputs, {{"cohort file", request.dataPath}, {"model file", request.modelPath.value_or("")}});

  // The analysed patients as `validate` (and the workstation) selects them: held defaults are
  // their medians and reference levels.
  Model model = readModelFile(*request.modelPath);
  model.levelMapping = request.levelMapping;
  const auto run = std::make_shared<const ValidationRun>(runValidation(request));
  const CohortData cohort{run};
  const std::vector<PredictorInfo> predictors =
      describePredictors(model, request.columnMapping, cohort);
  const auto known = [&](const std::string& variable) {
    for (const PredictorInfo& p : predictors) {
      if (p.variable == variable) return true;
    }
    return false;
  };
  std::string names;
  for (const PredictorInfo& p : predictors) names += (names.empty() ? "" : ", ") + p.variable;
  for (const std::string& v : chosen) {
    if (!known(v))
      throw InputError("--predictor: the model has no variable '" + v + "' (" + names + ")");
  }
  for (const auto& [variable, value] : held) {
    if (!known(variable)) {
      throw InputError("--hold: the model has no variable '" + variable + "' (" + names + ")");
    }
  }
  // Every predictor at its default unless held otherwise, as the workstation passes them.
  std::map<std::string, std::string> heldAll;
  for (const PredictorInfo& p : predictors) {
    const auto it = held.find(p.variable);
    heldAll[p.variable] = it == held.end() ? p.defaultValue : it->second;
  }

  std::string summary, json, csv;
  if (chosen.size() == 1 || chosen[0] == chosen[1]) {
    const RiskCurveData curve =
        riskCurve(model, request.columnMapping, cohort, predictors, chosen[0], heldAll, points);
    summary = riskCurveSummary(curve, threshold);
    json = riskCurveJson(curve, threshold);
    csv = riskCurveCsv(curve);
  } else {
    const BoundaryData surface = riskSurface(model, request.columnMapping, cohort, predictors,
                                             chosen[0], chosen[1], heldAll, grid);
    summary = riskSurfaceSummary(surface, threshold);
    json = riskSurfaceJson(surface, threshold);
    csv = riskSurfaceCsv(surface);
  }
  OutputTransaction files;
  if (const auto p = arguments.value("--csv")) files.add(*p, csv);
  if (const auto p = arguments.value("--json")) files.add(*p, json);
  files.commit();
  if (!arguments.value("--json")) std::cout << summary;
  return 0;
}

}  // namespace calivera::cli
