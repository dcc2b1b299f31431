#include "core/util/sha256.h"

#include <openssl/crypto.h>
#include <openssl/evp.h>

#include <array>
#include <cerrno>
#include <cstring>
#include <fstream>
#include <memory>
#include <vector>

#include "core/util/errors.h"
#include "core/util/input_file.h"

namespace calivera {
namespace {

using DigestContext = std::unique_ptr<EVP_MD_CTX, decltype(&EVP_MD_CTX_free)>;

DigestContext newContext() {
  DigestContext context(EVP_MD_CTX_new(), &EVP_MD_CTX_free);
  if (!context || EVP_DigestInit_ex(context.get(), EVP_sha256(), nullptr) != 1) {
    throw std::runtime_error("OpenSSL: cannot initialise SHA-256");
  }
  return context;
}

std::string finish(EVP_MD_CTX* context) {
  std::array<unsigned char, EVP_MAX_MD_SIZE> digest{};
  unsigned int length = 0;
  EVP_DigestFinal_ex(context, digest.data(), &length);
  static constexpr char kHex[] = "0123456789abcdef";
  std::string hex;
  hex.reserve(2 * length);
  for (unsigned int i = 0; i < length; ++i) {
    hex.push_back(kHex[digest[i] >> 4]);
    hex.push_back(kHex[digest[i] & 0xF]);
  }
  return hex;
}

}  // namespace

bool isSha256Hex(std::string_view text) {
  return text.size() == 64 && text.find_first_not_of("0123456789abcdef") == std::string_view::npos;
}

std::string sha256OfBytes(std::string_view bytes) {
  DigestContext context = newContext();
  EVP_DigestUpdate(context.get(), bytes.data(), bytes.size());
  return finish(context.get());
}

Sha256Stream::Sha256Stream() : context_(newContext().release()) {}

Sha256Stream::~Sha256Stream() {
  EVP_MD_CTX_free(static_cast<EVP_MD_CTX*>(context_));
}

void Sha256Stream::add(std::string_view bytes) {
  EVP_DigestUpdate(static_cast<EVP_MD_CTX*>(context_), bytes.data(), bytes.size());
}

std::string Sha256Stream::hex() {
  return finish(static_cast<EVP_MD_CTX*>(context_));
}

std::string hashLibraryVersion() {
  return OpenSSL_version(OPENSSL_VERSION);
}

std::future<std::string> sha256OfFileInBackground(const std::string& path) {
  return std::async(std::launch::async, [path] {
    std::string digest = sha256OfFile(path);
    releaseThreadHashState();
    return digest;
  });
}

void releaseThreadHashState() {
  OPENSSL_thread_stop();
}

std::string sha256OfFile(const std::string& path) {
  requireRegularFile(path, "input file");  // a FIFO or /dev/zero would never end
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(path + ": cannot open (" + std::strerror(errno) + ")");
  DigestContext context = newContext();
  std::vector<char> buffer(1 << 20);
  while (in) {
    in.read(buffer.data(), static_cast<std::streamsize>(buffer.size()));
    EVP_DigestUpdate(context.get(), buffer.data(), static_cast<std::size_t>(in.gcount()));
  }
  if (in.bad()) throw InputError(path + ": read failed");
  return finish(context.get());
}

}  // namespace calivera
