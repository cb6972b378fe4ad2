// The packed GeoPackage spatial index is checked by the libraries that read it: SQLite's own
// integrity check of an R-tree (rtreecheck(), SQLite R*Tree Module documentation, sqlite.org/rtree.html
// §8) and GDAL's GPKG driver answering spatial filters through it, compared with a brute-force
// scan of the same features. The GeoPackage rules (gpkg_extensions row, triggers): OGC GeoPackage
// Encoding Standard 1.2 (OGC 12-128r15), Annex F.3.
#include <catch2/catch.hpp>
#include <gdal_priv.h>
#include <ogrsf_frmts.h>

#include <filesystem>
#include <random>
#include <set>

#include "report/gpkg_rtree.hpp"
#include "test_paths.hpp"

namespace fs = std::filesystem;
using namespace rimline::report;

namespace {

// Every envelope once in the leaves, every child inside its parent's cell, all leaves at one depth.
void check_packing(const std::vector<PackedNode>& nodes, std::size_t n, std::size_t capacity) {
  REQUIRE(!nodes.empty());
  std::set<std::int64_t> seen;
  std::vector<int> depth_of(nodes.size() + 1, -1);
  depth_of[1] = nodes[0].depth;
  for (std::size_t k = 0; k < nodes.size(); ++k) {
    const auto& node = nodes[k];
    CHECK(node.cells.size() <= capacity);
    CHECK(node.depth == depth_of[k + 1]);
    for (const auto& c : node.cells) {
      if (node.depth == 0) {
        CHECK(seen.insert(c.id).second);
        continue;
      }
      REQUIRE(c.id >= 2);
      REQUIRE(static_cast<std::size_t>(c.id) <= nodes.size());
      depth_of[static_cast<std::size_t>(c.id)] = node.depth - 1;
      for (const auto& g : nodes[static_cast<std::size_t>(c.id) - 1].cells) {
        CHECK(g.min_x >= c.min_x);
        CHECK(g.max_x <= c.max_x);
        CHECK(g.min_y >= c.min_y);
        CHECK(g.max_y <= c.max_y);
      }
    }
  }
  CHECK(seen.size() == n);
}

std::vector<Envelope> random_boxes(std::size_t n, unsigned seed) {
  std::mt19937_64 rng(seed);
  std::uniform_real_distribution<double> at(300000.0, 310000.0), size(0.0, 120.0);
  std::vector<Envelope> out;
  for (std::size_t i = 0; i < n; ++i) {
    const double x = at(rng), y = at(rng) + 5.0e6;
    out.push_back(Envelope{static_cast<std::int64_t>(i + 1), x, x + size(rng), y, y + size(rng)});
  }
  return out;
}

}  // namespace

TEST_CASE("R-tree packing: each feature once, children inside parents, one leaf depth", "[report][rtree]") {
  for (std::size_t n : {0, 1, 51, 52, 2601, 2602, 20000}) {
    INFO("n = " << n);
    const auto nodes = pack_rtree(random_boxes(n, 7), 51);
    check_packing(nodes, n, 51);
    if (n <= 51) CHECK(nodes.size() == 1);
    if (n == 52) CHECK(nodes[0].depth == 1);
  }
}

TEST_CASE("packed GeoPackage index: SQLite's rtreecheck passes and GDAL's spatial filter matches a scan",
          "[report][rtree]") {
  GDALAllRegister();
  const fs::path dir = fs::path(rimline::test::binary_dir) / "gpkg-rtree";
  fs::remove_all(dir);
  fs::create_directories(dir);
  const std::string path = (dir / "lines.gpkg").string();
  const auto boxes = random_boxes(6000, 11);
  SpatialIndexRequest rq{"pipes", "", "fid", {}};
  {
    auto* drv = GetGDALDriverManager()->GetDriverByName("GPKG");
    GDALDatasetUniquePtr ds(drv->Create(path.c_str(), 0, 0, 0, GDT_Unknown, nullptr));
    char** opts = CSLSetNameValue(nullptr, "SPATIAL_INDEX", "NO");
    opts = CSLSetNameValue(opts, "FID", "fid");
    OGRLayer* l = ds->CreateLayer("pipes", nullptr, wkbLineString, opts);
    CSLDestroy(opts);
    REQUIRE(l);
    ds->StartTransaction();
    for (const auto& b : boxes) {
      OGRFeature f(l->GetLayerDefn());
      OGRLineString line;  // a diagonal of the box, so that its envelope is the box
      line.addPoint(b.min_x, b.min_y);
      line.addPoint(b.max_x, b.max_y);
      f.SetGeometry(&line);
      REQUIRE(l->CreateFeature(&f) == OGRERR_NONE);
      rq.envelopes.push_back(Envelope{f.GetFID(), b.min_x, b.max_x, b.min_y, b.max_y});
    }
    ds->CommitTransaction();
    rq.geometry_column = l->GetGeometryColumn();
  }
  add_gpkg_spatial_indexes(path, {rq});

  GDALDatasetUniquePtr ds(GDALDataset::Open(path.c_str(), GDAL_OF_VECTOR | GDAL_OF_UPDATE));
  REQUIRE(ds);
  {
    OGRLayer* r = ds->ExecuteSQL("SELECT rtreecheck('rtree_pipes_geom')", nullptr, nullptr);
    REQUIRE(r);
    std::unique_ptr<OGRFeature> f(r->GetNextFeature());
    REQUIRE(f);
    CHECK(std::string(f->GetFieldAsString(0)) == "ok");
    ds->ReleaseResultSet(r);
  }
  OGRLayer* l = ds->GetLayerByName("pipes");
  REQUIRE(l);
  CHECK(l->TestCapability(OLCFastSpatialFilter));  // GDAL sees and uses the index

  auto filtered = [&](double x0, double y0, double x1, double y1) {
    std::set<std::int64_t> ids;
    l->SetSpatialFilterRect(x0, y0, x1, y1);
    l->ResetReading();
    while (auto* f = l->GetNextFeature()) {
      ids.insert(f->GetFID());
      OGRFeature::DestroyFeature(f);
    }
    l->SetSpatialFilter(nullptr);
    return ids;
  };
  std::size_t found = 0;
  std::mt19937_64 rng(3);
  std::uniform_real_distribution<double> at(300000.0, 310000.0), size(10.0, 900.0);
  for (int q = 0; q < 25; ++q) {
    const double x0 = at(rng), y0 = at(rng) + 5.0e6, x1 = x0 + size(rng), y1 = y0 + size(rng);
    // The scan applies GDAL's own filter rule (the geometry meets the window), feature by feature.
    OGRLinearRing ring;
    for (auto [x, y] : {std::pair{x0, y0}, {x1, y0}, {x1, y1}, {x0, y1}, {x0, y0}}) ring.addPoint(x, y);
    OGRPolygon window;
    window.addRing(&ring);
    std::set<std::int64_t> scan;
    l->ResetReading();
    while (auto* g = l->GetNextFeature()) {
      if (g->GetGeometryRef()->Intersects(&window)) scan.insert(g->GetFID());
      OGRFeature::DestroyFeature(g);
    }
    INFO("window " << q);
    CHECK(filtered(x0, y0, x1, y1) == scan);
    found += scan.size();
  }
  CHECK(found > 100);  // the windows do meet features

  // An edit made later (here through GDAL) is indexed by the GeoPackage triggers.
  OGRFeature f(l->GetLayerDefn());
  OGRLineString line;
  line.addPoint(299000.0, 4999000.0);
  line.addPoint(299010.0, 4999010.0);
  f.SetGeometry(&line);
  REQUIRE(l->CreateFeature(&f) == OGRERR_NONE);
  CHECK(filtered(298990.0, 4998990.0, 299020.0, 4999020.0) == std::set<std::int64_t>{f.GetFID()});
}
