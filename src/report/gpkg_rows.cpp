#include "report/gpkg_rows.hpp"

#include <algorithm>
#include <cmath>
#include <cstring>
#include <limits>

namespace rimline::report {
namespace {

void put_u32(std::vector<unsigned char>& b, std::uint32_t v) {
  for (int k = 0; k < 4; ++k) b.push_back(static_cast<unsigned char>(v >> (8 * k)));
}
void put_i32(std::vector<unsigned char>& b, std::int32_t v) { put_u32(b, static_cast<std::uint32_t>(v)); }
void put_f64(std::vector<unsigned char>& b, double v) {
  std::uint64_t u;
  std::memcpy(&u, &v, 8);
  for (int k = 0; k < 8; ++k) b.push_back(static_cast<unsigned char>(u >> (8 * k)));
}

constexpr double inf = std::numeric_limits<double>::infinity();

}  // namespace

GpkgRows::GpkgRows(SqliteDb& db, std::string table, const std::string& geometry_column, std::vector<std::string> columns)
    : db_(db), table_(std::move(table)), geometry_column_(geometry_column), columns_(std::move(columns)) {
  {
    SqliteStmt s = db_.prepare("SELECT srs_id FROM gpkg_geometry_columns WHERE table_name = ?", table_);
    sqlite3_bind_text(s.get(), 1, table_.c_str(), -1, SQLITE_TRANSIENT);
    if (sqlite3_step(s.get()) != SQLITE_ROW) db_.fail(table_, "has no geometry column entry");
    srs_id_ = sqlite3_column_int(s.get(), 0);
  }
  // GDAL's triggers add one to gpkg_ogr_contents per row: lifted here, the count set once in finish().
  {
    SqliteStmt s = db_.prepare("SELECT name, sql FROM sqlite_master WHERE type = 'trigger' AND tbl_name = ? AND "
                               "(name LIKE 'trigger_insert_feature_count_%' OR name LIKE 'trigger_delete_feature_count_%')",
                               table_);
    sqlite3_bind_text(s.get(), 1, table_.c_str(), -1, SQLITE_TRANSIENT);
    std::vector<std::string> names;
    while (sqlite3_step(s.get()) == SQLITE_ROW) {
      names.emplace_back(reinterpret_cast<const char*>(sqlite3_column_text(s.get(), 0)));
      lifted_triggers_.emplace_back(reinterpret_cast<const char*>(sqlite3_column_text(s.get(), 1)));
    }
    s.reset();
    for (const auto& n : names) db_.exec("DROP TRIGGER " + sql_quoted(n), table_);
  }
  std::string sql = "INSERT INTO " + sql_quoted(table_) + " (" + sql_quoted(geometry_column_);
  for (const auto& c : columns_) sql += ", " + sql_quoted(c);
  sql += ") VALUES (?";
  for (std::size_t k = 0; k < columns_.size(); ++k) sql += ", ?";
  insert_ = db_.prepare(sql + ")", table_);
  extent_ = Envelope{0, inf, -inf, inf, -inf};
}

int GpkgRows::column(std::string_view name) const {
  const auto it = std::find(columns_.begin(), columns_.end(), name);
  if (it == columns_.end()) db_.fail(table_, "has no column " + std::string(name));
  return static_cast<int>(it - columns_.begin());
}

void GpkgRows::text(int column, std::string_view value) {
  sqlite3_bind_text(insert_.get(), column + 2, value.data(), static_cast<int>(value.size()), SQLITE_TRANSIENT);
}

void GpkgRows::real(int column, double value) {
  if (!std::isnan(value)) sqlite3_bind_double(insert_.get(), column + 2, value);  // SQLite stores NaN as NULL too
}

void GpkgRows::integer(int column, std::int64_t value) { sqlite3_bind_int64(insert_.get(), column + 2, value); }

void GpkgRows::point(double x, double y) {
  blob_.clear();
  blob_.insert(blob_.end(), {'G', 'P', 0, 0x01});  // version 0; little-endian, no envelope
  put_i32(blob_, srs_id_);
  blob_.push_back(1);  // WKB little-endian
  put_u32(blob_, 1);   // Point
  put_f64(blob_, x);
  put_f64(blob_, y);
  box_ = Envelope{0, x, x, y, y};
  has_geometry_ = true;
}

void GpkgRows::line(const std::vector<double>& xy) {
  const std::size_t n = xy.size() / 2;
  if (n < 2) return;
  Envelope b{0, inf, -inf, inf, -inf};
  for (std::size_t k = 0; k < n; ++k) {
    b.min_x = std::min(b.min_x, xy[2 * k]), b.max_x = std::max(b.max_x, xy[2 * k]);
    b.min_y = std::min(b.min_y, xy[2 * k + 1]), b.max_y = std::max(b.max_y, xy[2 * k + 1]);
  }
  blob_.clear();
  blob_.insert(blob_.end(), {'G', 'P', 0, 0x03});  // version 0; little-endian, envelope [minx maxx miny maxy]
  put_i32(blob_, srs_id_);
  for (double v : {b.min_x, b.max_x, b.min_y, b.max_y}) put_f64(blob_, v);
  blob_.push_back(1);  // WKB little-endian
  put_u32(blob_, 2);   // LineString
  put_u32(blob_, static_cast<std::uint32_t>(n));
  for (double v : xy) put_f64(blob_, v);
  box_ = b;
  has_geometry_ = true;
}

void GpkgRows::add() {
  if (has_geometry_)
    sqlite3_bind_blob(insert_.get(), 1, blob_.data(), static_cast<int>(blob_.size()), SQLITE_STATIC);
  db_.step_reset(insert_.get(), table_);
  sqlite3_clear_bindings(insert_.get());
  ++rows_;
  if (has_geometry_) {
    box_.id = sqlite3_last_insert_rowid(db_.get());
    envelopes_.push_back(box_);
    extent_.min_x = std::min(extent_.min_x, box_.min_x), extent_.max_x = std::max(extent_.max_x, box_.max_x);
    extent_.min_y = std::min(extent_.min_y, box_.min_y), extent_.max_y = std::max(extent_.max_y, box_.max_y);
  }
  has_geometry_ = false;
}

void GpkgRows::finish() {
  insert_.reset();
  for (const auto& sql : lifted_triggers_) db_.exec(sql, table_);
  lifted_triggers_.clear();
  if (rows_ == 0) return;  // an empty table stays as GDAL left it
  SqliteStmt count = db_.prepare("UPDATE gpkg_ogr_contents SET feature_count = ? WHERE lower(table_name) = lower(?)", table_);
  sqlite3_bind_int64(count.get(), 1, rows_);
  sqlite3_bind_text(count.get(), 2, table_.c_str(), -1, SQLITE_TRANSIENT);
  db_.step_reset(count.get(), table_);
  if (envelopes_.empty()) return;
  SqliteStmt ext = db_.prepare("UPDATE gpkg_contents SET min_x = ?, min_y = ?, max_x = ?, max_y = ?, "
                               "last_change = strftime('%Y-%m-%dT%H:%M:%fZ', 'now') WHERE table_name = ?",
                               table_);
  int k = 1;
  for (double v : {extent_.min_x, extent_.min_y, extent_.max_x, extent_.max_y}) sqlite3_bind_double(ext.get(), k++, v);
  sqlite3_bind_text(ext.get(), 5, table_.c_str(), -1, SQLITE_TRANSIENT);
  db_.step_reset(ext.get(), table_);
}

SpatialIndexRequest GpkgRows::index_request() && {
  return SpatialIndexRequest{table_, geometry_column_, "fid", std::move(envelopes_)};
}

}  // namespace rimline::report
