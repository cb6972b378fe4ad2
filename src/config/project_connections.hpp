#pragma once
// The project file's [comparison] and [headroom] tables. Private to src/config.
#include "config/toml_section.hpp"

namespace rimline::config::detail {

void read_connection_settings(TomlSection comparison, TomlSection headroom, Project& p);

}  // namespace rimline::config::detail
