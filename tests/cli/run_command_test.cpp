// `calivera run STUDY.cvstudy` against `calivera validate` with the options the study stands for
// (the contract of issue 10): the same JSON number for number, the same exit statuses, and the
// printed reproduce line. Data: MASS::birthwt (Debian r-cran-mass, tests/reference/data); the
// checks compare two routes of our own, so no reference value is involved.
#include <gtest/gtest.h>

#include <filesystem>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "core/study/limits.h"
#include "core/study/reproduce_command.h"
#include "core/study/study_file.h"
#include "core/util/sha256.h"
#include "tests/unit/cli_run.h"
#include "tests/unit/study_fixture.h"

namespace calivera {
namespace {

using testing::CliRun;
using testing::readWhole;
using testing::runCalivera;
using testing::TempDir;

const std::string kBirthwt = std::string(CALIVERA_SOURCE_DIR) + "/tests/reference/data/birthwt.csv";

// birthwt with ';' as delimiter and the column 'age' named 'mother_age': the same patients in
// another file, so neither its bytes nor its header match the model's development data.
std::string writeRelabelled(const TempDir& dir) {
  std::string text = readWhole(kBirthwt);
  for (char& c : text) {
    if (c == ',') c = ';';
  }
  text.replace(text.find("age"), 3, "mother_age");
  return dir.write("relabelled.csv", text);
}

std::vector<std::string> splitWords(const std::vector<std::string>& prefix,
                                    const std::vector<std::string>& words) {
  std::vector<std::string> all = prefix;
  all.insert(all.end(), words.begin(), words.end());
  return all;
}

class RunCommand : public ::testing::Test {
 protected:
  void SetUp() override {
    const CliRun fit = runCalivera({"fit", "--data", kBirthwt, "--outcome", "low", "--predictors",
                                    "age,lwt,smoke,ht", "--out", dir_.file("model.json")});
    ASSERT_EQ(fit.status, 0) << fit.err;
  }
  std::string model() const { return dir_.file("model.json"); }
  TempDir dir_{"run_command"};
};

TEST_F(RunCommand, JsonEqualsValidateWithTheStudysOptions) {
  StudyState study = testing::birthwtFileStudy(writeRelabelled(dir_), model());
  study.import.delimiter = ';';
  study.columnMapping["age"] = "mother_age";
  study.uncertaintySettings.bootstrapReplicates = 25;
  study.uncertaintySettings.seed = 11;
  study.uncertaintySettings.subgroupColumns = {"race"};
  study.uncertaintySettings.sizeThresholds = {0.2};
  const std::string studyPath = dir_.file("study.cvstudy");
  writeStudyFile(studyPath, study);

  const CliRun viaRun = runCalivera({"run", studyPath, "--json", dir_.file("run.json")});
  ASSERT_EQ(viaRun.status, 0) << viaRun.err;
  const StudyRequests requests = studyRequests(readStudyFile(studyPath));
  const std::vector<std::string> words =
      validateCommandWords(requests.validation, requests.uncertainty);
  const CliRun viaValidate =
      runCalivera(splitWords(splitWords({"validate"}, words), {"--json", dir_.file("v.json")}));
  ASSERT_EQ(viaValidate.status, 0) << viaValidate.err;

  const auto a = nlohmann::json::parse(readWhole(dir_.file("run.json")));
  const auto b = nlohmann::json::parse(readWhole(dir_.file("v.json")));
  EXPECT_EQ(a, b);  // every key, every number
  // The same patients (columns renamed and mapped, another delimiter): the analysed values are
  // the model's development data, whatever the file's bytes.
  EXPECT_EQ(a["cohort"]["performance"], "apparent");
  EXPECT_NE(a["cohort"]["performance_basis"].get<std::string>().find("analysed-data fingerprint"),
            std::string::npos);
  EXPECT_EQ(a["inputs"]["data"]["analysed_data_sha256"],
            a["model"]["development_analysed_data_sha256"]);
  EXPECT_FALSE(a["bootstrap"].is_null());
  // The mapping and the delimiter are in the words, spelled as the options take them.
  const std::string line = commandLine("validate", words);
  EXPECT_NE(line.find("--map age=mother_age"), std::string::npos) << line;
  EXPECT_NE(line.find("--delimiter ';'"), std::string::npos) << line;
  EXPECT_NE(line.find("--bootstrap 25 --seed 11"), std::string::npos) << line;
}

#ifdef CALIVERA_HAVE_PDF  // a build without the UI has no PDF writer
// Net benefit across sites is pooled where the workstation pools it for the same study, whether or
// not `run` also writes the report (whose own table rows are the study's report thresholds): the
// PDF the workstation exports and the one `run --pdf` writes carry the same site numbers.
TEST_F(RunCommand, SitesArePooledAsInTheWorkstationWithOrWithoutTheReport) {
  StudyState study = testing::birthwtFileStudy(kBirthwt, model());
  study.uncertaintySettings.clusterColumn = "race";
  study.report.thresholds = {0.15, 0.35};
  const std::string studyPath = dir_.file("sites.cvstudy");
  writeStudyFile(studyPath, study);
  const CliRun plain = runCalivera({"run", studyPath, "--json", dir_.file("plain.json")});
  ASSERT_EQ(plain.status, 0) << plain.err;
  const CliRun withPdf = runCalivera(
      {"run", studyPath, "--json", dir_.file("pdf.json"), "--pdf", dir_.file("sites.pdf")});
  ASSERT_EQ(withPdf.status, 0) << withPdf.err;
  const auto a = nlohmann::json::parse(readWhole(dir_.file("plain.json")));
  const auto b = nlohmann::json::parse(readWhole(dir_.file("pdf.json")));
  ASSERT_TRUE(a.contains("clusters"));
  EXPECT_EQ(a.at("clusters"), b.at("clusters"));
  std::vector<double> thresholds;
  for (const auto& row : a.at("clusters").at("net_benefit")) thresholds.push_back(row["threshold"]);
  EXPECT_EQ(thresholds, (std::vector<double>{0.05, 0.1, 0.2, 0.3, 0.5}));
}
#endif

TEST_F(RunCommand, SummaryEndsWithTheReproduceLineThenTheCaution) {
  const StudyState study = testing::birthwtFileStudy(kBirthwt, model());
  const std::string studyPath = dir_.file("plain.cvstudy");
  writeStudyFile(studyPath, study);
  const CliRun run = runCalivera({"run", studyPath});
  ASSERT_EQ(run.status, 0) << run.err;
  const std::size_t reproduce = run.out.find("Reproduce with:\n  calivera validate --data ");
  const std::size_t caution = run.out.find("do not replace clinical judgment");
  ASSERT_NE(reproduce, std::string::npos) << run.out;
  ASSERT_NE(caution, std::string::npos);
  EXPECT_LT(reproduce, caution);
  EXPECT_NE(run.out.find(reproduceCommandLine(study)), std::string::npos);
  // validate prints its own line the same way, with the options it was given.
  const CliRun validate = runCalivera(
      {"validate", "--data", kBirthwt, "--outcome", "low", "--model", model(), "--groups", "8"});
  ASSERT_EQ(validate.status, 0) << validate.err;
  EXPECT_NE(validate.out.find(reproduceCommandLine(study)), std::string::npos) << validate.out;
}

TEST_F(RunCommand, DevelopmentDataStatementAndFingerprintBothGiveApparent) {
  // The model's own development file: apparent by its SHA-256, Hosmer-Lemeshow on g - 2 df.
  writeStudyFile(dir_.file("own.cvstudy"), testing::birthwtFileStudy(kBirthwt, model()));
  ASSERT_EQ(runCalivera({"run", dir_.file("own.cvstudy"), "--json", dir_.file("own.json")}).status,
            0);
  const auto own = nlohmann::json::parse(readWhole(dir_.file("own.json")));
  EXPECT_EQ(own["cohort"]["performance"], "apparent");
  EXPECT_EQ(own["hosmer_lemeshow"]["df"], 6);

  // The same patients without the last one: new data unless the user states otherwise.
  std::string fewer = readWhole(writeRelabelled(dir_));
  fewer.erase(fewer.rfind('\n', fewer.size() - 2) + 1);
  StudyState stated = testing::birthwtFileStudy(dir_.write("fewer.csv", fewer), model());
  stated.import.delimiter = ';';
  stated.columnMapping["age"] = "mother_age";
  writeStudyFile(dir_.file("new.cvstudy"), stated);
  ASSERT_EQ(runCalivera({"run", dir_.file("new.cvstudy"), "--json", dir_.file("new.json")}).status,
            0);
  EXPECT_EQ(nlohmann::json::parse(readWhole(dir_.file("new.json")))["cohort"]["performance"],
            "new data");
  stated.analysis.apparent = true;
  writeStudyFile(dir_.file("stated.cvstudy"), stated);
  const CliRun run =
      runCalivera({"run", dir_.file("stated.cvstudy"), "--json", dir_.file("stated.json")});
  ASSERT_EQ(run.status, 0) << run.err;
  const auto j = nlohmann::json::parse(readWhole(dir_.file("stated.json")));
  EXPECT_EQ(j["cohort"]["performance"], "apparent");
  EXPECT_NE(j["cohort"]["performance_basis"].get<std::string>().find("stated by the user"),
            std::string::npos);
  EXPECT_EQ(j["hosmer_lemeshow"]["df"], 6);
  EXPECT_EQ(j["cohort"]["n"], 188);
}

TEST_F(RunCommand, BadStudyOrMissingInputIsExitTwoWithoutOutput) {
  const std::string broken = dir_.write("broken.cvstudy", "{\"format\": \"calivera-study/1\",");
  const CliRun bad = runCalivera({"run", broken, "--json", dir_.file("never.json")});
  EXPECT_EQ(bad.status, 2);
  EXPECT_NE(bad.err.find("broken.cvstudy"), std::string::npos) << bad.err;
  EXPECT_FALSE(std::filesystem::exists(dir_.file("never.json")));

  StudyState study = testing::birthwtFileStudy(kBirthwt, model());
  study.data->path = dir_.file("gone.csv");
  writeStudyFile(dir_.file("gone.cvstudy"), study);
  const CliRun gone =
      runCalivera({"run", dir_.file("gone.cvstudy"), "--json", dir_.file("n.json")});
  EXPECT_EQ(gone.status, 2);
  EXPECT_NE(gone.err.find("missing"), std::string::npos) << gone.err;
  EXPECT_FALSE(std::filesystem::exists(dir_.file("n.json")));

  EXPECT_EQ(runCalivera({"run"}).status, 2);
  const CliRun help = runCalivera({"run", "--help"});
  EXPECT_EQ(help.status, 0);
  EXPECT_NE(help.out.find("calivera run STUDY.cvstudy"), std::string::npos);
}

// A cohort changed after the study was saved still runs (on the file as it is now), and the user
// is told once, on stderr, with the study's name; the summary carries the new fingerprint.
TEST_F(RunCommand, ChangedCohortIsNamedOnce) {
  const std::string copy = dir_.write("copy.csv", readWhole(kBirthwt));
  StudyState study = testing::birthwtFileStudy(copy, model());
  writeStudyFile(dir_.file("changed.cvstudy"), study);
  dir_.write("copy.csv", readWhole(kBirthwt) + "\n");  // a trailing empty line: new bytes
  const CliRun run = runCalivera({"run", dir_.file("changed.cvstudy")});
  ASSERT_EQ(run.status, 0) << run.err;
  const std::string warning = "cohort data " + copy + " changed since the study was saved";
  const std::size_t at = run.err.find(warning);
  EXPECT_NE(at, std::string::npos) << run.err;
  EXPECT_EQ(run.err.find(warning, at + 1), std::string::npos) << run.err;
  EXPECT_NE(run.err.find("changed.cvstudy"), std::string::npos);
  EXPECT_NE(run.out.find(sha256OfFile(copy)), std::string::npos);
}

// The report settings the workstation saves with a study (StudyState::report) survive the file and
// reach `run --pdf`; a bad value is refused naming its field, before anything is written.
TEST_F(RunCommand, ReportSettingsRoundTripAndBadOnesAreRefused) {
  StudyState study = testing::birthwtFileStudy(kBirthwt, model());
  study.report.title = "Ward 7 =SUM(A1)";
  study.report.thresholds = {0.1, 0.2};
  study.report.suppressBelow = 5;
  study.report.paper = "letter";
  study.report.analyst = "A. Analyst";
  study.report.reviewer = "R. Reviewer";
  writeStudyFile(dir_.file("report.cvstudy"), study);
  const StudyState back = readStudyFile(dir_.file("report.cvstudy"));
  EXPECT_EQ(back.report.analyst, "A. Analyst");
  EXPECT_EQ(back.report.reviewer, "R. Reviewer");
  EXPECT_EQ(back.report.title, study.report.title);
  EXPECT_EQ(back.report.thresholds, study.report.thresholds);
  EXPECT_EQ(back.report.suppressBelow, 5u);
  EXPECT_EQ(back.report.paper, "letter");

#ifdef CALIVERA_HAVE_PDF  // a build without the UI has no PDF writer
  // A saved threshold that the validation did not compute is the report's error, exit 2.
  study.report.thresholds = {0.125};
  writeStudyFile(dir_.file("offgrid.cvstudy"), study);
  const CliRun offGrid =
      runCalivera({"run", dir_.file("offgrid.cvstudy"), "--pdf", dir_.file("never.pdf")});
  EXPECT_EQ(offGrid.status, 2);
  EXPECT_NE(offGrid.err.find("0.125"), std::string::npos) << offGrid.err;
  EXPECT_FALSE(std::filesystem::exists(dir_.file("never.pdf")));
  // ... and the same run with the option naming computed thresholds succeeds.
  const CliRun overridden = runCalivera({"run", dir_.file("offgrid.cvstudy"), "--pdf",
                                         dir_.file("ok.pdf"), "--report-thresholds", "0.1,0.3"});
  EXPECT_EQ(overridden.status, 0) << overridden.err;
  EXPECT_TRUE(std::filesystem::exists(dir_.file("ok.pdf")));
#endif

  const auto withReport = [&](const std::string& report) {
    std::string text = readWhole(dir_.file("report.cvstudy"));
    const std::size_t at = text.find("\"report\"");
    const std::size_t end = text.find('}', at);
    text.replace(at, end + 1 - at, "\"report\": " + report);
    return dir_.write("bad.cvstudy", text);
  };
  const std::string longName =
      R"({"reviewer": ")" + std::string(kMaxSignOffNameBytes + 1, 'r') + "\"}";
  const std::pair<const char*, const char*> cases[] = {
      {R"({"paper": "a3"})", "report.paper"},
      {R"({"suppressBelow": 1})", "report.suppressBelow"},
      {R"({"suppressBelow": 5000})", "report.suppressBelow"},
      {R"({"thresholds": [0.2, 1.5]})", "report.thresholds"},
      {R"({"title": 7})", "report.title"},
      {R"({"analyst": ["x"]})", "report.analyst"},
      {longName.c_str(), "report.reviewer"},
  };
  for (const auto& [report, field] : cases) {
    const CliRun run = runCalivera({"run", withReport(report)});
    EXPECT_EQ(run.status, 2) << report;
    EXPECT_NE(run.err.find(field), std::string::npos) << report << ": " << run.err;
  }
}

}  // namespace
}  // namespace calivera
