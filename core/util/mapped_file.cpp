#include "core/util/mapped_file.h"

#include <fcntl.h>
#include <sys/mman.h>
#include <sys/stat.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <cstdint>
#include <cstring>

#include "core/util/errors.h"
#include "core/util/input_file.h"

namespace calivera {
namespace {

// Closes the descriptor on every path; the mapping stays valid after close.
class Descriptor {
 public:
  explicit Descriptor(int fd) : fd_(fd) {}
  ~Descriptor() {
    if (fd_ >= 0) ::close(fd_);
  }
  Descriptor(const Descriptor&) = delete;
  Descriptor& operator=(const Descriptor&) = delete;
  int get() const { return fd_; }

 private:
  int fd_;
};

}  // namespace

MappedFile::MappedFile(const std::string& path) {
  // Checked before open(): opening a FIFO without a writer would block for good.
  requireRegularFile(path, "input file");
  const Descriptor fd(::open(path.c_str(), O_RDONLY | O_CLOEXEC | O_NONBLOCK));
  if (fd.get() < 0) throw InputError(path + ": cannot open (" + std::strerror(errno) + ")");
  struct stat info {};
  if (::fstat(fd.get(), &info) != 0) {
    throw InputError(path + ": cannot read (" + std::strerror(errno) + ")");
  }
  if (!S_ISREG(info.st_mode)) throw InputError(path + ": not a regular file");
  size_ = static_cast<std::size_t>(info.st_size);
  if (size_ == 0) return;  // mmap refuses empty files; an empty view is what we want
  void* mapped = ::mmap(nullptr, size_, PROT_READ, MAP_PRIVATE, fd.get(), 0);
  if (mapped == MAP_FAILED) {
    throw InputError(path + ": cannot read (" + std::strerror(errno) + ")");
  }
  data_ = static_cast<const char*>(mapped);
  ::madvise(mapped, size_, MADV_SEQUENTIAL);
}

MappedFile::~MappedFile() {
  if (data_ != nullptr) ::munmap(const_cast<char*>(data_), size_);
}

void MappedFile::release(std::string_view range) const {
  if (data_ == nullptr || range.empty()) return;
  const auto page = static_cast<std::uintptr_t>(::sysconf(_SC_PAGESIZE));
  const auto begin = reinterpret_cast<std::uintptr_t>(range.data());
  const auto end = begin + range.size();
  // Rounding the start down may hand back a page a neighbouring range still reads; that costs
  // one re-read from the page cache, never wrong data.
  const std::uintptr_t first =
      std::max(begin / page * page, reinterpret_cast<std::uintptr_t>(data_));
  const std::uintptr_t last = end / page * page;
  if (last <= first) return;
  // Advice only: on failure the pages simply stay resident.
  ::madvise(reinterpret_cast<void*>(first), last - first, MADV_DONTNEED);
}

void MappedFile::populate(std::string_view range) const {
#ifdef MADV_POPULATE_READ
  if (data_ == nullptr || range.empty()) return;
  const auto page = static_cast<std::uintptr_t>(::sysconf(_SC_PAGESIZE));
  const auto base = reinterpret_cast<std::uintptr_t>(data_);
  const auto begin = std::max(reinterpret_cast<std::uintptr_t>(range.data()) / page * page, base);
  const auto end =
      std::min(reinterpret_cast<std::uintptr_t>(range.data()) + range.size(), base + size_);
  if (end <= begin) return;
  ::madvise(reinterpret_cast<void*>(begin), end - begin, MADV_POPULATE_READ);
#else
  (void)range;
#endif
}

}  // namespace calivera
