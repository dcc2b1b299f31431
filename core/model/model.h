#pragma once
// A logistic risk model as a value: intercept plus terms, each term a transformation of one cohort
// column (or the product of two terms) with its coefficient. Risk = 1 / (1 + exp(-LP)),
// LP = intercept + sum of coefficient * transformed value. The JSON file format lives in
// model_io.h and is documented in the README.

#include <map>
#include <optional>
#include <string>
#include <vector>

namespace calivera {

inline constexpr const char* kModelFormatId = "calivera-model/1";

struct Estimate {
  double coefficient = 0.0;
  std::optional<double> se;
};

enum class TransformKind {
  Linear,     // (x - center) / scale
  Log,        // ln(x); x must be > 0
  Power,      // x^power, power 0 meaning ln(x) (fractional-polynomial convention); x must be > 0
  Indicator,  // 1 when the (text or numeric) value equals `level`, else 0
  Spline,     // one basis function of a restricted cubic spline with `knots` (Harrell)
  Product,    // product of the two `factors` (an interaction)
};

struct Term {
  std::string name;      // label in tables, unique within the model
  std::string variable;  // cohort column (after the model's column mapping); empty for Product
  TransformKind kind = TransformKind::Linear;
  double center = 0.0;
  double scale = 1.0;
  double power = 1.0;
  std::string level;
  std::vector<double> knots;  // Spline: ascending, at least 3
  int basisIndex = 0;         // Spline: 0 = the linear part x, j = 1..k-2 the j-th cubic part
  // Spline: divide the cubic parts by (t_k - t_1)^2, Harrell's default that keeps them on the
  // scale of x; false for models published with the undivided basis.
  bool splineScaled = true;
  std::vector<Term> factors;        // Product: exactly two; their own estimates are ignored
  std::optional<std::string> unit;  // unit the model expects the variable in, when stated
  Estimate estimate;
};

struct DevelopmentRecord {
  std::optional<long long> n;
  std::optional<long long> events;
  std::optional<std::string> dataSha256;  // lowercase hex of the development data file
  // The analysed-data fingerprint of the development data (core/model/analysed_fingerprint.h):
  // the same patients saved in another layout still match it.
  std::optional<std::string> analysedSha256;
  std::optional<std::string> software;     // e.g. "calivera 0.1.0"
  std::optional<std::string> method;       // e.g. "maximum likelihood", "Firth penalized"
  std::optional<std::string> description;  // free text: source publication, setting
};

struct Model {
  std::string name;
  std::string outcome;  // the outcome the model predicts (a description or column name)
  Estimate intercept;
  std::vector<Term> terms;
  DevelopmentRecord development;
  // Model variable name -> local cohort column, for published models whose names differ.
  std::map<std::string, std::string> columnMapping;
  // Categorical model variable -> its reference level(s): the levels scored 0 by every indicator
  // term (one for a fitted factor; several for a "level vs the rest" indicator), so that any
  // other level is an error rather than scored as the reference (core/model/category_levels.h).
  // Written by `calivera fit`; optional in a model file.
  std::map<std::string, std::vector<std::string>> referenceLevels;
  // Model variable -> (cohort level -> the model's level it stands for): a category spelled
  // differently in the local cohort ("Emergency" for "emergency"), stated by the user for this
  // validation (the column-mapping step, `--map-level`). Applied wherever the model is evaluated;
  // not part of the model file format.
  std::map<std::string, std::map<std::string, std::string>> levelMapping;
  // Free-form provenance of updates (which model it updates, on which data, which method).
  std::optional<std::string> provenance;
  // The file readModelFile read this model from, for messages; empty when built in memory.
  // Not part of the file format.
  std::string sourcePath;
};

}  // namespace calivera
