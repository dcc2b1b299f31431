#pragma once
// Fitting a logistic model to a cohort Table: complete cases over the outcome and predictors
// (exclusions counted per column), one linear term per numeric predictor, indicator terms
// against a reference level for each categorical predictor, then fitLogistic. The result is a
// Model ready for writeModelFile, so the fitted file and the fitted numbers cannot disagree:
// the design matrix is built from the Model itself (designMatrix).
//
// Categorical predictors: text columns, and numeric columns named in `categorical`. Their levels
// are those present in the analysed rows (a level seen only in excluded rows would give a
// column of zeros), ordered by byte order for text and numerically for numbers; the reference
// is the first of them unless `referenceLevels` names one. Indicator terms are named
// "COLUMN=LEVEL".

#include <cstddef>
#include <map>
#include <optional>
#include <set>
#include <string>
#include <vector>

#include "core/data/cohort.h"
#include "core/data/table.h"
#include "core/fit/logistic_fit.h"
#include "core/fit/profile_ci.h"
#include "core/model/model.h"

namespace calivera {

struct CohortFitSpec {
  OutcomeSpec outcome;
  std::vector<std::string> predictors;
  std::map<std::string, std::string> referenceLevels;  // column -> reference level
  std::set<std::string> categorical;                   // numeric columns to treat as categories
  // Numeric columns entered as a restricted cubic spline (Harrell) with this many knots (3..7)
  // at the default quantiles of the analysed rows (spline_knots.h), instead of linearly. The
  // terms are "COLUMN spline 0" (the linear part) to "COLUMN spline k-2".
  std::map<std::string, int> splineKnots;
  // Also the profile-likelihood 95% intervals (profile_ci.h); maximum likelihood only (ignored
  // with Firth, whose table keeps its Wald intervals).
  bool profileIntervals = false;
  std::string modelName;
  FitOptions fit;
};

struct CategoricalCoding {
  std::string column;
  std::string reference;
  std::vector<std::string> levels;  // the non-reference levels, one indicator term each
};

struct CohortFit {
  Model model;    // estimates, SEs and development n/events/software/method filled in
  FitResult fit;  // beta[0] is the intercept, then one per model term in order
  ExclusionReport exclusions;
  std::size_t events = 0;
  std::vector<CategoricalCoding> codings;
  std::optional<ProfileIntervals> profile;  // when asked: [0] the intercept, then each term
};

// InputError: unknown or repeated column, outcome used as a predictor, reference level that does
// not occur, bad outcome coding, a spline on a column that is not a numeric predictor.
// AnalysisError: no rows left, a predictor with a single value, and any FitProblem (separation and
// non-convergence unless Firth resolved them), naming the terms and variables involved.
CohortFit fitCohortModel(const Table& table, const CohortFitSpec& spec);

// The same fit from a table nobody needs afterwards (the command line's): its values are released
// column by column while the design matrix is built, so peak memory holds the cohort's values
// about once instead of twice (issue 13). Same result as the overload above.
CohortFit fitCohortModel(Table&& table, const CohortFitSpec& spec);

}  // namespace calivera
