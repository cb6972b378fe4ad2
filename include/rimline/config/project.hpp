#pragma once
// The project file (TOML): where the layers are, how the export's own field names map to
// rimline's roles and in which units, the boundary conditions, methods and criteria.
// Every quantity is held here in SI; the conversion happens in the parser, once.
//
// The user's reference to every key (unit, default, example, the findings it can raise) is
// docs/project-file.md; src/config/project_keys.cpp holds the same keys as the parser's table.
// Schema in brief (all paths relative to the project file; quantities are strings "<number> <unit>"):
//   [project]   name, units = "si"|"us" (report units), crs = "EPSG:xxxx" (only when a source has none),
//               vertical_datum = "..." (the datum of every level in the inputs, e.g. the agency's survey
//               datum; stated wherever the outputs give levels; not converted)
//   [pipes]     source, layer, snap_tolerance = "0.5 m",
//               open_options = ["X_POSSIBLE_NAMES=X"]  (GDAL open options, e.g. for CSV; any layer source)
//               shape_from_height = true   (no shape field: a feature whose mapped height is > 0 is a box
//                                           width x height, else circular with the diameter field or,
//                                           when no diameter field is mapped, the width field)
//               force_main_values = ["RM"] (values of fields.force_main that mark a pressure main)
//               flow_direction = "from_to" | "inverts" (with from/to fields: connect by them, but let the
//                                           inverts decide which way each pipe flows)
//   [pipes.fields]  id, from, to, shape, material, manning_n, split, force_main   -> "FIELD"
//                   diameter, width, height, ks, invert_up, invert_down, length, flow,
//                   invert_up_fallback, invert_down_fallback (used where the first are empty, e.g.
//                   design inverts behind measured ones)       -> { field = "FIELD", unit = "mm" }
//   [pipes.defaults] shape, manning_n, ks = "1.5 mm", diameter = "300 mm"
//   [pipes.defaults.manning_n_by_material] RC = 0.013; [pipes.defaults.ks_by_material] RC = "1.5 mm"
//               (a pipe's n / ks: its field, else its material's row, else the default; each default
//                use is counted in ReadResult::defaults_used)
//   [pipes.shapes]   circular = ["CIRC", "C"], box = ["BOX", "RECT"], egg = ["EGG", "OV"]
//                    (source values -> shape; an egg is the standard egg, height = 1.5 x width)
//   [pipes.section_tables.NAME] codes = ["HS1"], depth = [0, 0.2, ..., 1], width = [0.4, 1, ..., 0]
//                    (a closed section by its width at each depth, fractions of the pipe's height and
//                     width fields; pipes whose shape value is one of `codes` use it)
//   [pipes] unknown_shape = "leave_out" (default) | "equal_area_circle" (a shape value listed nowhere:
//                    a finding; with equal_area_circle the pipe is checked as the circle of the area of
//                    the ellipse width x height, D = sqrt(width x height))
//   [structures] source, layer; [structures.fields] id, type, loss_k, population -> "FIELD";
//                rim, invert, diameter, inflow, tailwater -> { field, unit }
//   [structures.types] outfall = ["OF"], inlet = ["CB"], manhole = ["MH"], junction = [...]
//   [structures.defaults] diameter = "1.2 m", loss_k = 0.5
//   [outfalls]  ids = ["OF-1"], field = "FIELD", values = ["OUT"] (structures taken as outfalls besides the
//               typed ones), [outfalls.tailwater] "OF-1" = "3.2 m" (a level of its own for an outfall)
//   [ground]    source = "dem.tif" (any GDAL raster), band = 1, unit = "m", offset = "0 m" (added to the
//               raster's values), fill_rims = true, compare_rims = true, rim_tolerance = "0.5 m"
//   [flows]     mode = "pipe_field" | "structure_inflows" | "rational" | "sanitary",
//               split = "hydraulic" (default: the network solve splits diversions and loops by the levels)
//                       | "capacity" | "field" (pipes.fields.split) | "fixed" ([flows.shares]): a rule at
//                       every diversion, loops cut, every component marched (the behaviour before the solve),
//               default_inflow = "5 L/s" (structures without an inflow value)
//   [flows.shares] "D-05" = 0.3, "D-06" = 0.7   (split = "fixed": each listed pipe's share of the flow
//               leaving its upstream structure; a diversion's shares are normalised to sum to 1)
//   [network_solve] components = "non_tree" (default: components with a loop, a diversion or more than one
//               outlet) | "all" (trees too, to compare with the march), max_iterations = 50 (Newton steps
//               per piece of a component), design_flow_iterations = 20 (rounds of design flows and solve)
//   [catchments] source, layer, outlet_search = "30 m" (rational and sanitary modes: polygons, each draining
//               to one structure; area from the geometry in the run CRS), allow_left_out = false (a
//               catchment that cannot contribute stops the run unless this is true)
//   [catchments.fields] id, structure, runoff_c, population -> "FIELD"; inlet_time -> { field, unit = "min" }
//   [catchments.defaults] runoff_c = 0.5, inlet_time = "10 min"
//   [land_use]  source, layer, runoff_c = "FIELD" (optional: C of each catchment = the area-weighted C of the
//               land-use polygons it overlaps; the uncovered part takes the catchment's own / default C)
//   [rational]  return_period = "10yr" (a key of [rational.idf]; may be left out when there is one),
//               travel_velocity = "normal_depth" | "full_flow"
//   [rational.idf.10yr] a = 3330, b = "19 min", c = 1.0, intensity_unit = "mm/h"   (i = a / (t + b)^c, t in min)
//                   or durations = ["5 min", "10 min", ...], intensities = ["180 mm/h", ...] (log-log interpolation)
//   [sanitary]  per_capita = "300 L/d", peaking = "harmon" or peaking_factor = 2.5, infiltration_per_length =
//               "0.1 L/s/km", infiltration_per_area = "0.2 L/s/ha" (population from catchments.fields.population
//               and / or structures.fields.population)
//   [tailwater] mode = "fixed" | "free" | "higher", levels = ["12.4 m", "13.0 m"]
//   [methods]   friction = "manning" | "darcy_weisbach", structure_loss = "constant_k" | "bend" | "hec22",
//               water_temperature = "15 C" (kinematic viscosity for Darcy-Weisbach), benching = "flat"|"half"|"full",
//               structure_energy = "whole_loss" (K V_o^2/2g is the whole loss across a structure; default)
//                                | "still_pool" (the arriving pipes' velocity head is lost too; not with hec22)
//   [methods.k_by_type] manhole = 0.5, inlet = 0.5, junction = 0.6
//   [methods.structures."T-04"] structure_energy = "still_pool"   (per structure id)
//   [plausibility] invert_min = "-500 m", invert_max = "900 m" (inverts and rims outside are sentinels),
//               diameter_min = "30 mm", diameter_max = "10 m", length_tolerance = 0.2 (mapped vs geometry),
//               manning_n_min = 0.008, manning_n_max = 0.05, ks_max = "0.1 m" (fields and project defaults),
//               level_tolerance = "0.1 m" (pipe inverts against their structures' invert and rim),
//               invert_step_max = "3 m" (invert step between the pipes at a structure)
//   [criteria]  freeboard = "0.3 m", velocity_min = "0.9 m/s", velocity_max = "4.6 m/s" (or "off"),
//               velocity_min_basis = "normal_depth" (design flow at normal depth; default) | "full_flow"
//               (flowing full at the pipe's slope), capacity_ratio_max = 1.0, cover_min = "0.6 m"
//   [criteria.structures."T-04"] freeboard = "0.5 m"          (per structure id)
//   [criteria.conduits."D-05"]   velocity_min = "0.6 m/s", velocity_min_basis, velocity_max, capacity_ratio_max, cover_min
//   [comparison] level_tolerance = "3 mm", velocity_tolerance = "0.01 m/s", ratio_tolerance = 0.01,
//               ignore_codes = ["SURCHARGED"]   (a proposal against the existing network; headroom)
//   [headroom]  structures = ["T-07"], existing = "no_worse" | "none", precision = "0.1 L/s",
//               relative_precision = 0.01, limit = "2 m3/s"   (connection headroom, `check --headroom`)
//   [[pump_stations]]  one per pump station (parsed in src/config/project_force_mains.cpp):
//               id = "WW-1" (the wet-well structure; the force main leaves it),
//               pump_on = "14.2 m", pump_off = "12.8 m" (wet-well levels, datum of the inverts),
//               duty_pumps = 2 (identical pumps in parallel, standby excluded),
//               curve = [["0 L/s", "32 m"], ["40 L/s", "27 m"], ...] (one pump, head falling with flow)
//                 or curve_table = { source = "pump.csv", flow_unit = "L/s", head_unit = "m" } (two
//                 numeric columns flow,head; a first line that is not numeric is a header),
//               discharge = "T-12" (receiving structure; default: where the force-main chain ends),
//               discharge_level = "9.5 m" (a fixed discharge HGL instead of the gravity march's level),
//               fittings = [{ k = 0.5, count = 4 }, ...] or k_total = 3.2 (exit loss K = 1 is added)
//   [force_mains] source, layer, open_options (optional: a line layer of force mains read with the
//               [pipes.fields] mapping, every feature a force main, besides those flagged in the pipe layer),
//               dem = "ground.tif", dem_unit = "m" (ground raster for mains without vertex Z),
//               cover = "1.2 m" (ground to crown), spacing = "10 m" (DEM samples along the line),
//               pressure_min = "0 m" (sub-atmospheric limit, pressure head), velocity_min = "0.6 m/s",
//               velocity_max = "2.5 m/s", friction = "hazen_williams" | "darcy_weisbach", hazen_c = 120
//   [pump_curves] NAME = [["0 L/s", "32 m"], ...]   (named curves; a station's curve = "NAME" uses one)
//   [pump_station_points] source, layer, open_options: pump stations as a point layer, besides
//               [[pump_stations]]; [pump_station_points.fields] id (wet-well structure id), curve (a
//               [pump_curves] name), duty_pumps, discharge, fittings_k -> "FIELD";
//               pump_on, pump_off -> { field, unit }. A feature with a data problem is a finding
//               (layer pump_stations) and is left out; the rest are checked.
//   pipes.fields.rated_pressure = { field = "CLASS_KPA", unit = "kPa" }  (kPa, psi, bar, m_head, ft_head)
//   Vertex Z of a force main's line is the pipe invert at that vertex, in the CRS's vertical unit.
#include <map>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "rimline/config/connection_settings.hpp"
#include "rimline/hydraulics/friction.hpp"
#include "rimline/hydraulics/losses.hpp"
#include "rimline/hydraulics/section.hpp"
#include "rimline/model/catchment.hpp"
#include "rimline/model/pump_station.hpp"
#include "rimline/units.hpp"

namespace rimline::config {

// A mapped source field and the unit its values are in.
struct FieldRef {
  std::string field;
  units::Unit unit = units::Unit::one;
  bool mapped() const { return !field.empty(); }
};

struct LayerSource {
  std::string source;  // path (resolved against the project file) or a GDAL connection string
  std::string layer;   // empty: the only / first layer
  std::vector<std::string> open_options;  // GDAL open options "KEY=VALUE" (CSV X/Y columns, ...)
  // An attribute filter (`where = "..."`, or `--where TABLE=SQL`): only the features it selects are
  // read (OGRLayer::SetAttributeFilter; a database driver runs it as SQL). Empty: every feature.
  std::string where;
  std::string where_origin;  // where the filter was written (the project file, or "--where"), for messages
};

struct PipeFields {
  std::string id, from, to, shape, material, manning_n, split, force_main;
  FieldRef diameter, width, height, ks, invert_up, invert_down, length, flow;
  FieldRef invert_up_fallback, invert_down_fallback;  // read where invert_up / invert_down are empty
  FieldRef rated_pressure;  // force mains: pipe class pressure (kPa, psi, bar, m_head, ft_head)
};

// [pump_station_points.fields]: a point layer of pump stations (one per wet well).
struct PumpStationFields {
  std::string id, duty_pumps, discharge, curve, fittings_k;  // curve: names a [pump_curves] entry
  FieldRef pump_on, pump_off;
};

struct PipeDefaults {
  hydraulics::Shape shape = hydraulics::Shape::circular;
  std::optional<double> manning_n;
  std::optional<double> ks_m;
  std::optional<double> diameter_m;
  std::map<std::string, double> manning_n_by_material;
  std::map<std::string, double> ks_m_by_material;
};

struct StructureFields {
  std::string id, type, loss_k;
  std::string population;  // persons served at the structure (flows mode "sanitary")
  FieldRef rim, invert, diameter, inflow, tailwater;
};

struct StructureDefaults {
  double diameter_m = 1.2;
  std::optional<double> loss_k;
};

enum class FlowMode { pipe_field, structure_inflows, rational, sanitary };

struct CatchmentFields {
  std::string id, structure, runoff_c, population;
  FieldRef inlet_time;
};

// [catchments] and [land_use]; source empty when the project has none.
struct CatchmentSettings {
  LayerSource source;
  CatchmentFields fields;
  std::optional<double> default_runoff_c;
  double default_inlet_time_s = 600.0;  // 10 min: common practice, no source (agency manuals use 5-15 min)
  double outlet_search_m = 30.0;        // nearest structure accepted within this of the polygon
  LayerSource land_use;
  std::string land_use_runoff_c;        // field of the land-use layer
  // A catchment that cannot contribute (no usable polygon, no C in rational mode, no outlet) stops
  // a design-flow run unless this is set; then each is a finding and the run goes on without it.
  bool allow_left_out = false;
};

struct RationalSettings {
  model::IdfCurve idf;
  bool full_flow_velocity = false;  // travel time from full-flow rather than normal-depth velocity
};

struct SanitarySettings {
  double per_capita_m3_s = 0.0;
  std::optional<double> peaking_constant;  // unset: Harmon
  std::optional<double> infiltration_per_length_m3_s_m;
  std::optional<double> infiltration_per_area_m3_s_m2;
};
enum class SplitRule { hydraulic, capacity, field, fixed };

// [network_solve]: the steady solve of components that are not simple trees (solve/network_solve.hpp).
struct NetworkSolveSettings {
  bool all_components = false;      // also trees (they agree with the march to < 1 mm)
  int max_iterations = 50;          // Newton steps per piece
  int design_flow_iterations = 20;  // rounds of design flows (by the solved split) and solve
};
enum class TailwaterMode { fixed, free, higher };

// Limits beyond which a source value is treated as a data error rather than used.
struct Plausibility {
  double invert_min_m = -500.0;   // below any inhabited land (Dead Sea shore ~ -430 m); common practice, no source
  double invert_max_m = 900.0;    // catches 999 / 999.5 no-data sentinels; raise it for high-altitude cities
  double diameter_min_m = 0.03;   // smaller than any sewer or drain main; common practice, no source
  double diameter_max_m = 10.0;   // larger than any sewer tunnel bore; common practice, no source
  double length_tolerance = 0.2;  // mapped length accepted within +-20 % of the geometry length
  // Manning n outside this range is a data error: smooth plastics ~0.009, rough brick / corrugated
  // metal ~0.025-0.03 (Chow, Open-Channel Hydraulics, 1959, Table 5-6, from memory); 0.05 leaves room.
  double manning_n_min = 0.008;
  double manning_n_max = 0.05;
  double ks_max_m = 0.1;          // equivalent sand roughness beyond any pipe wall; common practice, no source
  // A pipe invert this far below its structure's invert, or above its rim, is a data problem (survey
  // and digitising slack of levels; common practice, no source).
  double level_tolerance_m = 0.1;
  // A step between an arriving pipe's outlet invert and the leaving pipe's inlet invert beyond this is
  // implausible (drop structures rarely exceed a few metres; common practice, no source).
  double invert_step_max_m = 3.0;
};

enum class FlowDirection { from_to, inverts };

// [outfalls]: structures taken as outfalls when the export does not type them, and levels of their own.
struct OutfallSettings {
  std::vector<std::string> ids;             // structure ids (of the layer, or node ids of a pipes-only export)
  std::string field;                        // a structures field ...
  std::vector<std::string> values;          // ... whose values mark an outfall
  std::map<std::string, double> tailwater_m;  // outfall id -> its tailwater level
};

// [ground]: a ground raster (DEM) for rims that the export lacks, and a check of those it has.
struct GroundSettings {
  std::string source;            // empty: none
  int band = 1;
  double metres_per_unit = 1.0;  // the raster's vertical unit
  double offset_m = 0.0;         // added to every raster value (datum shift), after the unit
  bool fill_rims = true;         // missing rims from the ground level at the structure
  bool compare_rims = true;      // recorded rims against the ground
  double rim_tolerance_m = 0.5;  // a recorded rim this far from the ground is a finding; common practice, no source
};

// The velocity the minimum-velocity (self-cleansing) rule looks at: the design flow at normal depth
// in the pipe itself, or the pipe flowing full at its slope.
enum class VelocityMinBasis { normal_depth, full_flow };

struct Criteria {
  double freeboard_m = 0.3;          // common practice, no source (agency manuals range 0 - 0.3 m)
  double velocity_min_m_s = 0.9;     // storm: TxDOT Hydraulic Design Manual (2016 revision), 3 ft/s
  VelocityMinBasis velocity_min_basis = VelocityMinBasis::normal_depth;
  std::optional<double> velocity_max_m_s = 4.6;  // erosion protection ~15 ft/s (Ten States Standards, from memory)
  double capacity_ratio_max = 1.0;   // Q/Qfull; common practice, no source
  std::optional<double> cover_min_m; // off unless set
};

// Limits for one feature that differ from the run's (e.g. a stricter freeboard at one inlet).
struct CriteriaOverride {
  std::optional<double> freeboard_m;
  std::optional<double> velocity_min_m_s;
  std::optional<VelocityMinBasis> velocity_min_basis;
  std::optional<double> velocity_max_m_s;
  std::optional<double> capacity_ratio_max;
  std::optional<double> cover_min_m;
};

struct Methods {
  hydraulics::FrictionLaw friction = hydraulics::FrictionLaw::manning;
  hydraulics::StructureLossMethod structure_loss = hydraulics::StructureLossMethod::constant_k;
  hydraulics::Benching benching = hydraulics::Benching::flat;
  // Water temperature for the kinematic viscosity of Darcy-Weisbach (Reynolds number); 15 degC is a
  // common design figure for sewage and storm water (common practice, no source).
  double water_temperature_c = 15.0;
  std::map<std::string, double> k_by_type;  // structure kind name -> K
  // How a structure's loss is booked against the pipes arriving there (hydraulics/losses.hpp),
  // for the run and per structure id ([methods.structures."ID"] structure_energy).
  hydraulics::StructureEnergy structure_energy = hydraulics::StructureEnergy::whole_loss;
  std::map<std::string, hydraulics::StructureEnergy> structure_energy_by_id;
};

struct Project {
  std::string file;        // the project file path as given
  std::string directory;   // its directory, for relative sources
  std::string name;
  units::System report_units = units::System::si;
  std::string crs_override;
  std::string vertical_datum;  // [project] vertical_datum, as written; "" when not stated
  LayerSource pipes;
  LayerSource structures;  // source empty: structures derived from pipe ends
  double snap_tolerance_m = 0.5;
  PipeFields pipe_fields;
  PipeDefaults pipe_defaults;
  FlowDirection flow_direction = FlowDirection::from_to;
  OutfallSettings outfalls;
  GroundSettings ground;
  std::map<std::string, hydraulics::Shape> shape_values;   // source value -> shape
  // source value -> its [pipes.section_tables.NAME] (shape_values maps the value to Shape::table)
  std::map<std::string, std::shared_ptr<const hydraulics::SectionTable>> shape_tables;
  bool unknown_shape_as_circle = false;                    // [pipes] unknown_shape = "equal_area_circle"
  bool shape_from_height = false;                          // see [pipes] shape_from_height above
  std::vector<std::string> force_main_values;              // values of pipe_fields.force_main
  StructureFields structure_fields;
  StructureDefaults structure_defaults;
  std::map<std::string, std::string> structure_type_values;  // source value -> kind name
  FlowMode flow_mode = FlowMode::pipe_field;
  SplitRule split_rule = SplitRule::hydraulic;
  std::map<std::string, double> split_shares;  // [flows.shares]: pipe id -> share (split = "fixed")
  NetworkSolveSettings network_solve;
  // Local inflow at every structure that has none (structure_inflows mode): a uniform unit load
  // for exports without design flows. The summary states it.
  std::optional<double> default_inflow_m3_s;
  CatchmentSettings catchments;  // rational / sanitary modes
  RationalSettings rational;
  SanitarySettings sanitary;
  TailwaterMode tailwater_mode = TailwaterMode::higher;
  std::vector<double> tailwater_levels_m;  // a sweep when more than one
  Methods methods;
  Plausibility plausibility;
  Criteria criteria;
  std::map<std::string, CriteriaOverride> structure_criteria;  // by structure id
  std::map<std::string, CriteriaOverride> conduit_criteria;    // by pipe id
  std::vector<model::PumpStation> pump_stations;               // [[pump_stations]]
  model::ForceMainSettings force_mains;                        // [force_mains]
  LayerSource force_main_layer;  // [force_mains] source/layer: a line layer of force mains (pipe field mapping)
  LayerSource pump_station_points;            // [pump_station_points] source/layer (empty: none)
  // A proposal's new pipes and structures (config::proposed_project sets them; empty otherwise):
  // read with the [pipes.fields] / [structures.fields] mapping and added to the network.
  LayerSource proposal_pipes, proposal_structures;
  std::string proposal_file;  // the proposal file that names them, for messages
  PumpStationFields pump_station_fields;
  std::map<std::string, std::vector<hydraulics::CurvePoint>> pump_curves;  // [pump_curves] by name
  ConnectionSettings connections;  // [comparison], [headroom]
};

// Parses and validates a project file. Unknown keys and values of the wrong type are errors. Throws rimline::Error(bad_config) naming the file,
// the key and, for unknown keys, the closest known one ("did you mean ...?").
Project load_project(const std::string& path);
Project parse_project(const std::string& toml_text, const std::string& path_for_messages);

// The project's GIS layer sources by their table name: pipes, structures, catchments, land_use,
// force_mains, pump_station_points (those without a source included).
std::vector<std::pair<std::string, LayerSource*>> layer_sources(Project& p);
// Applies command-line filters "TABLE=SQL" (`--where`), each replacing the project file's `where`
// of that table ("TABLE=" removes it), so one project file serves every part of a split check.
// Throws Error(bad_config) for text without "=", an unknown table, or a table the project does not read.
void apply_where_overrides(Project& p, const std::vector<std::string>& specs);

// Every key the parser reads, sorted, as dotted patterns ("criteria.structures.*.freeboard",
// "pump_stations[].id"); docs/project-file.md lists the same keys.
const std::vector<std::string>& project_key_table();
// The keys of project_key_table that a project text sets, parsing it as parse_project does (throws the same).
std::vector<std::string> project_keys_set(const std::string& toml_text, const std::string& path_for_messages);

// "0.3 m" -> 0.3 (SI), checked against the expected dimension. Throws bad_config.
double parse_quantity(const std::string& text, units::Dimension expected, const std::string& where);

}  // namespace rimline::config
