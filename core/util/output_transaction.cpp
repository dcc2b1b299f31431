#include "core/util/output_transaction.h"

#include <cerrno>
#include <cstring>
#include <filesystem>
#include <fstream>

#include "core/util/atomic_file.h"
#include "core/util/errors.h"

namespace calivera {
namespace fs = std::filesystem;

namespace {

// The same file by any name: both exist and are equivalent, or their normal forms agree.
bool sameFile(const std::string& a, const std::string& b) {
  std::error_code error;
  if (fs::exists(a, error) && fs::exists(b, error) && fs::equivalent(a, b, error)) return true;
  return fs::weakly_canonical(fs::absolute(a), error) ==
         fs::weakly_canonical(fs::absolute(b), error);
}

}  // namespace

OutputTransaction::~OutputTransaction() {
  removeTemporaries();
}

void OutputTransaction::add(std::string path, std::string contents, bool createFolder) {
  staged_.push_back({std::move(path), std::move(contents), createFolder, {}});
}

void OutputTransaction::removeTemporaries() {
  for (Staged& s : staged_) {
    if (s.temporary.empty()) continue;
    std::error_code ignored;
    fs::remove(s.temporary, ignored);
    s.temporary.clear();
  }
}

void OutputTransaction::commit() {
  try {
    for (Staged& s : staged_) {
      const fs::path target(s.path);
      std::error_code error;
      if (s.createFolder && target.has_parent_path()) {
        fs::create_directories(target.parent_path(), error);
      }
      if (error) {
        throw InputError(target.parent_path().string() + ": cannot create the folder (" +
                         error.message() + ")");
      }
      const std::string temporary = temporaryPathFor(s.path);
      std::ofstream out(temporary, std::ios::binary | std::ios::trunc);
      if (!out) throw InputError(s.path + ": cannot write (" + std::strerror(errno) + ")");
      s.temporary = temporary;
      out.write(s.contents.data(), static_cast<std::streamsize>(s.contents.size()));
      out.flush();
      if (!out) throw InputError(s.path + ": write failed (" + std::strerror(errno) + ")");
    }
  } catch (...) {
    removeTemporaries();
    throw;
  }
  // A target that exists but is not a regular file (a folder of that name) would fail its rename
  // after earlier ones succeeded: refused before any rename.
  for (const Staged& s : staged_) {
    std::error_code error;
    if (fs::exists(s.path, error) && !fs::is_regular_file(s.path, error)) {
      removeTemporaries();
      throw InputError(s.path + ": exists and is not a regular file, so it cannot be replaced");
    }
  }
  // Every file is written in full: now the renames, in order (the JSON, staged last, last).
  for (Staged& s : staged_) {
    std::error_code error;
    fs::rename(s.temporary, s.path, error);
    if (error) {
      const std::string message = s.path + ": cannot rename into place (" + error.message() + ")";
      removeTemporaries();
      throw InputError(message);
    }
    s.temporary.clear();
  }
  staged_.clear();
}

void refuseOverwritingInputs(const std::vector<std::pair<std::string, std::string>>& outputs,
                             const std::vector<std::pair<std::string, std::string>>& inputs) {
  for (std::size_t i = 0; i < outputs.size(); ++i) {
    for (const auto& [inputName, inputPath] : inputs) {
      if (sameFile(outputs[i].second, inputPath)) {
        throw InputError(outputs[i].first + " " + outputs[i].second + " is the " + inputName +
                         ": an output must not overwrite an input");
      }
    }
    for (std::size_t j = i + 1; j < outputs.size(); ++j) {
      if (sameFile(outputs[i].second, outputs[j].second)) {
        throw InputError(outputs[i].first + " and " + outputs[j].first + " name the same file " +
                         outputs[i].second);
      }
    }
  }
}

}  // namespace calivera
