#pragma once
// Evaluating a Model on a cohort Table: the columns it needs, its design matrix, linear predictor
// and risks. Column names pass through the model's columnMapping first.

#include <Eigen/Dense>
#include <cstdint>
#include <string>
#include <vector>

#include "core/data/table.h"
#include "core/model/model.h"

namespace calivera {

// Cohort columns the model reads (after mapping), in first-use order: the complete-case set.
std::vector<std::string> requiredColumns(const Model& model);
// The cohort column a model variable is read from (Model::columnMapping), else its own name.
std::string mappedColumn(const Model& model, const std::string& variable);
// Model variables (term variables and product factors), in first-use order, before mapping.
std::vector<std::string> modelVariables(const Model& model);

// Throws InputError when a term needs a column the cohort lacks: the message names the file, the
// model, the term, the column (and the variable it is mapped from), the cohort's columns, a near
// name or another delimiter when either is likely (core/data/column_hints.h), and how to pair the
// variable with a cohort column (--map, Model → Map variables).
void requireModelColumns(const Model& model, const Table& table);

// Throws InputError when a term names a column the cohort lacks, a cohort level is unknown to the
// model (core/model/category_levels.h), a numeric transformation meets a text column (naming file,
// line and text), or a log/power term meets a value <= 0 (naming the line). One row per selected
// row, one column per term (no intercept column).
Eigen::MatrixXd designMatrix(const Model& model, const Table& table,
                             const std::vector<std::uint32_t>& rows);

// [1 designMatrix]: the intercept column first, built in place (the fitters' layout; no copy of
// an n x p matrix, issue 13). Same checks and messages as designMatrix.
Eigen::MatrixXd designMatrixWithIntercept(const Model& model, const Table& table,
                                          const std::vector<std::uint32_t>& rows);

// The same matrix from a table nobody reads afterwards: each column's values are released (and
// handed back to the system) as soon as the last term reading it is built, so the cohort's values
// and the matrix are never both resident in full (issue 13). The table keeps its names and levels
// but no values.
Eigen::MatrixXd designMatrixWithInterceptReleasing(const Model& model, Table& table,
                                                   const std::vector<std::uint32_t>& rows);

// intercept + design * coefficients, per selected row.
std::vector<double> linearPredictor(const Model& model, const Table& table,
                                    const std::vector<std::uint32_t>& rows);

double logisticRisk(double linearPredictor);

}  // namespace calivera
