#pragma once
// The one way an output that cannot be written is reported: a full disk is named as such, with the
// file (not 16 lines of "ERROR 1" from GDAL and then SQLite's "no such table"). Private to src/report.
#include <cerrno>
#include <cstring>
#include <string>

#include "rimline/error.hpp"

namespace rimline::report {

// Whether an errno or a library's message says the disk (or the user's quota) is full: ENOSPC,
// EDQUOT, SQLite's "database or disk is full" (SQLITE_FULL), the C library's text of ENOSPC.
inline bool means_disk_full(int err, const std::string& text) {
  return err == ENOSPC || err == EDQUOT || text.find("disk is full") != std::string::npos ||
         text.find("No space left on device") != std::string::npos ||
         text.find("Disk quota exceeded") != std::string::npos;
}

inline std::string write_failure_text(int err, const std::string& detail) {
  if (means_disk_full(err, detail)) return "the disk is full (no space left on device); free space or choose another --out";
  std::string out = "cannot be written";
  if (err != 0) out += std::string(": ") + std::strerror(err);
  if (!detail.empty()) out += ": " + detail;
  return out;
}

// Throws Error(bad_config) "FILE: the disk is full ..." or "FILE: cannot be written: ...".
[[noreturn]] inline void throw_write_failure(const std::string& file, int err, const std::string& detail) {
  throw Error(ErrorKind::bad_config, ErrorContext{file, "", "", ""}, write_failure_text(err, detail));
}

}  // namespace rimline::report
