#include "app/cli/pool_command.h"

#include <filesystem>
#include <iostream>
#include <nlohmann/json.hpp>

#include "app/cli/arguments.h"
#include "core/metrics/json_values.h"
#include "core/present/caution.h"
#include "core/present/number_text.h"
#include "core/report/audit_sites.h"
#include "core/report/csv_text.h"
#include "core/report/site_tables.h"
#include "core/sites/site_json.h"
#include "core/sites/summary_pooling.h"
#include "core/sites/summary_set.h"
#include "core/study/limits.h"
#include "core/study/reproduce_command.h"
#include "core/util/errors.h"
#include "core/util/output_transaction.h"
#include "core/util/sha256.h"
#include "core/util/shown_text.h"
#ifdef CALIVERA_HAVE_PDF
#include "render/report/audit_pdf_writer.h"
#endif

namespace calivera::cli {
namespace {

constexpr const char* kHelp =
    "usage: calivera pool SITE1.cvsummary SITE2.cvsummary ... [--json FILE] [--csv-dir DIR]\n"
    "       calivera pool --set SITES.cvsites [...]\n"
    "                     [--pdf FILE [--title TEXT] [--paper a4|letter]]\n"
    "                     [--report-thresholds T1,T2,...]\n\n"
    "Pools the site summaries written by `calivera summarize`: checks that every site validated\n"
    "the same model (SHA-256) with the same settings and that no summary was changed after it\n"
    "was written, then pools each measure across sites by random-effects meta-analysis (REML,\n"
    "Hartung-Knapp-Sidik-Jonkman 95% CI, prediction interval for a new site), exactly as\n"
    "`calivera validate --cluster` does on the sites' patients. The AUC of all patients together\n"
    "is estimated from the sites' histograms with a stated bound on its error.\n\n"
    "options:\n"
    "  --set FILE               the summaries of a set saved by the workstation (.cvsites),\n"
    "                           each checked against the SHA-256 the set recorded; its\n"
    "                           thresholds and title unless given here\n"
    "  --json FILE              results as JSON (key `clusters`, as validate --cluster)\n"
    "  --csv-dir DIR            sites.csv, sites_pooled.csv, sites_net_benefit.csv and\n"
    "                           site_inputs.csv (each summary's file and SHA-256)\n"
    "  --pdf FILE               a report: the summaries pooled, the tables and a forest plot\n"
    "                           per measure\n"
    "  --title TEXT             the report's title\n"
    "  --paper a4|letter        the report's paper (default a4)\n"
    "  --report-thresholds T,.. net benefit pooled at these thresholds (default: 0.05, 0.1,\n"
    "                           0.2, 0.3, 0.5 where the sites counted them)\n";

nlohmann::json pooledJson(const PooledSummaries& p) {
  nlohmann::json out;
  out["caution"] = kCautionText;
  out["software_version"] = CALIVERA_VERSION;
  const SiteSummary& first = p.inputs.front().summary;
  out["model"] = {{"kind", first.modelKind},
                  {"name", first.modelName},
                  {"sha256", first.modelSha256},
                  {"risk_column", first.riskColumn}};
  nlohmann::json inputs = nlohmann::json::array();
  for (const SummaryFile& f : p.inputs) {
    inputs.push_back({{"file", std::filesystem::path(f.path).filename().string()},
                      {"sha256", f.sha256},
                      {"site", f.summary.measures.name},
                      {"data_sha256", f.summary.dataSha256},
                      {"content_sha256", f.summary.contentSha256},
                      {"software_version", f.summary.softwareVersion},
                      {"suppress_below", f.summary.suppressBelow}});
  }
  out["inputs"] = inputs;
  out["overall"] = {
      {"n", p.n},
      {"events", p.events},
      {"oe_ratio", jsonNumber(p.overallOe)},
      {"brier", jsonNumber(p.overallBrier)},
      {"auc_from_histograms",
       {{"estimate", jsonNumber(p.overallAuc.auc)},
        {"error_bound", jsonNumber(p.overallAuc.errorBound)},
        {"note",
         "AUC of every site's patients together from the logit(risk) histograms: pairs in "
         "overlapping cells counted 1/2; the exact AUC lies within estimate +/- error_bound"}}}};
  out["clusters"] = siteAnalysisJson(p.analysis);
  out["warnings"] = p.warnings;
  return out;
}

}  // namespace

int runPoolCommand(const std::vector<std::string>& words) {
  OptionSpec spec;
  spec.valued = {"--set",   "--json",  "--csv-dir",          "--pdf",
                 "--title", "--paper", "--report-thresholds"};
  spec.flags = {"--help"};
  const Arguments arguments(words, spec);
  if (arguments.has("--help")) {
    std::cout << kHelp;
    return 0;
  }
  const std::vector<std::string>& paths = arguments.positional();
  std::optional<SummarySet> set;
  if (const auto setPath = arguments.value("--set")) set = readSummarySet(*setPath);
  std::vector<SummarySetEntry> entries = set ? set->summaries : std::vector<SummarySetEntry>{};
  for (const std::string& path : paths) entries.push_back({path, ""});
  if (entries.size() > kMaxPooledSummaries) {
    throw InputError("pool: at most " + std::to_string(kMaxPooledSummaries) + " summaries at once");
  }
  std::vector<double> thresholds = set ? set->netBenefitThresholds : std::vector<double>{};
  if (const auto list = arguments.value("--report-thresholds")) {
    thresholds.clear();
    for (const std::string& item : splitList(*list, "--report-thresholds")) {
      const double t = parseNumber(item, "--report-thresholds");
      if (!(t > 0.0 && t < 1.0))
        throw InputError("--report-thresholds: " + item + " is not in (0, 1)");
      thresholds.push_back(t);
    }
  }
  const auto jsonPath = arguments.value("--json");
  const auto csvDir = arguments.value("--csv-dir");
  const auto pdfPath = arguments.value("--pdf");
  const std::string title = arguments.value("--title").value_or(set ? set->title : "");
  if (title.size() > kMaxReportTitleBytes) {
    throw InputError("--title: at most " + std::to_string(kMaxReportTitleBytes) + " bytes");
  }
#ifdef CALIVERA_HAVE_PDF
  const report::PaperSize paper =
      report::parsePaperSize(arguments.value("--paper").value_or("a4"), "--paper");
#else
  if (pdfPath) throw InputError("--pdf: this build has no PDF report (built without the UI)");
#endif
  std::vector<std::pair<std::string, std::string>> outputs, inputs;
  if (jsonPath) outputs.emplace_back("--json", *jsonPath);
  if (csvDir) outputs.emplace_back("--csv-dir", *csvDir);
  if (pdfPath) outputs.emplace_back("--pdf", *pdfPath);
  for (const SummarySetEntry& e : entries) inputs.emplace_back("site summary", e.path);
  if (const auto setPath = arguments.value("--set")) inputs.emplace_back("--set", *setPath);
  refuseOverwritingInputs(outputs, inputs);

  const PooledSummaries pooled = poolSummaries(loadSummaryFiles(entries, {}), thresholds);

  OutputTransaction transaction;
#ifdef CALIVERA_HAVE_PDF
  if (pdfPath) {
    const AuditDocument doc =
        buildPooledSitesDocument(pooled, title, formatUtcTimestamp(reportTimestamp()));
    transaction.add(*pdfPath, report::renderDocumentPdf(doc, paper));
  }
#endif
  if (csvDir) {
    for (const ResultTable& table :
         {sitesTable(pooled.analysis), pooledSitesTable(pooled.analysis),
          pooledNetBenefitTable(pooled.analysis), summaryInputsTable(pooled)}) {
      transaction.add((std::filesystem::path(*csvDir) / table.fileName).string(), tableCsv(table),
                      /*createFolder=*/true);
    }
  }
  if (jsonPath) transaction.add(*jsonPath, pooledJson(pooled).dump(2) + "\n");
  transaction.commit();
  if (!jsonPath) {
    std::cout << "sites (from " << pooled.inputs.size() << " summaries), each validated alone:\n"
              << tableText(sitesTable(pooled.analysis), "  ")
              << "pooled across sites (random effects, REML; 95% CI by "
                 "Hartung-Knapp-Sidik-Jonkman; prediction interval for a new site on k-2 df):\n"
              << tableText(pooledSitesTable(pooled.analysis), "  ")
              << "net benefit across sites (all patients' counts, and the random-effects mean):\n"
              << tableText(pooledNetBenefitTable(pooled.analysis), "  ")
              << pooledOverallText(pooled) << '\n';
    for (const std::string& w : pooled.warnings)
      std::cout << "warning: " << shownText(w, 400) << '\n';
    std::cout << "\nReproduce with:\n  "
              << commandLine("pool", poolCommandWords(arguments.value("--set"), paths,
                                                      arguments.value("--report-thresholds")
                                                          ? thresholds
                                                          : std::vector<double>{}))
              << "\n\n"
              << kCautionText << '\n';
  }
  return 0;
}

}  // namespace calivera::cli
