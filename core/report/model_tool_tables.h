#pragma once
// The model tools' result tables (core/report/result_table.h): internal validation by bootstrap
// optimism correction, and the closed test of the model update. `calivera internal` and
// `calivera update` print them with tableText(); the workstation's dialogs show the same tables,
// so the screen and the command line use the same words and decimals.

#include "core/report/result_table.h"
#include "core/uncertainty/model_update.h"
#include "core/uncertainty/optimism.h"

namespace calivera {

// One row per measure: on fitting data (apparent), overfit (the mean optimism over the
// resamples), on new patients (apparent minus overfit: what to expect there), the spread of the
// overfit, and the resamples used (Harrell, Lee & Mark, Stat Med 1996; docs/methods.md).
ResultTable optimismTable(const OptimismResult& result);

// One row per step of the closed test (Vergouwe et al., Stat Med 2017): the likelihood-ratio
// statistic, its degrees of freedom, p, and the decision at the chosen alpha.
ResultTable closedTestTable(const ClosedTestResult& result);

}  // namespace calivera
