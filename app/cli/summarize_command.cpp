#include "app/cli/summarize_command.h"

#include <filesystem>
#include <iostream>

#include "app/cli/arguments.h"
#include "app/cli/data_options.h"
#include "app/cli/validate_command.h"
#include "core/metrics/validation_run.h"
#include "core/present/caution.h"
#include "core/present/number_text.h"
#include "core/sites/site_summary.h"
#include "core/util/errors.h"
#include "core/util/output_transaction.h"
#include "core/util/shown_text.h"

namespace calivera::cli {
namespace {

constexpr const char* kHelp =
    "usage: calivera summarize --data COHORT.csv --outcome COLUMN (--model MODEL.json | --risk "
    "COLUMN)\n"
    "                          --out SITE.cvsummary [--site NAME] [--suppress-below N]\n\n"
    "Validates the model on this site's cohort and writes only aggregates to SITE.cvsummary\n"
    "(JSON, readable before it is sent): counts, the measures with their standard errors,\n"
    "threshold counts, histograms of logit(risk) by outcome in bins of 0.02, Hosmer-Lemeshow\n"
    "group sums, the calibration curve at fixed risks, the model's and the data's SHA-256, the\n"
    "software version and the suppression applied. No patient row, identifier or single\n"
    "patient's value. `calivera pool` combines the summaries of several sites.\n\n"
    "options:\n"
    "  --site NAME            the site's name in every output (default: the cohort file's name,\n"
    "                         or the database table's; required with --query)\n"
    "  --suppress-below N     withhold threshold counts and group counts with a cell below N,\n"
    "                         merge histogram bins until each holds 0 or >= N of each outcome\n"
    "  --groups G             risk groups (default 10)\n"
    "  --thresholds T1,T2,..  threshold grid (FROM:TO:STEP or a list; default 0.01:0.99:0.01)\n"
    "  --map VAR=COLUMN       read model variable VAR from COLUMN (repeatable)\n"
    "  --map-level VAR:LEVEL=MODEL_LEVEL\n"
    "  --development-data     the cohort is the model's development data (apparent)\n";

}  // namespace

int runSummarizeCommand(const std::vector<std::string>& words) {
  OptionSpec spec;
  spec.valued = {"--data",   "--outcome",    "--model", "--risk", "--map",           "--map-level",
                 "--groups", "--thresholds", "--out",   "--site", "--suppress-below"};
  spec.flags = {"--help", "--development-data"};
  addDataOptions(spec);
  const Arguments arguments(words, spec);
  if (arguments.has("--help")) {
    std::cout << kHelp << kDataOptionsHelp;
    return 0;
  }
  if (!arguments.positional().empty()) {
    throw InputError("unexpected argument '" + arguments.positional().front() + "'");
  }
  if (arguments.values("--model").size() > 1) throw InputError("--model: give one model file");
  ValidationRequest request = validationRequestFrom(arguments);
  const std::string out = arguments.required("--out");
  SummaryOptions options;
  if (const auto site = arguments.value("--site")) {
    options.site = *site;
  } else if (!request.database) {
    options.site = std::filesystem::path(request.dataPath).stem().string();
  } else if (!request.database->table.empty()) {
    options.site = request.database->table;  // a database table names the site as a file does
  } else {
    throw InputError("--site: give the site's name (a query has no file name to default to)");
  }
  if (options.site.empty() || options.site.size() > kMaxSiteNameBytes) {
    throw InputError("--site: give a name of 1 to " + std::to_string(kMaxSiteNameBytes) + " bytes");
  }
  if (const auto n = arguments.value("--suppress-below")) {
    options.suppressBelow = suppressBelowFrom(*n);
  }
  if (!options.isValid()) throw InputError("--site: the name is not valid UTF-8");
  std::vector<std::pair<std::string, std::string>> inputs{{"cohort file", request.dataPath}};
  if (request.modelPath) inputs.emplace_back("model file", *request.modelPath);
  refuseOverwritingInputs({{"--out", out}}, inputs);

  request.csv.onlyColumns = analysisColumns(request, {}, {});
  ValidationRun run = runValidation(request);
  const SiteSummary summary = summarizeRun(run, options);
  OutputTransaction files;
  files.add(out, siteSummaryText(summary));
  files.commit();

  const SiteMeasures& m = summary.measures;
  std::cout << "site " << shownText(m.name) << ": " << m.n << " patients, " << m.events
            << " events; AUC " << formatNumber(m.auc, 3) << ", O/E " << formatNumber(m.oeRatio, 3)
            << ", calibration slope " << formatNumber(m.slope, 3) << "\n"
            << "wrote " << shownText(out, 200) << ": aggregates only (" << summary.histogram.size()
            << " histogram cells"
            << (options.suppressBelow > 0
                    ? ", cells below " + std::to_string(options.suppressBelow) +
                          " withheld or merged"
                    : std::string(", no small-cell suppression"))
            << "). Read it before sending it.\n"
            << kCautionText << '\n';
  return 0;
}

}  // namespace calivera::cli
