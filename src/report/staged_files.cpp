#include "rimline/report/staged_files.hpp"

#include <fcntl.h>
#include <signal.h>
#include <stdio.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <fstream>

#include "report/write_failure.hpp"
#include "rimline/error.hpp"
#include "rimline/file_kind.hpp"
#include "rimline/signal_cleanup.hpp"

namespace rimline::report {

namespace fs = std::filesystem;

namespace {

// Hidden sibling names: ".NAME.staging-PID" (being written) and ".NAME.old-PID" (the previous set
// on its way out, when the folders cannot be exchanged in one rename). NAME is cut so the name
// stays within NAME_MAX (255 bytes).
std::string sibling(const fs::path& out, const char* what, long pid) {
  return "." + out.filename().string().substr(0, 200) + "." + what + "-" + std::to_string(pid);
}

bool process_gone(long pid) { return pid > 0 && pid != ::getpid() && ::kill(static_cast<pid_t>(pid), 0) != 0 && errno == ESRCH; }

// The staging and old folders of earlier runs into this output folder whose process is gone.
void remove_leftovers(const fs::path& out) {
  std::error_code ec;
  const std::string prefix = "." + out.filename().string().substr(0, 200) + ".";
  for (const auto& entry : fs::directory_iterator(out.parent_path(), ec)) {
    const std::string name = entry.path().filename().string();
    if (name.rfind(prefix, 0) != 0) continue;
    const std::string rest = name.substr(prefix.size());
    for (const char* what : {"staging-", "old-"}) {
      if (rest.rfind(what, 0) != 0) continue;
      if (process_gone(std::strtol(rest.c_str() + std::strlen(what), nullptr, 10))) fs::remove_all(entry.path(), ec);
    }
  }
}

// `from` recreated at `to` without copying data: folders made, files hard-linked (copied where the
// file system has no hard links), symbolic links copied as links.
void mirror(const fs::path& from, const fs::path& to) {
  const auto st = fs::symlink_status(from);
  if (fs::is_symlink(st)) {
    fs::copy_symlink(from, to);
  } else if (fs::is_directory(st)) {
    fs::create_directory(to);
    for (const auto& e : fs::directory_iterator(from)) mirror(e.path(), to / e.path().filename());
  } else {
    std::error_code ec;
    fs::create_hard_link(from, to, ec);
    if (ec) fs::copy_file(from, to);
  }
}

fs::path resolved_out(const std::string& out_dir) {
  fs::path out = fs::absolute(out_dir).lexically_normal();
  if (out.filename().empty()) out = out.parent_path();  // "out/" -> "out"
  std::error_code ec;
  if (fs::is_symlink(out, ec)) out = fs::canonical(out, ec);
  return out;
}

}  // namespace

StagedFiles::StagedFiles(std::string out_dir, std::vector<std::string> outputs) : outputs_(std::move(outputs)) {
  const fs::path out = resolved_out(out_dir);
  out_ = out.string();
  const FileKind kind = file_kind(out_);
  if (kind != FileKind::missing && kind != FileKind::directory)
    throw Error(ErrorKind::bad_config, ErrorContext{out_dir, "", "", ""},
                "is " + std::string(file_kind_text(kind)) + ", not a folder; --out names the folder the outputs go in");
  // The set replaces the folder as a whole: a shell standing in it would be left in a removed folder.
  std::error_code ec;
  const fs::path cwd = fs::current_path(ec);
  if (!ec && kind == FileKind::directory) {
    const auto rel = cwd.lexically_relative(out);
    if (!rel.empty() && *rel.begin() != "..")
      throw Error(ErrorKind::bad_config, ErrorContext{out_dir, "", "", ""},
                  "is the current folder or holds it; the outputs replace their folder as a whole: name another "
                  "(e.g. --out out)");
  }
  fs::create_directories(out.parent_path(), ec);
  remove_leftovers(out);
  staging_ = (out.parent_path() / sibling(out, "staging", ::getpid())).string();
  fs::remove_all(staging_, ec);
  // Registered before it exists: a signal between the two steps must not leave it behind.
  register_for_cleanup(staging_);
  if (!fs::create_directory(staging_, ec) || ec)
    throw Error(ErrorKind::bad_config, ErrorContext{staging_, "", "", ""},
                "the folder the outputs are written into before they replace " + out_ + " cannot be made: " +
                    ec.message());
}

StagedFiles::~StagedFiles() {
  if (committed_) return;
  std::error_code ec;
  fs::remove_all(staging_, ec);
  release_from_cleanup(staging_);
}

std::string StagedFiles::path_for(const std::string& name) {
  const fs::path p = fs::path(staging_) / name;
  // Sub-folders made one level at a time below the staging folder, never the staging folder
  // itself: after a stop signal has removed it, a writer still running must fail to open its file
  // rather than make the folder again (which would then be left behind).
  fs::path folder = staging_;
  for (const auto& part : fs::path(name).parent_path()) {
    folder /= part;
    std::error_code ec;
    fs::create_directory(folder, ec);
  }
  return p.string();
}

std::string StagedFiles::final_name(const std::string& staged_path) const {
  if (staged_path.rfind(staging_, 0) != 0) return staged_path;
  return out_ + staged_path.substr(staging_.size());
}

void StagedFiles::write_text(const std::string& name, const std::string& text) {
  write_stream(name, [&text](std::ostream& out) { out << text; });
}

void StagedFiles::write_stream(const std::string& name, const std::function<void(std::ostream&)>& fill) {
  const std::string path = path_for(name);
  std::ofstream out(path, std::ios::binary | std::ios::trunc);
  errno = 0;
  fill(out);
  out.flush();
  if (!out) throw_write_failure(final_name(path), errno, "");
}

bool StagedFiles::owned(const std::string& name) const {
  std::error_code ec;
  if (fs::exists(fs::path(staging_) / name, ec)) return true;
  for (const auto& o : outputs_) {
    if (name == o) return true;
    for (const char* sidecar : {"-wal", "-shm", "-journal"})  // SQLite's, beside a GeoPackage
      if (name == o + sidecar) return true;
  }
  // Temporaries of rimline versions that staged inside the folder (".NAME.partial-PID.EXT").
  return name.size() > 1 && name[0] == '.' && name.find(".partial-") != std::string::npos;
}

void StagedFiles::carry_over_others() const {
  for (const auto& e : fs::directory_iterator(out_)) {
    const std::string name = e.path().filename().string();
    if (!owned(name)) mirror(e.path(), fs::path(staging_) / name);
  }
}

void StagedFiles::commit() {
  const fs::path out(out_), staging(staging_);
  auto fail = [&](const std::string& what, const std::string& state) {
    throw Error(ErrorKind::bad_config, ErrorContext{out_, "", "", ""}, what + "; " + state);
  };
  std::error_code ec;
  if (!fs::exists(out, ec)) {
    fs::rename(staging, out, ec);
    if (ec) fail("the outputs cannot be put in place: " + ec.message(), "no output folder was made");
    release_from_cleanup(staging_);
    committed_ = true;
    return;
  }
  try {
    carry_over_others();
  } catch (const fs::filesystem_error& e) {
    fail("the files in the output folder that are not outputs cannot be carried over (" + std::string(e.what()) + ")",
         untouched);
  }
  fs::permissions(staging, fs::status(out, ec).permissions(), ec);  // the folder keeps its own permissions
  fs::path old = staging;                                           // where the previous set ends up
  if (::renameat2(AT_FDCWD, staging_.c_str(), AT_FDCWD, out_.c_str(), RENAME_EXCHANGE) != 0) {
    const int err = errno;
    if (err != EINVAL && err != ENOSYS && err != ENOTSUP)
      fail("the outputs cannot be put in place: " + std::string(std::strerror(err)), untouched);
    // A file system without the exchange: the old folder aside, the new in its place, a moment apart.
    old = out.parent_path() / sibling(out, "old", ::getpid());
    fs::rename(out, old, ec);
    if (ec) fail("the outputs cannot be put in place: " + ec.message(), untouched);
    fs::rename(staging, out, ec);
    if (ec) {
      const std::string why = ec.message();
      fs::rename(old, out, ec);
      if (ec)
        fail("the outputs cannot be put in place: " + why,
             "the previous outputs are in " + old.string() + " and the new ones in " + staging_ + "; " + out_ +
                 " is missing: rename one of them to it");
      fail("the outputs cannot be put in place: " + why, untouched);
    }
  }
  release_from_cleanup(staging_);
  committed_ = true;
  // Anything put into the folder after it was carried over is moved across, then the old set goes.
  for (const auto& e : fs::directory_iterator(old, ec)) {
    const std::string name = e.path().filename().string();
    std::error_code move;
    if (!owned(name) && !fs::exists(out / name, move)) fs::rename(e.path(), out / name, move);
  }
  fs::remove_all(old, ec);
}

void refuse_outputs_over_inputs(const std::string& out_dir, const std::vector<std::string>& output_names,
                                const std::vector<std::string>& inputs) {
  const fs::path out = resolved_out(out_dir);
  if (file_kind(out.string()) != FileKind::directory) return;
  std::vector<std::pair<FileIdentity, std::string>> replaced;  // files the output set would replace
  auto add = [&replaced](const fs::path& p) {
    if (const auto id = file_identity(p.string())) replaced.emplace_back(*id, p.string());
  };
  std::error_code ec;
  for (const auto& name : output_names)
    for (const char* sidecar : {"", "-wal", "-shm", "-journal"}) {
      const fs::path p = out / (name + sidecar);
      add(p);
      if (fs::is_directory(p, ec))
        for (const auto& e : fs::recursive_directory_iterator(p, ec)) add(e.path());
    }
  for (const auto& input : inputs) {
    const auto id = file_identity(input);
    if (!id) continue;
    for (const auto& [rid, path] : replaced)
      if (rid == *id)
        throw Error(ErrorKind::bad_config, ErrorContext{path, "", "", ""},
                    "is an input of this run (" + input +
                        "); the outputs written to " + out_dir + " would replace it: choose another --out (nothing was written)");
  }
}

}  // namespace rimline::report
