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
  // Starts hashing `files` (project file first) on another thread.
  explicit InputHashes(std::vector<std::string> files);
  // Waits for them and hashes those of `files` not yet hashed; the result in the order of `files`.
  std::vector<InputFile> finish(const std::vector<std::string>& files);

 private:
  std::future<std::vector<InputFile>> early_;
};

}  // namespace rimline::run
