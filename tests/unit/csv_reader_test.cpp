// CSV import: RFC 4180 quoting, delimiters, byte order mark, line endings, missing values, text
// columns, and every input error with its file and line. Inputs are written inline so each test
// shows exactly the bytes it reads.

#include "core/data/csv_reader.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <optional>
#include <random>
#include <string>

#include "core/util/errors.h"

namespace calivera {
namespace {

void expectSameTables(const Table& a, const Table& b) {
  ASSERT_EQ(a.rowCount, b.rowCount);
  ASSERT_EQ(a.columns.size(), b.columns.size());
  EXPECT_EQ(a.recordLines, b.recordLines);
  for (std::size_t c = 0; c < a.columns.size(); ++c) {
    const Column& x = a.columns[c];
    const Column& y = b.columns[c];
    EXPECT_EQ(x.name, y.name);
    EXPECT_EQ(x.kind, y.kind);
    EXPECT_EQ(x.missingCount, y.missingCount);
    EXPECT_EQ(x.levels, y.levels);
    EXPECT_EQ(x.firstNonNumeric.has_value(), y.firstNonNumeric.has_value());
    if (x.firstNonNumeric && y.firstNonNumeric) {
      EXPECT_EQ(x.firstNonNumeric->line, y.firstNonNumeric->line);
      EXPECT_EQ(x.firstNonNumeric->text, y.firstNonNumeric->text);
    }
    EXPECT_EQ(x.codes, y.codes);
    ASSERT_EQ(x.numbers.size(), y.numbers.size());
    for (std::size_t r = 0; r < x.numbers.size(); ++r) {
      if (std::isnan(x.numbers[r])) {
        EXPECT_TRUE(std::isnan(y.numbers[r]));
      } else {
        EXPECT_EQ(x.numbers[r], y.numbers[r]);
      }
    }
  }
}

// The same text with the first header name in quotes: quoting anywhere sends a file through the
// sequential RFC 4180 path instead of the parallel quote-free one, and both must agree.
// Only for a plain first name (letters, digits, '_') ended by the delimiter or a line end.
std::optional<std::string> withQuotedFirstName(std::string_view text, char delimiter = 0) {
  const std::string_view bom = "\xEF\xBB\xBF";
  const std::size_t start = text.substr(0, 3) == bom ? 3 : 0;
  const std::string ends =
      delimiter == 0 ? std::string(",;\t\r\n") : std::string{delimiter, '\r', '\n'};
  const std::size_t end = text.find_first_of(ends, start);
  if (end == std::string_view::npos || end == start) return std::nullopt;
  const std::string_view name = text.substr(start, end - start);
  const bool plain = std::all_of(name.begin(), name.end(), [](char c) {
    return std::isalnum(static_cast<unsigned char>(c)) != 0 || c == '_';
  });
  if (!plain) return std::nullopt;
  return std::string(text.substr(0, start)) + '"' + std::string(name) + '"' +
         std::string(text.substr(end));
}

// Parses `text`, and checks that the sequential path gives the same table.
CsvReadResult parse(std::string_view text, CsvOptions options = {}) {
  CsvReadResult result = parseCsv(text, "cohort.csv", options);
  if (const std::optional<std::string> quoted = withQuotedFirstName(text, options.delimiter)) {
    expectSameTables(result.table, parseCsv(*quoted, "cohort.csv", options).table);
  }
  return result;
}

// The InputError message of `action`, or "" when it succeeds.
template <class Action>
std::string inputErrorOf(Action&& action) {
  try {
    action();
  } catch (const InputError& error) {
    return error.what();
  }
  return "";
}

// The error of parsing `text`, checked to be the same on the sequential path.
std::string errorOf(std::string_view text, CsvOptions options = {}) {
  const std::string error = inputErrorOf([&] { parseCsv(text, "cohort.csv", options); });
  if (const std::optional<std::string> quoted = withQuotedFirstName(text, options.delimiter)) {
    EXPECT_EQ(error, inputErrorOf([&] { parseCsv(*quoted, "cohort.csv", options); }));
  }
  return error;
}

TEST(CsvReader, ReadsNumericColumnsWithCommaByDefault) {
  const CsvReadResult result = parse("age,sbp\n61,140.5\n47,-3e2\n");
  const Table& table = result.table;
  ASSERT_EQ(table.columns.size(), 2U);
  EXPECT_EQ(table.rowCount, 2U);
  EXPECT_EQ(result.delimiter, ',');
  EXPECT_TRUE(result.delimiterDetected);
  EXPECT_FALSE(result.hadByteOrderMark);
  EXPECT_EQ(table.columns[0].name, "age");
  EXPECT_EQ(table.columns[0].kind, ColumnKind::Numeric);
  EXPECT_EQ(table.columns[0].numbers, (std::vector<double>{61, 47}));
  EXPECT_EQ(table.columns[1].numbers, (std::vector<double>{140.5, -300}));
  EXPECT_TRUE(table.recordLines.empty());
  EXPECT_EQ(table.lineOfRow(1), 3U);
}

TEST(CsvReader, FinalLineWithoutNewlineAndCrlf) {
  const Table a = parse("x,y\r\n1,2\r\n3,4").table;
  const Table b = parse("x,y\n1,2\n3,4\n").table;
  ASSERT_EQ(a.rowCount, 2U);
  EXPECT_EQ(a.columns[1].numbers, b.columns[1].numbers);
  EXPECT_EQ(a.columns[1].name, "y");  // no stray carriage return in the last header name
  EXPECT_EQ(a.columns[1].numbers[1], 4.0);
}

TEST(CsvReader, TrailingBlankLinesAreNotRecords) {
  EXPECT_EQ(parse("x,y\n1,2\n\n\r\n").table.rowCount, 1U);
}

TEST(CsvReader, ByteOrderMarkIsSkippedAndReported) {
  const CsvReadResult result = parse(
      "\xEF\xBB\xBF"
      "id,value\n1,2\n");
  EXPECT_TRUE(result.hadByteOrderMark);
  EXPECT_EQ(result.table.columns[0].name, "id");
}

TEST(CsvReader, QuotedFieldsWithDelimiterQuoteAndNewline) {
  const CsvReadResult result =
      parse("id,note,score\n1,\"a, b\",3\n2,\"say \"\"hi\"\"\",4\n3,\"two\nlines\",5\n4,x,6\n");
  const Table& table = result.table;
  ASSERT_EQ(table.rowCount, 4U);
  const Column& note = table.require("note");
  ASSERT_EQ(note.kind, ColumnKind::Text);
  EXPECT_EQ(note.levels, (std::vector<std::string>{"a, b", "say \"hi\"", "two\nlines", "x"}));
  EXPECT_EQ(note.codes, (std::vector<std::int32_t>{0, 1, 2, 3}));
  EXPECT_EQ(table.require("score").numbers, (std::vector<double>{3, 4, 5, 6}));
  // The third record holds a line break, so the fourth starts on line 6, not 5.
  EXPECT_EQ(table.recordLines, (std::vector<std::uint32_t>{2, 3, 4, 6}));
  EXPECT_EQ(table.lineOfRow(3), 6U);
}

TEST(CsvReader, QuotedNumbersAreNumbers) {
  const Table table = parse("a,b\n\"1.5\",\"\"\n").table;
  EXPECT_EQ(table.columns[0].kind, ColumnKind::Numeric);
  EXPECT_EQ(table.columns[0].numbers[0], 1.5);
  EXPECT_TRUE(table.columns[1].isMissing(0));
}

TEST(CsvReader, SemicolonAndTabAreDetected) {
  const CsvReadResult semicolon = parse("a;b;c\n1;2;3\n");
  EXPECT_EQ(semicolon.delimiter, ';');
  EXPECT_TRUE(semicolon.delimiterDetected);
  EXPECT_EQ(semicolon.table.columns.size(), 3U);
  const CsvReadResult tab = parse("a\tb\n1\t2\n");
  EXPECT_EQ(tab.delimiter, '\t');
  EXPECT_EQ(tab.table.columns[1].numbers[0], 2.0);
  // A comma inside a quoted header name does not count for detection.
  EXPECT_EQ(parse("\"x,y\";z\n1;2\n").delimiter, ';');
}

TEST(CsvReader, GivenDelimiterIsUsedAndNotDetected) {
  CsvOptions options;
  options.delimiter = ';';
  const CsvReadResult result = parse("a,b;c\n1,5;2\n", options);
  EXPECT_FALSE(result.delimiterDetected);
  EXPECT_EQ(result.table.columns[0].name, "a,b");
  EXPECT_EQ(result.table.columns[0].kind, ColumnKind::Text);  // "1,5": no decimal comma
}

TEST(CsvReader, AmbiguousDelimiterIsRefused) {
  EXPECT_NE(errorOf("a,b;c\n1,2;3\n").find("cannot tell the delimiter"), std::string::npos);
}

TEST(CsvReader, HeaderNamesAreTrimmed) {
  const Table table = parse(" age , sbp\n1,2\n").table;
  EXPECT_EQ(table.columns[0].name, "age");
  EXPECT_EQ(table.columns[1].name, "sbp");
}

TEST(CsvReader, DefaultMissingTokensAndExtraTokens) {
  const Table table = parse("a,b\n,1\nNA,2\n3, NA \n").table;
  EXPECT_EQ(table.columns[0].missingCount, 2U);
  EXPECT_TRUE(std::isnan(table.columns[0].numbers[0]));
  EXPECT_TRUE(std::isnan(table.columns[0].numbers[1]));
  EXPECT_EQ(table.columns[0].numbers[2], 3.0);
  EXPECT_EQ(table.columns[1].missingCount, 1U);

  CsvOptions options;
  options.missingTokens = {"", "NA", "-99", "."};
  const Table extra = parse("a,b\n-99,.\n4,5\n", options).table;
  EXPECT_EQ(extra.columns[0].kind, ColumnKind::Numeric);
  EXPECT_TRUE(extra.columns[0].isMissing(0));
  EXPECT_TRUE(extra.columns[1].isMissing(0));
  EXPECT_EQ(extra.columns[0].numbers[1], 4.0);

  CsvOptions none;
  none.missingTokens = {};
  const Table strict = parse("a,b\nNA,1\n", none).table;
  EXPECT_EQ(strict.columns[0].kind, ColumnKind::Text);
  EXPECT_EQ(strict.columns[0].levels, (std::vector<std::string>{"NA"}));
}

TEST(CsvReader, NumberSyntaxRules) {
  const Table table = parse("v\n1e3\n+5\n 5 \n.5\n-0.25\n").table;
  ASSERT_EQ(table.columns[0].kind, ColumnKind::Numeric);
  EXPECT_EQ(table.columns[0].numbers, (std::vector<double>{1000, 5, 5, 0.5, -0.25}));
  for (const char* text : {"inf", "nan", "-inf", "1e999", "0x1A", "5 mg", "+-5", "1.2.3"}) {
    const Table other = parse(std::string("v\n1\n") + text + "\n").table;
    EXPECT_EQ(other.columns[0].kind, ColumnKind::Text) << text;
  }
}

TEST(CsvReader, TextColumnHasSortedLevelsCodesAndFirstNonNumericField) {
  const Table table = parse("grp,x\n2,1\nb,2\na,3\n,4\nb,5\n").table;
  const Column& group = table.columns[0];
  ASSERT_EQ(group.kind, ColumnKind::Text);
  EXPECT_EQ(group.levels, (std::vector<std::string>{"2", "a", "b"}));
  EXPECT_EQ(group.codes, (std::vector<std::int32_t>{0, 2, 1, -1, 2}));
  EXPECT_EQ(group.missingCount, 1U);
  EXPECT_TRUE(group.numbers.empty());
  ASSERT_TRUE(group.firstNonNumeric.has_value());
  EXPECT_EQ(group.firstNonNumeric->line, 3U);
  EXPECT_EQ(group.firstNonNumeric->text, "b");
}

TEST(CsvReader, RequireNumericNamesFileLineColumnAndText) {
  const Table table = parse("age,bmi\n50,22.1\n51,abc\n52,25\n").table;
  EXPECT_EQ(inputErrorOf([&] { table.requireNumeric("bmi"); }),
            "cohort.csv:3: column 'bmi': 'abc' is not a number.");
  EXPECT_NO_THROW(table.requireNumeric("age"));
}

TEST(CsvReader, RequireNumericUsesTheLineWhereAFieldStartsAfterQuotedNewlines) {
  const Table table = parse("note,v\n\"a\nb\",1\nx,oops\n").table;
  EXPECT_EQ(inputErrorOf([&] { table.requireNumeric("v"); }),
            "cohort.csv:4: column 'v': 'oops' is not a number.");
}

TEST(CsvReader, RaggedRowsNameTheLine) {
  EXPECT_EQ(errorOf("a,b,c\n1,2,3\n4,5\n"), "cohort.csv:3: 2 fields, but the header has 3 columns");
  EXPECT_EQ(errorOf("a,b\n1,2\n3,4\n5,6,7\n"),
            "cohort.csv:4: 3 fields, but the header has 2 columns");
  EXPECT_EQ(errorOf("a,b\n1,2\n\n3,4\n"),
            "cohort.csv:3: blank line inside the data (expected 2 fields)");
  // With a quoted line break earlier, the line is the one where the ragged record starts.
  EXPECT_EQ(errorOf("a,b\n\"x\ny\",1\n2\n"), "cohort.csv:4: 1 field, but the header has 2 columns");
}

TEST(CsvReader, UnterminatedQuoteNamesTheLineWhereTheFieldStarts) {
  EXPECT_EQ(errorOf("a,b\n1,2\n3,\"open\n4,5\n6,7\n"),
            "cohort.csv:3: quoted field is never closed (missing '\"')");
}

TEST(CsvReader, TextAfterClosingQuoteIsAnError) {
  EXPECT_EQ(errorOf("a,b\n1,\"x\"y\n"),
            "cohort.csv:2: field 2: unexpected text after the closing quote (a '\"' inside a "
            "quoted field must be doubled)");
}

TEST(CsvReader, EmptyFileHeaderOnlyAndBadHeaderNames) {
  EXPECT_EQ(errorOf(""), "cohort.csv: the file is empty (no header row)");
  EXPECT_EQ(errorOf("\xEF\xBB\xBF\r\n"), "cohort.csv: the file is empty (no header row)");
  EXPECT_EQ(errorOf("a,b\n"), "cohort.csv: the file has a header row but no data rows");
  EXPECT_EQ(errorOf("a,,c\n1,2,3\n"), "cohort.csv:1: header column 2 has no name");
  EXPECT_EQ(errorOf("age,sex,age\n1,2,3\n"),
            "cohort.csv:1: header columns 1 and 3 are both named 'age'");
  EXPECT_EQ(errorOf("age, age \n1,2\n"),
            "cohort.csv:1: header columns 1 and 2 are both named 'age'");
}

TEST(CsvReader, CarriageReturnOnlyAndUtf16AreRefused) {
  EXPECT_EQ(errorOf("a,b\r1,2\r3,4\r"),
            "cohort.csv: lines end with a carriage return only (old Mac format); save the file "
            "with LF or CRLF line ends");
  EXPECT_EQ(errorOf(std::string("\xFF\xFE"
                                "a\0,\0b\0",
                                8)),
            "cohort.csv: the file is UTF-16 text; save it as UTF-8");
}

TEST(CsvReader, FileErrorsNameThePath) {
  const std::filesystem::path missingPath =
      std::filesystem::temp_directory_path() / "calivera_no_such_file.csv";
  EXPECT_NE(inputErrorOf([&] {
              readCsvFile(missingPath.string(), {});
            }).find(missingPath.string() + ": cannot open"),
            std::string::npos);
}

TEST(CsvReader, ReadsAFileAndUsesItsPathInMessages) {
  const std::filesystem::path path =
      std::filesystem::temp_directory_path() / "calivera_csv_reader_test.csv";
  {
    std::ofstream out(path, std::ios::binary);
    out << "\xEF\xBB\xBFy;x\r\n1;2,5\r\n0;3\r\n";
  }
  const CsvReadResult result = readCsvFile(path.string(), {});
  std::filesystem::remove(path);
  EXPECT_TRUE(result.hadByteOrderMark);
  EXPECT_EQ(result.delimiter, ';');
  EXPECT_EQ(result.table.sourceName, path.string());
  EXPECT_EQ(result.table.rowCount, 2U);
  EXPECT_EQ(inputErrorOf([&] { result.table.requireNumeric("x"); }),
            path.string() +
                ":2: column 'x': '2,5' is not a number. It looks like a decimal comma: Calivera "
                "reads only '.' as the decimal mark, so write the file's numbers with '.' (for "
                "example '2.5').");
}

// A few megabytes of generated rows with missing values and one text column: the parallel
// quote-free path, the one-thread path and the quoted (sequential) path must give identical
// tables, including error lines.
std::string generatedCohort(std::size_t rows) {
  std::mt19937_64 random(20261201);
  std::uniform_real_distribution<double> uniform(0.0, 1.0);
  std::string text = "y,age,sbp,group,score\n";
  char buffer[128];
  for (std::size_t r = 0; r < rows; ++r) {
    const double u = uniform(random);
    const char* group = u < 0.3 ? "a" : (u < 0.6 ? "b" : "c");
    std::snprintf(buffer, sizeof buffer, "%d,%.0f,%s,%s,%.6g\n", uniform(random) < 0.2 ? 1 : 0,
                  40 + 40 * uniform(random), uniform(random) < 0.05 ? "NA" : "131.25", group,
                  uniform(random) * 1e4 - 5e3);
    text += buffer;
  }
  return text;
}

TEST(CsvReader, ParallelParseEqualsSingleThreadParse) {
  const std::string text = generatedCohort(60000);
  CsvOptions one;
  one.threads = 1;
  CsvOptions four;
  four.threads = 4;
  const CsvReadResult single = parse(text, one);
  const CsvReadResult parallel = parse(text, four);
  EXPECT_EQ(single.threadsUsed, 1U);
  EXPECT_EQ(parallel.threadsUsed, 4U);
  expectSameTables(single.table, parallel.table);
  EXPECT_EQ(parallel.table.rowCount, 60000U);
  EXPECT_EQ(parallel.table.require("group").levels, (std::vector<std::string>{"a", "b", "c"}));
  EXPECT_GT(parallel.table.require("sbp").missingCount, 0U);

  // Quoting one header name sends the same data through the sequential RFC 4180 path.
  const CsvReadResult quoted = parse("\"y\"" + text.substr(1), four);
  EXPECT_EQ(quoted.threadsUsed, 1U);
  expectSameTables(single.table, quoted.table);
}

TEST(CsvReader, TextFoundLateInTheFileIsReportedWithItsLine) {
  std::string text = generatedCohort(60000);
  // Row 50000 (line 50002) lies in the last of four chunks; its age becomes text.
  std::size_t position = 0;
  for (int line = 1; line < 50002; ++line) position = text.find('\n', position) + 1;
  const std::size_t ageStart = text.find(',', position) + 1;
  text.replace(ageStart, text.find(',', ageStart) - ageStart, "unknown");
  CsvOptions four;
  four.threads = 4;
  const CsvReadResult result = parse(text, four);
  EXPECT_EQ(result.threadsUsed, 4U);
  EXPECT_EQ(inputErrorOf([&] { result.table.requireNumeric("age"); }),
            "cohort.csv:50002: column 'age': 'unknown' is not a number.");
  const Column& age = result.table.require("age");
  EXPECT_EQ(age.codes.size(), 60000U);
  EXPECT_TRUE(std::is_sorted(age.levels.begin(), age.levels.end()));
  EXPECT_EQ(age.levels.back(), "unknown");
}

TEST(CsvReader, MappedFileReadEqualsInMemoryParseOnSeveralMegabytes) {
  // Large enough that parsed pages of the mapped file are handed back during the parse.
  const std::string text = generatedCohort(400000);
  ASSERT_GT(text.size(), std::size_t{8} << 20);
  const std::filesystem::path path =
      std::filesystem::temp_directory_path() / "calivera_csv_reader_large_test.csv";
  for (const std::string& variant : {text, *withQuotedFirstName(text)}) {
    {
      std::ofstream out(path, std::ios::binary | std::ios::trunc);
      out << variant;
    }
    const CsvReadResult fromFile = readCsvFile(path.string(), {});
    const CsvReadResult inMemory = parseCsv(variant, path.string(), {});
    EXPECT_EQ(fromFile.threadsUsed, inMemory.threadsUsed);
    expectSameTables(fromFile.table, inMemory.table);
    EXPECT_EQ(fromFile.table.rowCount, 400000U);
  }
  std::filesystem::remove(path);
}

TEST(CsvReader, SingleColumnFileReadsBlankLinesAsMissing) {
  const Table table = parse("weight\n70\n\n82\n").table;
  EXPECT_EQ(table.rowCount, 3U);
  EXPECT_EQ(table.columns[0].missingCount, 1U);
  EXPECT_TRUE(table.columns[0].isMissing(1));
}

TEST(CsvReader, TabDelimitedKeepsTabsAsDelimitersWhileTrimmingSpaces) {
  const Table table = parse("a\tb\n 1 \t\n").table;
  EXPECT_EQ(table.columns[0].numbers[0], 1.0);
  EXPECT_TRUE(table.columns[1].isMissing(0));
  EXPECT_EQ(errorOf("a\tb\n1\t2\t\n"), "cohort.csv:2: 3 fields, but the header has 2 columns");
}

TEST(CsvReader, ParallelParseReportsTheEarliestErrorLine) {
  std::string text = generatedCohort(60000);
  // Break a row near the end and one in the middle: the middle one (earlier line) is reported.
  const std::size_t late = text.rfind('\n', text.size() - 200);
  text.insert(late, ",extra");
  std::size_t middle = text.size() / 2;
  middle = text.find('\n', middle);
  const std::size_t line =
      1 + static_cast<std::size_t>(
              std::count(text.begin(), text.begin() + static_cast<std::ptrdiff_t>(middle), '\n'));
  text.insert(middle, ",extra");
  CsvOptions four;
  four.threads = 4;
  EXPECT_EQ(errorOf(text, four),
            "cohort.csv:" + std::to_string(line) + ": 6 fields, but the header has 5 columns");
}

}  // namespace
}  // namespace calivera

namespace calivera {
namespace {

// CsvOptions::onlyColumns (issue 13): the stored columns equal a full read's, in file order; the
// header is kept whole for messages; every record's field count is still checked, on both the
// quote-free parallel path and the quoted sequential one; text in a skipped column is no error.
TEST(CsvReaderColumns, OnlyTheNamedColumnsAreStoredAndEqualAFullRead) {
  const std::string text = "id,age,note,sex,y\n1,50,a b,m,0\n2,,x,f,1\n3,61.5,\"q\",NA,0\n";
  const std::string quoteFree = "id,age,note,sex,y\n1,50,a b,m,0\n2,,x,f,1\n3,61.5,q,NA,0\n";
  for (const std::string& input : {text, quoteFree}) {
    const Table full = parseCsv(input, "cohort.csv", {}).table;
    CsvOptions options;
    options.onlyColumns = {"y", "sex", "age", "absent"};
    const Table part = parseCsv(input, "cohort.csv", options).table;
    ASSERT_EQ(part.columns.size(), 3U);
    EXPECT_EQ(part.headerNames, (std::vector<std::string>{"id", "age", "note", "sex", "y"}));
    EXPECT_EQ(part.fileColumnNames(), full.fileColumnNames());
    EXPECT_EQ(part.rowCount, full.rowCount);
    const std::vector<std::string> order{"age", "sex", "y"};
    for (std::size_t k = 0; k < order.size(); ++k) {
      const Column& a = part.columns[k];
      const Column& b = full.require(order[k]);
      EXPECT_EQ(a.name, b.name);
      EXPECT_EQ(a.kind, b.kind);
      EXPECT_EQ(a.missingCount, b.missingCount);
      EXPECT_EQ(a.levels, b.levels);
      EXPECT_EQ(a.codes, b.codes);
      ASSERT_EQ(a.numbers.size(), b.numbers.size());
      for (std::size_t r = 0; r < a.numbers.size(); ++r) {
        EXPECT_TRUE(a.numbers[r] == b.numbers[r] ||
                    (std::isnan(a.numbers[r]) && std::isnan(b.numbers[r])));
      }
    }
    // A skipped column is named as such in a message for a column the file lacks.
    EXPECT_NE(
        inputErrorOf([&] { part.require("height"); }).find("(columns: id, age, note, sex, y)"),
        std::string::npos);
  }
}

TEST(CsvReaderColumns, SkippedFieldsAreStillCountedOnEveryPath) {
  CsvOptions options;
  options.onlyColumns = {"a"};
  EXPECT_EQ(inputErrorOf([&] { parseCsv("a,b,c\n1,2,3\n4,5\n", "cohort.csv", options); }),
            "cohort.csv:3: 2 fields, but the header has 3 columns");
  EXPECT_EQ(inputErrorOf([&] { parseCsv("a,b,c\n1,2,3\n4,5,6,7\n", "cohort.csv", options); }),
            "cohort.csv:3: 4 fields, but the header has 3 columns");
  EXPECT_EQ(inputErrorOf([&] { parseCsv("\"a\",b,c\n1,2,3\n4,5\n", "cohort.csv", options); }),
            "cohort.csv:3: 2 fields, but the header has 3 columns");
  // Text in a column nobody reads is not an error and costs no level table.
  const Table table = parseCsv("a,b\n1,abc\n2,def\n", "cohort.csv", options).table;
  ASSERT_EQ(table.columns.size(), 1U);
  EXPECT_EQ(table.columns[0].kind, ColumnKind::Numeric);
}

TEST(CsvReaderColumns, AColumnInTheFileButNotReadIsAnInternalError) {
  CsvOptions options;
  options.onlyColumns = {"a"};
  const Table table = parseCsv("a,b\n1,2\n", "cohort.csv", options).table;
  EXPECT_THROW(table.require("b"), AnalysisError);
}

}  // namespace
}  // namespace calivera
