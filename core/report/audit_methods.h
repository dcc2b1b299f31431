#pragma once
// The fixed text of an audit report: one paragraph per method with its published source (the
// sources listed in the team's docs/methods.md) and the reporting checklist oriented on TRIPOD
// (Collins et al., BMJ 2015;350:g7594) and TRIPOD+AI (Collins et al., BMJ 2024;385:e078378).

#include <string>
#include <vector>

namespace calivera {

struct MethodParagraph {
  std::string title;
  std::string text;       // what was computed and how, in plain words
  std::string reference;  // the published source
};

const std::vector<MethodParagraph>& auditMethodParagraphs();

enum class ChecklistStatus { Covered, UserMustAdd };

struct ChecklistItem {
  std::string topic;  // the reporting item, in our words
  ChecklistStatus status = ChecklistStatus::Covered;
  std::string where;  // where the report covers it, or what the user must add
};

// `apparent`: the cohort is the development data (changes the wording of the validation item).
// `subgroups`: the report has a subgroup section (the subgroup item is then covered).
// `imputation`: ImputedValidation::method when the report pools imputed copies, else empty.
std::vector<ChecklistItem> auditChecklist(bool apparent, bool subgroups = false,
                                          const std::string& imputation = {});

}  // namespace calivera
