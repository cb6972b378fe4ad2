#pragma once
// The project file's [[pump_stations]] and [force_mains] tables. Private to src/config.
#include "config/toml_section.hpp"

namespace rimline::config::detail {

void read_force_main_settings(TomlSection s, Project& p);
// `array` is the root's pump_stations node (null when absent).
void read_pump_stations(const toml::node* array, Project& p);
// [pump_curves] (first: stations may name a curve) and [pump_station_points].
void read_pump_curves(TomlSection s, Project& p);
void read_pump_station_points(TomlSection s, Project& p);

}  // namespace rimline::config::detail
