// `calivera validate --pdf` (the real executable) on the invented sample data and on the open
// birthwt data (MASS::birthwt from Debian r-cran-mass, GPL-2 | GPL-3, shipped under
// tests/reference/data/): the PDF's text, extracted with poppler's pdftotext (an outside reader),
// must carry both fingerprints, the AUC and calibration values of the JSON report of the same
// run as printed to 3 decimals, the caution and the checklist; never a value of the cohort's
// identifier column; with --suppress-below, no small count of the threshold table; and with
// SOURCE_DATE_EPOCH two runs must be byte-identical.
#ifdef CALIVERA_HAVE_PDF

#include <gtest/gtest.h>

#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <nlohmann/json.hpp>
#include <regex>
#include <set>
#include <sstream>

#include "core/report/audit_format.h"
#include "tests/reference/reference_csv.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

using testing::readWhole;
using testing::referencePath;

std::string samplePath(const std::string& name) {
  return std::string(CALIVERA_SOURCE_DIR) + "/sample_data/" + name;
}

std::string pdfText(const std::string& path, bool layout) {
  const std::string command =
      std::string("pdftotext ") + (layout ? "-layout " : "") + testing::shellQuote(path) + " -";
  FILE* pipe = ::popen(command.c_str(), "r");
  std::string text;
  if (pipe == nullptr) return text;
  char buffer[4096];
  std::size_t got = 0;
  while ((got = std::fread(buffer, 1, sizeof buffer, pipe)) > 0) text.append(buffer, got);
  ::pclose(pipe);
  return text;
}

bool contains(const std::string& text, const std::string& part) {
  return text.find(part) != std::string::npos;
}

// SOURCE_DATE_EPOCH for the child processes of one test, restored afterwards.
class FixedEpoch {
 public:
  FixedEpoch() { setenv("SOURCE_DATE_EPOCH", "1764547200", 1); }
  ~FixedEpoch() { unsetenv("SOURCE_DATE_EPOCH"); }
};

TEST(AuditReportCli, SampleReportCarriesTheJsonValuesAndNoIdentifiers) {
  const testing::TempDir dir("audit_sample");
  const FixedEpoch epoch;
  const std::vector<std::string> words = {"validate",
                                          "--data",
                                          samplePath("local_cohort.csv"),
                                          "--outcome",
                                          "complication_30d",
                                          "--model",
                                          samplePath("published_model.json"),
                                          "--thresholds",
                                          "0.05,0.1,0.2,0.3",
                                          "--json",
                                          dir.file("report.json"),
                                          "--pdf",
                                          dir.file("report.pdf"),
                                          "--title",
                                          "Sample audit",
                                          "--paper",
                                          "letter"};
  const testing::CliRun run = testing::runCalivera(words);
  ASSERT_EQ(run.status, 0) << run.err;
  const nlohmann::json json = nlohmann::json::parse(readWhole(dir.file("report.json")));
  const std::string text = pdfText(dir.file("report.pdf"), false);
  ASSERT_FALSE(text.empty()) << "pdftotext produced nothing";

  EXPECT_TRUE(contains(text, json["inputs"]["data"]["sha256"].get<std::string>()));
  EXPECT_TRUE(contains(text, json["inputs"]["model"]["sha256"].get<std::string>()));
  const auto printed = [&](const nlohmann::json& value) {
    return formatFixed(value.get<double>(), 3);
  };
  EXPECT_TRUE(contains(text, printed(json["discrimination"]["auc"]) + " (" +
                                 printed(json["discrimination"]["auc_ci"][0]) + " to " +
                                 printed(json["discrimination"]["auc_ci"][1]) + ")"));
  EXPECT_TRUE(contains(text, printed(json["calibration"]["slope"]) + " (" +
                                 printed(json["calibration"]["slope_ci"][0])));
  EXPECT_TRUE(contains(text, printed(json["calibration"]["intercept"]) + " (" +
                                 printed(json["calibration"]["intercept_ci"][0])));
  EXPECT_TRUE(contains(text, printed(json["calibration"]["oe_ratio"])));
  EXPECT_TRUE(contains(text, "do not replace clinical judgment"));
  EXPECT_TRUE(contains(text, "Reporting checklist"));
  EXPECT_TRUE(contains(text, "[to add]"));
  EXPECT_TRUE(contains(text, "Eligibility criteria"));
  EXPECT_TRUE(contains(text, "Rows read"));

  // No value of the identifier column patient_ref, nor of its site column, nor a folder.
  std::ifstream cohort(samplePath("local_cohort.csv"));
  std::string line;
  std::getline(cohort, line);
  ASSERT_EQ(line.substr(0, 12), "patient_ref,");
  std::size_t checked = 0;
  while (std::getline(cohort, line) && checked < 12000) {
    const std::string id = line.substr(0, line.find(','));
    ASSERT_FALSE(id.empty());
    EXPECT_FALSE(contains(text, id)) << id;
    ++checked;
  }
  EXPECT_EQ(checked, 12000u);
  EXPECT_FALSE(contains(text, "Kestrel Bay General"));
  EXPECT_FALSE(contains(text, CALIVERA_SOURCE_DIR));

  // Same inputs, same settings, SOURCE_DATE_EPOCH: byte-identical.
  std::vector<std::string> again = words;
  again[again.size() - 5] = dir.file("again.pdf");
  const testing::CliRun second = testing::runCalivera(again);
  ASSERT_EQ(second.status, 0) << second.err;
  const std::string first = readWhole(dir.file("report.pdf"));
  ASSERT_GT(first.size(), 10000u);
  EXPECT_TRUE(first == readWhole(dir.file("again.pdf")));
  EXPECT_TRUE(contains(first, "/CreationDate (D:20251201000000"));
  EXPECT_TRUE(contains(first, "/MediaBox [0 0 612.000000 792.000000]"));
}

TEST(AuditReportCli, BirthwtSuppressionHidesSmallCountsAndTheirComplements) {
  const testing::TempDir dir("audit_birthwt");
  const FixedEpoch epoch;
  const testing::CliRun fit = testing::runCalivera(
      {"fit", "--data", referencePath("birthwt.csv"), "--outcome", "low", "--predictors",
       "age,lwt,race,ftv", "--reference", "race=white", "--out", dir.file("model.json")});
  ASSERT_EQ(fit.status, 0) << fit.err;
  const testing::CliRun run = testing::runCalivera(
      {"validate", "--data", referencePath("birthwt.csv"), "--outcome", "low", "--model",
       dir.file("model.json"), "--thresholds", "0.1,0.2,0.3,0.5,0.6", "--json",
       dir.file("birthwt.json"), "--pdf", dir.file("birthwt.pdf"), "--suppress-below", "11"});
  ASSERT_EQ(run.status, 0) << run.err;
  const nlohmann::json json = nlohmann::json::parse(readWhole(dir.file("birthwt.json")));
  const std::string text = pdfText(dir.file("birthwt.pdf"), true);
  EXPECT_TRUE(contains(text, "Small-cell suppression was applied"));
  EXPECT_TRUE(contains(text, "counts from 1 to 10 hidden"));
  EXPECT_TRUE(contains(text, formatFixed(json["discrimination"]["auc"].get<double>(), 3)));

  // The threshold table: a row with any count from 1 to 10 shows none of its four counts.
  const std::size_t table = text.find(". At the selected thresholds");
  ASSERT_NE(table, std::string::npos);
  const std::string tableText = text.substr(table, text.find("Warnings", table) - table);
  int hiddenRows = 0;
  for (const auto& row : json["thresholds"]) {
    const std::string threshold = formatThreshold(row["threshold"].get<double>());
    std::smatch match;
    // Built by appending: "literal" + std::string trips a GCC 12 -Wrestrict false positive.
    std::string pattern = "\\n\\s*";
    pattern += std::regex_replace(threshold, std::regex("\\."), "\\.");
    pattern += "\\s+([^\\n]*)";
    const std::regex rowLine(pattern);
    ASSERT_TRUE(std::regex_search(tableText, match, rowLine)) << threshold;
    const std::string cells = match[1].str();
    bool small = false;
    for (const char* key : {"tp", "fp", "fn", "tn"}) {
      const auto count = row[key].get<long long>();
      small = small || (count >= 1 && count < 11);
    }
    std::istringstream words(cells);
    std::vector<std::string> tokens;
    for (std::string word; words >> word;) tokens.push_back(word);
    ASSERT_GE(tokens.size(), 4u) << cells;
    if (small) {
      ++hiddenRows;
      for (int k = 0; k < 4; ++k) {
        EXPECT_TRUE(tokens[static_cast<std::size_t>(k)] == "<11" ||
                    tokens[static_cast<std::size_t>(k)] == "s")
            << threshold << ": " << cells;
      }
    } else {
      EXPECT_EQ(tokens[0], std::to_string(row["tp"].get<long long>())) << threshold;
    }
  }
  EXPECT_GE(hiddenRows, 1) << "birthwt at 0.6 leaves fewer than 11 flagged";

  // Hosmer-Lemeshow rows hold n = events + non-events: never exactly one hidden cell of three.
  const std::size_t hl = text.find(". Risk groups (Hosmer-Lemeshow)");
  ASSERT_NE(hl, std::string::npos);
  std::istringstream lines(text.substr(hl, table - hl));
  for (std::string line; std::getline(lines, line);) {
    std::smatch match;
    // "  3   0.131 to 0.178   19   <11   s   ..." : group, range, n, events, non-events.
    if (!std::regex_search(
            line, match,
            std::regex("^\\s*\\d+\\s+[0-9.]+ to [0-9.]+\\s+(\\S+)\\s+(\\S+)\\s+(\\S+)"))) {
      continue;
    }
    int hidden = 0;
    for (int k = 1; k <= 3; ++k) hidden += (match[k] == "<11" || match[k] == "s") ? 1 : 0;
    EXPECT_NE(hidden, 1) << line;
  }
}

TEST(AuditReportCli, PdfOptionsAreCheckedBeforeAnythingIsWritten) {
  const testing::TempDir dir("audit_options");
  const std::vector<std::string> base = {
      "validate",         "--data",  samplePath("local_cohort.csv"),     "--outcome",
      "complication_30d", "--model", samplePath("published_model.json"), "--json",
      dir.file("a.json")};
  auto with = [&](std::vector<std::string> extra) {
    std::vector<std::string> words = base;
    words.insert(words.end(), extra.begin(), extra.end());
    return testing::runCalivera(words);
  };
  EXPECT_EQ(with({"--pdf", dir.file("a.pdf"), "--paper", "a5"}).status, 2);
  EXPECT_EQ(with({"--pdf", dir.file("a.pdf"), "--suppress-below", "1"}).status, 2);
  EXPECT_EQ(with({"--title", "x"}).status, 2);
  EXPECT_FALSE(std::ifstream(dir.file("a.pdf")).good());
  const testing::CliRun missingFolder = with({"--pdf", dir.file("none/a.pdf")});
  EXPECT_EQ(missingFolder.status, 2) << missingFolder.err;
  EXPECT_FALSE(std::ifstream(dir.file("none/a.pdf")).good());
  EXPECT_FALSE(std::ifstream(dir.file("a.json")).good());  // the PDF is written first
}

}  // namespace
}  // namespace calivera

#endif  // CALIVERA_HAVE_PDF
