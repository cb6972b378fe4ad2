#pragma once
// The files behind a GIS source, looked at before GDAL opens them: what would block the run or
// mislead it is named instead, and a SQLite-based source that SQLite would rewrite on close is
// read from a private copy. Private to src/gis.
#include <memory>
#include <string>
#include <utility>
#include <vector>

namespace rimline::gis::detail {

// Throws Error(bad_input) for a source GDAL must not open: a named pipe, socket or device (GDAL
// blocks on a FIFO forever), a folder or shapefile set holding one, a shapefile without its .dbf
// (GDAL opens it with no fields at all). Connection strings and missing paths are left to GDAL.
void check_source_files(const std::string& source, const std::string& role);

// A copy of a SQLite database and its journal in a private temporary folder, removed (with the
// folder) when the last handle on it goes: the dataset must be closed first.
struct PrivateCopy {
  std::string folder;
  std::string path;  // the copy of the database, opened instead of the source
  // Each original file copied (the database, then its -wal or -journal) with the SHA-256 of the
  // bytes copied: what was read, whatever happens to the originals later.
  std::vector<std::pair<std::string, std::string>> read;
  PrivateCopy() = default;
  PrivateCopy(const PrivateCopy&) = delete;
  PrivateCopy& operator=(const PrivateCopy&) = delete;
  ~PrivateCopy();
};

// A GeoPackage or SpatiaLite file copied by another program while it had the database open comes
// with a -wal (or -journal, -shm), or is in WAL mode: SQLite, even read-only through GDAL, merges
// the WAL into the file on close and deletes the sidecars, rolls a hot journal back, or makes and
// removes sidecars. Such a source is copied (with its -wal / -journal) and the copy is opened, so
// nothing beside the input changes. Null for any other source. Throws Error(bad_input) when the
// copy cannot be made (a full temporary folder: TMPDIR names another).
std::shared_ptr<PrivateCopy> private_copy_if_sqlite(const std::string& source, const std::string& role);

}  // namespace rimline::gis::detail
