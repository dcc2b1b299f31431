#include "app/cli/validate_uncertainty.h"

#include <cmath>
#include <cstdio>
#include <cstring>
#include <string>

#include "core/present/number_text.h"
#include "core/present/wording.h"
#include "core/report/site_tables.h"
#include "core/report/validation_json.h"
#include "core/study/limits.h"
#include "core/uncertainty/bootstrap_measures.h"
#include "core/uncertainty/uncertainty_json.h"
#include "core/util/errors.h"
#include "core/util/shown_text.h"

namespace calivera::cli {
namespace {

// Four decimals, as the summary tables print their estimates (core/present/number_text.h).
std::string fixed4(double v) {
  return formatNumber(v, 4);
}

std::string pValueText(double p) {
  return formatPValue(p);
}

void printEstimate(std::ostream& out, const BootstrappedMeasure& m, const BootstrapEstimate& e) {
  out << "  " << m.label << ": " << formatNumber(e.estimate, m.decimals) << " (95% CI "
      << formatRange(e.ci.lo, e.ci.hi, m.decimals) << ")\n";
}

}  // namespace

void addUncertaintyOptions(OptionSpec& spec) {
  spec.valued.insert({"--bootstrap", "--seed", "--threads", "--compare", "--subgroup", "--cluster",
                      "--size-thresholds"});
}

const char* uncertaintyOptionsHelp() {
  return "  --bootstrap B           percentile bootstrap 95% CIs and bands from B resamples\n"
         "  --seed S                seed of the bootstrap and of --impute (default 1); the same\n"
         "                          seed gives the same results for any --threads\n"
         "  --threads N             threads of the bootstrap, the imputation and the stacked\n"
         "                          copies' validation (default: all cores)\n"
         "  --compare MODEL.json    compare a further model on the same patients (repeatable;\n"
         "                          a second --model does the same)\n"
         "  --subgroup COLUMN       every measure per level of COLUMN (repeatable)\n"
         "  --cluster COLUMN        each level of COLUMN is a site: validated alone, then pooled\n"
         "                          by random-effects meta-analysis (REML, HKSJ interval,\n"
         "                          prediction interval for a new site)\n"
         "  --size-thresholds T,..  thresholds for the net-benefit sample-size criterion\n";
}

std::optional<std::uint64_t> seedOption(const Arguments& args, const std::string& option) {
  const auto s = args.value(option);
  if (!s) return std::nullopt;
  const long long seed = parseInteger(*s, option);
  if (seed < kSeedLimit.min || seed > kSeedLimit.max) {
    throw InputError(option + ": give a whole number from 0 to " + std::to_string(kSeedLimit.max));
  }
  return static_cast<std::uint64_t>(seed);
}

std::optional<unsigned> threadsOption(const Arguments& args) {
  const auto t = args.value("--threads");
  if (!t) return std::nullopt;
  const long long threads = parseInteger(*t, "--threads");
  if (threads < 1 || threads > kThreadsLimit.max) {
    throw InputError("--threads: give 1 to " + std::to_string(kThreadsLimit.max));
  }
  return static_cast<unsigned>(threads);
}

UncertaintyRequest uncertaintyRequest(const Arguments& args) {
  UncertaintyRequest request;
  if (const auto b = args.value("--bootstrap")) {
    const long long replicates = parseInteger(*b, "--bootstrap");
    if (replicates < 1 || replicates > kBootstrapLimit.max) {
      throw InputError("--bootstrap: give 1 to " + std::to_string(kBootstrapLimit.max) +
                       " replicates");
    }
    request.bootstrapReplicates = static_cast<int>(replicates);
  }
  if (const auto seed = seedOption(args)) request.seed = *seed;
  if (const auto threads = threadsOption(args)) request.threads = *threads;
  const std::vector<std::string> models = args.values("--model");
  for (std::size_t m = 1; m < models.size(); ++m) request.compareModelPaths.push_back(models[m]);
  for (const auto& path : args.values("--compare")) request.compareModelPaths.push_back(path);
  request.subgroupColumns = args.values("--subgroup");
  const std::vector<std::string> clusters = args.values("--cluster");
  if (clusters.size() > 1) throw InputError("--cluster: give one site column");
  if (!clusters.empty()) {
    if (clusters.front().empty()) throw InputError("--cluster: give a column name");
    request.clusterColumn = clusters.front();
  }
  if (const auto list = args.value("--size-thresholds")) {
    for (const auto& item : splitList(*list, "--size-thresholds")) {
      const double t = parseNumber(item, "--size-thresholds");
      if (!(t > 0.0 && t < 1.0))
        throw InputError("--size-thresholds: " + item + " is not in (0, 1)");
      request.sampleSize.netBenefitThresholds.push_back(t);
    }
  }
  return request;
}

std::optional<std::string> primaryModelPath(const Arguments& args) {
  const std::vector<std::string> models = args.values("--model");
  return models.empty() ? std::nullopt : std::optional(models.front());
}

std::string validationJsonText(const ValidationRun& run, const UncertaintyResults& results) {
  nlohmann::json json = validationToJson(run);
  addUncertaintyJson(json, results);
  return json.dump(2) + "\n";
}

void printSampleSizeSummary(std::ostream& out, const UncertaintyResults& r) {
  const SampleSizeAssessment& s = r.sampleSize;
  out << "sample size: " << s.verdict << '\n';
  for (const auto& rule : s.rules) {
    out << "  " << rule.rule << ": " << sizeCriterionText(rule.met) << '\n';
  }
  for (const auto& c : s.criteria) {
    out << "  " << c.criterion << ": " << sizeCriterionText(c.met) << "; n >= " << c.requiredN
        << " (" << c.requiredEvents << " events) for a 95% CI width of " << fixed4(c.targetCiWidth);
    if (c.achievedCiWidth) out << "; achieved width " << fixed4(*c.achievedCiWidth);
    out << '\n';
  }
  out << '\n';
}

void printUncertaintySummary(std::ostream& out, const UncertaintyResults& r) {
  if (r.bootstrap) {
    const ValidationBootstrap& b = *r.bootstrap;
    out << "bootstrap: " << b.run.replicates << " resamples, seed " << b.run.seed << ", "
        << b.run.threads << " threads, " << b.run.failed << " failed\n";
    for (const BootstrappedMeasure& m : bootstrappedMeasures()) {
      printEstimate(out, m, b.*m.interval);
    }
    for (const auto& w : b.warnings) out << "  warning: " << w << '\n';
  }
  if (r.comparison) {
    out << "comparison on " << r.comparisonRows << " patients:\n";
    for (const auto& pair : r.comparison->pairs) {
      const PairedAucTest& t = pair.auc;
      out << "  AUC " << r.comparison->models[t.first] << " - " << r.comparison->models[t.second]
          << " = " << fixed4(t.difference) << " (95% CI " << fixed4(t.differenceCi.lo) << " to "
          << fixed4(t.differenceCi.hi) << "), paired DeLong z " << fixed4(t.z) << ", p "
          << pValueText(t.pValue) << '\n';
    }
    for (const auto& w : r.comparison->warnings) out << "  warning: " << w << '\n';
  }
  for (const auto& analysis : r.subgroups) {
    out << "subgroups by " << analysis.column << ":\n";
    for (const auto& level : analysis.levels) {
      out << "  " << level.level << ": n " << level.n << ", events " << level.events;
      if (level.metrics) {
        out << ", AUC " << fixed4(level.metrics->discrimination.auc) << ", slope "
            << fixed4(level.metrics->calibration.slope) << ", O/E "
            << fixed4(level.metrics->calibration.oeRatio);
      }
      out << '\n';
      for (const auto& w : level.warnings) out << "    warning: " << w << '\n';
    }
  }
  if (r.sites) {
    out << "sites by " << shownText(r.sites->column) << ", each validated alone:\n"
        << tableText(sitesTable(*r.sites), "  ");
    out << "pooled across sites (random effects, REML; 95% CI by Hartung-Knapp-Sidik-Jonkman; "
           "prediction interval for a new site on k-2 df):\n"
        << tableText(pooledSitesTable(*r.sites), "  ");
    out << "net benefit across sites (all patients' counts, and the random-effects mean):\n"
        << tableText(pooledNetBenefitTable(*r.sites), "  ");
  }
}

}  // namespace calivera::cli
