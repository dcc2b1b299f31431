#include "core/report/result_table.h"

#include <algorithm>
#include <cassert>
#include <cmath>

#include "core/present/number_text.h"
#include "core/report/csv_text.h"
#include "core/util/shown_text.h"

namespace calivera {

namespace table_columns {

TableColumn number(std::string key, std::string label, int decimals, std::string tip) {
  return {std::move(key), {}, std::move(label), std::move(tip), TableColumnKind::Number, decimals};
}
TableColumn count(std::string key, std::string label, std::string tip) {
  return {std::move(key), {}, std::move(label), std::move(tip), TableColumnKind::Count, 0};
}
TableColumn interval(std::string lo, std::string hi, std::string label, int decimals,
                     std::string tip) {
  return {std::move(lo), std::move(hi), std::move(label), std::move(tip), TableColumnKind::Interval,
          decimals};
}
TableColumn text(std::string key, std::string label, std::string tip, std::size_t shownChars) {
  return {std::move(key),        {}, std::move(label), std::move(tip),
          TableColumnKind::Text, 0,  shownChars};
}
TableColumn pValue(std::string key, std::string label, std::string tip) {
  return {std::move(key), {}, std::move(label), std::move(tip), TableColumnKind::PValue, 3};
}

}  // namespace table_columns

namespace {

using table_columns::count;
using table_columns::interval;
using table_columns::number;

const char* const kWilson = "Wilson score 95% interval";

}  // namespace

std::string tableCsv(const ResultTable& table) {
  std::vector<std::string> header;
  for (const TableColumn& c : table.columns) {
    header.push_back(c.key);
    if (c.kind == TableColumnKind::Interval) header.push_back(c.keyHi);
  }
  CsvText csv(header);
  for (const auto& row : table.rows) {
    assert(row.size() == table.columns.size());
    for (std::size_t k = 0; k < row.size(); ++k) {
      const TableValue& v = row[k];
      switch (table.columns[k].kind) {
        case TableColumnKind::Number:
        case TableColumnKind::PValue:
          csv.num(v.number);
          break;
        case TableColumnKind::Count:
          csv.count(static_cast<std::size_t>(v.number));
          break;
        case TableColumnKind::Interval:
          csv.ci(v.interval);
          break;
        case TableColumnKind::Text:
          csv.field(v.text);
          break;
      }
    }
    csv.end();
  }
  return csv.str();
}

namespace {

// Code points, for alignment (every byte but a UTF-8 continuation byte starts one).
std::size_t shownWidth(const std::string& s) {
  std::size_t n = 0;
  for (const unsigned char c : s) n += (c & 0xC0) != 0x80;
  return n;
}

std::string cellText(const TableColumn& c, const TableValue& v) {
  switch (c.kind) {
    case TableColumnKind::Number:
      return formatNumber(v.number, c.decimals);
    case TableColumnKind::Count:
      return std::to_string(static_cast<std::size_t>(v.number));
    case TableColumnKind::Interval:
      return formatRange(v.interval.lo, v.interval.hi, c.decimals);
    case TableColumnKind::Text:
      return visibleName(v.text, c.shownChars > 0 ? c.shownChars : 60);
    case TableColumnKind::PValue:
      return formatPValue(v.number);
  }
  return {};
}

}  // namespace

std::string tableText(const ResultTable& table, const std::string& indent) {
  std::vector<std::size_t> order = table.shownOrder;
  if (order.empty()) {
    for (std::size_t k = 0; k < table.columns.size(); ++k) order.push_back(k);
  }
  std::vector<std::vector<std::string>> lines(1);
  for (const std::size_t k : order) lines[0].push_back(table.columns[k].label);
  for (const auto& row : table.rows) {
    std::vector<std::string> cells;
    for (const std::size_t k : order) cells.push_back(cellText(table.columns[k], row[k]));
    lines.push_back(std::move(cells));
  }
  std::vector<std::size_t> width(order.size(), 0);
  for (const auto& line : lines) {
    for (std::size_t i = 0; i < line.size(); ++i)
      width[i] = std::max(width[i], shownWidth(line[i]));
  }
  std::string out;
  for (const auto& line : lines) {
    std::string text = indent;
    for (std::size_t i = 0; i < line.size(); ++i) {
      const std::string pad(width[i] - shownWidth(line[i]), ' ');
      const bool left = table.columns[order[i]].kind == TableColumnKind::Text;
      if (i > 0) text += "  ";
      text += left ? line[i] + pad : pad + line[i];
    }
    while (!text.empty() && text.back() == ' ') text.pop_back();
    out += text + "\n";
  }
  return out;
}

ResultTable thresholdTable(const ValidationResult& result) {
  ResultTable t;
  t.fileName = "thresholds.csv";
  // The CSV's column order is a contract (earlier columns keep their place); later additions
  // (flagged, net_benefit) come last.
  t.columns = {
      number("threshold", "Threshold", 3,
             "Patients with predicted risk at or above this value are flagged"),
      count("tp", "TP", "True positives: flagged, with the event"),
      count("fp", "FP", "False positives: flagged, without the event"),
      count("tn", "TN", "True negatives: not flagged, without the event"),
      count("fn", "FN", "False negatives: not flagged, with the event"),
      number("sensitivity", "Sensitivity", 3, "Share of patients with the event who are flagged"),
      interval("sensitivity_lo", "sensitivity_hi", "Sensitivity 95% CI", 3, kWilson),
      number("specificity", "Specificity", 3,
             "Share of patients without the event who are not flagged"),
      interval("specificity_lo", "specificity_hi", "Specificity 95% CI", 3, kWilson),
      number("ppv", "PPV", 3,
             "Positive predictive value: share of flagged patients with the event"),
      interval("ppv_lo", "ppv_hi", "PPV 95% CI", 3, kWilson),
      number("npv", "NPV", 3,
             "Negative predictive value: share of unflagged patients without the event"),
      interval("npv_lo", "npv_hi", "NPV 95% CI", 3, kWilson),
      number("flagged_per_1000", "Flagged per 1000", 1),
      number("events_caught_per_1000", "Events caught per 1000", 1),
      number("events_missed_per_1000", "Events missed per 1000", 1),
      number("flagged_without_event_per_1000", "Flagged without event per 1000", 1),
      count("flagged", "Flagged", "Number of patients flagged"),
      number("net_benefit", "Net benefit", 4,
             "Net benefit (Vickers & Elkin 2006): TP/n − FP/n × t/(1 − t); not defined at "
             "t = 0 or 1")};
  // On screen what a clinician reads first: how many are flagged, per 1000, and the net benefit;
  // then the counts and the proportions with their intervals.
  t.shownOrder = {0, 17, 13, 14, 15, 16, 18, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12};
  const auto& curve = result.decisionCurve;
  for (std::size_t i = 0; i < result.thresholds.size(); ++i) {
    const ThresholdRow& r = result.thresholds[i];
    double nb = std::nan("");
    if (i < curve.size() && std::abs(curve[i].threshold - r.threshold) < 1e-12) {
      nb = curve[i].netBenefit;
    }
    t.rows.push_back(
        {TableValue::of(r.threshold), TableValue::ofCount(r.tp), TableValue::ofCount(r.fp),
         TableValue::ofCount(r.tn), TableValue::ofCount(r.fn), TableValue::of(r.sensitivity),
         TableValue::of(r.sensitivityCi), TableValue::of(r.specificity),
         TableValue::of(r.specificityCi), TableValue::of(r.ppv), TableValue::of(r.ppvCi),
         TableValue::of(r.npv), TableValue::of(r.npvCi), TableValue::of(r.flaggedPer1000),
         TableValue::of(r.eventsCaughtPer1000), TableValue::of(r.eventsMissedPer1000),
         TableValue::of(r.flaggedWithoutEventPer1000), TableValue::ofCount(r.tp + r.fp),
         TableValue::of(nb)});
  }
  return t;
}

ResultTable hosmerLemeshowTable(const HosmerLemeshow& hl) {
  ResultTable t;
  t.fileName = "hosmer_lemeshow_groups.csv";
  t.columns = {count("group", "Risk group", "Groups of patients by quantiles of predicted risk"),
               count("n", "Patients"),
               count("observed", "Observed events"),
               number("expected", "Expected events", 2, "Sum of predicted risks in the group"),
               number("mean_risk", "Mean predicted risk", 4),
               number("observed_proportion", "Observed proportion", 4),
               interval("observed_lo", "observed_hi", "Observed 95% CI", 4, kWilson),
               number("risk_min", "Lowest risk", 4),
               number("risk_max", "Highest risk", 4)};
  std::size_t k = 0;
  for (const CalibrationGroup& g : hl.groups) {
    t.rows.push_back({TableValue::ofCount(++k), TableValue::ofCount(g.n),
                      TableValue::ofCount(g.observed), TableValue::of(g.expected),
                      TableValue::of(g.meanRisk), TableValue::of(g.observedProportion),
                      TableValue::of(g.observedCi), TableValue::of(g.riskLo),
                      TableValue::of(g.riskHi)});
  }
  return t;
}

}  // namespace calivera
