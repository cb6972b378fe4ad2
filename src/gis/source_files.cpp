#include "gis/source_files.hpp"

#include <stdlib.h>

#include <algorithm>
#include <cctype>
#include <cstring>
#include <filesystem>
#include <fstream>

#include "rimline/error.hpp"
#include "rimline/file_kind.hpp"
#include "rimline/sha256.hpp"
#include "rimline/signal_cleanup.hpp"

namespace rimline::gis::detail {
namespace {

namespace fs = std::filesystem;

std::string lower(std::string s) {
  std::transform(s.begin(), s.end(), s.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  return s;
}

[[noreturn]] void refuse(const std::string& source, const std::string& role, const std::string& what) {
  throw Error(ErrorKind::bad_input, ErrorContext{source, "", "", ""}, "the " + role + " source " + what);
}

void require_readable_kind(const std::string& source, const std::string& role, const fs::path& file,
                           const std::string& as) {
  const FileKind kind = file_kind(file.string());
  if (kind == FileKind::regular || kind == FileKind::directory || kind == FileKind::missing) return;
  refuse(source, role,
         (as.empty() ? "" : as + " ") + "is " + std::string(file_kind_text(kind)) +
             ", not a regular file; rimline reads GIS sources only from regular files and folders (reading it would "
             "wait for a writer forever)");
}

// The files of one file set: the entries of `dir` named `stem.<anything>` (x.shp, x.dbf, x.gpkg-wal).
std::vector<fs::path> same_stem(const fs::path& dir, const std::string& stem) {
  std::vector<fs::path> out;
  std::error_code ec;
  const std::string prefix = lower(stem) + ".";
  for (const auto& e : fs::directory_iterator(dir.empty() ? fs::path(".") : dir, ec)) {
    const std::string name = lower(e.path().filename().string());
    if (name.rfind(prefix, 0) == 0) out.push_back(e.path());
  }
  return out;
}

void require_dbf(const std::string& source, const std::string& role, const fs::path& shp) {
  for (const auto& p : same_stem(shp.parent_path(), shp.stem().string()))
    if (lower(p.extension().string()) == ".dbf" && lower(p.stem().string()) == lower(shp.stem().string())) return;
  refuse(source, role,
         "has no " + shp.stem().string() + ".dbf beside " + shp.filename().string() +
             ": a shapefile keeps its attributes in the .dbf; copy the .shp, .shx, .dbf and .prj together");
}

bool is_sqlite(const std::string& path, bool& wal_mode) {
  char header[20] = {};
  std::ifstream in(path, std::ios::binary);
  if (!in.read(header, sizeof header)) return false;
  // The database header (https://www.sqlite.org/fileformat2.html, 1.3): the magic string, and at
  // offsets 18 and 19 the file format write and read versions, 2 for WAL.
  if (std::memcmp(header, "SQLite format 3", 16) != 0) return false;
  wal_mode = header[18] == 2 || header[19] == 2;
  return true;
}

}  // namespace

void check_source_files(const std::string& source, const std::string& role) {
  const fs::path path(source);
  const FileKind kind = file_kind(source);
  if (kind == FileKind::missing) return;  // a connection string, or a missing file: GDAL says which
  require_readable_kind(source, role, path, "");
  if (kind == FileKind::directory) {
    std::error_code ec;
    for (const auto& e : fs::directory_iterator(path, ec)) {
      require_readable_kind(source, role, e.path(), "holds " + e.path().filename().string() + ", which");
      if (lower(e.path().extension().string()) == ".shp") require_dbf(source, role, e.path());
    }
    return;
  }
  for (const auto& p : same_stem(path.parent_path(), path.stem().string()))
    if (p.filename() != path.filename()) require_readable_kind(source, role, p, "file " + p.filename().string());
  if (lower(path.extension().string()) == ".shp") require_dbf(source, role, path);
}

PrivateCopy::~PrivateCopy() {
  std::error_code ec;
  fs::remove_all(folder, ec);
  release_from_cleanup(folder);
}

std::shared_ptr<PrivateCopy> private_copy_if_sqlite(const std::string& source, const std::string& role) {
  if (file_kind(source) != FileKind::regular) return nullptr;
  bool wal_mode = false;
  if (!is_sqlite(source, wal_mode)) return nullptr;
  const char* journals[] = {"-wal", "-journal"};
  bool sidecars = file_kind(source + "-shm") != FileKind::missing;
  for (const char* j : journals) sidecars = sidecars || file_kind(source + j) != FileKind::missing;
  if (!wal_mode && !sidecars) return nullptr;

  std::error_code ec;
  std::string pattern = (fs::temp_directory_path(ec) / "rimline-copy-XXXXXX").string();
  auto copy = std::make_shared<PrivateCopy>();
  auto fail = [&](const std::string& why) -> std::shared_ptr<PrivateCopy> {
    refuse(source, role,
           "is a SQLite database with a journal beside it (or in WAL mode), which SQLite would merge into it on "
           "close; it is read from a private copy, which cannot be made in " +
               fs::path(pattern).parent_path().string() + ": " + why + " (set TMPDIR to a folder with room)");
  };
  if (!::mkdtemp(pattern.data())) return fail(std::strerror(errno));
  copy->folder = pattern;
  register_for_cleanup(copy->folder);
  const fs::path name = fs::path(source).filename();
  copy->path = (fs::path(copy->folder) / name).string();
  std::vector<std::string> files = {source};
  for (const char* j : journals)
    if (file_kind(source + j) == FileKind::regular) files.push_back(source + j);
  for (const auto& f : files) {
    const fs::path to = fs::path(copy->folder) / (name.string() + f.substr(source.size()));
    fs::copy_file(f, to, fs::copy_options::overwrite_existing, ec);
    if (ec) return fail(ec.message());
    copy->read.emplace_back(f, sha256_file_hex(to.string()));  // before SQLite opens (and changes) the copy
  }
  return copy;
}

}  // namespace rimline::gis::detail
