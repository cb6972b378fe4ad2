#include "rimline/file_kind.hpp"

#include <sys/stat.h>

namespace rimline {

FileKind file_kind(const std::string& path) {
  struct stat st {};
  if (::stat(path.c_str(), &st) != 0) return FileKind::missing;
  if (S_ISREG(st.st_mode)) return FileKind::regular;
  if (S_ISDIR(st.st_mode)) return FileKind::directory;
  if (S_ISFIFO(st.st_mode)) return FileKind::fifo;
  if (S_ISSOCK(st.st_mode)) return FileKind::socket;
  if (S_ISCHR(st.st_mode)) return FileKind::character_device;
  if (S_ISBLK(st.st_mode)) return FileKind::block_device;
  return FileKind::other;
}

std::string_view file_kind_text(FileKind kind) {
  switch (kind) {
    case FileKind::missing: return "missing";
    case FileKind::regular: return "a regular file";
    case FileKind::directory: return "a folder";
    case FileKind::fifo: return "a named pipe (FIFO)";
    case FileKind::socket: return "a socket";
    case FileKind::character_device: return "a character device";
    case FileKind::block_device: return "a block device";
    case FileKind::other: break;
  }
  return "not a regular file";
}

std::optional<FileIdentity> file_identity(const std::string& path) {
  struct stat st {};
  if (::stat(path.c_str(), &st) != 0) return std::nullopt;
  return FileIdentity{static_cast<std::uint64_t>(st.st_dev), static_cast<std::uint64_t>(st.st_ino)};
}

}  // namespace rimline
