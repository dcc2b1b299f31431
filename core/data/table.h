#pragma once
// Columnar in-memory cohort as read from a file. Every column is parsed as numeric where possible;
// a column with any non-numeric, non-missing field is kept as text (categorical levels) and
// remembers where its first non-numeric field was, so an analysis that needs the column numeric
// can name the file, line, column and the offending text.

#include <cstddef>
#include <cstdint>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/data/database_provenance.h"

namespace calivera {

enum class ColumnKind { Numeric, Text };

struct FieldLocation {
  std::size_t line = 0;  // physical line in the file; the header is line 1
  std::string text;      // the field as written (unquoted)
};

struct Column {
  std::string name;
  ColumnKind kind = ColumnKind::Numeric;
  std::vector<double> numbers;      // Numeric: one value per row, NaN where missing
  std::vector<std::int32_t> codes;  // Text: index into levels per row, -1 where missing
  std::vector<std::string> levels;  // Text: distinct levels in sorted (byte) order
  std::size_t missingCount = 0;
  std::optional<FieldLocation> firstNonNumeric;  // Text columns: where numeric parsing failed
  // Text columns of statistical-package files: why the column is not numeric ("is a string
  // variable in the Stata file"), used instead of firstNonNumeric in messages.
  std::string nonNumericNote;
  // Value-labelled columns of statistical-package files: each level's stored code ("1"), in
  // the order of `levels`; empty for CSV columns.
  std::vector<std::string> levelCodes;

  bool isMissing(std::size_t row) const {
    return kind == ColumnKind::Numeric ? numbers[row] != numbers[row] : codes[row] < 0;
  }
};

// A column of the file that no analysis may use, with the reason (a date variable of a
// statistical-package file); Table::require names the reason.
struct RefusedColumn {
  std::string name;
  std::string reason;  // completes "column 'NAME' cannot be analysed: ...", e.g. "it holds dates"
};

struct Table {
  std::string sourceName;  // the file path, used in every message about this table
  // False for CSV (rows are named by their line in the file); true for statistical-package
  // files, whose rows are named by their 1-based record number.
  bool rowsAreRecords = false;
  std::vector<Column> columns;
  std::size_t rowCount = 0;
  // Physical line on which each record starts (for a statistical-package file, or a table cut
  // from one: its 1-based record number). Empty when no record spans several lines, in which
  // case row r (0-based) is on line r + 2 (record r + 1).
  std::vector<std::uint32_t> recordLines;

  // Every column name of the file's header, in order, when the reader stored only some columns
  // (CsvOptions::onlyColumns); empty when `columns` holds them all.
  std::vector<std::string> headerNames;

  std::vector<RefusedColumn> refusedColumns;

  // Read from a database (core/data/database_source.h): where the rows came from; null for a
  // file. Tables cut from this one share it.
  std::shared_ptr<const DatabaseProvenance> database;

  // The file's column names: headerNames, or the names of `columns`.
  std::vector<std::string> fileColumnNames() const;

  std::size_t lineOfRow(std::size_t row) const {
    return recordLines.empty() ? row + 2 : recordLines[row];
  }
  std::size_t recordOfRow(std::size_t row) const {
    return recordLines.empty() ? row + 1 : recordLines[row];
  }
  // Where a row is, for messages: "FILE:LINE" for CSV, "FILE, record N" otherwise.
  std::string placeOfRow(std::size_t row) const;
  // The row's name without the file: "line LINE" or "record N".
  std::string rowName(std::size_t row) const;
  const Column* find(std::string_view name) const;
  // The refusal of a column that is in the file but no analysis may use; nullptr otherwise.
  const RefusedColumn* findRefused(std::string_view name) const;
  // Throws InputError naming the file and listing the available columns, or giving the reason
  // a refused column cannot be used.
  const Column& require(std::string_view name) const;
  // Throws InputError naming file, line, column and text when the column is not numeric.
  const Column& requireNumeric(std::string_view name) const;
};

// The given rows of `table` (indices into it, in the order given) as a table of their own: every
// column kept, a text column's levels those the rows hold (in the same order), and each row still
// named by its place in the file.
Table tableRows(const Table& table, const std::vector<std::uint32_t>& rows);

}  // namespace calivera
