#pragma once
// Internal validation of a model fitted on the cohort at hand, as one entry point shared by
// `calivera internal` and the workstation: build the design of the model's own terms on the
// analysed rows, run the bootstrap optimism correction (optimism.h: Efron 1983; Harrell, Lee &
// Mark 1996) refitting with Firth when the model was fitted so (its development record says
// "Firth") or when asked, and write the uniformly shrunk model (Van Houwelingen & Le Cessie 1990)
// on request.
//
// Edge cases: a model whose development record names other data gets a warning (optimism
// correction is meant for the data a model was fitted on) but still runs; a non-positive
// corrected slope gives no shrunk model (AnalysisError).

#include <string>
#include <vector>

#include "core/model/model.h"
#include "core/uncertainty/model_update.h"
#include "core/uncertainty/optimism.h"

namespace calivera {

struct InternalValidation {
  OptimismResult optimism;
  bool firth = false;                 // the refits used Firth's penalized likelihood
  std::vector<std::string> warnings;  // the run's own, then the optimism result's
};

// True when the model's development record names Firth's method.
bool fittedWithFirth(const Model& model);

// `data` holds the analysed rows (complete cases over the model's columns and the outcome).
// options.fit.firth is or-ed with fittedWithFirth(model).
//
// Optimism correction estimates how much a model overfits the data it was developed on, by
// repeating its development on resamples (Harrell, Lee & Mark 1996); for a model developed
// elsewhere it has no meaning, and its "corrected" figures would look like evidence they are
// not. So the cohort must be the model's development data: the model file's recorded SHA-256 of
// its development data equals data.dataSha256, or the caller states it
// (`statedDevelopmentData`: the workstation's checkbox, `internal --development-data`).
// Otherwise throws InputError naming the reason and pointing to external validation.
// Throws AnalysisError when the fit on the full data fails, Cancelled through
// options.bootstrap.progress.
InternalValidation internalValidation(const Model& model, const UpdateData& data,
                                      OptimismOptions options, bool statedDevelopmentData = false);

// Empty when internal validation may run on `data` (stated, or the model's development record
// matches the file or the analysed-data fingerprint); else the reason it may not.
std::string internalValidationRefusal(const Model& model, const std::string& dataSha256,
                                      bool statedDevelopmentData,
                                      const std::string& analysedSha256 = {});

// The model refitted on `data` (same terms, Firth as given), every coefficient times
// `shrinkage` and the intercept re-estimated (optimism.h, shrinkModel). Throws AnalysisError for
// a non-positive factor.
Model shrunkModel(const Model& model, const UpdateData& data, double shrinkage, bool firth);

}  // namespace calivera
