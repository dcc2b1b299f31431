#pragma once
// Multiple imputation of the validation cohort's missing predictor values by chained equations
// (fully conditional specification; van Buuren, Flexible Imputation of Missing Data, 2nd ed.
// 2018, chapters 3 and 4; van Buuren & Groothuis-Oudshoorn, J Stat Softw 2011):
// - every column the model reads is a variable; each incomplete one is imputed in turn from the
//   outcome and all the other variables (the outcome belongs in every imputation model of a
//   validation: Moons et al., J Clin Epidemiol 2006), and the cycle is repeated `iterations`
//   times, starting from values drawn at random from each column's observed values;
// - numeric columns: predictive mean matching (Little, J Bus Econ Stat 1988) after a Bayesian
//   linear regression draw (van Buuren 2018, algorithms 3.1 and 3.3; ridge 1e-5 times the
//   diagonal of X'X, type-1 matching: observed patients by their fitted mean, missing ones by
//   the drawn coefficients), the imputed value taken from one of the `donors` closest observed
//   patients at random; so only values that occur in the data are imputed;
// - categorical columns with two levels: logistic regression, with more: multinomial logistic
//   regression (van Buuren 2018, algorithm 3.4 and section 3.6), coefficients drawn from the
//   normal approximation of their posterior, each level drawn from the drawn probabilities. A
//   weak ridge (kCategoricalRidge on the standardised scale, intercepts free) keeps the
//   estimates finite when a level is perfectly predicted (common practice; mice augments the
//   data instead);
// - the outcome is never imputed: only patients with a known outcome take part, and the others
//   are left as they are (the validation excludes them for their missing outcome).
//
// Reproducibility: copy k (0-based) draws from its own std::mt19937_64 seeded with
// replicateSeed(seed, k) (core/uncertainty/bootstrap.h); normal deviates come from Box-Muller
// and chi-squared ones by inverting Boost.Math's distribution, not from the standard library's
// distributions, so a seed gives the same copies on any thread count and compiler.

#include <cstddef>
#include <cstdint>
#include <string>
#include <vector>

#include "core/data/cohort.h"
#include "core/data/table.h"

namespace calivera {

inline constexpr double kCategoricalRidge = 1e-3;
// Bounds that keep one imputation model small (refused with a message beyond them).
inline constexpr std::size_t kMaxImputedLevels = 20;
inline constexpr std::size_t kMaxImputationPredictors = 200;

struct ChainedEquationsOptions {
  int copies = 0;       // m: how many completed copies; 2 to 1000, stated by the user
  int iterations = 10;  // cycles through the incomplete columns (1 to 1000)
  std::uint64_t seed = 1;
  unsigned threads = 0;  // 0: all hardware threads; results do not depend on it
  int donors = 5;        // predictive mean matching's donor pool (1 to 100)
  bool isValid() const {
    return copies >= 2 && copies <= 1000 && iterations >= 1 && iterations <= 1000 && donors >= 1 &&
           donors <= 100;
  }
};

enum class ImputationMethod { PredictiveMeanMatching, Logistic, Multinomial };

// "predictive_mean_matching", "logistic" or "multinomial" (the JSON's words).
const char* imputationMethodKey(ImputationMethod method);

// The cohort prepared once for every copy: the patients with a known outcome and every model
// column, numeric values as they are and categories as level codes (NaN where missing).
struct ChainedEquationsData {
  struct Variable {
    std::string name;
    std::size_t tableColumn = 0;
    bool categorical = false;
    // Categorical: the levels observed among these patients, numbered 0..levels-1 in the
    // column's order; levelCodes holds each one's code in the table's column.
    std::size_t levels = 0;
    std::vector<std::int32_t> levelCodes;
    std::vector<double> values;
    std::vector<std::uint32_t> missingAt;  // positions in `rows`
    std::vector<std::uint32_t> observedAt;
    double centre = 0.0, scale = 1.0;  // numeric: how it enters other columns' models
    ImputationMethod method = ImputationMethod::PredictiveMeanMatching;
  };
  std::vector<std::uint32_t> rows;      // table rows with a known outcome
  std::vector<double> outcome;          // 0/1, one per row
  std::vector<Variable> variables;      // every column the model reads, in the given order
  std::vector<std::size_t> incomplete;  // the variables with a missing value, in order
};

// Throws InputError naming the file and column: no model column has a missing value among the
// patients with a known outcome (nothing to impute), a column with no observed value, a
// categorical column with fewer than two observed levels or more than kMaxImputedLevels, or more
// than kMaxImputationPredictors columns in one imputation model.
ChainedEquationsData prepareChainedEquations(const Table& table,
                                             const std::vector<std::string>& columns,
                                             const OutcomeSpec& outcome);

// Completed copy `copy` (0-based) of `table`: the table with every missing value of the
// incomplete variables filled in for the patients with a known outcome.
Table imputedCopy(const Table& table, const ChainedEquationsData& data,
                  const ChainedEquationsOptions& options, std::size_t copy);

}  // namespace calivera
