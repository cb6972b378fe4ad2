// Rows written straight through SQLite are checked against GDAL's GPKG driver as the reference
// library: the same features written by GDAL into one table and by GpkgRows into another must be
// stored byte for byte alike (the GeoPackage binary geometry of OGC 12-128r15 clause 2.1.3, the
// values, NULLs), and GDAL must read the second table back with its feature count and extent.
#include <catch2/catch.hpp>
#include <gdal_priv.h>
#include <ogrsf_frmts.h>
#include <sqlite3.h>

#include <cmath>
#include <filesystem>
#include <string>
#include <vector>

#include "report/gpkg_rows.hpp"
#include "report/sqlite_db.hpp"
#include "test_paths.hpp"

namespace fs = std::filesystem;
using namespace rimline::report;

namespace {

struct Feature {
  std::string id;       // "" : NULL
  double value;         // NaN : NULL
  int flag;
  std::vector<double> xy;  // a point when 2 values, else a line (fewer than 4: no geometry)
};

const std::vector<Feature> features = {
    {"P-1", 1.25, 1, {305000.125, 5800000.5, 305040.75, 5800030.25, 305100.0, 5799990.0}},
    {"", std::nan(""), 0, {305100.0, 5799990.0, 305160.5, 5800001.0}},
    {"P-3", -0.0, 0, {}},  // no geometry
    {"P-4", 1e-300, 1, {306000.0, 5801000.0, 305999.0, 5801001.0}},
};

std::vector<std::string> rows_of(const std::string& path, const std::string& table) {
  sqlite3* db = nullptr;
  sqlite3_open_v2(path.c_str(), &db, SQLITE_OPEN_READONLY, nullptr);
  sqlite3_stmt* s = nullptr;
  sqlite3_prepare_v2(db, ("SELECT fid, quote(geom), quote(id), quote(value), quote(flag) FROM " + table + " ORDER BY fid").c_str(),
                     -1, &s, nullptr);
  std::vector<std::string> out;
  while (sqlite3_step(s) == SQLITE_ROW) {
    std::string row;
    for (int k = 0; k < 5; ++k) row += std::string(reinterpret_cast<const char*>(sqlite3_column_text(s, k))) + "|";
    out.push_back(row);
  }
  sqlite3_finalize(s);
  sqlite3_close(db);
  return out;
}

// The triggers on a table (GDAL's feature-count triggers), the table's name taken out of them.
std::vector<std::string> triggers_of(const std::string& path, const std::string& table) {
  sqlite3* db = nullptr;
  sqlite3_open_v2(path.c_str(), &db, SQLITE_OPEN_READONLY, nullptr);
  sqlite3_stmt* s = nullptr;
  sqlite3_prepare_v2(db, "SELECT sql FROM sqlite_master WHERE type = 'trigger' AND tbl_name = ? ORDER BY name", -1, &s, nullptr);
  sqlite3_bind_text(s, 1, table.c_str(), -1, SQLITE_TRANSIENT);
  std::vector<std::string> out;
  while (sqlite3_step(s) == SQLITE_ROW) {
    const std::string sql = reinterpret_cast<const char*>(sqlite3_column_text(s, 0));
    std::string general;
    for (std::size_t k = 0; k < sql.size();) {
      if (sql.compare(k, table.size(), table) == 0) {
        general += 'T';
        k += table.size();
      } else {
        general += sql[k++];
      }
    }
    out.push_back(general);
  }
  sqlite3_finalize(s);
  sqlite3_close(db);
  return out;
}

void write_both(const std::string& path, OGRwkbGeometryType type) {
  GDALDriver* drv = GetGDALDriverManager()->GetDriverByName("GPKG");
  GDALDataset* ds = drv->Create(path.c_str(), 0, 0, 0, GDT_Unknown, nullptr);
  REQUIRE(ds);
  OGRSpatialReference srs;
  srs.importFromEPSG(32755);
  for (const char* name : {"by_gdal", "by_rows"}) {
    char** opts = CSLSetNameValue(nullptr, "SPATIAL_INDEX", "NO");
    OGRLayer* l = ds->CreateLayer(name, &srs, type, opts);
    CSLDestroy(opts);
    OGRFieldDefn id("id", OFTString), value("value", OFTReal), flag("flag", OFTInteger);
    l->CreateField(&id);
    l->CreateField(&value);
    l->CreateField(&flag);
  }
  OGRLayer* g = ds->GetLayerByName("by_gdal");
  for (const auto& f : features) {
    OGRFeature feature(g->GetLayerDefn());
    if (!f.id.empty()) feature.SetField(0, f.id.c_str());
    if (!std::isnan(f.value)) feature.SetField(1, f.value);
    feature.SetField(2, f.flag);
    if (type == wkbPoint && f.xy.size() >= 2) {
      OGRPoint p(f.xy[0], f.xy[1]);
      feature.SetGeometry(&p);
    } else if (type == wkbLineString && f.xy.size() >= 4) {
      OGRLineString line;
      for (std::size_t k = 0; k + 1 < f.xy.size(); k += 2) line.addPoint(f.xy[k], f.xy[k + 1]);
      feature.SetGeometry(&line);
    }
    REQUIRE(g->CreateFeature(&feature) == OGRERR_NONE);
  }
  GDALClose(ds);

  SqliteDb db(path);
  db.exec("BEGIN", "");
  GpkgRows rows(db, "by_rows", "geom", {"id", "value", "flag"});
  for (const auto& f : features) {
    if (!f.id.empty()) rows.text(rows.column("id"), f.id);
    rows.real(rows.column("value"), f.value);
    rows.integer(rows.column("flag"), f.flag);
    if (type == wkbPoint && f.xy.size() >= 2) rows.point(f.xy[0], f.xy[1]);
    if (type == wkbLineString) rows.line(f.xy);
    rows.add();
  }
  rows.finish();
  db.exec("COMMIT", "");
}

}  // namespace

TEST_CASE("rows through SQLite are stored as GDAL's GPKG driver stores them", "[report][gpkg]") {
  GDALAllRegister();
  const fs::path dir = fs::path(rimline::test::binary_dir) / "gpkg-rows";
  fs::remove_all(dir);
  fs::create_directories(dir);
  for (OGRwkbGeometryType type : {wkbLineString, wkbPoint}) {
    const std::string path = (dir / (type == wkbPoint ? "points.gpkg" : "lines.gpkg")).string();
    write_both(path, type);
    const auto expected = rows_of(path, "by_gdal");
    REQUIRE(expected.size() == features.size());
    CHECK(rows_of(path, "by_rows") == expected);
    const auto gdal_triggers = triggers_of(path, "by_gdal");
    CHECK(!gdal_triggers.empty());
    CHECK(triggers_of(path, "by_rows") == gdal_triggers);

    // GDAL reads the table back: its count (gpkg_ogr_contents) and its extent (gpkg_contents).
    GDALDataset* ds = static_cast<GDALDataset*>(GDALOpenEx(path.c_str(), GDAL_OF_VECTOR, nullptr, nullptr, nullptr));
    REQUIRE(ds);
    OGRLayer* a = ds->GetLayerByName("by_gdal");
    OGRLayer* b = ds->GetLayerByName("by_rows");
    CHECK(b->GetFeatureCount(FALSE) == a->GetFeatureCount(FALSE));
    OGREnvelope ea, eb;
    REQUIRE(a->GetExtent(&ea, FALSE) == OGRERR_NONE);
    REQUIRE(b->GetExtent(&eb, FALSE) == OGRERR_NONE);
    CHECK(eb.MinX == Approx(ea.MinX).margin(1e-6));
    CHECK(eb.MaxX == Approx(ea.MaxX).margin(1e-6));
    CHECK(eb.MinY == Approx(ea.MinY).margin(1e-6));
    CHECK(eb.MaxY == Approx(ea.MaxY).margin(1e-6));
    GDALClose(ds);
  }
}
