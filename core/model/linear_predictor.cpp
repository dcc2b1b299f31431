#include "core/model/linear_predictor.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <map>
#include <sstream>
#include <string>
#include <vector>

#if defined(__GLIBC__)
#include <malloc.h>
#endif

#include "core/data/column_hints.h"
#include "core/model/category_levels.h"
#include "core/util/errors.h"
#include "core/util/shown_text.h"

namespace calivera {

std::string mappedColumn(const Model& model, const std::string& variable) {
  const auto found = model.columnMapping.find(variable);
  return found == model.columnMapping.end() ? variable : found->second;
}

namespace {

void collectColumns(const Model& model, const Term& term, std::vector<std::string>& out) {
  if (term.kind == TransformKind::Product) {
    for (const Term& factor : term.factors) collectColumns(model, factor, out);
    return;
  }
  const std::string column = mappedColumn(model, term.variable);
  if (std::find(out.begin(), out.end(), column) == out.end()) out.push_back(column);
}

std::string formatNumber(double value) {
  std::ostringstream out;
  out.precision(15);
  out << value;
  return out.str();
}

// Harrell's restricted cubic spline (Harrell, Regression Modeling Strategies, 2nd ed., sec.
// 2.4.5): basis 0 is x; basis j (1-based, j <= k-2) is
//   (x-t_j)+^3 - (x-t_{k-1})+^3 (t_k-t_j)/(t_k-t_{k-1}) + (x-t_k)+^3 (t_{k-1}-t_j)/(t_k-t_{k-1}),
// optionally divided by (t_k - t_1)^2 (the normalisation Harrell's software applies by default).
// Each cubic part is linear beyond the outer knots, which is what "restricted" means.
double splineBasis(double x, const std::vector<double>& t, int j, bool scaled) {
  if (j == 0) return x;
  const std::size_t k = t.size();
  const auto cube = [](double v) { return v > 0 ? v * v * v : 0.0; };
  const double tj = t[static_cast<std::size_t>(j) - 1];
  const double tk1 = t[k - 2];
  const double tk = t[k - 1];
  const double value = cube(x - tj) - cube(x - tk1) * (tk - tj) / (tk - tk1) +
                       cube(x - tk) * (tk1 - tj) / (tk - tk1);
  if (!scaled) return value;
  const double range = tk - t[0];
  return value / (range * range);
}

std::string missingColumnMessage(const Model& model, const Table& table, const std::string& label,
                                 const std::string& variable) {
  const std::string name = mappedColumn(model, variable);
  std::string available;
  for (const std::string& header : table.fileColumnNames()) {
    available += (available.empty() ? "" : ", ") + header;
  }
  const std::string mapped = name == variable ? "" : " (mapped from '" + variable + "')";
  const std::string modelText =
      model.sourcePath.empty() ? "model '" + model.name + "'" : "model file " + model.sourcePath;
  if (const RefusedColumn* refused = table.findRefused(name)) {
    return table.sourceName + ": " + modelText + ", term '" + label + "' needs column '" +
           shownText(name) + "'" + mapped + ", which cannot be analysed: " + refused->reason;
  }
  // Why it is missing decides the remedy: a near name (case, a typo) or another delimiter is
  // named; otherwise the user pairs the variable with the cohort's own column.
  return table.sourceName + ": " + modelText + ", term '" + label + "' needs column '" + name +
         "'" + mapped + ", which the cohort lacks (columns: " + available + ")." +
         closestColumnHint(table, name) + delimiterHint(table) +
         " If the cohort holds this variable under another name, pair them: --map " + variable +
         "=COLUMN on the command line, Model → Map variables in the workstation.";
}

void requireTermColumns(const Model& model, const Term& term, const Table& table) {
  if (term.kind == TransformKind::Product) {
    for (const Term& factor : term.factors) requireTermColumns(model, factor, table);
    return;
  }
  if (table.find(mappedColumn(model, term.variable)) == nullptr) {
    const std::string label = term.name.empty() ? term.variable : term.name;
    throw InputError(missingColumnMessage(model, table, label, term.variable));
  }
}

// One term bound to its cohort column, evaluated row by row.
class BoundTerm {
 public:
  BoundTerm(const Model& model, const Term& term, const Table& table)
      : model_(model), term_(term), table_(table) {
    if (term.kind == TransformKind::Product) {
      for (const Term& factor : term.factors) factors_.emplace_back(model, factor, table);
      return;
    }
    const std::string name = mappedColumn(model, term.variable);
    column_ = table.find(name);
    if (!column_) throw InputError(missingColumnMessage(model, table, label(), term.variable));
    if (term.kind == TransformKind::Indicator) {
      bindIndicator();
    } else if (column_->kind == ColumnKind::Text) {
      try {
        table.requireNumeric(name);
      } catch (const InputError& error) {
        throw InputError(std::string(error.what()) + " (term '" + label() + "' needs a number)");
      }
    }
  }

  // sink(i, value(rows[i])) for every i, with the plain linear term on a numeric column (most
  // terms of most models) in a tight loop (issue 13); the same arithmetic as value().
  template <class Sink>
  void forEachValue(const std::vector<std::uint32_t>& rows, Sink&& sink) const {
    if (term_.kind == TransformKind::Linear && column_->kind == ColumnKind::Numeric) {
      const double* const x = column_->numbers.data();
      for (std::size_t i = 0; i < rows.size(); ++i) {
        const double v = x[rows[i]];
        if (v != v) fail(rows[i], "is missing");
        sink(i, linearValue(v));
      }
      return;
    }
    for (std::size_t i = 0; i < rows.size(); ++i) sink(i, value(rows[i]));
  }

  double linearValue(double x) const { return (x - term_.center) / term_.scale; }

  double value(std::size_t row) const {
    if (term_.kind == TransformKind::Product)
      return factors_[0].value(row) * factors_[1].value(row);
    if (column_->isMissing(row)) fail(row, "is missing");
    if (term_.kind == TransformKind::Indicator) {
      if (column_->kind == ColumnKind::Text) {
        const std::int32_t code = column_->codes[row];
        return levelMatch_[static_cast<std::size_t>(code)] ? 1.0 : 0.0;
      }
      return column_->numbers[row] == levelNumber_ ? 1.0 : 0.0;
    }
    const double x = column_->numbers[row];
    switch (term_.kind) {
      case TransformKind::Linear:
        return linearValue(x);
      case TransformKind::Log:
        if (!(x > 0)) fail(row, "is " + formatNumber(x) + "; the natural log needs a value > 0");
        return std::log(x);
      case TransformKind::Power:
        // Fractional polynomials (Royston & Altman, Appl Stat 1994) are defined for x > 0 only,
        // power 0 meaning ln x.
        if (!(x > 0)) fail(row, "is " + formatNumber(x) + "; a power term needs a value > 0");
        return term_.power == 0.0 ? std::log(x) : std::pow(x, term_.power);
      case TransformKind::Spline:
        return splineBasis(x, term_.knots, term_.basisIndex, term_.splineScaled);
      case TransformKind::Indicator:
      case TransformKind::Product:
        break;
    }
    return 0.0;
  }

 private:
  std::string label() const { return term_.name.empty() ? term_.variable : term_.name; }

  void bindIndicator() {
    if (column_->kind == ColumnKind::Text) {
      // Which cohort levels score 1: those that are, or are mapped to, the term's level
      // (Model::levelMapping). A level absent from this cohort is legitimate: all zeros.
      const auto& levels = column_->levels;
      levelMatch_.assign(levels.size(), 0);
      for (std::size_t code = 0; code < levels.size(); ++code) {
        levelMatch_[code] = mappedLevel(model_, term_.variable, levels[code]) == term_.level;
      }
      return;
    }
    const char* begin = term_.level.data();
    const char* end = begin + term_.level.size();
    const auto [ptr, ec] = std::from_chars(begin, end, levelNumber_);
    if (term_.level.empty() || ec != std::errc() || ptr != end) {
      throw InputError(table_.sourceName + ": term '" + label() + "' matches level '" +
                       term_.level + "', but column '" + column_->name +
                       "' is numeric and the level is not a number");
    }
  }

  [[noreturn]] void fail(std::size_t row, const std::string& what) const {
    throw InputError(table_.placeOfRow(row) + ": column '" + column_->name + "' " + what +
                     " (term '" + label() + "')");
  }

  const Model& model_;
  const Term& term_;
  const Table& table_;
  const Column* column_ = nullptr;
  std::vector<BoundTerm> factors_;
  std::vector<char> levelMatch_;  // text indicator: per cohort level code
  double levelNumber_ = 0.0;
};

}  // namespace

void requireModelColumns(const Model& model, const Table& table) {
  for (const Term& term : model.terms) requireTermColumns(model, term, table);
}

std::vector<std::string> requiredColumns(const Model& model) {
  std::vector<std::string> columns;
  for (const Term& term : model.terms) collectColumns(model, term, columns);
  return columns;
}

namespace {

// Hands the values of a column nobody reads any more back to the system (issue 13): the vectors
// are freed, and glibc's malloc_trim returns the freed pages even from the middle of the heap.
void releaseValues(Column& column) {
  std::vector<double>().swap(column.numbers);
  std::vector<std::int32_t>().swap(column.codes);
#if defined(__GLIBC__)
  malloc_trim(0);
#endif
}

// The terms' values into columns first.. of `out` (sized by the caller). With `release` (the
// same table as `table`), each column is released once the last term reading it is built.
void fillDesign(const Model& model, const Table& table, const std::vector<std::uint32_t>& rows,
                Eigen::MatrixXd& out, Eigen::Index first, Table* release) {
  // Unknown category levels are an error before any term is evaluated (category_levels.h).
  checkCategoryLevels(model, table, rows);
  std::map<std::string, std::size_t> lastUse;  // column name -> index of the last term using it
  if (release != nullptr) {
    for (std::size_t j = 0; j < model.terms.size(); ++j) {
      std::vector<std::string> names;
      collectColumns(model, model.terms[j], names);
      for (const std::string& name : names) lastUse[name] = j;
    }
    for (Column& column : release->columns) {
      if (lastUse.count(column.name) == 0) releaseValues(column);
    }
  }
  for (std::size_t j = 0; j < model.terms.size(); ++j) {
    {
      const BoundTerm bound(model, model.terms[j], table);
      double* column = out.col(first + static_cast<Eigen::Index>(j)).data();
      bound.forEachValue(rows, [column](std::size_t i, double v) { column[i] = v; });
    }
    if (release == nullptr) continue;
    for (Column& column : release->columns) {
      const auto last = lastUse.find(column.name);
      if (last != lastUse.end() && last->second == j) releaseValues(column);
    }
  }
}

}  // namespace

Eigen::MatrixXd designMatrix(const Model& model, const Table& table,
                             const std::vector<std::uint32_t>& rows) {
  Eigen::MatrixXd design(static_cast<Eigen::Index>(rows.size()),
                         static_cast<Eigen::Index>(model.terms.size()));
  fillDesign(model, table, rows, design, 0, nullptr);
  return design;
}

Eigen::MatrixXd designMatrixWithIntercept(const Model& model, const Table& table,
                                          const std::vector<std::uint32_t>& rows) {
  Eigen::MatrixXd X(static_cast<Eigen::Index>(rows.size()),
                    static_cast<Eigen::Index>(model.terms.size()) + 1);
  X.col(0).setOnes();
  fillDesign(model, table, rows, X, 1, nullptr);
  return X;
}

Eigen::MatrixXd designMatrixWithInterceptReleasing(const Model& model, Table& table,
                                                   const std::vector<std::uint32_t>& rows) {
  Eigen::MatrixXd X(static_cast<Eigen::Index>(rows.size()),
                    static_cast<Eigen::Index>(model.terms.size()) + 1);
  X.col(0).setOnes();
  fillDesign(model, table, rows, X, 1, &table);
  return X;
}

std::vector<double> linearPredictor(const Model& model, const Table& table,
                                    const std::vector<std::uint32_t>& rows) {
  // Accumulated term by term, never as an n x p design matrix (issue 13: at 10^6 rows and 20
  // terms that matrix was 160 MB of fresh memory, most of the time of `validate --model`).
  checkCategoryLevels(model, table, rows);
  std::vector<double> lp(rows.size(), 0.0);
  for (const Term& term : model.terms) {
    const BoundTerm bound(model, term, table);
    const double beta = term.estimate.coefficient;
    bound.forEachValue(rows, [&lp, beta](std::size_t i, double v) { lp[i] += v * beta; });
  }
  for (double& value : lp) value += model.intercept.coefficient;
  return lp;
}

double logisticRisk(double linearPredictor) {
  // Never exponentiates a large positive number, so no overflow and no 0/0.
  if (linearPredictor >= 0) return 1.0 / (1.0 + std::exp(-linearPredictor));
  const double e = std::exp(linearPredictor);
  return e / (1.0 + e);
}

namespace {

void collectVariables(const Term& term, std::vector<std::string>& out) {
  if (term.kind == TransformKind::Product) {
    for (const Term& f : term.factors) collectVariables(f, out);
    return;
  }
  if (!term.variable.empty() && std::find(out.begin(), out.end(), term.variable) == out.end()) {
    out.push_back(term.variable);
  }
}

}  // namespace

std::vector<std::string> modelVariables(const Model& model) {
  std::vector<std::string> out;
  for (const Term& t : model.terms) collectVariables(t, out);
  return out;
}

}  // namespace calivera
