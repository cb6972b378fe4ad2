// Every key the project-file parser reads, as dotted patterns. The parser refuses to look up a key
// that is not listed here (a rimline defect, caught by the tests), and docs/project-file.md lists
// exactly these keys (tests/unit/config/project_keys_test.cpp), so the user's reference, this table
// and the parser stay in step. `*` stands for a name the user chooses (a material, a feature id, a
// return period), `[]` for an entry of an array of tables.
#include <algorithm>

#include "config/toml_section.hpp"
#include "rimline/config/project.hpp"
#include "rimline/config/proposal.hpp"
#include "rimline/error.hpp"

namespace rimline::config {

const std::vector<std::string>& project_key_table() {
  static const std::vector<std::string> keys = [] {
    std::vector<std::string> k{
        "project", "project.name", "project.units", "project.crs", "project.vertical_datum",
        // pipes
        "pipes", "pipes.source", "pipes.layer", "pipes.open_options", "pipes.where", "pipes.snap_tolerance", "pipes.shape_from_height",
        "pipes.force_main_values", "pipes.flow_direction", "pipes.fields", "pipes.fields.id", "pipes.fields.from",
        "pipes.fields.to", "pipes.fields.shape", "pipes.fields.material", "pipes.fields.manning_n", "pipes.fields.split",
        "pipes.fields.force_main", "pipes.fields.diameter", "pipes.fields.width", "pipes.fields.height",
        "pipes.fields.ks", "pipes.fields.invert_up", "pipes.fields.invert_down", "pipes.fields.invert_up_fallback",
        "pipes.fields.invert_down_fallback", "pipes.fields.length", "pipes.fields.flow", "pipes.fields.rated_pressure",
        "pipes.defaults", "pipes.defaults.shape", "pipes.defaults.manning_n", "pipes.defaults.ks",
        "pipes.defaults.diameter", "pipes.defaults.manning_n_by_material", "pipes.defaults.manning_n_by_material.*",
        "pipes.defaults.ks_by_material", "pipes.defaults.ks_by_material.*", "pipes.shapes", "pipes.shapes.circular",
        "pipes.shapes.box", "pipes.shapes.egg", "pipes.section_tables", "pipes.section_tables.*",
        "pipes.section_tables.*.codes", "pipes.section_tables.*.depth", "pipes.section_tables.*.width",
        "pipes.unknown_shape",
        // structures
        "structures", "structures.source", "structures.layer", "structures.open_options", "structures.where", "structures.fields",
        "structures.fields.id", "structures.fields.type", "structures.fields.loss_k", "structures.fields.population",
        "structures.fields.rim", "structures.fields.invert", "structures.fields.diameter",
        "structures.fields.tailwater", "structures.fields.inflow", "structures.types", "structures.types.manhole",
        "structures.types.inlet", "structures.types.junction", "structures.types.outfall",
        "structures.types.pump_station", "structures.defaults", "structures.defaults.diameter",
        "structures.defaults.loss_k",
        // outfalls and ground
        "outfalls", "outfalls.ids", "outfalls.field", "outfalls.values", "outfalls.tailwater", "outfalls.tailwater.*",
        "ground", "ground.source", "ground.band", "ground.unit", "ground.offset", "ground.fill_rims",
        "ground.compare_rims", "ground.rim_tolerance",
        // flows, tailwater
        "flows", "flows.mode", "flows.split", "flows.default_inflow", "flows.shares", "flows.shares.*",
        "network_solve", "network_solve.components", "network_solve.max_iterations",
        "network_solve.design_flow_iterations", "tailwater", "tailwater.mode", "tailwater.levels",
        // catchments
        "catchments", "catchments.source", "catchments.layer", "catchments.open_options", "catchments.where", "catchments.outlet_search",
        "catchments.allow_left_out", "catchments.fields", "catchments.fields.id", "catchments.fields.structure",
        "catchments.fields.runoff_c", "catchments.fields.population", "catchments.fields.inlet_time",
        "catchments.defaults", "catchments.defaults.runoff_c", "catchments.defaults.inlet_time", "land_use",
        "land_use.source", "land_use.layer", "land_use.open_options", "land_use.where", "land_use.runoff_c", "rational",
        "rational.return_period", "rational.travel_velocity", "rational.idf", "rational.idf.*", "rational.idf.*.a",
        "rational.idf.*.b", "rational.idf.*.c", "rational.idf.*.intensity_unit", "rational.idf.*.durations",
        "rational.idf.*.intensities", "sanitary", "sanitary.per_capita", "sanitary.peaking", "sanitary.peaking_factor",
        "sanitary.infiltration_per_length", "sanitary.infiltration_per_area",
        // methods, plausibility, criteria
        "methods", "methods.friction", "methods.structure_loss", "methods.benching", "methods.water_temperature",
        "methods.structure_energy", "methods.structures", "methods.structures.*", "methods.structures.*.structure_energy",
        "methods.k_by_type", "methods.k_by_type.*", "plausibility", "plausibility.invert_min",
        "plausibility.invert_max", "plausibility.diameter_min", "plausibility.diameter_max",
        "plausibility.length_tolerance", "plausibility.manning_n_min", "plausibility.manning_n_max",
        "plausibility.ks_max", "plausibility.level_tolerance", "plausibility.invert_step_max", "criteria",
        "criteria.freeboard", "criteria.velocity_min", "criteria.velocity_max", "criteria.capacity_ratio_max",
        "criteria.cover_min", "criteria.velocity_min_basis", "criteria.structures", "criteria.structures.*", "criteria.structures.*.freeboard",
        "criteria.conduits", "criteria.conduits.*", "criteria.conduits.*.velocity_min", "criteria.conduits.*.velocity_min_basis",
        "criteria.conduits.*.velocity_max", "criteria.conduits.*.capacity_ratio_max", "criteria.conduits.*.cover_min",
        // pump stations and force mains
        "pump_stations", "pump_stations[].id", "pump_stations[].pump_on", "pump_stations[].pump_off",
        "pump_stations[].duty_pumps", "pump_stations[].curve", "pump_stations[].curve_table",
        "pump_stations[].curve_table.source", "pump_stations[].curve_table.flow_unit",
        "pump_stations[].curve_table.head_unit", "pump_stations[].discharge", "pump_stations[].discharge_level",
        "pump_stations[].fittings", "pump_stations[].fittings[].k", "pump_stations[].fittings[].count",
        "pump_stations[].k_total", "force_mains", "force_mains.source", "force_mains.layer", "force_mains.open_options", "force_mains.where",
        "force_mains.dem", "force_mains.dem_unit", "force_mains.cover", "force_mains.spacing",
        "force_mains.pressure_min", "force_mains.velocity_min", "force_mains.velocity_max", "force_mains.friction",
        "force_mains.hazen_c", "pump_curves", "pump_curves.*", "pump_station_points", "pump_station_points.source",
        "pump_station_points.layer", "pump_station_points.open_options", "pump_station_points.where", "pump_station_points.fields",
        "pump_station_points.fields.id", "pump_station_points.fields.duty_pumps",
        "pump_station_points.fields.discharge", "pump_station_points.fields.curve",
        "pump_station_points.fields.fittings_k", "pump_station_points.fields.pump_on",
        "pump_station_points.fields.pump_off",
        // development connections: the project's [comparison] and [headroom], and the proposal file
        "comparison", "comparison.level_tolerance", "comparison.velocity_tolerance", "comparison.ratio_tolerance",
        "comparison.ignore_codes", "headroom", "headroom.structures", "headroom.existing", "headroom.precision",
        "headroom.relative_precision", "headroom.limit", "proposal", "proposal.name", "proposal.inflows",
        "proposal.inflows[].structure", "proposal.inflows[].flow", "proposal.pipes", "proposal.pipes[].id",
        "proposal.pipes[].diameter", "proposal.pipes[].width", "proposal.pipes[].height", "proposal.pipes[].manning_n",
        "proposal.pipes[].invert_up", "proposal.pipes[].invert_down", "proposal.tailwater", "proposal.tailwater.mode",
        "proposal.tailwater.levels", "proposal.new_pipes", "proposal.new_pipes.source",
        "proposal.new_pipes.layer", "proposal.new_pipes.open_options", "proposal.new_pipes.where",
        "proposal.new_structures", "proposal.new_structures.source", "proposal.new_structures.layer",
        "proposal.new_structures.open_options", "proposal.new_structures.where"};
    std::sort(k.begin(), k.end());
    return k;
  }();
  return keys;
}

std::vector<std::string> project_keys_set(const std::string& toml_text, const std::string& path_for_messages) {
  std::vector<std::string> keys;
  {
    detail::KeyCollector collector(keys);
    // A proposal file (its one table is [proposal]) is read by its own parser.
    if (toml_text.rfind("[proposal]", 0) == 0) (void)parse_proposal(toml_text, path_for_messages);
    else (void)parse_project(toml_text, path_for_messages);
  }
  std::sort(keys.begin(), keys.end());
  return keys;
}

namespace detail {

void require_in_key_table(const std::string& pattern) {
  if (pattern.rfind(unchecked_pattern, 0) == 0) return;
  const auto& keys = project_key_table();
  if (!std::binary_search(keys.begin(), keys.end(), pattern))
    throw Error(ErrorKind::internal, "the project-file parser reads key \"" + pattern +
                                         "\", which src/config/project_keys.cpp and docs/project-file.md do not list");
}

}  // namespace detail
}  // namespace rimline::config
