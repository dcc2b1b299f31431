// The set of site summaries the workstation saves (core/sites/summary_set.h): paths inside the
// set's folder come back from anywhere the set is moved with its summaries, and a hostile or
// damaged set is refused with a message naming the file and the field (common practice for our
// own file formats; no outside reference applies).
#include "core/sites/summary_set.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <string>

#include "core/util/errors.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

std::string refusal(const std::string& path) {
  try {
    readSummarySet(path);
  } catch (const InputError& e) {
    return e.what();
  }
  return {};
}

const std::string kSha(64, 'a');

TEST(SummarySet, PathsInsideTheFolderAreRelativeAndFollowTheSet) {
  const testing::TempDir dir("summary_set_paths");
  std::filesystem::create_directories(dir.file("sites"));
  SummarySet set;
  set.summaries = {{dir.file("sites/a.cvsummary"), kSha}, {"/elsewhere/b.cvsummary", ""}};
  set.netBenefitThresholds = {0.1, 0.25};
  set.title = "Four hospitals";
  ASSERT_TRUE(set.isValid());
  const std::string text = summarySetText(set, dir.file("s.cvsites"));
  EXPECT_NE(text.find("\"sites/a.cvsummary\""), std::string::npos) << text;
  EXPECT_NE(text.find("\"/elsewhere/b.cvsummary\""), std::string::npos) << text;
  EXPECT_NE(text.find("do not replace clinical judgment"), std::string::npos);

  // Moved together to another folder: the relative path follows, the absolute one stays.
  const testing::TempDir moved("summary_set_moved");
  const SummarySet back = readSummarySet(moved.write("s.cvsites", text));
  ASSERT_EQ(back.summaries.size(), 2u);
  EXPECT_EQ(back.summaries[0].path,
            (std::filesystem::path(moved.file("s.cvsites")).parent_path() / "sites/a.cvsummary")
                .lexically_normal()
                .string());
  EXPECT_EQ(back.summaries[0].sha256, kSha);
  EXPECT_EQ(back.summaries[1].path, "/elsewhere/b.cvsummary");
  EXPECT_EQ(back.netBenefitThresholds, set.netBenefitThresholds);
  EXPECT_EQ(back.title, set.title);
}

TEST(SummarySet, HostileOrDamagedSetsAreRefusedNamingTheField) {
  const testing::TempDir dir("summary_set_bad");
  const auto set = [&](const std::string& name, const std::string& body) {
    return dir.write(name, body);
  };
  const std::string head = "{\"format\": \"calivera-site-summary-set\", \"format_version\": 1, ";
  const std::string two =
      "\"summaries\": [{\"file\": \"a.cvsummary\", \"sha256\": \"\"}, {\"file\": "
      "\"b.cvsummary\", \"sha256\": \"\"}]";
  struct Case {
    std::string name, body, expected;
  };
  const Case cases[] = {
      {"model.cvsites", "{\"format\": \"calivera-model\"}", "not a Calivera site summary set"},
      {"cut.cvsites", head + two.substr(0, 30), "not valid JSON"},
      {"version.cvsites",
       "{\"format\": \"calivera-site-summary-set\", \"format_version\": 2, " + two + "}",
       "format_version"},
      {"list.cvsites", head + "\"summaries\": {}}", "'summaries' is not a list"},
      {"one.cvsites", head + "\"summaries\": [{\"file\": \"a\", \"sha256\": \"\"}]}",
       "fewer than two"},
      {"entry.cvsites", head + "\"summaries\": [{\"file\": 3, \"sha256\": \"\"}, 4]}",
       "summaries[0]"},
      {"sha.cvsites",
       head + "\"summaries\": [{\"file\": \"a\", \"sha256\": \"xyz\"}, {\"file\": \"b\", "
              "\"sha256\": \"\"}]}",
       "summaries[0].sha256"},
      {"empty.cvsites",
       head + "\"summaries\": [{\"file\": \"\", \"sha256\": \"\"}, {\"file\": \"b\", "
              "\"sha256\": \"\"}]}",
       "summaries[0].file"},
      {"threshold.cvsites", head + two + ", \"net_benefit_thresholds\": [0.1, 1.5]}",
       "net_benefit_thresholds"},
      {"title.cvsites", head + two + ", \"title\": \"" + std::string(2000, 'x') + "\"}", "'title'"},
      {"twice.cvsites", head + two + ", \"title\": \"a\", \"title\": \"b\"}", "appears twice"},
      {"deep.cvsites",
       head + two + ", \"x\": " + std::string(200, '[') + std::string(200, ']') + "}",
       "nested deeper"},
  };
  for (const Case& c : cases) {
    const std::string path = set(c.name, c.body);
    const std::string message = refusal(path);
    EXPECT_NE(message.find(path), std::string::npos) << c.name << ": " << message;
    EXPECT_NE(message.find(c.expected), std::string::npos) << c.name << ": " << message;
  }
}

TEST(SummarySet, ASummaryChangedSinceTheSetWasSavedIsRefusedBeforeItIsRead) {
  const testing::TempDir dir("summary_set_changed");
  const std::string path = dir.write("a.cvsummary", "{\"format\": \"calivera-site-summary\"}");
  try {
    loadSummaryFiles({{path, kSha}}, {});
    FAIL() << "a changed summary was read";
  } catch (const InputError& e) {
    const std::string message = e.what();
    EXPECT_NE(message.find(path), std::string::npos) << message;
    EXPECT_NE(message.find("changed after the set was saved"), std::string::npos) << message;
  }
}

}  // namespace
}  // namespace calivera
