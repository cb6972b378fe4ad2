#pragma once
// Where a layer's `source` points: a GDAL connection string stays as written; a relative path is
// taken from the folder of the file that names it (the project file, or a proposal file).
#include <string>

namespace rimline::config::detail {

bool is_connection_string(const std::string& s);
std::string resolve_source(const std::string& source, const std::string& directory);

}  // namespace rimline::config::detail
