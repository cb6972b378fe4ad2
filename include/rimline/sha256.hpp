#pragma once
// SHA-256 (FIPS 180-4) of a file's bytes, so the summary names each input exactly.
#include <string>
#include <string_view>

namespace rimline {

std::string sha256_hex(std::string_view bytes);
// Throws rimline::Error(bad_input) when the file cannot be read.
std::string sha256_file_hex(const std::string& path);

}  // namespace rimline
