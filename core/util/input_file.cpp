#include "core/util/input_file.h"

#include <sys/stat.h>

#include <cerrno>
#include <cstring>
#include <fstream>
#include <sstream>

#include "core/util/errors.h"

namespace calivera {
namespace {

const char* kindOf(mode_t mode) {
  if (S_ISDIR(mode)) return "a directory";
  if (S_ISFIFO(mode)) return "a FIFO (named pipe)";
  if (S_ISCHR(mode)) return "a character device";
  if (S_ISBLK(mode)) return "a block device";
  if (S_ISSOCK(mode)) return "a socket";
  return "not a regular file";
}

}  // namespace

void requireRegularFile(const std::string& path, const std::string& role) {
  struct stat info {};
  if (::stat(path.c_str(), &info) != 0) {
    throw InputError(path + ": cannot open the " + role + " (" + std::strerror(errno) + ")");
  }
  if (!S_ISREG(info.st_mode)) {
    throw InputError(path + ": the " + role + " is " + kindOf(info.st_mode) +
                     ", not a regular file");
  }
}

std::string readSmallFile(const std::string& path, const std::string& role, std::size_t maxBytes) {
  requireRegularFile(path, role);
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(path + ": cannot open the " + role + " (" + std::strerror(errno) + ")");
  in.seekg(0, std::ios::end);
  const std::streamoff size = in.tellg();
  if (size < 0) throw InputError(path + ": cannot read the " + role);
  if (static_cast<std::size_t>(size) > maxBytes) {
    throw InputError(path + ": the " + role + " is " + std::to_string(size) +
                     " bytes, more than the " + std::to_string(maxBytes >> 20) + " MiB a " + role +
                     " may have");
  }
  in.seekg(0, std::ios::beg);
  std::string text(static_cast<std::size_t>(size), '\0');
  in.read(text.data(), size);
  if (in.gcount() != size) throw InputError(path + ": reading the " + role + " failed");
  return text;
}

}  // namespace calivera
