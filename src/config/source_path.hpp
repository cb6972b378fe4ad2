#pragma once
// Where a layer's `source` points: a GDAL connection string stays as written; a relative path is
// taken from the folder of the file that names it (the project file, or a proposal file).
#include <string>

#include "config/toml_section.hpp"
#include "rimline/config/project.hpp"

namespace rimline::config::detail {

bool is_connection_string(const std::string& s);
std::string resolve_source(const std::string& source, const std::string& directory);
// A layer's source, layer, open_options and where from its table; a missing source is an error.
LayerSource read_layer_source(TomlSection& s, const std::string& directory);

}  // namespace rimline::config::detail
