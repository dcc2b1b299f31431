// `calivera summarize` and `calivera pool` on the Aids2 cohort (tests/reference/data/
// aids2_sites.csv, Debian r-cran-mass) split into one file per state, as four sites would hold it:
// pooling the summaries gives exactly what `validate --cluster state` gives on the whole file
// (whose numbers are checked against R and metafor in tests/reference/aids2_sites_test.cpp), the
// AUC of all patients from histograms lies within its stated bound, no patient's value reaches a
// summary, withheld cells stay withheld, and bad summaries are refused clearly.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <fstream>
#include <map>
#include <nlohmann/json.hpp>
#include <optional>

#include "core/sites/summary_set.h"
#include "core/util/sha256.h"
#include "tests/reference/reference_csv.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

using testing::referencePath;
using testing::runCalivera;

nlohmann::json readJson(const std::string& path) {
  std::ifstream in(path);
  return nlohmann::json::parse(in);
}

class SiteSummaries : public ::testing::Test {
 protected:
  SiteSummaries() : dir_("site_summaries") {
    auto columns = testing::readColumns(referencePath("aids2_sites.csv"));
    std::map<std::string, std::string> files;
    for (std::size_t i = 0; i < columns["state"].size(); ++i) {
      std::string& text = files[columns["state"][i]];
      if (text.empty()) text = "patient_id,dead,risk\n";
      // A distinctive identifier per patient: it must never reach a summary.
      text += "ZQX" + std::to_string(100000 + i) + "," + columns["dead"][i] + "," +
              columns["risk"][i] + "\n";
    }
    for (const auto& [state, text] : files) {
      cohorts_[state] = dir_.write(state + ".csv", text);
      states_.push_back(state);
    }
  }

  // summarize for every state; returns the summary paths.
  std::vector<std::string> summarizeAll(const std::vector<std::string>& extra = {}) {
    std::vector<std::string> out;
    for (const std::string& state : states_) {
      std::vector<std::string> words{"summarize",
                                     "--data",
                                     cohorts_[state],
                                     "--outcome",
                                     "dead",
                                     "--risk",
                                     "risk",
                                     "--site",
                                     state,
                                     "--out",
                                     dir_.file(state + ".cvsummary")};
      words.insert(words.end(), extra.begin(), extra.end());
      const testing::CliRun run = runCalivera(words);
      EXPECT_EQ(run.status, 0) << run.err;
      EXPECT_NE(run.out.find("do not replace clinical judgment"), std::string::npos);
      out.push_back(dir_.file(state + ".cvsummary"));
    }
    return out;
  }

  testing::CliRun pool(const std::vector<std::string>& summaries,
                       const std::vector<std::string>& extra = {}) {
    std::vector<std::string> words{"pool"};
    words.insert(words.end(), summaries.begin(), summaries.end());
    words.insert(words.end(), extra.begin(), extra.end());
    return runCalivera(words);
  }

  testing::TempDir dir_;
  std::map<std::string, std::string> cohorts_;
  std::vector<std::string> states_;
};

TEST_F(SiteSummaries, PoolingSummariesEqualsValidatingTheWholeCohortBySite) {
  const std::vector<std::string> summaries = summarizeAll();
  const testing::CliRun pooled = pool(summaries, {"--json", dir_.file("pooled.json")});
  ASSERT_EQ(pooled.status, 0) << pooled.err;
  const testing::CliRun whole =
      runCalivera({"validate", "--data", referencePath("aids2_sites.csv"), "--outcome", "dead",
                   "--risk", "risk", "--cluster", "state", "--json", dir_.file("whole.json")});
  ASSERT_EQ(whole.status, 0) << whole.err;
  const nlohmann::json p = readJson(dir_.file("pooled.json"));
  const nlohmann::json w = readJson(dir_.file("whole.json"));
  // Each site's patients give the same validation whichever file they are read from, and the
  // pools run through the same code: equal, not merely close. Site warnings are left aside (the
  // whole-cohort run words a subgroup's sample-size notes).
  nlohmann::json ps = p.at("clusters").at("sites");
  nlohmann::json ws = w.at("clusters").at("sites");
  for (auto* sites : {&ps, &ws}) {
    for (auto& s : *sites) s.erase("warnings");
  }
  EXPECT_EQ(ps, ws);
  // Each site's calibration curve (the "calibration by site" plot) is among what is equal.
  for (const nlohmann::json& site : ps) EXPECT_GT(site.at("calibration_curve").size(), 10u);
  EXPECT_EQ(p.at("clusters").at("pooled"), w.at("clusters").at("pooled"));
  EXPECT_EQ(p.at("clusters").at("net_benefit"), w.at("clusters").at("net_benefit"));
  // What only the whole cohort gives exactly: the AUC of all patients, within the stated bound.
  const double exact = w.at("discrimination").at("auc");
  const nlohmann::json& binned = p.at("overall").at("auc_from_histograms");
  const double bound = binned.at("error_bound");
  EXPECT_LE(std::abs(binned.at("estimate").get<double>() - exact), bound);
  EXPECT_GT(bound, 0.0);
  EXPECT_LT(bound, 0.005);  // 0.02-wide bins: the bound is small as well as honest
  EXPECT_NEAR(p.at("overall").at("brier").get<double>(), w.at("overall").at("brier").get<double>(),
              1e-14);
  EXPECT_NEAR(p.at("overall").at("oe_ratio").get<double>(),
              w.at("calibration").at("oe_ratio").get<double>(), 1e-13);
}

TEST_F(SiteSummaries, NoPatientValueOrIdentifierReachesASummary) {
  const std::vector<std::string> summaries = summarizeAll();
  auto columns = testing::readColumns(referencePath("aids2_sites.csv"));
  for (const std::string& path : summaries) {
    const std::string text = testing::readWhole(path);
    EXPECT_EQ(text.find("ZQX"), std::string::npos) << path;
    EXPECT_EQ(text.find("patient_id"), std::string::npos) << path;
    for (const std::string& risk : columns["risk"]) {
      // The risk as written, and its first 9 significant digits in any longer number.
      ASSERT_EQ(text.find(risk), std::string::npos) << path << " holds " << risk;
      ASSERT_EQ(text.find(risk.substr(0, 11)), std::string::npos) << path << " holds " << risk;
      const double logit = std::log(std::stod(risk) / (1.0 - std::stod(risk)));
      char buffer[32];
      std::snprintf(buffer, sizeof buffer, "%.9g", logit);
      ASSERT_EQ(text.find(buffer), std::string::npos) << path << " holds logit " << buffer;
    }
  }
}

TEST_F(SiteSummaries, WithheldCellsStayWithheldInThePool) {
  const std::vector<std::string> summaries = summarizeAll({"--suppress-below", "20"});
  // At a low threshold few of QLD's patients are left unflagged: small cells.
  const nlohmann::json qld = readJson(dir_.file("QLD.cvsummary"));
  bool anyWithheld = false;
  for (const nlohmann::json& c : qld.at("site").at("threshold_counts")) {
    anyWithheld = anyWithheld || c.contains("withheld");
  }
  EXPECT_TRUE(anyWithheld);
  for (const nlohmann::json& cell : qld.at("logit_histogram").at("cells")) {
    for (int k : {2, 3}) {
      const std::size_t count = cell[static_cast<std::size_t>(k)];
      EXPECT_TRUE(count == 0 || count >= 20) << cell.dump();
    }
  }
  const testing::CliRun pooled = pool(summaries, {"--json", dir_.file("pooled.json")});
  ASSERT_EQ(pooled.status, 0) << pooled.err;
  const nlohmann::json p = readJson(dir_.file("pooled.json"));
  bool sawWithheld = false;
  for (const nlohmann::json& nb : p.at("clusters").at("net_benefit")) {
    if (nb.at("by_counts").contains("withheld_by")) {
      sawWithheld = true;
      EXPECT_TRUE(nb.at("by_counts").at("true_positives").is_null());
      EXPECT_TRUE(nb.at("by_counts").at("estimate").is_null());
    }
  }
  EXPECT_TRUE(sawWithheld);
  // Merged bins widen the bound, which still holds.
  const testing::CliRun whole =
      runCalivera({"validate", "--data", referencePath("aids2_sites.csv"), "--outcome", "dead",
                   "--risk", "risk", "--json", dir_.file("whole.json")});
  ASSERT_EQ(whole.status, 0) << whole.err;
  const double exact = readJson(dir_.file("whole.json")).at("discrimination").at("auc");
  const nlohmann::json& binned = p.at("overall").at("auc_from_histograms");
  EXPECT_LE(std::abs(binned.at("estimate").get<double>() - exact),
            binned.at("error_bound").get<double>());
}

#ifdef CALIVERA_HAVE_PDF
TEST_F(SiteSummaries, ReportsCarryTheSiteSectionWithAForestPlotPerMeasure) {
  const std::vector<std::string> summaries = summarizeAll();
  const testing::CliRun pooled =
      pool(summaries, {"--pdf", dir_.file("pooled.pdf"), "--json", dir_.file("pooled.json")});
  ASSERT_EQ(pooled.status, 0) << pooled.err;
  const testing::CliRun whole =
      runCalivera({"validate", "--data", referencePath("aids2_sites.csv"), "--outcome", "dead",
                   "--risk", "risk", "--cluster", "state", "--pdf", dir_.file("whole.pdf"),
                   "--json", dir_.file("whole.json")});
  ASSERT_EQ(whole.status, 0) << whole.err;
  for (const std::string& pdf : {dir_.file("pooled.pdf"), dir_.file("whole.pdf")}) {
    const std::string text = testing::pdfText(pdf);
    SCOPED_TRACE(pdf);
    EXPECT_NE(text.find("Validation across sites"), std::string::npos);
    EXPECT_NE(text.find("Pooled across sites (random effects)"), std::string::npos);
    // One forest plot per measure, each with its pooled row and its prediction interval row.
    std::size_t plots = 0;
    for (std::size_t at = 0; (at = text.find("Prediction interval", at)) != std::string::npos;
         ++at) {
      ++plots;
    }
    EXPECT_EQ(plots, 4u);
    // The pooled c-statistic as the JSON has it, rounded as printed.
    EXPECT_NE(text.find("0.849 (0.790 to 0.894)"), std::string::npos);
    EXPECT_NE(text.find("do not replace clinical judgment"), std::string::npos);
  }
  const std::string pdf = testing::pdfText(dir_.file("pooled.pdf"));
  EXPECT_NE(pdf.find("QLD.cvsummary"), std::string::npos);
  // Every site's calibration curve on one set of axes, with each site in its legend.
  const std::size_t curves = pdf.find("Calibration by site");
  ASSERT_NE(curves, std::string::npos);
  for (const std::string& state : states_) {
    EXPECT_NE(pdf.find(state, curves), std::string::npos) << state;
  }
}
#endif

// A set of summaries as the workstation saves it (core/sites/summary_set.h): `pool --set` pools
// exactly what naming the files pools, finds them relative to the set's folder, carries the set's
// thresholds, and refuses a summary changed after the set was saved.
TEST_F(SiteSummaries, ASavedSetPoolsAsItsFilesDoAndRefusesAChangedSummary) {
  const std::vector<std::string> summaries = summarizeAll();
  SummarySet set;
  for (const std::string& path : summaries) set.summaries.push_back({path, sha256OfFile(path)});
  set.netBenefitThresholds = {0.1, 0.2};
  const std::string setPath = dir_.file("four.cvsites");
  dir_.write("four.cvsites", summarySetText(set, setPath));
  // Paths inside the set's folder are stored relative to it.
  EXPECT_NE(testing::readWhole(setPath).find("\"file\": \"QLD.cvsummary\""), std::string::npos);
  const testing::CliRun bySet =
      runCalivera({"pool", "--set", setPath, "--json", dir_.file("set.json"), "--csv-dir",
                   dir_.file("set_tables")});
  ASSERT_EQ(bySet.status, 0) << bySet.err;
  const testing::CliRun byFiles =
      pool(summaries, {"--report-thresholds", "0.1,0.2", "--json", dir_.file("files.json")});
  ASSERT_EQ(byFiles.status, 0) << byFiles.err;
  EXPECT_EQ(readJson(dir_.file("set.json")).at("clusters"),
            readJson(dir_.file("files.json")).at("clusters"));
  EXPECT_EQ(readJson(dir_.file("set.json")).at("clusters").at("net_benefit").size(), 2u);
  const std::string inputs = testing::readWhole(dir_.file("set_tables/site_inputs.csv"));
  EXPECT_NE(inputs.find(sha256OfFile(summaries[0])), std::string::npos) << inputs;
  // The reproducing line names the set.
  const testing::CliRun text = runCalivera({"pool", "--set", setPath});
  ASSERT_EQ(text.status, 0) << text.err;
  EXPECT_NE(text.out.find("calivera pool --set " + setPath), std::string::npos) << text.out;

  // A summary replaced after the set was saved (valid on its own) is refused, naming it.
  const testing::CliRun redo =
      runCalivera({"summarize", "--data", cohorts_[states_[1]], "--outcome", "dead", "--risk",
                   "risk", "--site", states_[1], "--suppress-below", "5", "--out", summaries[1]});
  ASSERT_EQ(redo.status, 0) << redo.err;
  const testing::CliRun changed = runCalivera({"pool", "--set", setPath});
  EXPECT_EQ(changed.status, 2);
  EXPECT_NE(changed.err.find(summaries[1]), std::string::npos) << changed.err;
  EXPECT_NE(changed.err.find("changed after the set was saved"), std::string::npos) << changed.err;
  // Not a set; a set naming one summary.
  const testing::CliRun notSet = runCalivera({"pool", "--set", summaries[0]});
  EXPECT_EQ(notSet.status, 2);
  EXPECT_NE(notSet.err.find("not a Calivera site summary set"), std::string::npos) << notSet.err;
  SummarySet single;
  single.summaries = {{summaries[0], ""}};
  dir_.write("one.cvsites", summarySetText(single, dir_.file("one.cvsites")));
  const testing::CliRun one = runCalivera({"pool", "--set", dir_.file("one.cvsites")});
  EXPECT_EQ(one.status, 2);
  EXPECT_NE(one.err.find("fewer than two"), std::string::npos) << one.err;
}

TEST_F(SiteSummaries, BadSummariesAreRefusedClearly) {
  const std::vector<std::string> summaries = summarizeAll();
  // One site only.
  const testing::CliRun one = pool({summaries[0]});
  EXPECT_EQ(one.status, 2);
  EXPECT_NE(one.err.find("at least two site summaries"), std::string::npos) << one.err;
  // The same summary twice.
  const testing::CliRun twice = pool({summaries[0], summaries[0]});
  EXPECT_EQ(twice.status, 2);
  EXPECT_NE(twice.err.find("given twice"), std::string::npos) << twice.err;
  // Hand-edited: one count changed, the file still valid JSON.
  std::string text = testing::readWhole(summaries[1]);
  const std::size_t at = text.find("\"events\": 142");
  ASSERT_NE(at, std::string::npos);
  text.replace(at, 13, "\"events\": 143");
  const std::string edited = dir_.write("edited.cvsummary", text);
  const testing::CliRun changed = pool({summaries[0], edited});
  EXPECT_EQ(changed.status, 2);
  EXPECT_NE(changed.err.find("edited.cvsummary"), std::string::npos) << changed.err;
  EXPECT_NE(changed.err.find("content_sha256"), std::string::npos) << changed.err;
  // Cut short in transit.
  const std::string cut = dir_.write("cut.cvsummary", text.substr(0, text.size() / 2));
  const testing::CliRun damaged = pool({summaries[0], cut});
  EXPECT_EQ(damaged.status, 2);
  EXPECT_NE(damaged.err.find("cut.cvsummary"), std::string::npos) << damaged.err;
  // Different settings: another threshold grid.
  const testing::CliRun other = runCalivera(
      {"summarize", "--data", cohorts_["VIC"], "--outcome", "dead", "--risk", "risk", "--site",
       "VIC-b", "--thresholds", "0.1,0.2", "--out", dir_.file("grid.cvsummary")});
  ASSERT_EQ(other.status, 0) << other.err;
  const testing::CliRun grid = pool({summaries[0], dir_.file("grid.cvsummary")});
  EXPECT_EQ(grid.status, 2);
  EXPECT_NE(grid.err.find("threshold grid"), std::string::npos) << grid.err;
  // A different model: another risk column (here the outcome itself, a perfect "risk").
  const testing::CliRun model =
      runCalivera({"summarize", "--data", cohorts_["VIC"], "--outcome", "dead", "--risk", "dead",
                   "--site", "VIC-c", "--out", dir_.file("model.cvsummary")});
  ASSERT_EQ(model.status, 0) << model.err;
  const testing::CliRun differs = pool({summaries[0], dir_.file("model.cvsummary")});
  EXPECT_EQ(differs.status, 2);
  EXPECT_NE(differs.err.find("the risk column"), std::string::npos) << differs.err;
  // A site with one outcome class cannot be summarized: a clear error.
  const std::string oneClass = dir_.write("one_class.csv", "dead,risk\n1,0.2\n1,0.3\n1,0.4\n");
  const testing::CliRun single =
      runCalivera({"summarize", "--data", oneClass, "--outcome", "dead", "--risk", "risk", "--out",
                   dir_.file("one.cvsummary")});
  EXPECT_NE(single.status, 0);
  EXPECT_FALSE(std::filesystem::exists(dir_.file("one.cvsummary")));
  EXPECT_FALSE(single.err.empty());
}

}  // namespace
}  // namespace calivera
