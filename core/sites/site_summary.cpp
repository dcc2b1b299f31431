#include "core/sites/site_summary.h"

#include <algorithm>
#include <cmath>
#include <nlohmann/json.hpp>

#include "core/metrics/json_values.h"
#include "core/present/caution.h"
#include "core/sites/site_json.h"
#include "core/util/errors.h"
#include "core/util/input_file.h"
#include "core/util/sha256.h"
#include "core/util/strict_json.h"
#include "core/util/utf8.h"

namespace calivera {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

bool isSmallCell(std::size_t count, std::size_t below) {
  return below > 0 && count > 0 && count < below;
}

long long logitBin(double risk, double width) {
  double logit = std::log(risk / (1.0 - risk));
  if (std::isnan(logit)) logit = 0.0;  // not reached: risks are checked to lie in [0, 1]
  logit = std::clamp(logit, -kLogitBound, kLogitBound - width / 2.0);
  return static_cast<long long>(std::floor(logit / width));
}

// Bins of logit(risk): logit is non-decreasing in the risk, so two patients in different bins are
// ordered by risk as by their bins (the AUC's order), and equal risks share a bin.
std::vector<LogitHistogramCell> logitHistogram(const ValidationInput& input, double width,
                                               std::size_t suppressBelow) {
  // Bins are bounded (|logit| <= kLogitBound), so counts go into a flat array, not a map.
  const long long first = logitBin(0.0, width);
  const long long last = logitBin(1.0, width);
  std::vector<std::size_t> events(static_cast<std::size_t>(last - first + 1), 0);
  std::vector<std::size_t> nonEvents(events.size(), 0);
  for (std::size_t i = 0; i < input.risk.size(); ++i) {
    const auto k = static_cast<std::size_t>(logitBin(input.risk[i], width) - first);
    (input.outcome[i] > 0.5 ? events[k] : nonEvents[k]) += 1;
  }
  std::vector<LogitHistogramCell> cells;
  for (std::size_t k = 0; k < events.size(); ++k) {
    if (events[k] == 0 && nonEvents[k] == 0) continue;
    const long long bin = first + static_cast<long long>(k);
    cells.push_back({bin, bin + 1, events[k], nonEvents[k]});
  }
  if (suppressBelow == 0) return cells;
  // Merge neighbours until each cell holds 0 or >= N of each outcome; a small remainder joins the
  // cell before it.
  const auto settled = [&](const LogitHistogramCell& c) {
    return !isSmallCell(c.events, suppressBelow) && !isSmallCell(c.nonEvents, suppressBelow);
  };
  std::vector<LogitHistogramCell> merged;
  std::optional<LogitHistogramCell> open;
  for (const LogitHistogramCell& c : cells) {
    if (!open) {
      open = c;
    } else {
      open->toBin = c.toBin;
      open->events += c.events;
      open->nonEvents += c.nonEvents;
    }
    if (settled(*open)) {
      merged.push_back(*open);
      open.reset();
    }
  }
  if (open) {
    if (merged.empty()) {
      merged.push_back(*open);
    } else {
      merged.back().toBin = open->toBin;
      merged.back().events += open->events;
      merged.back().nonEvents += open->nonEvents;
    }
  }
  return merged;
}

nlohmann::json numberOrNull(const std::optional<std::size_t>& v) {
  return v ? nlohmann::json(*v) : nlohmann::json(nullptr);
}

nlohmann::json summaryJson(const SiteSummary& s) {
  nlohmann::json out;
  out["format"] = kSiteSummaryFormat;
  out["format_version"] = kSiteSummaryVersion;
  out["caution"] = kCautionText;
  out["contents"] =
      "Aggregates of one site's validation only: counts, measures with standard errors, "
      "threshold counts, histograms of logit(risk) by outcome, Hosmer-Lemeshow group sums and a "
      "calibration curve read at fixed risks. No patient row, identifier or single patient's "
      "value.";
  out["software_version"] = s.softwareVersion;
  out["model"] = {{"kind", s.modelKind},
                  {"name", s.modelName},
                  {"sha256", s.modelSha256},
                  {"risk_column", s.riskColumn}};
  out["data"] = {{"sha256", s.dataSha256},
                 {"analysed_sha256", s.analysedSha256},
                 {"outcome_column", s.outcomeColumn},
                 {"performance", s.performance}};
  out["settings"] = {{"groups", s.groups},
                     {"thresholds", s.thresholdGrid},
                     {"logit_bin_width", s.binWidth},
                     {"suppress_below", s.suppressBelow}};
  nlohmann::json site = siteMeasuresJson(s.measures);
  nlohmann::json counts = nlohmann::json::array();
  for (const SiteThresholdCounts& c : s.measures.thresholds) {
    if (c.suppressed) {
      counts.push_back({{"threshold", c.threshold},
                        {"true_positives", nullptr},
                        {"false_positives", nullptr},
                        {"withheld", true}});
    } else {
      counts.push_back({{"threshold", c.threshold},
                        {"true_positives", c.truePositives},
                        {"false_positives", c.falsePositives}});
    }
  }
  site["threshold_counts"] = counts;
  out["site"] = site;
  nlohmann::json histogram = nlohmann::json::array();
  for (const LogitHistogramCell& c : s.histogram) {
    histogram.push_back(nlohmann::json::array({c.fromBin, c.toBin, c.events, c.nonEvents}));
  }
  out["logit_histogram"] = {
      {"bin_width", s.binWidth},
      {"cells", histogram},
      {"layout",
       "[from_bin, to_bin, events, non_events]: logits in [from_bin * bin_width, "
       "to_bin * bin_width)"}};
  nlohmann::json groups = nlohmann::json::array();
  for (const SummaryGroup& g : s.hosmerLemeshowGroups) {
    groups.push_back(
        {{"n", g.n}, {"observed", numberOrNull(g.observed)}, {"expected", jsonNumber(g.expected)}});
  }
  out["hosmer_lemeshow"] = {{"groups", groups},
                            {"statistic", jsonNumber(s.hosmerLemeshowStatistic)},
                            {"df", s.hosmerLemeshowDf},
                            {"p_value", jsonNumber(s.hosmerLemeshowP)}};
  out["calibration_curve"] = {{"points", calibrationCurveJson(s.measures.calibrationCurve)},
                              {"layout", "[risk, smoothed observed proportion] at fixed risks"}};
  return out;
}

// ---- reading ----

class SummaryReader {
 public:
  SummaryReader(const nlohmann::json& root, std::string path)
      : root_(root), path_(std::move(path)) {}

  [[noreturn]] void fail(const std::string& field, const std::string& problem) const {
    throw InputError(path_ + ": field '" + field + "' " + problem);
  }
  const nlohmann::json& at(const nlohmann::json& object, const std::string& key,
                           const std::string& field) const {
    if (!object.is_object() || !object.contains(key)) fail(field, "is missing");
    return object.at(key);
  }
  std::string text(const nlohmann::json& object, const std::string& key, const std::string& field,
                   std::size_t maxBytes = kMaxSiteNameBytes) const {
    const nlohmann::json& v = at(object, key, field);
    if (!v.is_string()) fail(field, "is not text");
    const std::string s = v.get<std::string>();
    if (s.size() > maxBytes) fail(field, "is longer than " + std::to_string(maxBytes) + " bytes");
    if (!validUtf8(s)) fail(field, "is not valid UTF-8");
    return s;
  }
  double number(const nlohmann::json& object, const std::string& key, const std::string& field,
                bool nullable = true) const {
    const nlohmann::json& v = at(object, key, field);
    if (v.is_null() && nullable) return kNaN;
    if (!v.is_number()) fail(field, "is not a number");
    return v.get<double>();
  }
  std::size_t count(const nlohmann::json& v, const std::string& field) const {
    if (!v.is_number_unsigned()) fail(field, "is not a whole number >= 0");
    return v.get<std::size_t>();
  }
  std::size_t count(const nlohmann::json& object, const std::string& key,
                    const std::string& field) const {
    return count(at(object, key, field), field);
  }
  const nlohmann::json& array(const nlohmann::json& object, const std::string& key,
                              const std::string& field, std::size_t maxItems) const {
    const nlohmann::json& v = at(object, key, field);
    if (!v.is_array()) fail(field, "is not a list");
    if (v.size() > maxItems) fail(field, "has more than " + std::to_string(maxItems) + " items");
    return v;
  }
  const nlohmann::json& root() const { return root_; }

 private:
  const nlohmann::json& root_;
  std::string path_;
};

SiteMeasures readSiteMeasures(const SummaryReader& r, const nlohmann::json& site) {
  SiteMeasures m;
  m.name = r.text(site, "name", "site.name");
  if (m.name.empty()) r.fail("site.name", "is empty");
  m.n = r.count(site, "n", "site.n");
  m.events = r.count(site, "events", "site.events");
  if (m.n == 0 || m.events > m.n) r.fail("site.events", "is not between 0 and site.n (n > 0)");
  m.auc = r.number(site, "auc", "site.auc");
  m.aucSe = r.number(site, "auc_se", "site.auc_se");
  const nlohmann::json& ci = r.array(site, "auc_ci", "site.auc_ci", 2);
  if (ci.size() != 2) r.fail("site.auc_ci", "is not [lo, hi]");
  m.aucCi = {ci[0].is_null() ? kNaN : ci[0].get<double>(),
             ci[1].is_null() ? kNaN : ci[1].get<double>()};
  m.oeRatio = r.number(site, "oe_ratio", "site.oe_ratio");
  m.intercept = r.number(site, "calibration_intercept", "site.calibration_intercept");
  m.interceptSe = r.number(site, "calibration_intercept_se", "site.calibration_intercept_se");
  m.slope = r.number(site, "calibration_slope", "site.calibration_slope");
  m.slopeSe = r.number(site, "calibration_slope_se", "site.calibration_slope_se");
  m.brier = r.number(site, "brier", "site.brier");
  m.hasMetrics = !site.contains("no_metrics_reason");
  if (!m.hasMetrics)
    m.noMetricsReason = r.text(site, "no_metrics_reason", "site.no_metrics_reason", 2000);
  const nlohmann::json& problems = r.at(site, "not_pooled", "site.not_pooled");
  if (!problems.is_object()) r.fail("site.not_pooled", "is not an object");
  for (const auto& [key, reason] : problems.items()) {
    if (std::find(std::begin(kPooledMeasureKeys), std::end(kPooledMeasureKeys), key) ==
        std::end(kPooledMeasureKeys)) {
      r.fail("site.not_pooled." + key, "is not a pooled measure");
    }
    m.problems[key] = r.text(problems, key, "site.not_pooled." + key, 2000);
  }
  const nlohmann::json& warnings = r.array(site, "warnings", "site.warnings", 1000);
  for (std::size_t i = 0; i < warnings.size(); ++i) {
    if (!warnings[i].is_string()) r.fail("site.warnings", "holds a value that is not text");
    m.warnings.push_back(warnings[i].get<std::string>());
  }
  // A usable measure must be a finite number with a positive SE.
  const auto usable = [&](const char* key, double value, double se, const char* field) {
    if (m.problems.count(key) == 0 && !(std::isfinite(value) && std::isfinite(se) && se > 0.0)) {
      r.fail(field, "has no finite estimate and standard error, and no reason why");
    }
  };
  usable("c_statistic", m.auc, m.aucSe, "site.auc");
  usable("oe_ratio", m.oeRatio, m.hasMetrics ? m.logOeSe() : kNaN, "site.oe_ratio");
  usable("calibration_intercept", m.intercept, m.interceptSe, "site.calibration_intercept");
  usable("calibration_slope", m.slope, m.slopeSe, "site.calibration_slope");
  if (m.problems.count("c_statistic") == 0 && !(m.auc > 0.0 && m.auc < 1.0)) {
    r.fail("site.auc", "is not strictly between 0 and 1");
  }
  return m;
}

}  // namespace

bool SummaryOptions::isValid() const {
  return !site.empty() && site.size() <= kMaxSiteNameBytes && validUtf8(site) &&
         (suppressBelow == 0 || (suppressBelow >= 2 && suppressBelow <= 1000)) && binWidth > 0.0 &&
         binWidth <= 1.0;
}

SiteSummary summarizeRun(const ValidationRun& run, const SummaryOptions& options) {
  if (!options.isValid()) throw InputError("--site: give a name of 1 to 200 bytes of UTF-8");
  SiteSummary s;
  s.modelKind = run.model ? "model file" : "risk column";
  s.modelName = run.modelName;
  s.modelSha256 = run.modelSha256;
  s.riskColumn = run.request.riskColumn.value_or("");
  s.outcomeColumn = run.request.outcome.column;
  s.performance = run.performance;
  s.softwareVersion = run.softwareVersion;
  s.dataSha256 = run.dataSha256;
  s.analysedSha256 = run.analysedSha256;
  s.suppressBelow = options.suppressBelow;
  s.groups = run.request.options.groups;
  s.thresholdGrid = run.request.options.thresholds;
  s.binWidth = options.binWidth;
  const ValidationInput& input = run.cohort.input;
  const ValidationResult& result = run.result;
  s.measures = siteMeasures(options.site, result.cohort.n, result.cohort.events, &result, {}, {},
                            result.thresholds, s.thresholdGrid, options.suppressBelow);
  s.histogram = logitHistogram(input, options.binWidth, options.suppressBelow);
  for (const CalibrationGroup& g : result.hosmerLemeshow.groups) {
    SummaryGroup group{g.n, g.observed, g.expected};
    if (isSmallCell(g.observed, options.suppressBelow) ||
        isSmallCell(g.n - g.observed, options.suppressBelow)) {
      group.observed.reset();
    }
    s.hosmerLemeshowGroups.push_back(group);
  }
  s.hosmerLemeshowStatistic = result.hosmerLemeshow.statistic;
  s.hosmerLemeshowDf = result.hosmerLemeshow.df;
  s.hosmerLemeshowP = result.hosmerLemeshow.pValue;
  return s;
}

std::string siteSummaryText(const SiteSummary& summary) {
  nlohmann::json json = summaryJson(summary);
  json["content_sha256"] = sha256OfBytes(json.dump());
  return json.dump(2) + "\n";
}

SiteSummary readSiteSummary(const std::string& path) {
  return parseSiteSummary(readSmallFile(path, "site summary", kMaxSiteSummaryBytes), path,
                          IntegrityCheck::Required);
}

SiteSummary parseSiteSummary(const std::string& text, const std::string& path,
                             IntegrityCheck integrity) {
  nlohmann::json root = parseStrictJson(text, path, false);
  const SummaryReader r(root, path);
  if (!root.is_object() || !root.contains("format") || root["format"] != kSiteSummaryFormat) {
    throw InputError(path + ": not a Calivera site summary (no \"format\": \"" +
                     std::string(kSiteSummaryFormat) + "\")");
  }
  const nlohmann::json& version = r.at(root, "format_version", "format_version");
  if (!version.is_number_integer() || version.get<long long>() != kSiteSummaryVersion) {
    r.fail("format_version", "is not " + std::to_string(kSiteSummaryVersion) +
                                 " (written by another version of Calivera)");
  }
  SiteSummary s;
  s.contentSha256 = r.text(root, "content_sha256", "content_sha256");
  nlohmann::json withoutHash = root;
  withoutHash.erase("content_sha256");
  if (integrity == IntegrityCheck::Required &&
      sha256OfBytes(withoutHash.dump()) != s.contentSha256) {
    throw InputError(path +
                     ": the summary's content does not match its content_sha256: it was edited "
                     "or damaged after it was written; ask the site for a fresh copy");
  }
  s.softwareVersion = r.text(root, "software_version", "software_version");
  const nlohmann::json& model = r.at(root, "model", "model");
  s.modelKind = r.text(model, "kind", "model.kind");
  if (s.modelKind != "model file" && s.modelKind != "risk column") {
    r.fail("model.kind", "is neither \"model file\" nor \"risk column\"");
  }
  s.modelName = r.text(model, "name", "model.name", 2000);
  s.modelSha256 = r.text(model, "sha256", "model.sha256");
  s.riskColumn = r.text(model, "risk_column", "model.risk_column", 2000);
  const nlohmann::json& data = r.at(root, "data", "data");
  s.dataSha256 = r.text(data, "sha256", "data.sha256");
  s.analysedSha256 = r.text(data, "analysed_sha256", "data.analysed_sha256");
  s.outcomeColumn = r.text(data, "outcome_column", "data.outcome_column", 2000);
  s.performance = r.text(data, "performance", "data.performance");
  const nlohmann::json& settings = r.at(root, "settings", "settings");
  const nlohmann::json& groups = r.at(settings, "groups", "settings.groups");
  if (!groups.is_number_integer() || groups.get<long long>() < 2 || groups.get<long long>() > 100) {
    r.fail("settings.groups", "is not a whole number from 2 to 100");
  }
  s.groups = groups.get<int>();
  for (const nlohmann::json& t : r.array(settings, "thresholds", "settings.thresholds", 10000)) {
    if (!t.is_number() || !(t.get<double>() > 0.0 && t.get<double>() < 1.0)) {
      r.fail("settings.thresholds", "holds a value that is not strictly between 0 and 1");
    }
    if (!s.thresholdGrid.empty() && !(t.get<double>() > s.thresholdGrid.back())) {
      r.fail("settings.thresholds", "is not ascending");
    }
    s.thresholdGrid.push_back(t.get<double>());
  }
  s.binWidth = r.number(settings, "logit_bin_width", "settings.logit_bin_width", false);
  if (!(s.binWidth > 0.0 && s.binWidth <= 1.0))
    r.fail("settings.logit_bin_width", "is not in (0, 1]");
  s.suppressBelow = r.count(settings, "suppress_below", "settings.suppress_below");

  const nlohmann::json& site = r.at(root, "site", "site");
  s.measures = readSiteMeasures(r, site);
  const nlohmann::json& counts = r.array(site, "threshold_counts", "site.threshold_counts", 10000);
  if (counts.size() != s.thresholdGrid.size()) {
    r.fail("site.threshold_counts", "does not have one entry per threshold of the settings");
  }
  const std::size_t nonEvents = s.measures.n - s.measures.events;
  for (std::size_t i = 0; i < counts.size(); ++i) {
    const std::string field = "site.threshold_counts[" + std::to_string(i) + "]";
    const double t = r.number(counts[i], "threshold", field + ".threshold", false);
    if (t != s.thresholdGrid[i]) r.fail(field + ".threshold", "differs from the settings");
    SiteThresholdCounts c{t, 0, 0, false};
    if (counts[i].contains("withheld")) {
      c.suppressed = true;
    } else {
      c.truePositives = r.count(counts[i], "true_positives", field + ".true_positives");
      c.falsePositives = r.count(counts[i], "false_positives", field + ".false_positives");
      if (c.truePositives > s.measures.events || c.falsePositives > nonEvents) {
        r.fail(field, "counts more flagged patients than the site has");
      }
    }
    s.measures.thresholds.push_back(c);
  }

  const nlohmann::json& histogram = r.at(root, "logit_histogram", "logit_histogram");
  std::size_t events = 0, others = 0;
  long long previousEnd = std::numeric_limits<long long>::min();
  const long long maxBin = static_cast<long long>(std::ceil(kLogitBound / s.binWidth)) + 1;
  for (const nlohmann::json& cell : r.array(histogram, "cells", "logit_histogram.cells", 1000000)) {
    if (!cell.is_array() || cell.size() != 4 || !cell[0].is_number_integer() ||
        !cell[1].is_number_integer()) {
      r.fail("logit_histogram.cells", "holds a cell that is not [from, to, events, non_events]");
    }
    LogitHistogramCell c{cell[0].get<long long>(), cell[1].get<long long>(),
                         r.count(cell[2], "logit_histogram.cells"),
                         r.count(cell[3], "logit_histogram.cells")};
    if (c.fromBin >= c.toBin || c.fromBin < previousEnd || c.fromBin < -maxBin ||
        c.toBin > maxBin) {
      r.fail("logit_histogram.cells", "holds cells out of order, overlapping or out of range");
    }
    previousEnd = c.toBin;
    events += c.events;
    others += c.nonEvents;
    s.histogram.push_back(c);
  }
  if (events != s.measures.events || others != nonEvents) {
    r.fail("logit_histogram.cells", "does not count the site's events and non-events");
  }
  const nlohmann::json& hl = r.at(root, "hosmer_lemeshow", "hosmer_lemeshow");
  for (const nlohmann::json& g : r.array(hl, "groups", "hosmer_lemeshow.groups", 1000)) {
    SummaryGroup group;
    group.n = r.count(g, "n", "hosmer_lemeshow.groups.n");
    const nlohmann::json& observed = r.at(g, "observed", "hosmer_lemeshow.groups.observed");
    if (!observed.is_null()) group.observed = r.count(observed, "hosmer_lemeshow.groups.observed");
    group.expected = r.number(g, "expected", "hosmer_lemeshow.groups.expected");
    s.hosmerLemeshowGroups.push_back(group);
  }
  s.hosmerLemeshowStatistic = r.number(hl, "statistic", "hosmer_lemeshow.statistic");
  const nlohmann::json& df = r.at(hl, "df", "hosmer_lemeshow.df");
  if (!df.is_number_integer()) r.fail("hosmer_lemeshow.df", "is not a whole number");
  s.hosmerLemeshowDf = df.get<int>();
  s.hosmerLemeshowP = r.number(hl, "p_value", "hosmer_lemeshow.p_value");
  const nlohmann::json& curve = r.at(root, "calibration_curve", "calibration_curve");
  for (const nlohmann::json& p : r.array(curve, "points", "calibration_curve.points", 1000)) {
    if (!p.is_array() || p.size() != 2 || !p[0].is_number()) {
      r.fail("calibration_curve.points", "holds a point that is not [risk, observed]");
    }
    s.measures.calibrationCurve.push_back(
        {p[0].get<double>(), p[1].is_null() ? kNaN : p[1].get<double>()});
  }
  return s;
}

BinnedAuc binnedAuc(const std::vector<const std::vector<LogitHistogramCell>*>& histograms) {
  struct Cell {
    long long from, to;
    double count;
  };
  std::vector<Cell> events, nonEvents;
  BinnedAuc out;
  for (const auto* histogram : histograms) {
    for (const LogitHistogramCell& c : *histogram) {
      if (c.events > 0) events.push_back({c.fromBin, c.toBin, static_cast<double>(c.events)});
      if (c.nonEvents > 0) {
        nonEvents.push_back({c.fromBin, c.toBin, static_cast<double>(c.nonEvents)});
      }
      out.events += c.events;
      out.nonEvents += c.nonEvents;
    }
  }
  if (out.events == 0 || out.nonEvents == 0) {
    out.auc = out.errorBound = kNaN;
    return out;
  }
  // Non-event cells sorted by their upper end (certainly below an event cell starting at or
  // above it) and by their lower end (certainly above an event cell ending at or below it).
  std::vector<std::pair<long long, double>> byTo, byFrom;
  for (const Cell& c : nonEvents) {
    byTo.emplace_back(c.to, c.count);
    byFrom.emplace_back(c.from, c.count);
  }
  std::sort(byTo.begin(), byTo.end());
  std::sort(byFrom.begin(), byFrom.end());
  std::vector<double> toPrefix(byTo.size() + 1, 0.0), fromSuffix(byFrom.size() + 1, 0.0);
  for (std::size_t i = 0; i < byTo.size(); ++i) toPrefix[i + 1] = toPrefix[i] + byTo[i].second;
  for (std::size_t i = byFrom.size(); i-- > 0;)
    fromSuffix[i] = fromSuffix[i + 1] + byFrom[i].second;
  const double totalNonEvents = static_cast<double>(out.nonEvents);
  double concordant = 0.0, ambiguous = 0.0;
  for (const Cell& e : events) {
    const std::size_t below = static_cast<std::size_t>(
        std::upper_bound(byTo.begin(), byTo.end(), std::make_pair(e.from, kNaN),
                         [](const auto& a, const auto& b) { return a.first < b.first; }) -
        byTo.begin());
    const double certainlyBelow = toPrefix[below];  // non-event cells with to <= e.from
    const std::size_t above = static_cast<std::size_t>(
        std::lower_bound(byFrom.begin(), byFrom.end(), std::make_pair(e.to, 0.0),
                         [](const auto& a, const auto& b) { return a.first < b.first; }) -
        byFrom.begin());
    const double certainlyAbove = fromSuffix[above];  // non-event cells with from >= e.to
    const double overlapping = totalNonEvents - certainlyBelow - certainlyAbove;
    concordant += e.count * certainlyBelow;
    ambiguous += e.count * overlapping;
  }
  const double pairs = static_cast<double>(out.events) * totalNonEvents;
  out.auc = (concordant + 0.5 * ambiguous) / pairs;
  out.errorBound = 0.5 * ambiguous / pairs;
  return out;
}

}  // namespace calivera
