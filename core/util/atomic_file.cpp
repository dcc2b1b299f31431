#include "core/util/atomic_file.h"

#include <cerrno>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <random>

#include "core/util/errors.h"

namespace calivera {
std::string temporaryPathFor(const std::string& targetPath) {
  const std::filesystem::path target(targetPath);
  std::random_device device;
  // Appended piece by piece: GCC 12 gives a false -Wrestrict warning for the chain of operator+.
  std::string name = ".";
  name += target.filename().string();
  name += ".tmp-";
  name += std::to_string(device());
  return (target.parent_path() / name).string();
}

void writeFileAtomically(const std::string& path, const std::function<void(std::ostream&)>& write) {
  const std::filesystem::path target(path);
  const std::filesystem::path temporary = temporaryPathFor(path);
  try {
    {
      std::ofstream out(temporary, std::ios::binary | std::ios::trunc);
      if (!out) {
        throw InputError(path + ": cannot write (" + std::strerror(errno) + ")");
      }
      write(out);
      out.flush();
      if (!out) throw InputError(path + ": write failed (" + std::strerror(errno) + ")");
    }
    std::error_code error;
    std::filesystem::rename(temporary, target, error);
    if (error) throw InputError(path + ": cannot rename into place (" + error.message() + ")");
  } catch (...) {
    std::error_code ignored;
    std::filesystem::remove(temporary, ignored);
    throw;
  }
}

void writeFileAtomically(const std::string& path, std::string_view contents) {
  writeFileAtomically(path, [&](std::ostream& out) {
    out.write(contents.data(), static_cast<std::streamsize>(contents.size()));
  });
}

}  // namespace calivera
