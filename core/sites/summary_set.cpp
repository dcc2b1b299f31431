#include "core/sites/summary_set.h"

#include <filesystem>
#include <nlohmann/json.hpp>

#include "core/present/caution.h"
#include "core/study/limits.h"
#include "core/util/errors.h"
#include "core/util/input_file.h"
#include "core/util/sha256.h"
#include "core/util/strict_json.h"
#include "core/util/utf8.h"

namespace calivera {
namespace {

namespace fs = std::filesystem;

// `path` as written in a set saved in `folder`: relative when inside it.
std::string storedPath(const std::string& path, const fs::path& folder) {
  std::error_code error;
  const fs::path absolute = fs::weakly_canonical(fs::absolute(path), error);
  if (error) return path;
  const fs::path relative = absolute.lexically_relative(folder);
  if (!relative.empty() && *relative.begin() != "..") return relative.generic_string();
  return absolute.string();
}

fs::path folderOf(const std::string& setPath) {
  std::error_code error;
  const fs::path folder = fs::weakly_canonical(fs::absolute(setPath), error).parent_path();
  return error ? fs::absolute(setPath).parent_path() : folder;
}

}  // namespace

bool SummarySet::isValid() const {
  if (summaries.size() < 2 || summaries.size() > kMaxPooledSummaries) return false;
  for (const double t : netBenefitThresholds) {
    if (!(t > 0.0 && t < 1.0)) return false;
  }
  return title.size() <= kMaxReportTitleBytes;
}

std::string summarySetText(const SummarySet& set, const std::string& setPath) {
  const fs::path folder = folderOf(setPath);
  nlohmann::json out;
  out["format"] = kSummarySetFormat;
  out["format_version"] = kSummarySetVersion;
  out["caution"] = kCautionText;
  nlohmann::json files = nlohmann::json::array();
  for (const SummarySetEntry& e : set.summaries) {
    files.push_back({{"file", storedPath(e.path, folder)}, {"sha256", e.sha256}});
  }
  out["summaries"] = files;
  out["net_benefit_thresholds"] = set.netBenefitThresholds;
  out["title"] = set.title;
  return out.dump(2) + "\n";
}

SummarySet readSummarySet(const std::string& path) {
  return parseSummarySet(readSmallFile(path, "site summary set", kMaxSummarySetBytes), path);
}

SummarySet parseSummarySet(const std::string& text, const std::string& path) {
  const nlohmann::json root = parseStrictJson(text, path, false);
  const auto fail = [&](const std::string& field, const std::string& problem) {
    throw InputError(path + ": field '" + field + "' " + problem);
  };
  if (!root.is_object() || !root.contains("format") || root["format"] != kSummarySetFormat) {
    throw InputError(path + ": not a Calivera site summary set (no \"format\": \"" +
                     std::string(kSummarySetFormat) + "\")");
  }
  if (!root.contains("format_version") || !root["format_version"].is_number_integer() ||
      root["format_version"].get<long long>() != kSummarySetVersion) {
    fail("format_version", "is not " + std::to_string(kSummarySetVersion) +
                               " (written by another version of Calivera)");
  }
  SummarySet set;
  const fs::path folder = folderOf(path);
  if (!root.contains("summaries") || !root["summaries"].is_array())
    fail("summaries", "is not a list");
  const nlohmann::json& files = root["summaries"];
  if (files.size() > kMaxPooledSummaries) {
    fail("summaries", "holds more than " + std::to_string(kMaxPooledSummaries) + " files");
  }
  for (std::size_t i = 0; i < files.size(); ++i) {
    const std::string field = "summaries[" + std::to_string(i) + "]";
    const nlohmann::json& f = files[i];
    if (!f.is_object() || !f.contains("file") || !f["file"].is_string() || !f.contains("sha256") ||
        !f["sha256"].is_string()) {
      fail(field, "is not {\"file\": text, \"sha256\": text}");
    }
    const std::string file = f["file"].get<std::string>();
    const std::string sha = f["sha256"].get<std::string>();
    if (file.empty() || file.size() > 4096 || !validUtf8(file) ||
        file.find('\0') != std::string::npos) {
      fail(field + ".file", "is not a file name");
    }
    if (!sha.empty() && !isSha256Hex(sha)) fail(field + ".sha256", "is not a SHA-256 in hex");
    const fs::path p(file);
    set.summaries.push_back({(p.is_absolute() ? p : folder / p).lexically_normal().string(), sha});
  }
  if (set.summaries.size() < 2) fail("summaries", "names fewer than two summaries");
  if (root.contains("net_benefit_thresholds")) {
    const nlohmann::json& list = root["net_benefit_thresholds"];
    if (!list.is_array() || list.size() > 1000) fail("net_benefit_thresholds", "is not a list");
    for (const nlohmann::json& t : list) {
      if (!t.is_number() || !(t.get<double>() > 0.0 && t.get<double>() < 1.0)) {
        fail("net_benefit_thresholds", "holds a value that is not a number in (0, 1)");
      }
      set.netBenefitThresholds.push_back(t.get<double>());
    }
  }
  if (root.contains("title")) {
    if (!root["title"].is_string()) fail("title", "is not text");
    set.title = root["title"].get<std::string>();
    if (set.title.size() > kMaxReportTitleBytes || !validUtf8(set.title)) {
      fail("title",
           "is longer than " + std::to_string(kMaxReportTitleBytes) + " bytes or not valid UTF-8");
    }
  }
  return set;
}

std::vector<SummaryFile> loadSummaryFiles(const std::vector<SummarySetEntry>& entries,
                                          const ProgressCallback& progress) {
  if (entries.size() > kMaxPooledSummaries) {
    throw InputError("at most " + std::to_string(kMaxPooledSummaries) + " summaries at once");
  }
  std::vector<SummaryFile> files;
  files.reserve(entries.size());
  for (std::size_t i = 0; i < entries.size(); ++i) {
    SummaryFile file;
    file.path = entries[i].path;
    // One read: the bytes hashed are the bytes parsed.
    const std::string text = readSmallFile(file.path, "site summary", kMaxSiteSummaryBytes);
    file.sha256 = sha256OfBytes(text);
    if (!entries[i].sha256.empty() && file.sha256 != entries[i].sha256) {
      throw InputError(file.path + ": this site summary changed after the set was saved (SHA-256 " +
                       file.sha256 + ", the set recorded " + entries[i].sha256 +
                       "); add it again if the change is intended");
    }
    file.summary = parseSiteSummary(text, file.path, IntegrityCheck::Required);
    files.push_back(std::move(file));
    reportProgress(progress, static_cast<double>(i + 1) / static_cast<double>(entries.size()));
  }
  return files;
}

}  // namespace calivera
