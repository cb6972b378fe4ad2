#pragma once
// What a path names, for refusing what cannot be read like a file (a FIFO blocks the reader
// forever, a folder reads as empty), and a file's identity, for telling whether two paths name
// one file however they are spelt (links, "..", symbolic links).
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>

namespace rimline {

enum class FileKind { missing, regular, directory, fifo, socket, character_device, block_device, other };

// Follows symbolic links; never opens the path (stat only, which does not block on a FIFO).
FileKind file_kind(const std::string& path);
// "a named pipe (FIFO)", "a folder", ... for messages.
std::string_view file_kind_text(FileKind kind);

// The device and inode of an existing path (following symbolic links); nullopt when it does not exist.
struct FileIdentity {
  std::uint64_t device = 0;
  std::uint64_t inode = 0;
  bool operator==(const FileIdentity&) const = default;
  bool operator<(const FileIdentity& o) const { return device != o.device ? device < o.device : inode < o.inode; }
};
std::optional<FileIdentity> file_identity(const std::string& path);

}  // namespace rimline
