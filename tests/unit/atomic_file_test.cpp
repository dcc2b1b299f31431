// Atomic output: the target appears only when writing succeeds; a failed write leaves neither a
// half-written target nor a temporary file.

#include "core/util/atomic_file.h"

#include <gtest/gtest.h>
#include <unistd.h>

#include <filesystem>
#include <fstream>
#include <sstream>
#include <stdexcept>

#include "core/util/errors.h"

namespace calivera {
namespace {

namespace fs = std::filesystem;

std::string contentsOf(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream out;
  out << in.rdbuf();
  return out.str();
}

class AtomicFile : public ::testing::Test {
 protected:
  void SetUp() override {
    folder_ = fs::temp_directory_path() / ("calivera_atomic_" + std::to_string(::getpid()));
    fs::create_directories(folder_);
  }
  void TearDown() override { fs::remove_all(folder_); }
  std::size_t filesInFolder() const {
    return static_cast<std::size_t>(std::distance(fs::directory_iterator(folder_), {}));
  }
  fs::path folder_;
};

TEST_F(AtomicFile, WritesAndReplaces) {
  const fs::path target = folder_ / "report.txt";
  writeFileAtomically(target.string(), "first");
  EXPECT_EQ(contentsOf(target), "first");
  writeFileAtomically(target.string(), "second");
  EXPECT_EQ(contentsOf(target), "second");
  EXPECT_EQ(filesInFolder(), 1U);
}

TEST_F(AtomicFile, FailedWriteKeepsOldContentsAndLeavesNoTemporary) {
  const fs::path target = folder_ / "report.txt";
  writeFileAtomically(target.string(), "old");
  EXPECT_THROW(writeFileAtomically(target.string(),
                                   [](std::ostream& out) {
                                     out << "partial";
                                     throw std::runtime_error("failed half way");
                                   }),
               std::runtime_error);
  EXPECT_EQ(contentsOf(target), "old");
  EXPECT_EQ(filesInFolder(), 1U);
}

TEST_F(AtomicFile, UnwritableFolderIsAnInputError) {
  EXPECT_THROW(writeFileAtomically((folder_ / "no_such_dir" / "x.txt").string(), "x"), InputError);
}

}  // namespace
}  // namespace calivera
