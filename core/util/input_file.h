#pragma once
// Inputs are regular files: a FIFO, a device such as /dev/zero or a directory given as a cohort,
// model, study or compared model would block, read forever or grow memory without end, so each
// is refused at once with an InputError naming the path and what it is. Small text inputs (model
// and study files) are also bounded in size.

#include <cstddef>
#include <string>

namespace calivera {

inline constexpr std::size_t kMaxModelFileBytes = std::size_t{16} << 20;  // 16 MiB
inline constexpr std::size_t kMaxStudyFileBytes = std::size_t{16} << 20;

// Throws InputError "PATH: the ROLE is not a regular file (a FIFO)" and the like, or
// "PATH: cannot open the ROLE (reason)".
void requireRegularFile(const std::string& path, const std::string& role);

// The whole file after requireRegularFile, refused above `maxBytes`.
std::string readSmallFile(const std::string& path, const std::string& role, std::size_t maxBytes);

}  // namespace calivera
