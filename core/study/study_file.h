#pragma once
// The study file: one analysis saved as JSON (format id kStudyFormatId) so it can be reopened
// exactly. It stores the inputs (absolute path, path relative to the study file, SHA-256 of the
// contents) and every setting; results are not stored, they are recomputed from the inputs. A
// fitted model is stored as its fit settings (the fit is deterministic) together with the fitted
// coefficients, so a reopened study can show what was fitted even if the data changed.
//
//   { "format": "calivera-study/1",
//     "data": {"path": "...", "relativePath": "...", "sha256": "..."},
//     "import": {"delimiter": "auto" | "," | ";" | "\t", "missingTokens": ["", "NA"],
//                "outcome": "died", "eventValue": "yes" | null},
//     "model": {"source": "none" | "file" | "fitted", "file": {...as data...},
//               "predictors": [...], "firth": false, "fitted": <model JSON> | null},
//     "columnMapping": {"model variable": "cohort column"},
//     "analysis": {"threshold": 0.1, "reasonableLo": 0.05, "reasonableHi": 0.3, "groups": 10,
//                  "apparent": false},
//     "predictorView": {"predictors": [...], "held": {"age": "65"}},
//     "uncertainty": {"bootstrap": 0 | B, "seed": 1, "threads": 0 (all cores),
//                     "compareModels": [{...as data...}], "subgroups": ["site"],
//                     "sizeThresholds": [0.1]} }
// "uncertainty" is optional (studies saved before it existed open with everything off).

#include <string>
#include <vector>

#include "core/study/limits.h"
#include "core/study/study.h"

namespace calivera {

inline constexpr const char* kStudyFormatId = "calivera-study/1";
inline constexpr int kMaxBootstrapReplicates = static_cast<int>(kBootstrapLimit.max);

// Paths are written relative to the folder of `studyPath` as well as absolute.
std::string studyToJson(const StudyState& study, const std::string& studyPath);
// Throws InputError naming the file and the field for malformed JSON, a wrong format id or a
// missing/mistyped field. Relative paths are resolved against the study file's folder when the
// absolute path no longer exists.
StudyState parseStudyJson(const std::string& text, const std::string& studyPath);

void writeStudyFile(const std::string& path, const StudyState& study);  // atomic
StudyState readStudyFile(const std::string& path);

struct InputCheck {
  std::string role;  // "cohort data", "model file", "compared model file"
  std::string path;
  std::string problem;  // "missing" or "changed since the study was saved"
};

// Compares each input's current SHA-256 with the recorded one. `cohortSha256`: the cohort's
// SHA-256 as a run has just read it, so a large cohort is not hashed twice; empty: hashed here.
std::vector<InputCheck> checkInputs(const StudyState& study, const std::string& cohortSha256 = {});

}  // namespace calivera
