// `calivera fit` and `calivera validate` (the real executable) on SAS, Stata and SPSS copies of
// MASS::birthwt and MASS::Pima.tr (Debian r-cran-mass) written by R's haven 2.5.1 (Debian
// r-cran-haven; tests/reference/scripts/package_files.R) give the numbers of the CSV route: the
// fitted coefficients bit for bit, every validation result equal, and the same exclusions where
// each format marks values missing its own way.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>

#include "core/model/model_io.h"
#include "tests/reference/reference_csv.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

using nlohmann::json;
using testing::referencePath;

std::string packagePath(const std::string& name) {
  return referencePath("package/" + name);
}

TEST(PackageFilesCli, FitGivesTheCsvCoefficientsFromEveryFormat) {
  const testing::TempDir dir("package_fit");
  const auto fit = [&](const std::string& data, const std::string& out) {
    const testing::CliRun run = testing::runCalivera(
        {"fit", "--data", data, "--outcome", "low", "--predictors", "age,lwt,race,ftv",
         "--reference", "race=white", "--out", dir.file(out)});
    EXPECT_EQ(run.status, 0) << data << run.err;
    return readModelFile(dir.file(out));
  };
  const Model csv = fit(referencePath("birthwt.csv"), "csv.json");
  for (const char* name : {"birthwt.dta", "birthwt.sav", "birthwt.zsav", "birthwt.sas7bdat"}) {
    const Model model = fit(packagePath(name), std::string(name) + ".json");
    EXPECT_EQ(model.intercept.coefficient, csv.intercept.coefficient) << name;
    ASSERT_EQ(model.terms.size(), csv.terms.size()) << name;
    for (std::size_t j = 0; j < csv.terms.size(); ++j) {
      EXPECT_EQ(model.terms[j].name, csv.terms[j].name) << name;
      EXPECT_EQ(model.terms[j].estimate.coefficient, csv.terms[j].estimate.coefficient) << name;
      EXPECT_EQ(model.terms[j].estimate.se, csv.terms[j].estimate.se) << name;
    }
    // The fingerprint is of the file's bytes, so it differs from the CSV's.
    ASSERT_TRUE(model.development.dataSha256.has_value());
    EXPECT_NE(*model.development.dataSha256, *csv.development.dataSha256) << name;
  }
}

TEST(PackageFilesCli, ValidateGivesTheCsvResultsWithEachFormatsMissingValues) {
  const testing::TempDir dir("package_validate");
  const std::string model = dir.file("model.json");
  ASSERT_EQ(testing::runCalivera({"fit", "--data", referencePath("birthwt.csv"), "--outcome", "low",
                                  "--predictors", "age,lwt,race,ftv", "--reference", "race=white",
                                  "--out", model})
                .status,
            0);
  const auto validate = [&](const std::string& data, const std::string& out) {
    const testing::CliRun run =
        testing::runCalivera({"validate", "--data", data, "--outcome", "low", "--model", model,
                              "--json", dir.file(out)});
    EXPECT_EQ(run.status, 0) << data << run.err;
    return json::parse(testing::readWhole(dir.file(out)));
  };
  json csv = validate(packagePath("birthwt_missing.csv"), "csv.json");
  EXPECT_EQ(csv["inputs"]["source"], "file");
  EXPECT_EQ(csv["inputs"]["data"]["format"], "CSV");
  EXPECT_EQ(csv["cohort"]["excluded_by_column"]["lwt"], 7);
  const std::pair<const char*, const char*> files[] = {{"birthwt_missing.sav", "SPSS"},
                                                       {"birthwt_missing.dta", "Stata"},
                                                       {"birthwt_missing.sas7bdat", "SAS"}};
  for (const auto& [name, format] : files) {
    json got = validate(packagePath(name), std::string(name) + ".json");
    EXPECT_EQ(got["inputs"]["source"], "file") << name;
    EXPECT_EQ(got["inputs"]["data"]["format"], format) << name;
    // The analysed-data fingerprint is of the values analysed, so it is the CSV's.
    EXPECT_EQ(got["inputs"]["data"]["analysed_data_sha256"],
              csv["inputs"]["data"]["analysed_data_sha256"])
        << name;
    EXPECT_NE(got["inputs"]["data"]["sha256"], csv["inputs"]["data"]["sha256"]) << name;
    for (const char* key :
         {"cohort", "discrimination", "overall", "calibration", "hosmer_lemeshow", "settings"}) {
      EXPECT_EQ(got[key], csv[key]) << name << ": " << key;
    }
    got.erase("inputs");
    json reference = csv;
    reference.erase("inputs");
    EXPECT_EQ(got, reference) << name;
  }
}

TEST(PackageFilesCli, LabelledOutcomeAndRefusedColumnsGiveClearErrors) {
  const std::string pima = packagePath("pima_tr.sav");
  const testing::CliRun noEvent =
      testing::runCalivera({"validate", "--data", pima, "--outcome", "diabetic", "--risk", "ped"});
  EXPECT_EQ(noEvent.status, 2);
  EXPECT_NE(noEvent.err.find("value labels: 'No' = 0, 'Yes' = 1"), std::string::npos)
      << noEvent.err;

  const testing::TempDir dir("package_errors");
  const std::string model = dir.file("model.json");
  ASSERT_EQ(testing::runCalivera({"fit", "--data", referencePath("birthwt.csv"), "--outcome", "low",
                                  "--predictors", "age,lwt", "--out", model})
                .status,
            0);
  const testing::CliRun date =
      testing::runCalivera({"validate", "--data", packagePath("birthwt.dta"), "--outcome", "low",
                            "--model", model, "--map", "lwt=visit"});
  EXPECT_EQ(date.status, 2);
  EXPECT_NE(date.err.find("needs column 'visit' (mapped from 'lwt'), which cannot be analysed: it "
                          "holds dates or times (display format %td in the Stata file)"),
            std::string::npos)
      << date.err;
  const testing::CliRun delimiter =
      testing::runCalivera({"validate", "--data", packagePath("birthwt.dta"), "--outcome", "low",
                            "--model", model, "--delimiter", ";"});
  EXPECT_EQ(delimiter.status, 2);
  EXPECT_NE(delimiter.err.find("has no delimiter"), std::string::npos) << delimiter.err;
}

}  // namespace
}  // namespace calivera
