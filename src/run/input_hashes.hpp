#pragma once
// SHA-256 of the run's input files for the summary and the report, taken once per run. The
// network layers (a city's export: hundreds of MB) are hashed on their own thread while the
// network is connected and marched; files read later (pump curves, catchments) are added at the end.
#include <future>
#include <string>
#include <vector>

#include "rimline/run/check_run.hpp"

namespace rimline::run {

class InputHashes {
 public:
  // Starts hashing `files` (project file first) on another thread. A file in `already_read` (read
  // through a private copy) takes the hash given there, of the bytes that were read.
  InputHashes(std::vector<std::string> files, std::vector<std::pair<std::string, std::string>> already_read);
  InputHashes(const InputHashes&) = delete;  // the hashing thread holds `this`
  InputHashes& operator=(const InputHashes&) = delete;
  // Waits for them and hashes those of `files` not yet hashed; the result in the order of `files`.
  std::vector<InputFile> finish(const std::vector<std::string>& files);

 private:
  InputFile hash_of(const std::string& path) const;
  std::vector<std::pair<std::string, std::string>> already_read_;
  std::future<std::vector<InputFile>> early_;
};

}  // namespace rimline::run
