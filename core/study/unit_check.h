#pragma once
// Unit check for the variable-mapping step. A cohort CSV carries no units, so the only evidence is
// the column header: a unit in brackets or parentheses ("creatinine [umol/L]", "age (years)").
// When the model file states a unit for a variable and the header states another, the pairing is
// flagged; when the header states none, the user is asked to confirm, with the column's range.

#include <optional>
#include <string>

namespace calivera {

enum class UnitVerdict { NotStated, Matches, Differs, ColumnSilent };

struct UnitCheck {
  UnitVerdict verdict = UnitVerdict::NotStated;
  std::string message;
};

// "creatinine [umol/L]" -> "umol/L"; none when the header has no bracketed unit.
std::optional<std::string> unitFromHeader(const std::string& header);
// Case-, space- and micro-sign-insensitive comparison ("µmol/L" == "umol/l").
bool sameUnit(const std::string& a, const std::string& b);
UnitCheck checkUnit(const std::optional<std::string>& modelUnit, const std::string& columnHeader);

}  // namespace calivera
