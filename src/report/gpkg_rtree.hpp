#pragma once
// A GeoPackage R-tree spatial index (the gpkg_rtree_index extension) built in one pass from
// the features' envelopes and written straight into SQLite's R-tree tables, instead of one
// R*-tree insertion per feature: at 10^6 features that insertion is most of the cost of a
// GeoPackage write (measured in bench/RESULTS.md).
#include <cstdint>
#include <string>
#include <vector>

namespace rimline::report {

struct Envelope {
  std::int64_t id = 0;  // the feature's fid
  double min_x = 0.0, max_x = 0.0, min_y = 0.0, max_y = 0.0;
};

struct SpatialIndexRequest {
  std::string table;              // feature table, already written with its features
  std::string geometry_column;    // e.g. "geom"
  std::string fid_column;         // e.g. "fid"
  std::vector<Envelope> envelopes;  // one per feature with a non-empty geometry
};

// Opens the GeoPackage at `path` (closed by every other writer), adds one index per request in
// one transaction: the R-tree virtual table, its nodes packed by sort-tile-recursive order, the
// GeoPackage triggers that keep it current under later edits, and the gpkg_extensions row.
// Throws rimline::Error naming the file and table on an SQLite failure. The requests are used
// up: each one's envelopes are released as soon as its index is written (at 10^6 pipes they are
// ~40 MB a table, and the writers' end is the run's peak of memory).
void add_gpkg_spatial_indexes(const std::string& path, std::vector<SpatialIndexRequest> requests);
// The same inside a transaction the caller holds on `db`.
class SqliteDb;
void add_gpkg_spatial_indexes(SqliteDb& db, std::vector<SpatialIndexRequest> requests);

// The node layout on its own, for tests: nodes of at most `capacity` cells, root first.
struct PackedNode {
  int depth = 0;  // 0 for a leaf
  std::vector<Envelope> cells;  // leaf: feature envelopes; inner: child node numbers as id
};
std::vector<PackedNode> pack_rtree(std::vector<Envelope> envelopes, std::size_t capacity);

}  // namespace rimline::report
