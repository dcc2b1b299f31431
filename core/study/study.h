#pragma once
// Everything one analysis consists of, as plain values (no Qt): the inputs with their SHA-256, the
// import and analysis settings the user chose, and (once computed) the model and the validation
// result. The study file (study_file.h) saves the inputs and settings; the workstation recomputes
// the rest on reopening. The PDF report reads a StudyState and nothing else.

#include <cstdint>
#include <map>
#include <memory>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "core/data/cohort.h"
#include "core/data/database_provenance.h"
#include "core/metrics/validation.h"
#include "core/metrics/validation_run.h"
#include "core/model/model.h"
#include "core/study/limits.h"
#include "core/uncertainty/uncertainty_run.h"

namespace calivera {

struct InputFileRecord {
  InputFileRecord() = default;
  InputFileRecord(std::string filePath, std::string fileSha256,
                  std::optional<DatabaseSelection> databaseSelection = std::nullopt)
      : path(std::move(filePath)),
        sha256(std::move(fileSha256)),
        database(std::move(databaseSelection)) {}

  std::string path;    // absolute path at the time it was loaded; a PostgreSQL URI for a database
  std::string sha256;  // lowercase hex of the file contents (a database: the result's fingerprint)
  // A cohort in a PostgreSQL database (core/data/database_source.h): the table or query read
  // from the URI in `path`. Reopening the study reconnects and reads it again.
  std::optional<DatabaseSelection> database;
};

struct ImportSettings {
  char delimiter = 0;  // 0: detect from the header line
  std::vector<std::string> missingTokens{"", "NA"};
  std::string outcomeColumn;
  std::optional<std::string> eventValue;  // empty: the outcome column holds 0/1
};

enum class ModelSource { None, File, Fitted };

struct FitSettings {
  std::vector<std::string> predictors;  // cohort columns; text columns become indicator terms
  bool firth = false;
  std::map<std::string, int> splineKnots;  // numeric predictor -> restricted cubic spline knots
  bool profileIntervals = false;           // also profile-likelihood CIs (fit dialog table)
};

struct AnalysisSettings {
  double threshold = 0.10;
  // Range of clinically reasonable thresholds, chosen by the user (shaded on the decision curve).
  double reasonableLo = 0.05;
  double reasonableHi = 0.30;
  int groups = 10;        // risk groups for the calibration table and Hosmer-Lemeshow
  bool apparent = false;  // the cohort is the model's development data
};

// Uncertainty, comparison and subgroups (core/uncertainty/uncertainty_run.h). The sample-size
// assessment is always computed; the rest only when asked for here.
struct UncertaintySettings {
  int bootstrapReplicates = 0;  // 0: no bootstrap intervals or bands
  std::uint64_t seed = 1;
  unsigned threads = 0;                        // 0: all hardware threads
  std::vector<InputFileRecord> compareModels;  // further model files compared with the study's
  std::vector<std::string> subgroupColumns;    // cohort columns
  // The cohort column naming each patient's site: validation across sites (empty: none).
  std::string clusterColumn;
  // Thresholds of the net-benefit sample-size criterion (Riley et al. 2021), each in (0, 1); its
  // achieved CI width needs the bootstrap.
  std::vector<double> sizeThresholds;

  bool anyRequested() const {
    return bootstrapReplicates > 0 || !compareModels.empty() || !subgroupColumns.empty() ||
           !clusterColumn.empty();
  }
};

// How missing values of the model's columns are handled (core/imputation/): complete cases only
// (the default), imputed copies stacked in the cohort, or copies imputed here by chained
// equations. Either way the complete-case results stay where they are; the pooled results are
// added beside them. The workers are uncertaintySettings.threads.
struct MissingDataSettings {
  // Not empty: the cohort stacks imputed copies numbered by this column (0: the original data).
  std::string imputationColumn;
  int imputeCopies = 0;  // 0: none; else kImputeCopiesLimit (core/study/limits.h)
  int imputeIterations = 10;
  std::uint64_t imputeSeed = 1;

  bool imputesHere() const { return imputeCopies > 0; }
  bool any() const { return imputesHere() || !imputationColumn.empty(); }
  // Within the limits, and not both routes at once.
  bool isValid() const {
    const bool copies = imputeCopies == 0 || (imputeCopies >= kImputeCopiesLimit.min &&
                                              imputeCopies <= kImputeCopiesLimit.max);
    const bool iterations = imputeIterations >= kImputeIterationsLimit.min &&
                            imputeIterations <= kImputeIterationsLimit.max;
    const bool seed = imputeSeed <= static_cast<std::uint64_t>(kSeedLimit.max);
    return copies && iterations && seed && !(imputesHere() && !imputationColumn.empty());
  }
  bool operator==(const MissingDataSettings&) const = default;
};

// The PDF report's choices, saved with the study: `calivera run STUDY --pdf` writes the report the
// workstation's export dialog last wrote for this study (command-line options override each).
struct ReportSettings {
  std::string title;               // empty: the report's default title
  std::vector<double> thresholds;  // the threshold table's rows; empty: core's default rows
                                   // (defaultTableThresholds, core/report/audit_report.h)
  std::size_t suppressBelow = 0;   // 0: off; else within kSuppressBelowLimit
  std::string paper = "a4";        // "a4" or "letter"
  std::string analyst;             // on the sign-off lines; empty: a blank line to sign
  std::string reviewer;
};

struct StudyState {
  std::optional<InputFileRecord> data;
  ImportSettings import;
  ModelSource modelSource = ModelSource::None;
  std::optional<InputFileRecord> modelFile;          // ModelSource::File
  FitSettings fit;                                   // ModelSource::Fitted
  std::map<std::string, std::string> columnMapping;  // model variable -> cohort column
  // Model variable -> (cohort level -> model level): categories spelled differently here.
  std::map<std::string, std::map<std::string, std::string>> levelMapping;
  AnalysisSettings analysis;
  // Predictor-space views: chosen predictors and the values the others are held at.
  std::vector<std::string> predictorView;
  std::map<std::string, std::string> heldValues;
  UncertaintySettings uncertaintySettings;
  MissingDataSettings missingData;
  ReportSettings report;

  // Read, not saved: an input found through its relative path outside the study file's folder
  // ("../../../../etc/passwd"), one sentence each, shown to the user when the study opens.
  std::vector<std::string> pathNotes;

  // Computed, not saved (recomputed from the inputs when a study is reopened).
  std::optional<Model> model;
  std::vector<std::string> modelWarnings;  // separation, non-convergence, unit checks
  ExclusionReport exclusions;
  // The one run the command line would make for this study (core/metrics/validation_run.h):
  // performance basis, fingerprints, request; `result` aliases run->result.
  std::shared_ptr<const ValidationRun> run;
  std::shared_ptr<const ValidationResult> result;
  // Sample size (always, once a result exists) and whatever uncertaintySettings asked for.
  std::shared_ptr<const UncertaintyResults> uncertainty;
  // validationBasis() of the inputs `uncertainty` was computed for; a run with another basis
  // (new cohort, model, mapping, outcome coding, groups) makes it stale.
  std::string uncertaintyBasis;
};

}  // namespace calivera
