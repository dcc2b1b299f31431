#pragma once
// SHA-256 fingerprints of input files (OpenSSL's libcrypto), recorded in model files, reports and
// study files so a reader can tell exactly which data produced a result.

#include <string>
#include <string_view>

namespace calivera {

// Lowercase hex digest. Throws InputError naming the path when the file cannot be read.
std::string sha256OfFile(const std::string& path);
std::string sha256OfBytes(std::string_view bytes);

}  // namespace calivera
