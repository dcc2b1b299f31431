// Hostile and faulty inputs (issue 11): special files refused at once, duplicate keys and deep
// nesting in model and study files refused with the file and the key named, exit status 2 and no
// output file. Every run has a time limit, so a regression that hangs fails instead of stalling.
#include <gtest/gtest.h>
#include <sys/stat.h>

#include <filesystem>
#include <string>

#include "core/report/audit_format.h"
#include "core/report/csv_text.h"
#include "core/util/shown_text.h"
#include "core/util/utf8.h"
#include "tests/unit/birthwt_run.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

using testing::CliRun;
using testing::runCalivera;
using testing::TempDir;

constexpr int kLimitSeconds = 20;

class HostileInputs : public ::testing::Test {
 protected:
  void SetUp() override {
    testing::writeBirthwtModel(dir_.file("m.json"), {"age", "lwt"}, "two terms");
  }
  CliRun validate(const std::string& data, const std::string& model) {
    return runCalivera({"validate", "--data", data, "--outcome", "low", "--model", model, "--json",
                        dir_.file("out.json")},
                       kLimitSeconds);
  }
  void expectRefused(const CliRun& run, const std::string& part) {
    EXPECT_EQ(run.status, 2) << run.err;
    EXPECT_NE(run.err.find(part), std::string::npos) << run.err;
    EXPECT_FALSE(std::filesystem::exists(dir_.file("out.json")));
  }
  TempDir dir_{"hostile"};
};

TEST_F(HostileInputs, FifoAndDevicesAreRefusedAtOnce) {
  const std::string fifo = dir_.file("cohort.fifo");
  ASSERT_EQ(::mkfifo(fifo.c_str(), 0600), 0);
  expectRefused(validate(fifo, dir_.file("m.json")), "is a FIFO (named pipe), not a regular file");
  expectRefused(validate(testing::birthwtPath(), "/dev/zero"),
                "/dev/zero: the model file is a character device");
  expectRefused(validate(dir_.file(""), dir_.file("m.json")), "is a directory");
  const CliRun compare =
      runCalivera({"validate", "--data", testing::birthwtPath(), "--outcome", "low", "--model",
                   dir_.file("m.json"), "--compare", "/dev/zero", "--json", dir_.file("out.json")},
                  kLimitSeconds);
  expectRefused(compare, "/dev/zero");
  const CliRun study = runCalivera({"run", fifo}, kLimitSeconds);
  EXPECT_EQ(study.status, 2) << study.err;
}

TEST_F(HostileInputs, DuplicateKeysAndDeepNestingInAModelFileAreRefused) {
  const std::string duplicate =
      dir_.write("dup.json",
                 R"({"format": "calivera-model/1", "name": "m", "outcome": "low",
          "intercept": {"coefficient": 1.0, "coefficient": 2.0}, "terms": []})");
  expectRefused(validate(testing::birthwtPath(), duplicate),
                "dup.json: the key 'coefficient' appears twice in one object");
  std::string deep = R"({"format": "calivera-model/1", "name": "m", "outcome": "low", "x": )";
  for (int i = 0; i < 5000; ++i) deep += "[";
  for (int i = 0; i < 5000; ++i) deep += "]";
  deep += "}";
  expectRefused(validate(testing::birthwtPath(), dir_.write("deep.json", deep)),
                "deep.json: nested deeper than 64 levels");
}

TEST_F(HostileInputs, DuplicateKeyInAStudyFileIsRefused) {
  const std::string study =
      dir_.write("dup.cvstudy", R"({"format": "calivera-study/1", "format": "calivera-study/1"})");
  const CliRun run = runCalivera({"run", study, "--json", dir_.file("out.json")}, kLimitSeconds);
  expectRefused(run, "dup.cvstudy: the key 'format' appears twice in one object");
}

// An output equal to an input is refused before anything runs: the cohort and the model stay as
// they were (they used to be overwritten by --json and update --out).
TEST_F(HostileInputs, OutputsNeverOverwriteInputs) {
  const std::string data = dir_.write("cohort.csv", testing::readWhole(testing::birthwtPath()));
  const std::string before = testing::readWhole(data);
  const CliRun json = runCalivera({"validate", "--data", data, "--outcome", "low", "--model",
                                   dir_.file("m.json"), "--json", data},
                                  kLimitSeconds);
  EXPECT_EQ(json.status, 2);
  EXPECT_NE(json.err.find("must not overwrite an input"), std::string::npos) << json.err;
  EXPECT_EQ(testing::readWhole(data), before);
  const std::string model = testing::readWhole(dir_.file("m.json"));
  const CliRun update =
      runCalivera({"update", "--data", data, "--outcome", "low", "--model", dir_.file("m.json"),
                   "--method", "intercept", "--out", dir_.file("./m.json")},
                  kLimitSeconds);
  EXPECT_EQ(update.status, 2);
  EXPECT_EQ(testing::readWhole(dir_.file("m.json")), model);
  const CliRun same =
      runCalivera({"validate", "--data", data, "--outcome", "low", "--model", dir_.file("m.json"),
                   "--json", dir_.file("r.out"), "--csv-dir", dir_.file("r.out")},
                  kLimitSeconds);
  EXPECT_EQ(same.status, 2);
  EXPECT_NE(same.err.find("name the same file"), std::string::npos) << same.err;
}

// Outputs are all or none: when the last output cannot be written, the earlier ones of the same
// run do not appear and an earlier --csv-dir result is left exactly as it was.
TEST_F(HostileInputs, AFailedOutputLeavesNoOtherOutputAndKeepsEarlierTables) {
  const std::vector<std::string> base{"validate",          "--data",    testing::birthwtPath(),
                                      "--outcome",         "low",       "--model",
                                      dir_.file("m.json"), "--csv-dir", dir_.file("tables")};
  ASSERT_EQ(runCalivera(base, kLimitSeconds).status, 0);
  const std::string earlier = testing::readWhole(dir_.file("tables") + "/thresholds.csv");
  ASSERT_FALSE(earlier.empty());
  // A JSON path under a regular file cannot be created: the run fails on its last output, after
  // its tables (with other groups, so other contents) were already rendered.
  dir_.write("blocker", "x");
  std::vector<std::string> failing = base;
  failing.insert(failing.end(), {"--groups", "5", "--json", dir_.file("blocker/out.json")});
  const CliRun run = runCalivera(failing, kLimitSeconds);
  EXPECT_EQ(run.status, 2) << run.err;
  EXPECT_NE(run.err.find("blocker"), std::string::npos) << run.err;
  EXPECT_EQ(testing::readWhole(dir_.file("tables") + "/thresholds.csv"), earlier);
  for (const auto& entry : std::filesystem::directory_iterator(dir_.file("tables"))) {
    EXPECT_EQ(entry.path().filename().string().find(".tmp-"), std::string::npos) << entry.path();
  }
}

// Study file numbers are range-checked against the one table of limits before any conversion
// (core/study/limits.h): "groups": 3e69 was undefined behaviour, 2000000000 ran out of memory.
TEST_F(HostileInputs, StudyFileNumbersOutsideTheirLimitsAreRefused) {
  const auto study = [&](const std::string& analysis) {
    return dir_.write("s.cvstudy", R"({"format": "calivera-study/1", "import": {},
        "model": {"source": "none"}, "analysis": )" +
                                       analysis + "}");
  };
  const std::pair<const char*, const char*> cases[] = {
      {R"({"groups": 3e69})", "analysis.groups': is outside its allowed range"},
      {R"({"groups": 2000000000})", "analysis.groups': is outside its allowed range"},
      {R"({"groups": 7.5})", "analysis.groups': must be a whole number"},
      {R"({"reasonableLo": 0.9, "reasonableHi": -5})", "analysis.reasonableHi"},
      {R"({"reasonableLo": 0.4, "reasonableHi": 0.2})", "must be below analysis.reasonableHi"},
      {R"({"threshold": 15})", "analysis.threshold': must lie between 0 and 1"},
  };
  for (const auto& [analysis, message] : cases) {
    const CliRun run = runCalivera({"run", study(analysis)}, kLimitSeconds);
    EXPECT_EQ(run.status, 2) << analysis;
    EXPECT_NE(run.err.find(message), std::string::npos) << analysis << ": " << run.err;
    EXPECT_NE(run.err.find("s.cvstudy"), std::string::npos) << run.err;
  }
}

TEST_F(HostileInputs, AHugeThresholdGridIsRefusedNotAllocated) {
  const CliRun run =
      runCalivera({"validate", "--data", testing::birthwtPath(), "--outcome", "low", "--model",
                   dir_.file("m.json"), "--thresholds", "0.000000001:0.999999999:0.000000001"},
                  kLimitSeconds);
  EXPECT_EQ(run.status, 2);
  EXPECT_NE(run.err.find("at most 10000"), std::string::npos) << run.err;
}

// Invalid UTF-8 is refused when the cohort is read, naming the line and the column (it used to
// fail only when the JSON was written, exit 1 with a library message).
TEST_F(HostileInputs, InvalidUtf8IsRefusedAtReadingWithItsLocation) {
  const std::string data =
      dir_.write("latin1.csv", "low,age,lwt,site\n0,20,120,A\n1,30,130,Z\xfcrich\n0,25,110,A\n");
  // Used (as the subgroup column): refused where it is read.
  const CliRun run = runCalivera({"validate", "--data", data, "--outcome", "low", "--risk", "lwt",
                                  "--subgroup", "site", "--json", dir_.file("out.json")},
                                 kLimitSeconds);
  expectRefused(run, "latin1.csv:3: column 4 ('site'): the value is not valid UTF-8 (Z\\xfcrich)");
  // A column the analysis never reads is not parsed (issue 13): its bytes reach no output, so
  // they stop nothing. Header names are always checked.
  const std::string risks =
      dir_.write("latin1_risk.csv", "low,risk,site\n0,0.2,A\n1,0.3,Z\xfcrich\n0,0.25,A\n1,0.6,B\n");
  const CliRun unused = runCalivera({"validate", "--data", risks, "--outcome", "low", "--risk",
                                     "risk", "--json", dir_.file("out.json")},
                                    kLimitSeconds);
  EXPECT_EQ(unused.status, 0) << unused.err;
  std::filesystem::remove(dir_.file("out.json"));
  const std::string badHeader =
      dir_.write("latin1_header.csv", "low,risk,Z\xfcrich\n0,0.2,1\n1,0.3,2\n0,0.25,1\n");
  expectRefused(runCalivera({"validate", "--data", badHeader, "--outcome", "low", "--risk", "risk",
                             "--json", dir_.file("out.json")},
                            kLimitSeconds),
                "the column name is not valid UTF-8");
  EXPECT_TRUE(validUtf8("Z\xc3\xbcrich"));
  EXPECT_FALSE(validUtf8("\xed\xa0\x80"));      // a surrogate
  EXPECT_FALSE(validUtf8("\xc0\xaf"));          // overlong
  EXPECT_FALSE(validUtf8("\xf4\x90\x80\x80"));  // above U+10FFFF
}

// A study whose input is found through a relative path leaving its folder says so (the run still
// uses it: moving a study with its data is legitimate, but the user sees where the file is).
TEST_F(HostileInputs, RelativePathLeavingTheStudyFolderIsShown) {
  testing::writeBirthwtModel(dir_.file("m3.json"), {"age", "lwt"}, "two terms");
  dir_.write("data.csv", testing::readWhole(testing::birthwtPath()));
  std::filesystem::create_directories(dir_.file("studies"));
  const std::string study = dir_.write("studies/s.cvstudy",
                                       R"({"format": "calivera-study/1",
          "data": {"path": "/nonexistent/data.csv", "relativePath": "../data.csv", "sha256": ""},
          "import": {"outcome": "low"},
          "model": {"source": "file", "file": {"path": ")" +
                                           dir_.file("m3.json") + R"(", "sha256": ""}},
          "analysis": {"groups": 8}})");
  const CliRun run = runCalivera({"run", study, "--json", dir_.file("out.json")}, kLimitSeconds);
  EXPECT_EQ(run.status, 0) << run.err;
  EXPECT_NE(run.err.find("'../data.csv', which leaves the study file's folder"), std::string::npos)
      << run.err;
}

// A huge or hidden-byte field is echoed cut and escaped, never whole (a 100 MB field reached
// stderr in full; a NUL cut the message).
TEST_F(HostileInputs, BadFieldTextIsEchoedCutAndEscaped) {
  const std::string huge(100000, 'q');
  const std::string data =
      dir_.write("bad.csv", "low,age\n0,20\n1," + huge + "\n0,2" + std::string(1, '\0') + "x\n");
  const CliRun run =
      runCalivera({"validate", "--data", data, "--outcome", "low", "--risk", "age"}, kLimitSeconds);
  EXPECT_EQ(run.status, 2);
  EXPECT_LT(run.err.size(), 400u) << run.err.size();
  EXPECT_NE(run.err.find("bad.csv:3: column 'age': 'qqqq"), std::string::npos) << run.err;
  EXPECT_NE(run.err.find("...' is not a number"), std::string::npos) << run.err;
}

TEST(ReportNames, LongNamesAreCutForThePrintedReport) {
  const std::string level(2000, 'L');
  EXPECT_EQ(reportName(level).size(), kReportNameChars + 3);
  EXPECT_EQ(fileNameOnly("/a/b/" + std::string(300, 'f') + ".csv").size(), kReportNameChars + 3);
}

TEST(ShownText, BidiControlsAreWrittenOutAndLongNamesCut) {
  EXPECT_EQ(visibleName("gnp\u202Eexe.png"), "gnp[U+202E]exe.png");
  EXPECT_EQ(visibleName("a\tb"), "a[U+0009]b");
  EXPECT_EQ(visibleName(std::string(100, 'y'), 10), std::string(10, 'y') + "...");
  EXPECT_EQ(visibleName("caf\xc3\xa9"), "caf\xc3\xa9");  // ordinary UTF-8 unchanged
}

// Formula injection: a level or model name starting with =, +, -, @ reaches a spreadsheet as text
// (leading apostrophe, quoted), while numbers, negative ones included, stay numbers.
TEST(CsvCells, FormulasAreNeutralisedNumbersAreNot) {
  EXPECT_EQ(csvCell("=HYPERLINK(\"x\")"), "\"'=HYPERLINK(\"\"x\"\")\"");
  EXPECT_EQ(csvCell("@SUM(A1)"), "\"'@SUM(A1)\"");
  EXPECT_EQ(csvCell("+cmd"), "\"'+cmd\"");
  EXPECT_EQ(csvCell("-2+3"), "\"'-2+3\"");
  EXPECT_EQ(csvCell("\tx"), "\"'\tx\"");
  EXPECT_EQ(csvCell("-0.41"), "-0.41");
  EXPECT_EQ(csvCell("+1e-5"), "+1e-5");
  EXPECT_EQ(csvCell("plain"), "plain");
  EXPECT_EQ(csvCell("a,b"), "\"a,b\"");
  EXPECT_EQ(csvCell("=x", false), "'=x");
  CsvText csv({"level", "value"});
  csv.field("=1+1").num(-0.25).end();
  EXPECT_EQ(csv.str(), "level,value\n\"'=1+1\",-0.25\n");
}

// A subgroup level named like a formula reaches --csv-dir neutralised.
TEST_F(HostileInputs, SubgroupLevelNamedLikeAFormulaIsNeutralisedInCsv) {
  std::string text = testing::readWhole(testing::birthwtPath());
  for (std::size_t at = text.find(",white,"); at != std::string::npos;
       at = text.find(",white,", at)) {
    text.replace(at, 7, ",=cmd(),");
  }
  const std::string data = dir_.write("formula.csv", text);
  testing::writeBirthwtModel(dir_.file("m2.json"), {"age", "lwt"}, "two terms");
  const CliRun run =
      runCalivera({"validate", "--data", data, "--outcome", "low", "--model", dir_.file("m2.json"),
                   "--subgroup", "race", "--csv-dir", dir_.file("tables")},
                  kLimitSeconds);
  ASSERT_EQ(run.status, 0) << run.err;
  const std::string csv = testing::readWhole(dir_.file("tables") + "/subgroups.csv");
  EXPECT_NE(csv.find("\"'=cmd()\""), std::string::npos) << csv;
  EXPECT_EQ(csv.find(",=cmd()"), std::string::npos) << csv;
}

}  // namespace
}  // namespace calivera
