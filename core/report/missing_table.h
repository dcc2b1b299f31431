#pragma once
// The missing-data results as result tables: one definition each for the command line's CSV and
// the workstation's table.

#include "core/imputation/imputed_validation.h"
#include "core/imputation/missing_patterns.h"
#include "core/report/result_table.h"

namespace calivera {

ResultTable missingPatternsTable(const MissingPatternReport& report);

// The measures pooled over imputed copies beside the complete cases' (pooled_imputations.csv, and
// the workstation's table once it runs imputations): one row per pooled measure, its label and
// complete-case value from the measure catalog (core/present/measures.h). Decimals belong to a
// column, so the screen shows every estimate with 3 (the CSV keeps 10 significant digits).
ResultTable pooledImputationsTable(const ImputedValidation& imputed,
                                   const ValidationResult& completeCases);

}  // namespace calivera
