#pragma once
// Every output of one run as a transaction: each file is first written in full to a temporary
// name in its target folder; only when all of them were written are they renamed into place,
// one rename each (atomic per file on one file system). A failure while writing (a full disk, a
// folder that is not writable) removes every temporary file and leaves every earlier output
// untouched; nothing is half-written, and an earlier --csv-dir result is never partly replaced.
// The remaining window is the renames themselves, a few system calls with no data written.
//
// Outputs must not overwrite inputs: refuseOverwritingInputs compares each output path with the
// run's inputs (the same file by any name) and with the other outputs.

#include <string>
#include <utility>
#include <vector>

namespace calivera {

class OutputTransaction {
 public:
  OutputTransaction() = default;
  ~OutputTransaction();  // removes temporaries of an uncommitted transaction
  OutputTransaction(const OutputTransaction&) = delete;
  OutputTransaction& operator=(const OutputTransaction&) = delete;

  // Stages `contents` for `path`. Its folder must exist, unless `createFolder` (a --csv-dir),
  // when it is created on commit.
  void add(std::string path, std::string contents, bool createFolder = false);
  // Throws InputError naming the path that failed; then nothing has changed.
  void commit();

 private:
  struct Staged {
    std::string path;
    std::string contents;
    bool createFolder = false;
    std::string temporary;  // set once written
  };
  void removeTemporaries();
  std::vector<Staged> staged_;
};

// Throws InputError when an output path names an input file (the same file by any name) or two
// outputs name the same file. `outputs` and `inputs`: (what it is, path), e.g. ("--json", path).
void refuseOverwritingInputs(const std::vector<std::pair<std::string, std::string>>& outputs,
                             const std::vector<std::pair<std::string, std::string>>& inputs);

}  // namespace calivera
