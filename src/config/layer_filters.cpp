// The layer sources by table name and the command line's `--where TABLE=SQL` filters over them.
// A split check (README, "Past one machine") runs one project file per part with a different filter.
#include <algorithm>

#include "rimline/config/project.hpp"
#include "rimline/error.hpp"

namespace rimline::config {

std::vector<std::pair<std::string, LayerSource*>> layer_sources(Project& p) {
  return {{"pipes", &p.pipes},
          {"structures", &p.structures},
          {"catchments", &p.catchments.source},
          {"land_use", &p.catchments.land_use},
          {"force_mains", &p.force_main_layer},
          {"pump_station_points", &p.pump_station_points}};
}

void apply_where_overrides(Project& p, const std::vector<std::string>& specs) {
  auto sources = layer_sources(p);
  for (const auto& spec : specs) {
    const auto eq = spec.find('=');
    const std::string table = spec.substr(0, eq);
    std::string names;
    for (const auto& [name, src] : sources) names += (names.empty() ? "" : ", ") + name;
    if (eq == std::string::npos || table.empty())
      throw Error(ErrorKind::bad_config, "--where needs TABLE=SQL (TABLE one of " + names + "), not '" + spec + "'");
    const auto it = std::find_if(sources.begin(), sources.end(), [&](const auto& s) { return s.first == table; });
    if (it == sources.end())
      throw Error(ErrorKind::bad_config, "--where " + spec + ": no layer table \"" + table + "\" (one of " + names + ")");
    if (it->second->source.empty())
      throw Error(ErrorKind::bad_config, ErrorContext{p.file, "", "", ""},
                  "--where " + spec + ": the project reads no " + table + " layer (no [" + table + "] source)");
    it->second->where = spec.substr(eq + 1);
    it->second->where_origin = p.file + " (--where)";
  }
}

}  // namespace rimline::config
