// Hints for a column that is missing or not numeric (core/data/column_hints.h): a near name, a
// file read with the wrong delimiter, a decimal comma. Unit checks on inline tables, then the real
// `calivera validate` on MASS::birthwt (Debian r-cran-mass, tests/reference/data/birthwt.csv)
// re-written the three faulty ways.
#include "core/data/column_hints.h"

#include <gtest/gtest.h>

#include <fstream>
#include <sstream>
#include <string>

#include "core/data/csv_reader.h"
#include "core/util/errors.h"
#include "tests/unit/birthwt_run.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

Table parsed(const std::string& text, char delimiter = 0) {
  CsvOptions options;
  options.delimiter = delimiter;
  return parseCsv(text, "cohort.csv", options).table;
}

TEST(ColumnHints, ClosestNameIgnoresCaseThenAllowsOneOrTwoEdits) {
  const Table table = parsed("Age,weight_kg,sex,outcome\n1,2,m,0\n");
  EXPECT_EQ(closestColumnName(table, "age"), "Age");
  EXPECT_EQ(closestColumnName(table, "weight_gk"), "weight_kg");  // two edits, 9 bytes
  EXPECT_EQ(closestColumnName(table, "sx"), "sex");               // one edit, short name
  EXPECT_EQ(closestColumnName(table, "height"), "");              // nothing near
  EXPECT_EQ(closestColumnHint(table, "AGE"), " Did you mean 'Age'?");
  EXPECT_EQ(closestColumnHint(table, "creatinine"), "");
}

TEST(ColumnHints, ANameEquallyNearTwoColumnsIsNotGuessed) {
  const Table table = parsed("ab,ac\n1,2\n");
  EXPECT_EQ(closestColumnName(table, "aa"), "");
}

TEST(ColumnHints, AHeaderReadAsOneColumnNamesTheOtherDelimiter) {
  const Table semicolons = parsed("age;lwt;low\n19;182;0\n", ',');
  ASSERT_EQ(semicolons.columns.size(), 1U);
  EXPECT_NE(delimiterHint(semicolons).find("may separate its fields with ';'"), std::string::npos)
      << delimiterHint(semicolons);
  EXPECT_EQ(delimiterHint(parsed("age,lwt\n1,2\n")), "");
  EXPECT_EQ(delimiterHint(parsed("age\n1\n")), "");
}

TEST(ColumnHints, DecimalCommasAndJoinedNumbersAreRecognised) {
  EXPECT_NE(numberFieldHint("1,5").find("decimal comma"), std::string::npos);
  EXPECT_NE(numberFieldHint(" -0,25 ").find("(for example '-0.25')"), std::string::npos)
      << numberFieldHint(" -0,25 ");
  EXPECT_NE(numberFieldHint("19;182;0").find("numbers joined by ';'"), std::string::npos);
  EXPECT_NE(numberFieldHint("2.5|3").find("numbers joined by '|'"), std::string::npos);
  for (const char* plain : {"abc", "5 mg", "1,5,7", ",5", "1,", "yes;no", "1;", ""}) {
    EXPECT_EQ(numberFieldHint(plain), "") << plain;
  }
  EXPECT_EQ(numberFieldHint(std::string(60, '1') + ",5"), "");  // too long to echo
}

TEST(ColumnHints, RequireAndRequireNumericCarryTheHints) {
  const Table table = parsed("Age;lwt\n19;1,5\n", ';');
  try {
    table.require("age");
    ADD_FAILURE() << "no error";
  } catch (const InputError& e) {
    EXPECT_EQ(std::string(e.what()),
              "cohort.csv: no column named 'age' (columns: Age, lwt). Did you mean 'Age'?");
  }
  try {
    table.requireNumeric("lwt");
    ADD_FAILURE() << "no error";
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("'1,5' is not a number. It looks like a decimal comma"),
              std::string::npos)
        << e.what();
  }
}

// birthwt re-written: `transform` gets the header line and each data line.
std::string rewrittenBirthwt(const testing::TempDir& dir, const std::string& name,
                             std::string (*transform)(const std::string&, bool header)) {
  std::ifstream in(testing::birthwtPath());
  const std::string path = dir.file(name);
  std::ofstream out(path);
  std::string line;
  bool header = true;
  while (std::getline(in, line)) {
    out << transform(line, header) << '\n';
    header = false;
  }
  return path;
}

class ColumnHintsCli : public ::testing::Test {
 protected:
  void SetUp() override {
    testing::writeBirthwtModel(dir_.file("m.json"), {"age", "lwt"}, "two terms");
  }
  testing::CliRun validate(const std::string& data, std::vector<std::string> extra = {}) {
    std::vector<std::string> words = {"validate",          "--data", data,
                                      "--outcome",         "low",    "--model",
                                      dir_.file("m.json"), "--json", dir_.file("out.json")};
    words.insert(words.end(), extra.begin(), extra.end());
    return testing::runCalivera(words, 30);
  }
  testing::TempDir dir_{"column_hints"};
};

TEST_F(ColumnHintsCli, AModelVariableMissingFromTheCohortNamesTheTermAndTheMapping) {
  const std::string data =
      rewrittenBirthwt(dir_, "renamed.csv", [](const std::string& line, bool header) {
        return header ? "low,Mother_age" + line.substr(7) : line;
      });
  const testing::CliRun run = validate(data);
  EXPECT_EQ(run.status, 2) << run.err;
  EXPECT_NE(run.err.find("term 'age' needs column 'age'"), std::string::npos) << run.err;
  EXPECT_NE(run.err.find("--map age=COLUMN"), std::string::npos) << run.err;
  EXPECT_NE(run.err.find("Model → Map variables"), std::string::npos) << run.err;
  EXPECT_FALSE(std::filesystem::exists(dir_.file("out.json")));
  // The suggested mapping works.
  const testing::CliRun mapped = validate(data, {"--map", "age=Mother_age"});
  EXPECT_EQ(mapped.status, 0) << mapped.err;

  const std::string cased =
      rewrittenBirthwt(dir_, "cased.csv", [](const std::string& line, bool header) {
        return header ? "low,AGE" + line.substr(7) : line;
      });
  const testing::CliRun near = validate(cased);
  EXPECT_NE(near.err.find("Did you mean 'AGE'?"), std::string::npos) << near.err;
}

TEST_F(ColumnHintsCli, SemicolonFileReadWithCommasAndDecimalCommasGetHints) {
  const std::string semicolons =
      rewrittenBirthwt(dir_, "semicolons.csv", [](const std::string& line, bool) {
        std::string out = line;
        for (char& c : out) c = c == ',' ? ';' : c;
        return out;
      });
  const testing::CliRun wrong = validate(semicolons, {"--delimiter", ","});
  EXPECT_EQ(wrong.status, 2) << wrong.err;
  EXPECT_NE(wrong.err.find("may separate its fields with ';'"), std::string::npos) << wrong.err;
  EXPECT_EQ(validate(semicolons, {"--delimiter", ";"}).status, 0);

  // lwt (pounds) written as "182,0": a decimal comma in a semicolon file.
  const std::string commas =
      rewrittenBirthwt(dir_, "decimal_commas.csv", [](const std::string& line, bool header) {
        std::stringstream in(line);
        std::string field, out;
        for (int i = 0; std::getline(in, field, ','); ++i) {
          out += (i == 0 ? "" : ";") + field + (i == 2 && !header ? ",0" : "");
        }
        return out;
      });
  const testing::CliRun decimal = validate(commas);
  EXPECT_EQ(decimal.status, 2) << decimal.err;
  EXPECT_NE(decimal.err.find(":2: column 'lwt': '182,0' is not a number. It looks like a decimal "
                             "comma"),
            std::string::npos)
      << decimal.err;
}

}  // namespace
}  // namespace calivera
