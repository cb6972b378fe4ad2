#include "rimline/report/staged_files.hpp"

#include <signal.h>
#include <unistd.h>

#include <cerrno>
#include <cstdlib>

#include <filesystem>
#include <fstream>

#include "rimline/error.hpp"

namespace rimline::report {

namespace fs = std::filesystem;

StagedFiles::StagedFiles(std::string out_dir) : dir_(std::move(out_dir)) {
  std::error_code ec;
  fs::create_directories(dir_, ec);
  if (ec || !fs::is_directory(dir_))
    throw Error(ErrorKind::bad_config, ErrorContext{dir_, "", "", ""}, "output directory cannot be created: " + ec.message());
  remove_leftovers();
}

// Temporaries of an earlier run that was killed (".NAME.partial-PID.EXT" whose process is gone).
void StagedFiles::remove_leftovers() {
  std::error_code ec;
  for (const auto& entry : fs::directory_iterator(dir_, ec)) {
    const std::string name = entry.path().filename().string();
    const auto at = name.find(".partial-");
    if (name.empty() || name[0] != '.' || at == std::string::npos) continue;
    const long pid = std::strtol(name.c_str() + at + 9, nullptr, 10);
    if (pid <= 0 || pid == ::getpid()) continue;
    if (::kill(static_cast<pid_t>(pid), 0) == 0 || errno != ESRCH) continue;  // still running
    std::error_code rm;
    fs::remove_all(entry.path(), rm);
  }
}

StagedFiles::~StagedFiles() {
  if (committed_) return;
  std::error_code ec;
  for (const auto& [tmp, final_name] : staged_) fs::remove_all(tmp, ec);
}

std::string StagedFiles::path_for(const std::string& name) {
  // Hidden, with the pid, and with the final extension kept (GDAL drivers look at it).
  const fs::path final_path(name);
  const std::string tmp =
      (fs::path(dir_) / ("." + final_path.stem().string() + ".partial-" + std::to_string(::getpid()) +
                         final_path.extension().string()))
          .string();
  std::error_code ec;
  fs::remove_all(tmp, ec);
  staged_.emplace_back(tmp, (fs::path(dir_) / name).string());
  return tmp;
}

void StagedFiles::write_text(const std::string& name, const std::string& text) {
  write_stream(name, [&text](std::ostream& out) { out << text; });
}

void StagedFiles::write_stream(const std::string& name, const std::function<void(std::ostream&)>& fill) {
  const std::string tmp = path_for(name);
  std::ofstream out(tmp, std::ios::binary | std::ios::trunc);
  fill(out);
  out.flush();
  if (!out) throw Error(ErrorKind::bad_config, ErrorContext{tmp, "", "", ""}, "cannot be written");
}

void StagedFiles::commit() {
  for (const auto& [tmp, final_name] : staged_) {
    std::error_code ec;
    fs::rename(tmp, final_name, ec);
    if (ec) throw Error(ErrorKind::bad_config, ErrorContext{final_name, "", "", ""}, "cannot be replaced: " + ec.message());
  }
  committed_ = true;
}

}  // namespace rimline::report
