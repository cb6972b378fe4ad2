#include "report/gpkg_rtree.hpp"

#include <algorithm>
#include <cmath>
#include <cstring>
#include <memory>
#include <utility>

#include "report/sqlite_db.hpp"
#include "rimline/error.hpp"

namespace rimline::report {
namespace {

// SQLite's R-tree stores coordinates as 32-bit floats; a box is rounded outwards so that it
// still holds the feature (as SQLite's own insertion does).
float down(double v) {
  float f = static_cast<float>(v);
  if (static_cast<double>(f) > v) f = std::nextafter(f, -INFINITY);
  return f;
}
float up(double v) {
  float f = static_cast<float>(v);
  if (static_cast<double>(f) < v) f = std::nextafter(f, INFINITY);
  return f;
}

double centre_x(const Envelope& e) { return 0.5 * (e.min_x + e.max_x); }
double centre_y(const Envelope& e) { return 0.5 * (e.min_y + e.max_y); }

// One level of sort-tile-recursive packing (Leutenegger, Lopez & Edgington 1997): vertical
// slices by centre x, each cut into runs of `capacity` by centre y.
std::vector<std::vector<Envelope>> pack_level(std::vector<Envelope>& items, std::size_t capacity) {
  const std::size_t nodes = (items.size() + capacity - 1) / capacity;
  const auto slices = static_cast<std::size_t>(std::ceil(std::sqrt(static_cast<double>(nodes))));
  const std::size_t per_slice = slices * capacity;
  std::sort(items.begin(), items.end(), [](const Envelope& a, const Envelope& b) {
    return centre_x(a) < centre_x(b) || (centre_x(a) == centre_x(b) && a.id < b.id);
  });
  std::vector<std::vector<Envelope>> out;
  out.reserve(nodes);
  for (std::size_t s = 0; s < items.size(); s += per_slice) {
    const auto first = items.begin() + static_cast<std::ptrdiff_t>(s);
    const auto last = items.begin() + static_cast<std::ptrdiff_t>(std::min(items.size(), s + per_slice));
    std::sort(first, last, [](const Envelope& a, const Envelope& b) {
      return centre_y(a) < centre_y(b) || (centre_y(a) == centre_y(b) && a.id < b.id);
    });
    for (auto it = first; it < last; it += static_cast<std::ptrdiff_t>(std::min<std::size_t>(capacity, last - it)))
      out.emplace_back(it, it + static_cast<std::ptrdiff_t>(std::min<std::size_t>(capacity, last - it)));
  }
  return out;
}

Envelope bounds(const std::vector<Envelope>& cells) {
  Envelope b{0, INFINITY, -INFINITY, INFINITY, -INFINITY};
  for (const auto& c : cells) {
    b.min_x = std::min(b.min_x, c.min_x), b.max_x = std::max(b.max_x, c.max_x);
    b.min_y = std::min(b.min_y, c.min_y), b.max_y = std::max(b.max_y, c.max_y);
  }
  return b;
}

void put16(unsigned char* p, unsigned v) {
  p[0] = static_cast<unsigned char>(v >> 8);
  p[1] = static_cast<unsigned char>(v);
}
void put32(unsigned char* p, float f) {
  std::uint32_t v;
  std::memcpy(&v, &f, 4);
  for (int k = 0; k < 4; ++k) p[k] = static_cast<unsigned char>(v >> (24 - 8 * k));
}
void put64(unsigned char* p, std::int64_t i) {
  const auto v = static_cast<std::uint64_t>(i);
  for (int k = 0; k < 8; ++k) p[k] = static_cast<unsigned char>(v >> (56 - 8 * k));
}

// The GeoPackage 1.2 R-tree triggers (OGC 12-128r15, Annex F.3), so that an edit made later in
// a GIS keeps the index in step with the table.
std::string triggers_sql(const std::string& t, const std::string& g, const std::string& i) {
  const std::string rt = "rtree_" + t + "_" + g;
  const std::string T = sql_quoted(t), G = sql_quoted(g), I = sql_quoted(i), R = sql_quoted(rt);
  const std::string box = "(NEW." + I + ", ST_MinX(NEW." + G + "), ST_MaxX(NEW." + G + "), ST_MinY(NEW." + G +
                          "), ST_MaxY(NEW." + G + "))";
  const std::string has = "(NEW." + G + " NOT NULL AND NOT ST_IsEmpty(NEW." + G + "))";
  const std::string lacks = "(NEW." + G + " ISNULL OR ST_IsEmpty(NEW." + G + "))";
  auto trig = [&](const std::string& name, const std::string& when, const std::string& body) {
    return "CREATE TRIGGER " + sql_quoted(rt + "_" + name) + " " + when + " BEGIN " + body + "; END;\n";
  };
  return trig("insert", "AFTER INSERT ON " + T + " WHEN " + has, "INSERT OR REPLACE INTO " + R + " VALUES " + box) +
         trig("update1", "AFTER UPDATE OF " + G + " ON " + T + " WHEN OLD." + I + " = NEW." + I + " AND " + has,
              "INSERT OR REPLACE INTO " + R + " VALUES " + box) +
         trig("update2", "AFTER UPDATE OF " + G + " ON " + T + " WHEN OLD." + I + " = NEW." + I + " AND " + lacks,
              "DELETE FROM " + R + " WHERE id = OLD." + I) +
         trig("update3", "AFTER UPDATE ON " + T + " WHEN OLD." + I + " != NEW." + I + " AND " + has,
              "DELETE FROM " + R + " WHERE id = OLD." + I + "; INSERT OR REPLACE INTO " + R + " VALUES " + box) +
         trig("update4", "AFTER UPDATE ON " + T + " WHEN OLD." + I + " != NEW." + I + " AND " + lacks,
              "DELETE FROM " + R + " WHERE id IN (OLD." + I + ", NEW." + I + ")") +
         trig("delete", "AFTER DELETE ON " + T + " WHEN OLD." + G + " NOT NULL", "DELETE FROM " + R + " WHERE id = OLD." + I);
}

// Takes the request: its envelopes go into the packer and are gone when the index is written.
void write_index(SqliteDb& db, SpatialIndexRequest rq) {
  const std::string rt = "rtree_" + rq.table + "_" + rq.geometry_column;
  db.exec("CREATE VIRTUAL TABLE " + sql_quoted(rt) + " USING rtree(id, minx, maxx, miny, maxy)", rq.table);
  // SQLite sized the root node for this file's page size; every node must have that size.
  int node_bytes = 0;
  {
    SqliteStmt s = db.prepare("SELECT length(data) FROM " + sql_quoted(rt + "_node") + " WHERE nodeno = 1", rq.table);
    if (sqlite3_step(s.get()) == SQLITE_ROW) node_bytes = sqlite3_column_int(s.get(), 0);
  }
  constexpr int cell_bytes = 8 + 4 * 4;
  if (node_bytes < 4 + 3 * cell_bytes) db.fail(rq.table, "spatial index: unexpected R-tree node size");
  const auto capacity = static_cast<std::size_t>((node_bytes - 4) / cell_bytes);
  const std::size_t features = rq.envelopes.size();
  const auto nodes = pack_rtree(std::move(rq.envelopes), capacity);  // no second copy of the envelopes

  db.exec("DELETE FROM " + sql_quoted(rt + "_node"), rq.table);
  SqliteStmt put_node = db.prepare("INSERT INTO " + sql_quoted(rt + "_node") + "(nodeno, data) VALUES (?, ?)", rq.table);
  SqliteStmt put_parent = db.prepare("INSERT INTO " + sql_quoted(rt + "_parent") + "(nodeno, parentnode) VALUES (?, ?)", rq.table);
  std::vector<unsigned char> blob(static_cast<std::size_t>(node_bytes));
  std::vector<std::pair<std::int64_t, std::int64_t>> rowid_node;  // feature fid -> leaf node number
  rowid_node.reserve(features);
  for (std::size_t k = 0; k < nodes.size(); ++k) {
    const auto nodeno = static_cast<std::int64_t>(k + 1);
    const auto& n = nodes[k];
    std::fill(blob.begin(), blob.end(), 0);
    put16(blob.data(), k == 0 ? static_cast<unsigned>(n.depth) : 0u);  // the depth is kept in the root only
    put16(blob.data() + 2, static_cast<unsigned>(n.cells.size()));
    unsigned char* p = blob.data() + 4;
    for (const auto& c : n.cells) {
      put64(p, c.id);
      put32(p + 8, down(c.min_x)), put32(p + 12, up(c.max_x)), put32(p + 16, down(c.min_y)), put32(p + 20, up(c.max_y));
      p += cell_bytes;
      if (n.depth == 0) rowid_node.emplace_back(c.id, nodeno);
      else {
        sqlite3_bind_int64(put_parent.get(), 1, c.id);
        sqlite3_bind_int64(put_parent.get(), 2, nodeno);
        db.step_reset(put_parent.get(), rq.table);
      }
    }
    sqlite3_bind_int64(put_node.get(), 1, nodeno);
    sqlite3_bind_blob(put_node.get(), 2, blob.data(), node_bytes, SQLITE_STATIC);
    db.step_reset(put_node.get(), rq.table);
  }
  std::sort(rowid_node.begin(), rowid_node.end());  // appending in key order keeps the B-tree inserts cheap
  SqliteStmt put_rowid = db.prepare("INSERT INTO " + sql_quoted(rt + "_rowid") + "(rowid, nodeno) VALUES (?, ?)", rq.table);
  for (const auto& [fid, nodeno] : rowid_node) {
    sqlite3_bind_int64(put_rowid.get(), 1, fid);
    sqlite3_bind_int64(put_rowid.get(), 2, nodeno);
    db.step_reset(put_rowid.get(), rq.table);
  }
  db.exec(triggers_sql(rq.table, rq.geometry_column, rq.fid_column), rq.table);
  db.exec("INSERT INTO gpkg_extensions (table_name, column_name, extension_name, definition, scope) VALUES (" +
              sql_literal(rq.table) + ", " + sql_literal(rq.geometry_column) +
              ", 'gpkg_rtree_index', 'http://www.geopackage.org/spec120/#extension_rtree', 'write-only')",
          rq.table);
}

}  // namespace

std::vector<PackedNode> pack_rtree(std::vector<Envelope> envelopes, std::size_t capacity) {
  if (capacity < 2) throw Error(ErrorKind::internal, "R-tree node capacity below 2");
  // Levels from the leaves up; a level's node k is referred to by its index until numbered.
  std::vector<std::vector<std::vector<Envelope>>> levels;
  levels.push_back(pack_level(envelopes, capacity));
  std::vector<Envelope>().swap(envelopes);  // the leaves hold their own copies now
  if (levels.back().empty()) levels.back().emplace_back();  // an empty index is one empty leaf
  while (levels.back().size() > 1) {
    std::vector<Envelope> parents;
    parents.reserve(levels.back().size());
    for (std::size_t k = 0; k < levels.back().size(); ++k) {
      Envelope b = bounds(levels.back()[k]);
      b.id = static_cast<std::int64_t>(k);
      parents.push_back(b);
    }
    // pack_level reorders the children; renumber the lower level to the new order.
    auto upper = pack_level(parents, capacity);
    std::vector<std::vector<Envelope>> lower;
    lower.reserve(levels.back().size());
    std::int64_t next = 0;
    for (auto& node : upper)
      for (auto& cell : node) {
        lower.push_back(std::move(levels.back()[static_cast<std::size_t>(cell.id)]));
        cell.id = next++;
      }
    levels.back() = std::move(lower);
    levels.push_back(std::move(upper));
  }
  // Number the nodes from the root (1) down, level by level; inner cells name child node numbers.
  std::vector<PackedNode> out;
  std::int64_t first_of_level = 1;
  for (std::size_t l = levels.size(); l-- > 0;) {
    const std::int64_t first_below = first_of_level + static_cast<std::int64_t>(levels[l].size());
    for (auto& cells : levels[l]) {
      PackedNode n;
      n.depth = static_cast<int>(l);
      n.cells = std::move(cells);
      if (l > 0)
        for (auto& c : n.cells) c.id += first_below;
      out.push_back(std::move(n));
    }
    first_of_level = first_below;
  }
  return out;
}

void add_gpkg_spatial_indexes(SqliteDb& db, std::vector<SpatialIndexRequest> requests) {
  if (requests.empty()) return;
  db.exec("CREATE TABLE IF NOT EXISTS gpkg_extensions (table_name TEXT, column_name TEXT, extension_name TEXT NOT NULL, "
          "definition TEXT NOT NULL, scope TEXT NOT NULL, CONSTRAINT ge_tce UNIQUE (table_name, column_name, extension_name))",
          "");
  for (auto& rq : requests) write_index(db, std::move(rq));
}

void add_gpkg_spatial_indexes(const std::string& path, std::vector<SpatialIndexRequest> requests) {
  if (requests.empty()) return;
  SqliteDb db(path);
  db.exec("BEGIN", "");
  add_gpkg_spatial_indexes(db, std::move(requests));
  db.exec("COMMIT", "");
}

}  // namespace rimline::report
