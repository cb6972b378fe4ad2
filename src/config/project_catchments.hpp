#pragma once
// The project file's catchment sections: [catchments], [land_use], [rational], [sanitary]
// (schema in include/rimline/config/project.hpp). Private to src/config.
#include "config/toml_section.hpp"
#include "rimline/config/project.hpp"

namespace rimline::config::detail {

struct CatchmentSections {
  TomlSection catchments, land_use, rational, sanitary;
};

// Reads the sections into `p` (after [flows]: what is required depends on p.flow_mode).
// `resolve` turns a source as written into a path relative to the project file.
void read_catchment_sections(CatchmentSections s, Project& p,
                             LayerSource (*read_source)(TomlSection&, const std::string&));

}  // namespace rimline::config::detail
