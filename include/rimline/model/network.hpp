#pragma once
// The network as plain data, in SI, after reading and unit conversion. No I/O, no hydraulics.
#include <cstddef>
#include <cstdint>
#include <limits>
#include <optional>
#include <string>
#include <vector>

#include "rimline/hydraulics/friction.hpp"
#include "rimline/optional_double.hpp"
#include "rimline/hydraulics/section.hpp"

namespace rimline::model {

inline constexpr std::size_t no_index = std::numeric_limits<std::size_t>::max();

enum class StructureKind { manhole, inlet, junction, outfall, pump_station, derived };
std::string_view structure_kind_name(StructureKind k);

struct Point2 {
  double x = 0.0;
  double y = 0.0;
};

struct Structure {
  std::string id;                 // the source layer's own id (or the node id for derived structures)
  std::int64_t fid = -1;          // OGR feature id in the source layer; -1 for derived
  StructureKind kind = StructureKind::manhole;
  bool proposed = false;          // added by a proposal's new_structures layer (fid is of that layer)
  Point2 location;                // in the run CRS (projected, metres or feet as the CRS says -> converted to m)
  OptionalDouble rim_m;    // ground / cover level
  OptionalDouble invert_m; // sump / lowest invert
  OptionalDouble loss_k;   // structure loss coefficient from the source, if mapped
  OptionalDouble diameter_m;      // inside diameter (HEC-22 b)
  OptionalDouble inflow_m3_s;     // local inflow (flows mode "structure_inflows")
  OptionalDouble population;      // persons served here (flows mode "sanitary"), besides its catchments'
  OptionalDouble tailwater_m;     // outfall tailwater from a field
  std::string type_text;          // the source's own type value, for the report
};

struct Conduit {
  std::string id;
  std::int64_t fid = -1;
  std::string from_id;            // upstream structure id as read (or as derived by snapping)
  std::string to_id;              // downstream structure id
  std::size_t from = no_index;    // index into Network::structures (upstream end, after orientation)
  std::size_t to = no_index;      // downstream end
  hydraulics::Section section;
  hydraulics::Roughness roughness;
  OptionalDouble invert_up_m;
  OptionalDouble invert_down_m;
  double length_m = 0.0;          // mapped length field if present and plausible, else geometry length
  double geometry_length_m = 0.0; // plan length of the line
  OptionalDouble flow_m3_s;   // design flow from a field
  OptionalDouble split_fraction;  // share of a diversion's flow, if given
  Point2 up_point;                // line end at the upstream structure (after orientation)
  Point2 down_point;
  Point2 up_direction;            // unit vector of the line leaving its upstream end (flow direction)
  Point2 down_direction;          // unit vector of the line arriving at its downstream end (flow direction)
  std::vector<Point2> vertices;   // plan geometry, upstream to downstream (for drawings)
  std::vector<double> vertex_z_m; // Z of the vertices when the source has it, else empty
  bool reversed = false;          // digitised against the flow, turned by topology
  bool force_main = false;
  bool proposed = false;          // added by a proposal's new_pipes layer (fid is of that layer)
  bool usable = true;             // false when a data problem keeps it out of the march
  OptionalDouble rated_pressure_head_m;  // force mains: rated (class) pressure as head of water
};

struct Network {
  std::vector<Structure> structures;
  std::vector<Conduit> conduits;
  std::string crs_description;    // name of the run CRS, e.g. "WGS 84 / UTM zone 55S"
  std::string crs_wkt;            // WKT of the run CRS (outputs are written in the input CRS)
  std::string crs_note;           // e.g. "reprojected from EPSG:4326 to UTM zone 55S"
  double crs_metres_per_unit = 1.0;
};

// Whether a conduit takes part in the march: usable and connected at both ends.
inline bool marched(const Conduit& c) { return c.usable && c.from != no_index && c.to != no_index; }

// Index of a structure by id, or no_index. Linear; topology builds the hash map once.
std::size_t find_structure(const Network& n, const std::string& id);

}  // namespace rimline::model
