#pragma once
// Read-only memory map of a whole input file, so a large cohort is parsed in place instead of
// being copied into a buffer first. Pages already parsed can be handed back (release) so the
// file and the parsed columns are not both resident at their full size.
//
// The file must not be truncated by another program while it is mapped (the read would fault).

#include <cstddef>
#include <string>
#include <string_view>

namespace calivera {

class MappedFile {
 public:
  // Throws InputError naming the path when the file cannot be opened or mapped.
  explicit MappedFile(const std::string& path);
  ~MappedFile();
  MappedFile(const MappedFile&) = delete;
  MappedFile& operator=(const MappedFile&) = delete;

  std::string_view bytes() const { return {data_, size_}; }

  // The pages from the one holding the start of `range` (a part of bytes()) to the last one that
  // ends inside it leave this process's resident memory; touching them again reads them back
  // from the page cache, so this is only ever a cost, never a change of contents.
  void release(std::string_view range) const;

  // Maps the pages of `range` (clamped to bytes()) into this process in one call, so reading
  // them does not fault page by page (on a virtual machine each fault is an expensive exit).
  // Advice only: a kernel without MADV_POPULATE_READ (before 5.14) simply faults as usual.
  void populate(std::string_view range) const;

 private:
  const char* data_ = nullptr;
  std::size_t size_ = 0;
};

// Hands parsed stretches of a mapped file back to the kernel as a parse moves on, so the file
// text and the finished columns are never both fully resident.
class ReleaseBehind {
 public:
  static constexpr std::ptrdiff_t kStep = std::ptrdiff_t{4} << 20;  // bytes between releases
  // `file` may be null (text not from a file): then nothing is released.
  // The window ahead of the reader is populated as it goes (MappedFile::populate).
  ReleaseBehind(const MappedFile* file, const char* start) : file_(file), from_(start) {
    if (file_ != nullptr) file_->populate(std::string_view(start, kStep));
  }
  void passed(const char* position) {
    if (file_ != nullptr && position - from_ >= kStep) {
      finish(position);
      file_->populate(std::string_view(position, kStep));
    }
  }
  void finish(const char* position) {
    if (file_ == nullptr || position <= from_) return;
    file_->release(std::string_view(from_, static_cast<std::size_t>(position - from_)));
    from_ = position;
  }

 private:
  const MappedFile* file_;
  const char* from_;
};

}  // namespace calivera
