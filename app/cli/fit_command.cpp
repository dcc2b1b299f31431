#include "app/cli/fit_command.h"

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <future>
#include <iostream>
#include <utility>

#include "app/cli/arguments.h"
#include "app/cli/data_options.h"
#include "core/data/cohort_source.h"
#include "core/data/csv_reader.h"
#include "core/fit/cohort_fit.h"
#include "core/model/model_io.h"
#include "core/present/number_text.h"
#include "core/util/errors.h"
#include "core/util/sha256.h"
#include "core/util/stage_times.h"

namespace calivera::cli {
namespace {

constexpr const char* kUsage =
    "usage: calivera fit --data COHORT.csv --outcome COLUMN --predictors A,B,C --out MODEL.json\n"
    "                    [options]\n\n"
    "Fits a logistic regression model to a cohort and writes it as a Calivera model file.\n"
    "Numeric predictors enter linearly; text predictors (and those named in --categorical) enter\n"
    "as one indicator term per level against a reference level (the first in sorted order\n"
    "unless --reference names one). Rows missing the outcome or any predictor are excluded and\n"
    "counted per column.\n\n"
    "options:\n"
    "  --data FILE            cohort CSV (header row; comma, semicolon or tab), or a SAS\n"
    "                         .sas7bdat, Stata .dta or SPSS .sav/.zsav file\n"
    "  --outcome COLUMN       0/1 outcome column (or any two values with --event-value)\n"
    "  --event-value VALUE    the outcome value that means an event\n"
    "  --predictors LIST      comma-separated predictor columns\n"
    "  --categorical LIST     numeric predictors to code by level instead of linearly\n"
    "  --reference COL=LEVEL  reference level of a categorical predictor (repeatable)\n"
    "  --spline COL=K         a numeric predictor as a restricted cubic spline with K knots\n"
    "                         (3 to 7) at Harrell's default quantiles (repeatable)\n"
    "  --firth                Firth's penalized likelihood (finite estimates under separation)\n"
    "  --profile-ci           also the profile-likelihood 95% intervals (maximum likelihood;\n"
    "                         about 50 constrained fits per coefficient)\n"
    "  --max-iterations N     Newton-Raphson iteration limit (default 100)\n"
    "  --name TEXT            model name stored in the file\n"
    "  --delimiter C          CSV only: ',', ';' or 'tab' (default: detected from the header)\n"
    "  --table NAME           with --data postgresql://HOST:PORT/DB: fit on this table\n"
    "  --query 'SELECT ...'   with --data postgresql://HOST:PORT/DB: fit on this query's rows\n"
    "  --missing TOKEN        an extra field value that means missing (repeatable; '' and NA\n"
    "                         always do)\n"
    "  --out FILE             model file to write (JSON, format calivera-model/1)\n"
    "  --help                 this text\n\n"
    "Exit status: 0 fitted, 1 the fit cannot be completed (separation without --firth,\n"
    "collinear or constant predictors, no convergence), 2 bad usage or bad input.\n";

char parseDelimiter(const std::string& text) {
  if (text == "tab" || text == "\\t" || text == "\t") return '\t';
  if (text == "," || text == ";") return text[0];
  throw InputError("--delimiter: '" + text + "' is not one of ',', ';', 'tab'");
}

std::string formatValue(double value, int digits = 5) {
  if (!std::isfinite(value)) return value > 0 ? "inf" : value < 0 ? "-inf" : "nan";
  char buffer[40];
  std::snprintf(buffer, sizeof buffer, "%.*g", digits, value);
  return buffer;
}

std::string formatP(double p) {
  return formatPValue(p);
}

std::string pad(const std::string& text, std::size_t width, bool right = true) {
  if (text.size() >= width) return text;
  const std::string fill(width - text.size(), ' ');
  return right ? fill + text : text + fill;
}

void printCoefficients(const CohortFit& result, bool firth) {
  const Model& model = result.model;
  std::vector<std::pair<std::string, Estimate>> rows{{"(intercept)", model.intercept}};
  for (const Term& term : model.terms) rows.emplace_back(term.name, term.estimate);
  std::size_t nameWidth = 4;
  for (const auto& row : rows) nameWidth = std::max(nameWidth, row.first.size());
  std::cout << pad("term", nameWidth, false) << pad("coef", 12) << pad("SE", 11) << pad("z", 9)
            << pad("p", 9) << pad("95% CI", 24) << pad("OR", 11) << pad("OR 95% CI", 24) << '\n';
  constexpr double kZ = 1.959963984540054;  // standard normal 97.5% quantile
  for (const auto& [name, estimate] : rows) {
    const double b = estimate.coefficient;
    const double se = estimate.se.value_or(std::nan(""));
    const double z = b / se;
    const double p = std::erfc(std::abs(z) / std::sqrt(2.0));  // two-sided, normal (Wald)
    const double lo = b - kZ * se, hi = b + kZ * se;
    std::cout << pad(name, nameWidth, false) << pad(formatValue(b), 12)
              << pad(formatValue(se, 4), 11) << pad(formatValue(z, 4), 9) << pad(formatP(p), 9)
              << pad(formatValue(lo, 4) + " to " + formatValue(hi, 4), 24);
    if (name == "(intercept)") {
      std::cout << '\n';
      continue;
    }
    std::cout << pad(formatValue(std::exp(b), 4), 11)
              << pad(formatValue(std::exp(lo), 4) + " to " + formatValue(std::exp(hi), 4), 24)
              << '\n';
  }
  std::cout << "(Wald z, p and 95% intervals from the " << (firth ? "penalized " : "")
            << "information at the estimate; OR = odds ratio per unit of the term)\n";
}

void printProfileIntervals(const CohortFit& result) {
  std::cout << "\nprofile-likelihood 95% intervals (Venzon & Moolgavkar 1988; "
            << result.profile->constrainedFits << " constrained fits)\n";
  for (std::size_t j = 0; j < result.profile->ci.size(); ++j) {
    const std::string name = j == 0 ? "(intercept)" : result.model.terms[j - 1].name;
    const ProfileBounds& b = result.profile->ci[j];
    std::cout << "  " << name << std::string(name.size() < 22 ? 22 - name.size() : 1, ' ')
              << formatValue(b.lo, 6) << " to " << formatValue(b.hi, 6) << '\n';
  }
  for (const std::string& w : result.profile->warnings) std::cout << "warning: " << w << '\n';
}

void printSummary(const CohortFit& result, const std::string& dataPath) {
  const ExclusionReport& ex = result.exclusions;
  std::cout << "cohort: " << dataPath << "\n  rows read " << ex.rowsRead << ", analysed "
            << ex.rowsAnalysed << ", excluded " << ex.rowsExcluded
            << " (missing outcome or predictor)\n";
  for (const ColumnExclusion& column : ex.byColumn) {
    if (column.rowsMissing > 0) {
      std::cout << "  missing in '" << column.column << "': " << column.rowsMissing << " rows\n";
    }
  }
  std::cout << "  events " << result.events << " of " << ex.rowsAnalysed << '\n';
  for (const CategoricalCoding& coding : result.codings) {
    std::cout << "  '" << coding.column << "' coded against reference level '" << coding.reference
              << "'\n";
  }
  std::cout << '\n';
}

}  // namespace

int runFitCommand(const std::vector<std::string>& words) {
  const OptionSpec spec{{"--data", "--outcome", "--predictors", "--out", "--reference",
                         "--delimiter", "--missing", "--event-value", "--name", "--categorical",
                         "--max-iterations", "--spline", "--table", "--query"},
                        {"--firth", "--profile-ci", "--help"}};
  const Arguments args(words, spec);
  if (args.has("--help")) {
    std::cout << kUsage;
    return 0;
  }
  if (!args.positional().empty()) {
    throw InputError("unexpected argument '" + args.positional().front() +
                     "' (see calivera fit --help)");
  }
  const std::string dataPath = args.required("--data");
  const std::string outPath = args.required("--out");
  const std::optional<DatabaseSelection> database = databaseSelectionFrom(args);
  CohortFitSpec fitSpec;
  fitSpec.outcome.column = args.required("--outcome");
  fitSpec.outcome.eventValue = args.value("--event-value");
  fitSpec.predictors = splitList(args.required("--predictors"), "--predictors");
  if (auto list = args.value("--categorical")) {
    for (const std::string& column : splitList(*list, "--categorical")) {
      fitSpec.categorical.insert(column);
    }
  }
  for (const std::string& item : args.values("--reference")) {
    const auto eq = item.find('=');
    if (eq == std::string::npos || eq == 0 || eq + 1 == item.size()) {
      throw InputError("--reference: '" + item + "' is not COLUMN=LEVEL");
    }
    fitSpec.referenceLevels[item.substr(0, eq)] = item.substr(eq + 1);
  }
  for (const std::string& item : args.values("--spline")) {
    const auto eq = item.find('=');
    if (eq == std::string::npos || eq == 0 || eq + 1 == item.size()) {
      throw InputError("--spline: '" + item + "' is not COLUMN=KNOTS");
    }
    const long long knots = parseInteger(item.substr(eq + 1), "--spline");
    if (knots < 3 || knots > 7) throw InputError("--spline: '" + item + "': give 3 to 7 knots");
    fitSpec.splineKnots[item.substr(0, eq)] = static_cast<int>(knots);
  }
  fitSpec.fit.firth = args.has("--firth");
  fitSpec.profileIntervals = args.has("--profile-ci");
  if (fitSpec.profileIntervals && fitSpec.fit.firth) {
    throw InputError("--profile-ci: profile intervals are for maximum likelihood, not --firth");
  }
  if (auto limit = args.value("--max-iterations")) {
    const long long value = parseInteger(*limit, "--max-iterations");
    if (value < 1 || value > 10000) throw InputError("--max-iterations: must be 1 to 10000");
    fitSpec.fit.maxIterations = static_cast<int>(value);
  }
  fitSpec.modelName = args.value("--name").value_or("");
  std::error_code same;
  if (std::filesystem::equivalent(dataPath, outPath, same)) {
    throw InputError("--out: '" + outPath + "' is the cohort file itself");
  }
  CsvOptions csv;
  if (auto delimiter = args.value("--delimiter")) csv.delimiter = parseDelimiter(*delimiter);
  for (const std::string& token : args.values("--missing")) csv.missingTokens.push_back(token);
  // Only the outcome and the predictors are parsed and kept (issue 13).
  csv.onlyColumns = fitSpec.predictors;
  csv.onlyColumns.push_back(fitSpec.outcome.column);

  CohortRead read = readCohort(dataPath, database, csv);
  const std::shared_ptr<const DatabaseProvenance> source = read.table.database;
  CohortFit result = fitCohortModel(std::move(read.table), fitSpec);
  markStage("fitted");
  Model& model = result.model;
  model.development.dataSha256 = read.sha256;
  const std::string cohortName =
      source ? "PostgreSQL database " + source->database +
                   (database->table.empty() ? " (query)" : " table " + database->table)
             : std::filesystem::path(dataPath).filename().string();
  model.development.description = "fitted by calivera fit on " + cohortName + " (" +
                                  std::to_string(result.exclusions.rowsAnalysed) + " of " +
                                  std::to_string(result.exclusions.rowsRead) + " rows complete)";
  writeModelFile(outPath, model);

  std::cout << "Calivera " << CALIVERA_VERSION << " - logistic model fit ("
            << (fitSpec.fit.firth ? "Firth penalized likelihood" : "maximum likelihood")
            << ")\noutcome: " << model.outcome << "\n";
  printSummary(result, dataPath);
  printCoefficients(result, fitSpec.fit.firth);
  if (result.profile) printProfileIntervals(result);
  const FitResult& fit = result.fit;
  std::cout << "\ndeviance " << formatValue(fit.deviance, 8) << ", null deviance "
            << formatValue(fit.nullDeviance, 8) << ", AIC " << formatValue(fit.aic, 8) << ", "
            << fit.iterations << " iterations, " << (fit.converged ? "converged" : "NOT converged")
            << '\n';
  for (const std::string& warning : fit.warnings) std::cout << "warning: " << warning << '\n';
  std::cout << "model written to " << outPath << "\n\n"
            << "The model describes associations in this cohort; it does not replace clinical\n"
               "judgment, and any use in care is a decision for local clinical governance.\n";
  return 0;
}

}  // namespace calivera::cli
