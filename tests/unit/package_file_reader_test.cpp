// The statistical-package cohort reader (core/data/package_file_reader.h) on files written by R's
// haven 2.5.1 (Debian r-cran-haven) from MASS::birthwt and MASS::Pima.tr (Debian r-cran-mass);
// script: tests/reference/scripts/package_files.R. Each file is checked against the same data
// read from CSV by the CSV reader, column by column.
#include "core/data/package_file_reader.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <fstream>

#include "core/data/cohort.h"
#include "core/data/cohort_file.h"
#include "core/data/csv_reader.h"
#include "core/util/errors.h"
#include "tests/reference/reference_csv.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

using testing::referencePath;

std::string packagePath(const std::string& name) {
  return referencePath("package/" + name);
}

std::string errorOf(const std::function<void()>& action) {
  try {
    action();
  } catch (const InputError& error) {
    return error.what();
  }
  return "(no InputError)";
}

// Every column of `csv` has the same values in `package`: numbers bit for bit (NaN where
// missing), text columns the same levels in the same order and the same codes.
void expectSameColumns(const Table& csv, const Table& package, const std::string& what) {
  ASSERT_EQ(package.rowCount, csv.rowCount) << what;
  for (const Column& expected : csv.columns) {
    const Column* got = package.find(expected.name);
    ASSERT_NE(got, nullptr) << what << ": " << expected.name;
    ASSERT_EQ(got->kind, expected.kind) << what << ": " << expected.name;
    EXPECT_EQ(got->missingCount, expected.missingCount) << what << ": " << expected.name;
    if (expected.kind == ColumnKind::Text) {
      EXPECT_EQ(got->levels, expected.levels) << what << ": " << expected.name;
      EXPECT_EQ(got->codes, expected.codes) << what << ": " << expected.name;
      continue;
    }
    for (std::size_t row = 0; row < csv.rowCount; ++row) {
      const double a = expected.numbers[row];
      const double b = got->numbers[row];
      ASSERT_TRUE((std::isnan(a) && std::isnan(b)) || a == b)
          << what << ": " << expected.name << " row " << row << ": " << a << " vs " << b;
    }
  }
}

TEST(PackageFileReader, FormatsAreKnownByExtensionInAnyCase) {
  PackageFormat format{};
  EXPECT_TRUE(packageFormatOf("a/b/cohort.DTA", format));
  EXPECT_EQ(format, PackageFormat::Stata);
  EXPECT_TRUE(packageFormatOf("cohort.zsav", format));
  EXPECT_EQ(format, PackageFormat::Spss);
  EXPECT_TRUE(packageFormatOf("cohort.Sas7bdat", format));
  EXPECT_EQ(format, PackageFormat::Sas7bdat);
  EXPECT_FALSE(packageFormatOf("cohort.csv", format));
  EXPECT_FALSE(packageFormatOf("dir.dta/cohort", format));
  EXPECT_EQ(cohortFileFormat("x.sav"), "SPSS");
  EXPECT_EQ(cohortFileFormat("x.txt"), "CSV");
}

TEST(PackageFileReader, EveryFormatGivesTheCsvTable) {
  const Table csv = readCsvFile(referencePath("birthwt.csv"), {}).table;
  for (const char* name : {"birthwt.dta", "birthwt.sav", "birthwt.zsav", "birthwt.sas7bdat"}) {
    const CohortFileRead read = readCohortFile(packagePath(name), {});
    EXPECT_FALSE(read.isCsv);
    EXPECT_TRUE(read.table.rowsAreRecords);
    expectSameColumns(csv, read.table, name);
  }
}

TEST(PackageFileReader, ValueLabelsBecomeLevelsWithTheirCodesKept) {
  const Table table = readCohortFile(packagePath("birthwt.sav"), {}).table;
  const Column& race = table.require("race");
  ASSERT_EQ(race.kind, ColumnKind::Text);
  EXPECT_EQ(race.levels, (std::vector<std::string>{"black", "other", "white"}));
  EXPECT_EQ(race.levelCodes, (std::vector<std::string>{"2", "3", "1"}));
  // MASS::birthwt's first record has race 2 (black).
  EXPECT_EQ(race.levels[static_cast<std::size_t>(race.codes[0])], "black");
  EXPECT_NE(errorOf([&] { table.requireNumeric("race"); }).find("value labels"), std::string::npos);
}

TEST(PackageFileReader, DeclaredMissingValuesOfEachFormatAreCountedAsMissing) {
  // lwt is missing in records 3, 17, 40, 88, 101, 150 and 189: SPSS user-missing code 999,
  // Stata tagged missing .a, SAS system missing, CSV NA.
  const Table csv = readCsvFile(packagePath("birthwt_missing.csv"), {}).table;
  EXPECT_EQ(csv.require("lwt").missingCount, 7u);
  for (const char* name :
       {"birthwt_missing.sav", "birthwt_missing.dta", "birthwt_missing.sas7bdat"}) {
    const Table table = readCohortFile(packagePath(name), {}).table;
    expectSameColumns(csv, table, name);
    const AnalysisRows rows = selectCompleteCases(table, {"low", "lwt"});
    EXPECT_EQ(rows.exclusions.rowsExcluded, 7u) << name;
    EXPECT_EQ(rows.exclusions.byColumn[1].rowsMissing, 7u) << name;
  }
}

TEST(PackageFileReader, ANumericMissingTokenAppliesToNumbers) {
  // 250 is no declared missing value in the Stata file's lwt; --missing 250 makes it one, as
  // in the CSV.
  CsvOptions options;
  options.missingTokens.push_back("250");
  const Table table = readCohortFile(packagePath("birthwt.dta"), options).table;
  const Table csv = readCsvFile(referencePath("birthwt.csv"), options).table;
  EXPECT_GT(csv.require("lwt").missingCount, 0u);
  expectSameColumns(csv, table, "--missing 250");
}

TEST(PackageFileReader, DatesAreRefusedByNameWhenAnAnalysisAsksForThem) {
  for (const char* name : {"birthwt.dta", "birthwt.sav", "birthwt.sas7bdat"}) {
    const Table table = readCohortFile(packagePath(name), {}).table;
    EXPECT_EQ(table.find("visit"), nullptr) << name;
    const auto names = table.fileColumnNames();
    EXPECT_NE(std::find(names.begin(), names.end(), "visit"), names.end()) << name;
    const std::string message = errorOf([&] { table.require("visit"); });
    EXPECT_NE(message.find("column 'visit' cannot be analysed"), std::string::npos) << message;
    EXPECT_NE(message.find("dates or times"), std::string::npos) << message;
  }
}

TEST(PackageFileReader, TwoCodesWithOneLabelAreRefusedNotMerged) {
  const Table table = readCohortFile(packagePath("pima_shared_label.dta"), {}).table;
  const std::string message = errorOf([&] { table.require("bp_band"); });
  EXPECT_NE(message.find("'high' names two codes (2 and 3)"), std::string::npos) << message;
  EXPECT_EQ(table.require("bp").kind, ColumnKind::Numeric);  // the other columns are read
}

TEST(PackageFileReader, LabelledOutcomeTakesTheEventAsLabelOrCode) {
  const Table table = readCohortFile(packagePath("pima_tr.sav"), {}).table;
  const AnalysisRows rows = selectCompleteCases(table, {"diabetic"});
  const std::vector<double> byLabel = outcomeValues(table, {"diabetic", "Yes"}, rows.rows);
  const std::vector<double> byCode = outcomeValues(table, {"diabetic", "1"}, rows.rows);
  const std::vector<double> byText = outcomeValues(table, {"type", "Yes"}, rows.rows);
  EXPECT_EQ(byLabel, byCode);
  EXPECT_EQ(byLabel, byText);
  // MASS::Pima.tr has 68 diabetic women of 200 (R 4.2.2: table(MASS::Pima.tr$type)).
  EXPECT_EQ(std::count(byLabel.begin(), byLabel.end(), 1.0), 68);
  const std::string message = errorOf([&] { outcomeValues(table, {"diabetic", {}}, rows.rows); });
  EXPECT_NE(message.find("'No' = 0, 'Yes' = 1"), std::string::npos) << message;
}

TEST(PackageFileReader, OnlyTheAskedColumnsAreKeptAndRowsAreNamedAsRecords) {
  CsvOptions options;
  options.onlyColumns = {"low", "age"};
  const Table table = readCohortFile(packagePath("birthwt.dta"), options).table;
  ASSERT_EQ(table.columns.size(), 2u);
  EXPECT_EQ(table.fileColumnNames().size(), 11u);
  EXPECT_EQ(table.placeOfRow(4), packagePath("birthwt.dta") + ", record 5");
  PackageReadOptions preview;
  preview.rowLimit = 10;
  EXPECT_EQ(readPackageFile(packagePath("birthwt.sav"), PackageFormat::Spss, preview).rowCount,
            10u);
}

TEST(PackageFileReader, BrokenFilesAreInputErrorsNamingTheFile) {
  const testing::TempDir dir("package_reader");
  const std::string garbage = dir.write("garbage.dta", "this is not a Stata file\n");
  EXPECT_NE(errorOf([&] { readCohortFile(garbage, {}); }).find("not a readable Stata file"),
            std::string::npos);
  const std::string empty = dir.write("empty.sav", "");
  EXPECT_NE(errorOf([&] { readCohortFile(empty, {}); }).find(empty), std::string::npos);
  // Every prefix of a real file is refused or read whole, never a crash or a partial table.
  const std::string whole = testing::readWhole(packagePath("birthwt.sas7bdat"));
  for (std::size_t cut :
       {std::size_t(100), std::size_t(1024), whole.size() / 2, whole.size() - 1}) {
    const std::string path = dir.write("cut.sas7bdat", whole.substr(0, cut));
    try {
      const Table table = readCohortFile(path, {}).table;
      EXPECT_EQ(table.rowCount, 189u) << cut;
    } catch (const InputError& error) {
      EXPECT_NE(std::string(error.what()).find("cut.sas7bdat"), std::string::npos);
    }
  }
  CsvOptions withDelimiter;
  withDelimiter.delimiter = ';';
  EXPECT_NE(errorOf([&] {
              readCohortFile(packagePath("birthwt.dta"), withDelimiter);
            }).find("has no delimiter"),
            std::string::npos);
}

}  // namespace
}  // namespace calivera
