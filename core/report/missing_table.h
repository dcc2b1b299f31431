#pragma once
// The missing-data results as result tables: one definition each for the command line's CSV and
// the workstation's table.

#include "core/imputation/imputed_validation.h"
#include "core/imputation/missing_patterns.h"
#include "core/report/result_table.h"

namespace calivera {

ResultTable missingPatternsTable(const MissingPatternReport& report);

// The measures pooled over imputed copies beside the complete cases' (pooled_imputations.csv and
// the workstation's table): one row per pooled measure, labels and the screen's decimals from the
// measure catalog (core/present/measures.h).
ResultTable pooledImputationsTable(const ImputedValidation& imputed,
                                   const ValidationResult& completeCases);

}  // namespace calivera
