#pragma once
// Hints added to the messages about a cohort column that is missing or not numeric, for the two
// commonest causes the reader cannot detect by itself: a file written with another delimiter
// than the one read (the whole header becomes one column), and numbers written with a decimal
// comma ('1,5', which the reader keeps as text: core/data/csv_reader.h). Each returns an empty
// string when it has nothing to say, otherwise a sentence starting with a space.

#include <string>
#include <string_view>

#include "core/data/table.h"

namespace calivera {

// The table's one column whose name is closest to `wanted`: equal ignoring ASCII case, else at
// an edit distance (Levenshtein) of at most 1 for names up to 6 bytes and 2 for longer ones, and
// unique at that distance. Empty when there is none.
std::string closestColumnName(const Table& table, std::string_view wanted);

// " Did you mean 'X'?" for closestColumnName, or "".
std::string closestColumnHint(const Table& table, std::string_view wanted);

// When the whole header was read as one column whose name holds another delimiter (',', ';',
// tab or '|'): a sentence naming that character and how to give the delimiter. Otherwise "".
std::string delimiterHint(const Table& table);

// When `field` (a field that is not a number) reads as a number written with a decimal comma
// ('1,5', '-0,25', '12,0'), or as two numbers joined by ';' or '|' (a field of a file with another
// delimiter): a sentence saying so. Otherwise "".
std::string numberFieldHint(std::string_view field);

}  // namespace calivera
