// "Never touch the inputs": every input file hashes the same (SHA-256, FIPS 180-4, via
// rimline::sha256_file_hex) before and after a whole `rimline check`, and no file appears beside
// them (no GDAL .aux.xml, no SQLite -wal/-shm, no lock file), for GeoJSON and GeoPackage sources.
#include "e2e/badinput/gpkg_fixture.hpp"
#include "e2e/reliability/output_files.hpp"
#include "e2e/reliability/run_cli.hpp"

using namespace rimline;
using namespace rimline::badinput;
using namespace rimline::reliability;

namespace {

void check_untouched(const Case& c, const std::string& label) {
  const fs::path inputs = c.dir;
  const auto before = hash_tree(inputs);
  REQUIRE(before.size() >= 3);
  const fs::path out = c.dir.parent_path() / (c.dir.filename().string() + "-out");
  fs::remove_all(out);
  const int rc = run_rimline({"check", c.path("project.toml"), "--out", out.string(), "--fail-on", "error"});
  INFO(label);
  CHECK((rc == 0 || rc == 1));
  CHECK(fs::exists(out / "summary.json"));
  CHECK(hash_tree(inputs) == before);
}

}  // namespace

TEST_CASE("reliability: a run leaves GeoJSON inputs and the project file byte for byte as they were") {
  Case c("untouched_geojson");
  c.write_network(base_pipes(), base_structures());
  check_untouched(c, "geojson");
}

TEST_CASE("reliability: a run leaves GeoPackage inputs byte for byte as they were") {
  Case c("untouched_gpkg");
  c.write_network(base_pipes(), base_structures());
  copy_layer(c.path("pipes.geojson"), c.path("pipes.gpkg"), "GPKG", "pipes", 32631, false);
  copy_layer(c.path("structures.geojson"), c.path("structures.gpkg"), "GPKG", "structures", 32631, false);
  c.write("project.toml",
          replace(replace(base_project(), "pipes.geojson", "pipes.gpkg"), "structures.geojson", "structures.gpkg"));
  check_untouched(c, "gpkg");
}

TEST_CASE("reliability: a run leaves the bundled demo inputs as they were") {
  const fs::path demo = fs::path(test::source_dir) / "data/demo/metric";
  const auto before = hash_tree(demo);
  const fs::path out = fs::path(test::binary_dir) / "badinput" / "untouched_demo-out";
  fs::remove_all(out);
  CHECK(run_rimline({"check", (demo / "project.toml").string(), "--out", out.string(), "--fail-on", "error"}) <= 1);
  CHECK(hash_tree(demo) == before);
}
