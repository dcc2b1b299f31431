#pragma once
// SHA-256 fingerprints of input files (OpenSSL's libcrypto), recorded in model files, reports and
// study files so a reader can tell exactly which data produced a result.

#include <future>
#include <string>
#include <string_view>

namespace calivera {

// Lowercase hex digest. Throws InputError naming the path when the file cannot be read.
std::string sha256OfFile(const std::string& path);
std::string sha256OfBytes(std::string_view bytes);
// True for a digest as these functions write it: 64 lowercase hex digits.
bool isSha256Hex(std::string_view text);

// sha256OfFile on a thread of its own, so a file is hashed while it is parsed (issue 13: both
// read the same bytes, and hashing is one serial pass). The thread's OpenSSL state is released
// when it ends. If the caller throws before get(), the future's destructor waits for the hash
// (sha256OfFile refuses special files at once, so it never blocks on a FIFO).
std::future<std::string> sha256OfFileInBackground(const std::string& path);

// The hashing library as it reports itself at run time (e.g. "OpenSSL 3.0.x ..."), for About.
std::string hashLibraryVersion();

// Frees the calling thread's OpenSSL state (its error queue), which OpenSSL otherwise frees only
// when the thread exits. A pooled worker thread that hashes calls this when its job ends: a pool
// thread still alive when the process exits outlives OpenSSL's exit handler, so its state would
// never be freed (LeakSanitizer reports the 904-byte error queue).
void releaseThreadHashState();

// SHA-256 fed in pieces, for data that is never one string (the analysed-data fingerprint).
class Sha256Stream {
 public:
  Sha256Stream();
  ~Sha256Stream();
  Sha256Stream(const Sha256Stream&) = delete;
  Sha256Stream& operator=(const Sha256Stream&) = delete;
  void add(std::string_view bytes);
  std::string hex();  // the digest; the stream is finished
 private:
  void* context_;  // EVP_MD_CTX
};

}  // namespace calivera
