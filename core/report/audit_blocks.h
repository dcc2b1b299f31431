#pragma once
// Building blocks of the audit document (audit_report.h), shared by the files that write its
// sections.

#include <string>
#include <utility>
#include <vector>

#include "core/report/audit_report.h"

namespace calivera {

inline ReportBlock reportHeading(std::string text, int level = 1) {
  ReportBlock block;
  block.kind = ReportBlock::Kind::Heading;
  block.level = level;
  block.text = std::move(text);
  return block;
}

inline ReportBlock reportParagraph(std::string text) {
  ReportBlock block;
  block.kind = ReportBlock::Kind::Paragraph;
  block.text = std::move(text);
  return block;
}

inline ReportBlock reportTable(ReportTable table) {
  ReportBlock block;
  block.kind = ReportBlock::Kind::Table;
  block.table = std::move(table);
  return block;
}

// Captions name their table "Table #. ..."; numberTables numbers them in reading order.
inline constexpr const char* kTablePrefix = "Table #. ";
void numberTables(std::vector<ReportBlock>& blocks);

}  // namespace calivera
