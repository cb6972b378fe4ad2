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

// The first rows of a layer, kept so that roles can be inferred from the data itself (which field's
// values another layer's field holds, which levels agree where pipes meet). At most max_rows.
struct FieldColumn {
  std::vector<double> number;       // per row; NaN: null or not a number
  std::vector<std::int32_t> text;   // per row: index into `values`; -1: null or blank
  std::vector<std::string> values;  // distinct texts as read
};

struct LayerRows {
  static constexpr std::size_t max_rows = 100000;
  std::size_t count = 0;             // rows kept
  std::vector<FieldColumn> columns;  // aligned with LayerSummary::fields
  // First and last vertex of each row's geometry (a point: both the same), in degrees of WGS 84
  // longitude / latitude when the layer has a CRS (so layers in different CRSs compare), else as
  // stored (lonlat false); NaN without geometry.
  std::vector<double> x0, y0, x1, y1;
  std::vector<double> length_m;      // plan length of a line [m]; 0 otherwise
  bool lonlat = false;
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
  LayerRows rows;
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

// One proposed field for a role ("diameter", "invert_up", ...), with its unit, the evidence and a
// confidence (0..1; confidence_word: high >= 0.8, medium >= 0.5, else low).
struct FieldProposal {
  std::string role;
  std::string field;
  std::optional<units::Unit> unit;  // for roles with a dimension
  std::string reason;               // the evidence, e.g. "values within 0.02 m of the next pipe's ..."
  double confidence = 0.0;
};
std::string confidence_word(double confidence);

// A value of a code field (shape, structure type, pressure-main flag) and what it was taken for.
struct CodeValue {
  std::string value;
  std::string meaning;  // "circular" / "box", a structure kind, "pressure"; "" when not recognised
  std::string why;
  std::size_t count = 0;  // rows with the value (of those inspected)
};

struct MappingProposal {
  LayerKind kind = LayerKind::other;
  std::vector<FieldProposal> fields;  // in the order they were inferred
  bool shape_from_height = false;     // width + height fields, height 0 for some features
  std::vector<CodeValue> shape_values;       // pipes: values of the shape field
  std::vector<CodeValue> type_values;        // structures: values of the type field
  std::vector<CodeValue> force_main_values;  // pipes: values of the pressure-main flag field
  std::vector<std::string> material_values;  // pipes: values of the material field, most frequent first
  bool direction_from_inverts = false;       // from/to is the digitising order, not the flow
  std::vector<std::string> notes;            // what else the data said (second invert pair, ...)
  std::vector<std::string> network_ends;     // structures / nodes no pipe leaves (outfall candidates)
  const FieldProposal* find(const std::string& role) const;
};

// The mapping of a pipe layer and (optional) structure layer, inferred together: links between the
// layers, levels that agree where pipes meet, magnitudes, ratios to the geometry; names second.
struct NetworkProposal {
  MappingProposal pipes, structures;
};
NetworkProposal propose_network(const LayerSummary* pipes, const LayerSummary* structures);
// One layer on its own (lines: pipes, points: structures).
MappingProposal propose_mapping(const LayerSummary& layer);

// A starter project file (TOML) for the user to edit: sources, every proposed role with its evidence
// as a comment, the shape and type values seen, a flow source, a tailwater and the criteria. It parses
// with parse_project as written; what it could not infer is marked "EDIT".
struct StarterLayer {
  std::string source;                   // as the project file should say it (relative to the project)
  const LayerSummary* layer = nullptr;  // null: not present
};
std::string starter_project_toml(const StarterLayer& pipes, const StarterLayer& structures = {});

}  // namespace rimline::mapping
