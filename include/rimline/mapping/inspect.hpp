#pragma once
// Looking inside a GIS source before writing a project file (the `fields` command): its layers,
// geometry, CRS and fields with value ranges, a proposed mapping of fields to rimline's roles
// (from names and value ranges), and a starter project file. Plain data; nothing is printed.
#include <cstddef>
#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "rimline/units.hpp"

namespace rimline::mapping {

struct FieldSummary {
  std::string name;
  std::string type;             // OGR field type: "Integer", "Integer64", "Real", "String", "DateTime", ...
  std::size_t null_count = 0;   // null, unset or blank
  std::size_t value_count = 0;  // the others
  std::optional<double> min;    // numeric fields, and text fields whose every value is a number
  std::optional<double> max;
  std::optional<double> median;           // of the first 10,000 numeric values
  std::optional<double> median_positive;  // of the first 10,000 values > 0
  std::optional<double> zero_fraction;    // share of numeric values that are exactly 0
  std::vector<std::string> samples;       // up to 3 distinct values, in reading order
  std::optional<bool> unique;             // tracked for id-like names only: every non-null value distinct
  // Lines only: median of value / plan length of the feature's line [m], a hint at the length unit.
  std::optional<double> median_ratio_to_line_length;
  bool numeric() const { return min.has_value(); }
};

struct LayerSummary {
  std::string name;
  std::string declared_geometry;                       // the layer's declared type, e.g. "Line String"
  std::map<std::string, std::size_t> geometry_counts;  // observed: "LINESTRING" -> 2250, "(none)" -> 0 ...
  std::string crs_name;                                // "" when the layer has no CRS
  std::string crs_id;                                  // "EPSG:4326", or "" when it has no code
  bool crs_geographic = false;
  std::string crs_linear_unit;  // "metre", "US survey foot", ... (projected only)
  double crs_metres_per_unit = 1.0;
  std::int64_t feature_count = 0;
  std::optional<double> min_x, min_y, max_x, max_y;  // extent in the layer's CRS
  std::vector<FieldSummary> fields;
  bool lines() const;   // mostly (Multi)LineStrings
  bool points() const;  // mostly Points
};

struct SourceSummary {
  std::string source;  // as opened (passwords masked)
  std::string driver;  // GDAL driver short name, e.g. "GPKG"
  std::vector<LayerSummary> layers;
};

// Opens the source read-only and reads every feature once. Throws Error(bad_input) when the
// source cannot be opened.
SourceSummary inspect_source(const std::string& source, const std::vector<std::string>& open_options = {});

enum class LayerKind { pipes, structures, other };

// One proposed field for a role ("diameter", "invert_up", ...), with its unit and why.
struct FieldProposal {
  std::string role;
  std::string field;
  std::optional<units::Unit> unit;  // for roles with a dimension
  std::string reason;               // one sentence, e.g. "name; median 375 looks like millimetres"
};

struct MappingProposal {
  LayerKind kind = LayerKind::other;
  std::vector<FieldProposal> fields;  // in the order the project file lists the roles
  bool shape_from_height = false;     // width + height fields, height 0 for most features
  const FieldProposal* find(const std::string& role) const;
};

MappingProposal propose_mapping(const LayerSummary& layer);

// A starter project file (TOML) for the user to edit: sources, the proposed mappings with their
// reasons as comments, and defaults to review. It parses with parse_project as written.
struct StarterLayer {
  std::string source;                   // as the project file should say it (relative to the project)
  const LayerSummary* layer = nullptr;  // null: not present
};
std::string starter_project_toml(const StarterLayer& pipes, const StarterLayer& structures = {});

}  // namespace rimline::mapping
