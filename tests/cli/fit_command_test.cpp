// `calivera fit` error paths and codings, through the real executable.
#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>

#include "core/model/model_io.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

using testing::CliRun;
using testing::runCalivera;
using testing::TempDir;

// 12 rows: x separates y (every x = 1 is an event), a/b noise, c = a + b, k constant,
// g a numeric category code, m with one missing value.
const char* kCohort =
    "id,y,x,a,b,c,k,g,m,site\n"
    "p01,1,1,0.5,1.0,1.5,5,1,2.0,north\n"
    "p02,1,1,1.5,0.2,1.7,5,2,1.0,south\n"
    "p03,0,0,2.5,1.1,3.6,5,3,0.5,north\n"
    "p04,1,0,0.1,0.3,0.4,5,1,NA,south\n"
    "p05,0,0,1.2,2.2,3.4,5,2,1.5,north\n"
    "p06,0,0,0.7,0.9,1.6,5,3,2.5,south\n"
    "p07,1,1,1.9,1.4,3.3,5,1,0.8,north\n"
    "p08,0,0,0.4,0.6,1.0,5,2,1.1,south\n"
    "p09,1,0,2.2,0.1,2.3,5,3,1.9,north\n"
    "p10,0,0,1.1,1.8,2.9,5,1,0.3,south\n"
    "p11,0,1,0.9,0.5,1.4,5,2,1.2,north\n"
    "p12,1,0,1.6,1.3,2.9,5,3,0.7,south\n";

// Same rows with p11 an event, so that x separates perfectly on the x = 1 side.
std::string separatedCohort() {
  std::string text = kCohort;
  const std::string from = "p11,0,1,";
  text.replace(text.find(from), from.size(), "p11,1,1,");
  return text;
}

struct Fixture {
  TempDir dir{"fit_command"};
  std::string data = dir.write("cohort.csv", kCohort);
  std::string out = dir.file("model.json");
  CliRun fit(std::vector<std::string> extra, const std::string& predictors) const {
    std::vector<std::string> words{"fit",          "--data",   data,    "--outcome", "y",
                                   "--predictors", predictors, "--out", out};
    words.insert(words.end(), extra.begin(), extra.end());
    return runCalivera(words);
  }
  bool wroteModel() const { return std::filesystem::exists(out); }
};

void expectError(const CliRun& run, int status, const std::string& part) {
  EXPECT_EQ(run.status, status) << run.out << run.err;
  EXPECT_EQ(run.err.rfind("error: ", 0), 0u) << run.err;
  EXPECT_NE(run.err.find(part), std::string::npos) << "wanted '" << part << "' in " << run.err;
}

TEST(FitCommand, UsageErrorsExitTwoWithoutOutput) {
  const Fixture f;
  expectError(runCalivera({"fit", "--data", f.data, "--outcome", "y", "--predictors", "a"}), 2,
              "missing required option --out");
  expectError(f.fit({}, "a,nosuch"), 2, "no column named 'nosuch'");
  expectError(f.fit({"--reference", "site=east"}, "a,site"), 2,
              "reference level 'east' does not occur in column 'site'");
  expectError(f.fit({"--reference", "a=1"}, "a"), 2, "'a', which is numeric");
  expectError(f.fit({"--reference", "site"}, "site"), 2, "not COLUMN=LEVEL");
  expectError(f.fit({}, "a,a"), 2, "listed more than once");
  expectError(f.fit({}, "y,a"), 2, "is the outcome");
  expectError(f.fit({"--outcome", "g"}, "a"), 2, "is not 0 or 1");
  expectError(f.fit({"--delimiter", "|"}, "a"), 2, "--delimiter");
  expectError(f.fit({"--bogus"}, "a"), 2, "unknown option --bogus");
  expectError(f.fit({"--max-iterations", "0"}, "a"), 2, "--max-iterations");
  expectError(runCalivera({"fit", "--data", f.dir.file("absent.csv"), "--outcome", "y",
                           "--predictors", "a", "--out", f.out}),
              2, "absent.csv");
  EXPECT_FALSE(f.wroteModel());
}

TEST(FitCommand, SeparationExitsOneNamingTheVariableAndFirthFits) {
  Fixture f;
  f.data = f.dir.write("separated.csv", separatedCohort());
  expectError(f.fit({}, "x,a"), 1, "separation by 'x'");
  EXPECT_NE(f.fit({}, "x,a").err.find("--firth"), std::string::npos);
  EXPECT_FALSE(f.wroteModel());
  const CliRun firth = f.fit({"--firth"}, "x,a");
  ASSERT_EQ(firth.status, 0) << firth.err;
  const Model model = readModelFile(f.out);
  EXPECT_EQ(*model.development.method, "Firth penalized likelihood (Newton-Raphson)");
  EXPECT_TRUE(std::isfinite(model.terms[0].estimate.coefficient));
  EXPECT_GT(model.terms[0].estimate.coefficient, 1.0);
}

TEST(FitCommand, CollinearConstantAndNonConvergedExitOne) {
  const Fixture f;
  expectError(f.fit({}, "a,b,c"), 1, "'a', 'b', 'c' are collinear");
  expectError(f.fit({}, "a,k"), 1, "'k' is 5 in every one of the 12 analysed rows");
  expectError(f.fit({"--max-iterations", "1"}, "a,b"), 1, "did not converge in 1 iterations");
  expectError(f.fit({"--firth", "--max-iterations", "1"}, "a,b"), 1, "did not converge");
  EXPECT_FALSE(f.wroteModel());
}

TEST(FitCommand, CodesCategoriesAndReportsExclusions) {
  const Fixture f;
  const CliRun run =
      f.fit({"--categorical", "g", "--reference", "g=2", "--name", "demo"}, "m,g,site");
  ASSERT_EQ(run.status, 0) << run.err;
  EXPECT_NE(run.out.find("rows read 12, analysed 11, excluded 1"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("missing in 'm': 1 rows"), std::string::npos) << run.out;
  EXPECT_EQ(run.out.find("p04"), std::string::npos);  // no patient identifiers in the output
  const Model model = readModelFile(f.out);
  EXPECT_EQ(model.name, "demo");
  ASSERT_EQ(model.terms.size(), 4u);
  EXPECT_EQ(model.terms[1].name, "g=1");
  EXPECT_EQ(model.terms[2].name, "g=3");
  EXPECT_EQ(model.terms[3].name, "site=south");
  EXPECT_EQ(model.terms[3].kind, TransformKind::Indicator);
  EXPECT_EQ(model.development.n, 11);
}

TEST(FitCommand, SplineWritesOneTermPerBasisFunctionAndRejectsBadRequests) {
  const Fixture f;
  const CliRun run = f.fit({"--spline", "a=3"}, "a,b");
  ASSERT_EQ(run.status, 0) << run.err;
  const Model model = readModelFile(f.out);
  ASSERT_EQ(model.terms.size(), 3u);  // a spline 0, a spline 1, b
  EXPECT_EQ(model.terms[0].name, "a spline 0");
  EXPECT_EQ(model.terms[1].kind, TransformKind::Spline);
  EXPECT_EQ(model.terms[1].knots.size(), 3u);
  EXPECT_EQ(model.terms[2].name, "b");
  std::filesystem::remove(f.out);
  expectError(f.fit({"--spline", "a=2"}, "a,b"), 2, "3 to 7 knots");
  expectError(f.fit({"--spline", "site=3"}, "a,site"), 2, "categorical");
  expectError(f.fit({"--spline", "a"}, "a,b"), 2, "COLUMN=KNOTS");
  EXPECT_FALSE(f.wroteModel());
}

TEST(FitCommand, ProfileIntervalsArePrintedAndRefusedWithFirth) {
  const Fixture f;
  const CliRun run = f.fit({"--profile-ci"}, "a,b");
  ASSERT_EQ(run.status, 0) << run.err;
  EXPECT_NE(run.out.find("profile-likelihood 95% intervals"), std::string::npos) << run.out;
  std::filesystem::remove(f.out);
  expectError(f.fit({"--profile-ci", "--firth"}, "a,b"), 2, "--profile-ci");
  EXPECT_FALSE(f.wroteModel());
}

TEST(FitCommand, HelpExitsZero) {
  const CliRun run = runCalivera({"fit", "--help"});
  EXPECT_EQ(run.status, 0);
  EXPECT_NE(run.out.find("--predictors"), std::string::npos);
}

}  // namespace
}  // namespace calivera
