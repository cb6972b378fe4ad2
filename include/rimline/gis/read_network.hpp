#pragma once
// Reads the pipe and structure layers named in the project through GDAL/OGR into a Network
// (SI, one projected CRS), converting every value once. Per-feature data problems become
// Findings (code, the source's feature id, the field) and the feature is kept or left out
// as stated in the finding; the whole read fails only when a source cannot be used at all.
// Geometry is kept as digitised (topology orients it); a pipe whose geometry or section is
// unusable is still listed, with Conduit::usable = false, so outputs can show it. A structure
// without a usable point is left out (its finding says so).
// Codes (messages name the source field and its value as read; computed figures are q() tokens):
//   DATA_MISSING      a mapped value is null/blank: the value is unknown, or the default is used (info)
//   DATA_IMPLAUSIBLE  text or non-finite where a number belongs; inverts/rims exactly 0 or outside
//                     [plausibility] (sentinels); sizes <= 0 or outside diameter_min..max, with the unit
//                     the value looks like; n outside 0.008..0.05, ks outside 0..0.1 m; mapped length off
//                     the geometry by more than length_tolerance; negative flows; unlisted shape/type values;
//                     a structure rim below its invert (the rim is then unknown)
//   DATA_GEOMETRY     no geometry, not a line / point, zero length, multi-part with a gap (error), or
//                     multi-part merged into one line (info), a line crossing or running back over itself (warning)
//   DATA_DUPLICATE_ID an id an earlier feature of the layer already has
//   DATA_SOURCE       a message GDAL raised while reading the feature
// Severity error = the pipe is unusable (Conduit::usable = false) or the structure left out.
#include "rimline/finding.hpp"
#include "rimline/config/project.hpp"
#include "rimline/model/catchment.hpp"
#include "rimline/model/network.hpp"

namespace rimline::gis {
using namespace rimline::config;  // the readers speak the project file's vocabulary

// A value filled from the project's defaults rather than the source, counted once per kind so
// the report can say "n = 0.013 from [pipes.defaults.manning_n_by_material] RC for 779 pipes".
struct DefaultNote {
  LayerRole layer = LayerRole::conduits;
  std::string role;                      // "manning_n", "diameter", "shape", "loss_k", ...
  std::string text;                      // what was used and from where (plain text, SI figures)
  std::size_t count = 0;                 // features it was used for
  std::vector<std::string> example_ids;  // the first few feature ids (at most 5)
};

struct ReadResult {
  model::Network network;
  Findings findings;
  std::vector<std::string> input_files;  // every file read, for hashing in the summary
  // SHA-256 of the input files read through a private copy (a GeoPackage with its -wal), by path:
  // the hash of the bytes copied and read (src/gis/source_files.hpp).
  std::vector<std::pair<std::string, std::string>> read_hashes;
  std::string source_crs_wkt;            // CRS of the pipe layer as read (outputs go back to it)
  std::vector<DefaultNote> defaults_used;
  std::vector<model::Catchment> catchments;  // [catchments] polygons (src/gis/read_catchments.hpp), run CRS
};

ReadResult read_network(const Project& project);

}  // namespace rimline::gis
