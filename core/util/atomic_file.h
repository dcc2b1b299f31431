#pragma once
// Output files are written to a temporary name in the target folder and renamed into place, so a
// failed or cancelled run never leaves a half-written file behind.

#include <functional>
#include <ostream>
#include <string>
#include <string_view>

namespace calivera {

// A temporary name beside `target` (same folder, so a rename moves it into place atomically):
// ".NAME.tmp-RANDOM".
std::string temporaryPathFor(const std::string& target);

// Throws InputError naming the path when the folder is not writable.
void writeFileAtomically(const std::string& path, std::string_view contents);

// Streams into a temporary file; only when `write` returns normally is the file renamed to
// `path`. An exception from `write` removes the temporary file and propagates.
void writeFileAtomically(const std::string& path, const std::function<void(std::ostream&)>& write);

}  // namespace calivera
