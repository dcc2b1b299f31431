#include "core/model/model_io.h"

#include <gtest/gtest.h>

#include <cstring>
#include <filesystem>
#include <fstream>
#include <random>

#include "core/util/errors.h"

namespace calivera {
namespace {

Model sampleModel() {
  Model model;
  model.name = "demo score";
  model.outcome = "complication within 30 days";
  model.intercept = {-2.0 / 3.0, 0.1};
  Term age;
  age.name = "age per 10 years above 50";
  age.variable = "age";
  age.kind = TransformKind::Linear;
  age.center = 50;
  age.scale = 10;
  age.unit = "years";
  age.estimate = {0.1 + 0.2, 1e-300};
  Term creat;
  creat.name = "log creatinine";
  creat.variable = "creatinine";
  creat.kind = TransformKind::Log;
  creat.estimate = {std::nextafter(1.0, 2.0), std::nullopt};
  Term fp;
  fp.name = "bmi^-0.5";
  fp.variable = "bmi";
  fp.kind = TransformKind::Power;
  fp.power = -0.5;
  fp.estimate = {-1.2345678901234567e-7, 4.9e-324};
  Term level;
  level.name = "urgency=emergency";
  level.variable = "urgency";
  level.kind = TransformKind::Indicator;
  level.level = "emergency";
  level.estimate = {0.81, 0.2};
  Term spline;
  spline.name = "age spline 1";
  spline.variable = "age";
  spline.kind = TransformKind::Spline;
  spline.knots = {30.1, 50, 70.7};
  spline.basisIndex = 1;
  spline.splineScaled = false;
  spline.estimate = {0.01, 0.002};
  Term product;
  product.name = "age x emergency";
  product.kind = TransformKind::Product;
  product.factors = {age, level};
  product.factors[0].name.clear();
  product.estimate = {-0.05, 0.01};
  model.terms = {age, creat, fp, level, spline, product};
  model.development.n = 3000;
  model.development.events = 240;
  model.development.dataSha256 = std::string(64, 'a');
  model.development.software = "calivera 0.1.0";
  model.development.method = "maximum likelihood";
  model.development.description = "invented";
  model.columnMapping = {{"creatinine", "creat_umol"}};
  model.provenance = "test";
  return model;
}

void expectSameBits(double a, double b, const std::string& what) {
  EXPECT_EQ(std::memcmp(&a, &b, sizeof a), 0) << what << ": " << a << " vs " << b;
}

void expectSameTerm(const Term& a, const Term& b) {
  EXPECT_EQ(a.name, b.name);
  EXPECT_EQ(a.variable, b.variable);
  EXPECT_EQ(a.kind, b.kind);
  expectSameBits(a.center, b.center, a.name + " center");
  expectSameBits(a.scale, b.scale, a.name + " scale");
  if (a.kind == TransformKind::Power) expectSameBits(a.power, b.power, a.name + " power");
  EXPECT_EQ(a.level, b.level);
  ASSERT_EQ(a.knots.size(), b.knots.size());
  for (std::size_t i = 0; i < a.knots.size(); ++i) expectSameBits(a.knots[i], b.knots[i], "knot");
  EXPECT_EQ(a.basisIndex, b.basisIndex);
  EXPECT_EQ(a.splineScaled, b.splineScaled);
  EXPECT_EQ(a.unit, b.unit);
  ASSERT_EQ(a.factors.size(), b.factors.size());
  for (std::size_t i = 0; i < a.factors.size(); ++i) expectSameTerm(a.factors[i], b.factors[i]);
}

void expectSameModel(const Model& a, const Model& b) {
  EXPECT_EQ(a.name, b.name);
  EXPECT_EQ(a.outcome, b.outcome);
  expectSameBits(a.intercept.coefficient, b.intercept.coefficient, "intercept");
  EXPECT_EQ(a.intercept.se.has_value(), b.intercept.se.has_value());
  ASSERT_EQ(a.terms.size(), b.terms.size());
  for (std::size_t j = 0; j < a.terms.size(); ++j) {
    expectSameTerm(a.terms[j], b.terms[j]);
    expectSameBits(a.terms[j].estimate.coefficient, b.terms[j].estimate.coefficient, "coef");
    ASSERT_EQ(a.terms[j].estimate.se.has_value(), b.terms[j].estimate.se.has_value());
    if (a.terms[j].estimate.se) {
      expectSameBits(*a.terms[j].estimate.se, *b.terms[j].estimate.se, "se");
    }
  }
  EXPECT_EQ(a.development.n, b.development.n);
  EXPECT_EQ(a.development.events, b.development.events);
  EXPECT_EQ(a.development.dataSha256, b.development.dataSha256);
  EXPECT_EQ(a.development.software, b.development.software);
  EXPECT_EQ(a.development.method, b.development.method);
  EXPECT_EQ(a.development.description, b.development.description);
  EXPECT_EQ(a.columnMapping, b.columnMapping);
  EXPECT_EQ(a.provenance, b.provenance);
}

std::string errorOf(const std::string& json) {
  try {
    parseModelJson(json, "m.json");
  } catch (const InputError& error) {
    return error.what();
  }
  return "(no error)";
}

// A minimal valid file with one term whose body is `term`.
std::string withTerm(const std::string& term) {
  return R"({"format": "calivera-model/1", "name": "x", "outcome": "y",
             "intercept": {"coefficient": -1}, "terms": [)" +
         term + "]}";
}

TEST(ModelIo, RoundTripIsBitExact) {
  const Model model = sampleModel();
  const std::string json = modelToJson(model);
  expectSameModel(model, parseModelJson(json, "m.json"));
  EXPECT_EQ(modelToJson(parseModelJson(json, "m.json")), json);
}

TEST(ModelIo, RandomDoublesRoundTripThroughAFile) {
  std::mt19937_64 random(42);
  Model model = sampleModel();
  const auto path = std::filesystem::temp_directory_path() / "calivera_model_io_test.json";
  for (int trial = 0; trial < 200; ++trial) {
    for (Term& term : model.terms) {
      std::uint64_t bits = random();
      double value = 0;
      std::memcpy(&value, &bits, sizeof value);
      if (!std::isfinite(value)) value = 1.0 / 3.0;
      term.estimate.coefficient = value;
    }
    writeModelFile(path.string(), model);
    expectSameModel(model, readModelFile(path.string()));
  }
  std::filesystem::remove(path);
}

TEST(ModelIo, CommentsAreAllowed) {
  const Model model = parseModelJson(withTerm(R"(
    // age in years
    {"name": "age", "variable": "age", "transform": "linear", /* per year */
     "estimate": {"coefficient": 0.05}})"),
                                     "m.json");
  ASSERT_EQ(model.terms.size(), 1u);
  EXPECT_EQ(model.terms[0].center, 0.0);
  EXPECT_EQ(model.terms[0].scale, 1.0);
  EXPECT_FALSE(model.terms[0].estimate.se.has_value());
}

TEST(ModelIo, MalformedJsonGivesTheBytePosition) {
  const std::string message = errorOf(R"({"format": "calivera-model/1", "name": })");
  EXPECT_NE(message.find("m.json: not valid JSON: malformed at byte 40"), std::string::npos) << message;
}

TEST(ModelIo, ErrorsNameFileTermAndField) {
  const auto expectError = [](const std::string& json, const std::string& part) {
    const std::string message = errorOf(json);
    EXPECT_NE(message.find("m.json: "), std::string::npos) << message;
    EXPECT_NE(message.find(part), std::string::npos) << "wanted '" << part << "' in: " << message;
  };
  expectError(withTerm(R"({"name": "a", "variable": "a", "transform": "cubic",
                           "estimate": {"coefficient": 1}})"),
              "term 1 ('a'): unknown transform 'cubic'");
  expectError(withTerm(R"({"name": "a", "variable": "a", "transform": "linear"})"),
              "term 1 ('a'): missing field 'estimate'");
  expectError(withTerm(R"({"name": "a", "transform": "log", "estimate": {"coefficient": 1}})"),
              "term 1 ('a'): missing field 'variable'");
  expectError(
      withTerm(R"({"name": "a", "variable": "a", "transform": "log",
                           "estimate": {"coefficient": 1e999}})"),
      "a number is not finite ([json.exception.out_of_range.406] number overflow parsing '1e999')");
  expectError(withTerm(R"({"name": "a", "variable": "a", "transform": "log",
                           "estimate": {"coefficient": "1"}})"),
              "field 'coefficient' must be a number");
  expectError(withTerm(R"({"name": "a", "variable": "a", "transform": "linear", "centre": 5,
                           "estimate": {"coefficient": 1}})"),
              "unknown field 'centre'");
  expectError(withTerm(R"({"name": "a", "variable": "a", "transform": "linear", "scale": 0,
                           "estimate": {"coefficient": 1}})"),
              "'scale' must not be 0");
  expectError(withTerm(R"({"name": "a", "variable": "a", "transform": "spline",
                           "knots": [1, 3, 2], "basis": 1, "estimate": {"coefficient": 1}})"),
              "strictly ascending");
  expectError(withTerm(R"({"name": "a", "variable": "a", "transform": "spline",
                           "knots": [1, 2, 3], "basis": 2, "estimate": {"coefficient": 1}})"),
              "'basis' must be a whole number from 0 to 1");
  expectError(withTerm(R"({"name": "a", "variable": "a", "transform": "power",
                           "estimate": {"coefficient": 1}})"),
              "missing field 'power'");
  expectError(withTerm(R"({"name": "a", "transform": "product",
                           "factors": [{"variable": "b", "transform": "log"}],
                           "estimate": {"coefficient": 1}})"),
              "exactly two factors");
  expectError(withTerm(R"({"name": "a", "transform": "product",
                           "factors": [{"variable": "b", "transform": "log"},
                                       {"variable": "c", "transform": "indicator"}],
                           "estimate": {"coefficient": 1}})"),
              "term 1 ('a'), factor 2: missing field 'level'");
  expectError(withTerm(R"({"name": "a", "variable": "a", "transform": "log",
                           "estimate": {"coefficient": 1}},
                          {"name": "a", "variable": "b", "transform": "log",
                           "estimate": {"coefficient": 1}})"),
              "term 2: the name 'a' is used by an earlier term");
  expectError(withTerm(R"({"name": "a", "variable": "a", "transform": "log",
                           "estimate": {"coefficient": 1, "se": -1}})"),
              "'se' must be >= 0");
  expectError(R"({"format": "other/2", "name": "x", "outcome": "y",
                  "intercept": {"coefficient": 0}, "terms": []})",
              "expected 'calivera-model/1'");
  expectError(R"({"format": "calivera-model/1", "name": "x", "outcome": "y", "terms": []})",
              "missing field 'intercept'");
  expectError(R"({"format": "calivera-model/1", "name": "x", "outcome": "y",
                  "intercept": {"coefficient": 0}, "terms": [],
                  "development": {"data_sha256": "XYZ"}})",
              "development: field 'data_sha256' must be 64 lowercase hex digits");
  expectError(R"({"format": "calivera-model/1", "name": "x", "outcome": "y",
                  "intercept": {"coefficient": 0}, "terms": [], "development": {"n": -3}})",
              "field 'n' must be a whole number >= 0");
  expectError(R"([1, 2])", "must hold one JSON object");
}

TEST(ModelIo, MissingFileIsAnInputError) {
  EXPECT_THROW(readModelFile("/nonexistent/calivera/model.json"), InputError);
}

TEST(ModelIo, NonFiniteCoefficientIsNotWritten) {
  Model model = sampleModel();
  model.terms[0].estimate.coefficient = std::nan("");
  EXPECT_THROW(modelToJson(model), AnalysisError);
}

}  // namespace
}  // namespace calivera
