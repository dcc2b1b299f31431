#pragma once
// The columns missing together (core/imputation/missing_patterns.h) as a result table: one
// definition for the command line's missing_patterns.csv and the workstation's table.

#include "core/imputation/missing_patterns.h"
#include "core/report/result_table.h"

namespace calivera {

ResultTable missingPatternsTable(const MissingPatternReport& report);

}  // namespace calivera
