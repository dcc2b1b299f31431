#pragma once
// Runs the real calivera executable (CALIVERA_BINARY) in a shell and captures its exit status,
// standard output and standard error, for command-line tests.

#include <sys/wait.h>
#include <unistd.h>

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

namespace calivera::testing {

struct CliRun {
  int status = -1;
  std::string out;
  std::string err;
};

inline std::string shellQuote(const std::string& word) {
  std::string quoted = "'";
  for (const char c : word) quoted += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return quoted + "'";
}

inline std::string readWhole(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream buffer;
  buffer << in.rdbuf();
  return buffer.str();
}

// `seconds` > 0 runs it under timeout(1): a test of input that once hung ends with status 124
// instead of holding up the whole suite.
inline CliRun runCalivera(const std::vector<std::string>& words, int seconds = 0) {
  static int counter = 0;
  const auto dir = std::filesystem::temp_directory_path();
  const auto errPath =
      dir / ("calivera_cli_err_" + std::to_string(::getpid()) + "_" + std::to_string(counter++));
  std::string command = (seconds > 0 ? "timeout " + std::to_string(seconds) + " " : std::string()) +
                        shellQuote(CALIVERA_BINARY);
  for (const std::string& word : words) command += " " + shellQuote(word);
  command += " 2>" + shellQuote(errPath.string());
  CliRun run;
  FILE* pipe = ::popen(command.c_str(), "r");
  if (!pipe) return run;
  std::array<char, 4096> buffer{};
  std::size_t got = 0;
  while ((got = std::fread(buffer.data(), 1, buffer.size(), pipe)) > 0)
    run.out.append(buffer.data(), got);
  const int raw = ::pclose(pipe);
  run.status = WIFEXITED(raw) ? WEXITSTATUS(raw) : -1;
  run.err = readWhole(errPath);
  std::filesystem::remove(errPath);
  return run;
}

// What a shell command writes to standard output (empty when it cannot start).
inline std::string commandOutput(const std::string& command) {
  FILE* pipe = ::popen(command.c_str(), "r");
  std::string text;
  if (pipe == nullptr) return text;
  char buffer[4096];
  for (std::size_t got; (got = std::fread(buffer, 1, sizeof buffer, pipe)) > 0;) {
    text.append(buffer, got);
  }
  ::pclose(pipe);
  return text;
}

// A PDF's text as poppler's pdftotext (an outside reader, Debian poppler-utils) extracts it,
// with -layout so table rows stay on one line.
inline std::string pdfText(const std::string& path) {
  return commandOutput("pdftotext -layout " + shellQuote(path) + " -");
}

// A fresh empty folder under the temporary directory, removed with the object.
class TempDir {
 public:
  explicit TempDir(const std::string& tag)
      : path_(std::filesystem::temp_directory_path() /
              ("calivera_" + tag + "_" + std::to_string(::getpid()))) {
    std::filesystem::remove_all(path_);
    std::filesystem::create_directories(path_);
  }
  ~TempDir() {
    std::error_code ignored;
    std::filesystem::remove_all(path_, ignored);
  }
  TempDir(const TempDir&) = delete;
  TempDir& operator=(const TempDir&) = delete;
  std::string file(const std::string& name) const { return (path_ / name).string(); }
  std::string write(const std::string& name, const std::string& text) const {
    std::ofstream(path_ / name, std::ios::binary) << text;
    return file(name);
  }

 private:
  std::filesystem::path path_;
};

}  // namespace calivera::testing
