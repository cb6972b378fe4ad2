#include "rimline/signal_cleanup.hpp"

#include <algorithm>
#include <filesystem>
#include <mutex>
#include <vector>

namespace rimline {
namespace {

std::mutex& lock() {
  static std::mutex m;
  return m;
}

std::vector<std::string>& registered() {
  static std::vector<std::string> paths;
  return paths;
}

}  // namespace

void register_for_cleanup(const std::string& path) {
  const std::lock_guard<std::mutex> hold(lock());
  registered().push_back(path);
}

void release_from_cleanup(const std::string& path) {
  const std::lock_guard<std::mutex> hold(lock());
  auto& paths = registered();
  const auto it = std::find(paths.begin(), paths.end(), path);
  if (it != paths.end()) paths.erase(it);
}

void remove_registered_paths() noexcept {
  namespace fs = std::filesystem;
  const std::lock_guard<std::mutex> hold(lock());
  for (const auto& path : registered()) {
    std::error_code ec;
    // Renamed aside first: a writer thread still running opens its next file by the old path and
    // fails, instead of creating it in a folder being removed.
    const fs::path aside = path + ".removing";
    fs::rename(path, aside, ec);
    fs::remove_all(ec ? fs::path(path) : aside, ec);
  }
  registered().clear();
}

}  // namespace rimline
