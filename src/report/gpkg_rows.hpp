#pragma once
// The rows of a GeoPackage feature table that GDAL created (schema, contents and geometry
// column entries) but left empty, appended through one SQLite prepared statement. At 10^6
// pipes and structures GDAL's per-feature path (an OGRFeature per row, its field lookups and
// SQLite's per-call locking) was most of results.gpkg's time (bench/RESULTS.md).
//
// The geometry is written as the GeoPackage binary (OGC 12-128r15, clause 2.1.3): "GP", version 0,
// flags (little-endian; an [minx, maxx, miny, maxy] envelope for lines, none for points), the
// srs_id, then ISO WKB; the bytes GDAL writes for the same 2-D point or line string.
#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

#include "report/gpkg_rtree.hpp"
#include "report/sqlite_db.hpp"

namespace rimline::report {

class GpkgRows {
 public:
  // `columns`: the attribute columns bound by index (0-based, in this order); fid is assigned by
  // SQLite (1, 2, ... as GDAL does), the geometry column is `geometry_column`.
  GpkgRows(SqliteDb& db, std::string table, const std::string& geometry_column, std::vector<std::string> columns);

  int column(std::string_view name) const;  // index in `columns`; throws for an unknown name

  void text(int column, std::string_view value);
  void real(int column, double value);  // NaN: NULL
  void integer(int column, std::int64_t value);
  void point(double x, double y);
  void line(const std::vector<double>& xy);  // x0 y0 x1 y1 ...; fewer than two points: no geometry
  void add();  // writes the row (columns not set are NULL) and starts the next

  // Restores what GDAL keeps about the table: its feature count (gpkg_ogr_contents, whose
  // per-row triggers are lifted while the rows go in) and its extent in gpkg_contents. A table
  // given no rows is left as GDAL wrote it.
  void finish();

  void expect_rows(std::size_t n) { envelopes_.reserve(n); }  // no doubling copies of the envelopes
  SpatialIndexRequest index_request() &&;  // envelopes of the rows with a geometry
  std::int64_t rows() const { return rows_; }

 private:
  SqliteDb& db_;
  std::string table_, geometry_column_;
  std::vector<std::string> columns_;
  SqliteStmt insert_;
  std::int32_t srs_id_ = 0;
  std::vector<unsigned char> blob_;
  bool has_geometry_ = false;
  Envelope box_;
  std::vector<Envelope> envelopes_;
  Envelope extent_{0, 0, 0, 0, 0};
  std::int64_t rows_ = 0;
  std::vector<std::string> lifted_triggers_;  // SQL to re-create
};

}  // namespace rimline::report
