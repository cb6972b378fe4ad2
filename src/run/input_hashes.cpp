#include "run/input_hashes.hpp"

#include <algorithm>
#include <exception>

#include "rimline/sha256.hpp"

namespace rimline::run {
namespace {

InputFile hashed(const std::string& path) {
  try {
    return {path, sha256_file_hex(path)};
  } catch (const std::exception&) {
    return {path, ""};  // a database source has no file to hash
  }
}

}  // namespace

InputHashes::InputHashes(std::vector<std::string> files, std::vector<std::pair<std::string, std::string>> already_read)
    : already_read_(std::move(already_read)),
      early_(std::async(std::launch::async, [this, files = std::move(files)] {
        std::vector<InputFile> out;
        for (const auto& f : files) out.push_back(hash_of(f));
        return out;
      })) {}

InputFile InputHashes::hash_of(const std::string& path) const {
  for (const auto& [file, sha] : already_read_)
    if (file == path) return {path, sha};
  return hashed(path);
}

std::vector<InputFile> InputHashes::finish(const std::vector<std::string>& files) {
  const auto early = early_.get();
  std::vector<InputFile> out;
  for (const auto& f : files) {
    const auto it = std::find_if(early.begin(), early.end(), [&f](const InputFile& x) { return x.path == f; });
    out.push_back(it != early.end() ? *it : hash_of(f));
  }
  return out;
}

}  // namespace rimline::run
