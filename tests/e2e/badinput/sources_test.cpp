// Bad-input catalogue, sources: geographic CRS, two CRSs, no CRS, a corrupt GeoPackage, an empty
// layer. Expected messages follow include/rimline/error.hpp ("file:layer:fid:field:" prefix);
// inputs invented for the test.
// clang-format off
#include "e2e/badinput/gpkg_fixture.hpp"
#include "e2e/badinput/cli_fixture.hpp"
#include "e2e/reliability/output_files.hpp"

#include <sys/stat.h>

#include <cpl_conv.h>

#include <filesystem>
// clang-format on

using namespace rimline;
using namespace rimline::badinput;

namespace {

// The base network written as GeoJSON, then each layer copied to a GeoPackage with `epsg`.
void write_gpkg_network(const Case& c, int pipes_epsg, int structures_epsg, bool reproject,
                        const std::string& project_extra = "") {
  c.write_network(base_pipes(), base_structures());
  copy_layer(c.path("pipes.geojson"), c.path("pipes.gpkg"), "GPKG", "pipes", pipes_epsg, reproject);
  copy_layer(c.path("structures.geojson"), c.path("structures.gpkg"), "GPKG", "structures", structures_epsg, reproject);
  auto p = replace(replace(base_project(), "pipes.geojson", "pipes.gpkg"), "structures.geojson", "structures.gpkg");
  c.write("project.toml", replace(p, "units = \"si\"", "units = \"si\"" + project_extra));
}

}  // namespace

TEST_CASE("badinput sources: a geographic CRS (WGS 84) is reprojected and the network still solves") {
  Case c("geographic_crs");
  write_gpkg_network(c, 4326, 4326, true);
  const auto r = c.run();
  INFO(dump(r));
  // Lengths survive the round trip to degrees and back through a local projection (50 m pipes).
  CHECK(r.read.network.conduits[conduit_index(r, "P1")].length_m == Approx(50.0).margin(0.05));
  // The run says so (printed by `rimline check` and written to the summary).
  CHECK(r.read.network.crs_note ==
        "The pipe layer's CRS WGS 84 (EPSG:4326) is geographic; coordinates were reprojected to WGS 84 / UTM zone "
        "31N (EPSG:32631), the UTM zone of the layer's extent centre, to measure lengths.");
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}

TEST_CASE("badinput sources: layers in two CRSs are brought to one and still snap") {
  Case c("two_crs");
  c.write_network(base_pipes(), base_structures());
  copy_layer(c.path("structures.geojson"), c.path("structures.gpkg"), "GPKG", "structures", 4326, true);
  c.write("project.toml", replace(base_project(), "structures.geojson", "structures.gpkg"));
  const auto r = c.run();
  INFO(dump(r));
  CHECK(find(r, "TOPOLOGY_UNCONNECTED", "*") == nullptr);
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}

TEST_CASE("badinput sources: no CRS at all stops the run unless [project] crs names one") {
  Case c("no_crs");
  write_gpkg_network(c, 0, 0, false);
  const std::string e = error_of([&] { c.run(); });
  CHECK(
      e ==
      c.path("pipes.gpkg") +
          R"(:pipes: the layer has no CRS; set crs = "EPSG:...." in [project] to say which one its coordinates are in)");
  Case ok("no_crs_override");
  write_gpkg_network(ok, 0, 0, false, "\ncrs = \"EPSG:32631\"");
  const auto r = ok.run();
  INFO(dump(r));
  check_solved(r, {"OF", "M1", "M2", "M3", "M4"});
}

TEST_CASE("badinput sources: a corrupt GeoPackage stops the run naming the file") {
  Case c("corrupt_gpkg");
  write_gpkg_network(c, 32631, 32631, false);
  {  // overwrite the SQLite header and the first pages: a torn copy from a file share
    std::fstream f(c.path("pipes.gpkg"), std::ios::in | std::ios::out | std::ios::binary);
    const std::string junk(4096, '\x5a');
    f.write(junk.data(), static_cast<std::streamsize>(junk.size()));
  }
  const std::string e = error_of([&] { c.run(); });
  CHECK(e == c.path("pipes.gpkg") + R"(: cannot open the pipes source: no GDAL vector driver recognises it)");
}

TEST_CASE("badinput sources: a GeoPackage cut short stops the run naming the file") {
  Case c("truncated_gpkg");
  write_gpkg_network(c, 32631, 32631, false);
  std::filesystem::resize_file(c.path("structures.gpkg"), 2048);
  const std::string e = error_of([&] { c.run(); });
  CHECK(e == c.path("structures.gpkg") + R"(: cannot open the structures source: database disk image is malformed)");
}

TEST_CASE("badinput sources: an empty pipe layer stops the run naming file and layer") {
  Case c("empty_layer");
  c.write_network({}, base_structures());
  const std::string e = error_of([&] { c.run(); });
  CHECK(e == c.path("pipes.geojson") + R"(:pipes: the pipes layer has no features)");
}

TEST_CASE("badinput sources: a missing source file stops the run naming it") {
  Case c("missing_file");
  c.write_network(base_pipes(), base_structures(), replace(base_project(), "pipes.geojson", "pipes_v2.geojson"));
  const std::string e = error_of([&] { c.run(); });
  CHECK(e == c.path("pipes_v2.geojson") + R"(: cannot open the pipes source: no GDAL vector driver recognises it)");
}

// Issue 18, defect 7: GDAL opened a FIFO and waited for a writer forever (check and fields).
TEST_CASE("badinput sources: a FIFO as a source is refused at once, by check and by fields, exit 3") {
  Case c("fifo_source");
  c.write_network(base_pipes(), base_structures());
  std::filesystem::remove(c.path("pipes.geojson"));
  REQUIRE(::mkfifo(c.path("pipes.geojson").c_str(), 0600) == 0);
  const std::string why =
      " is a named pipe (FIFO), not a regular file; rimline reads GIS sources only from regular files and folders "
      "(reading it would wait for a writer forever)\n";
  const Ran check = run_cli({"check", c.path("project.toml"), "--out", c.path("out")}, 20);
  CHECK(check.code == 3);
  CHECK(check.out == "rimline: error: " + c.path("pipes.geojson") + ": the pipes source" + why);
  const Ran fields = run_cli({"fields", c.path("pipes.geojson")}, 20);
  CHECK(fields.code == 3);
  CHECK(fields.out == "rimline: error: " + c.path("pipes.geojson") + ": the inspected source" + why);
}

TEST_CASE("badinput sources: a FIFO among a shapefile's files or in a source folder is refused, exit 3") {
  Case c("fifo_sidecar");
  c.write_network(base_pipes(), base_structures());
  copy_layer(c.path("pipes.geojson"), c.path("pipes.shp"), "ESRI Shapefile", "pipes", 32631, false);
  std::filesystem::remove(c.path("pipes.prj"));
  REQUIRE(::mkfifo(c.path("pipes.prj").c_str(), 0600) == 0);
  c.write("project.toml", replace(base_project(), "pipes.geojson", "pipes.shp"));
  const Ran r = run_cli({"check", c.path("project.toml"), "--out", c.path("out")}, 20);
  CHECK(r.code == 3);
  CHECK(r.out == "rimline: error: " + c.path("pipes.shp") +
                     ": the pipes source file pipes.prj is a named pipe (FIFO), not a regular file; rimline reads GIS "
                     "sources only from regular files and folders (reading it would wait for a writer forever)\n");
  const Ran folder = run_cli({"fields", c.dir.string()}, 20);
  CHECK(folder.code == 3);
  CHECK_THAT(folder.out, Catch::Contains(": the inspected source holds pipes.prj, which is a named pipe (FIFO)"));
}

// Issue 18: a shapefile without its .dbf opened with no fields: "field ... not in the layer", exit 2.
TEST_CASE("badinput sources: a shapefile without its .dbf names the missing file, exit 3") {
  Case c("shapefile_no_dbf");
  c.write_network(base_pipes(), base_structures());
  copy_layer(c.path("pipes.geojson"), c.path("pipes.shp"), "ESRI Shapefile", "pipes", 32631, false);
  std::filesystem::remove(c.path("pipes.dbf"));
  c.write("project.toml", replace(base_project(), "pipes.geojson", "pipes.shp"));
  const Ran r = run_cli({"check", c.path("project.toml"), "--out", c.path("out")});
  CHECK(r.code == 3);
  CHECK(r.out == "rimline: error: " + c.path("pipes.shp") +
                     ": the pipes source has no pipes.dbf beside pipes.shp: a shapefile keeps its attributes in the "
                     ".dbf; copy the .shp, .shx, .dbf and .prj together\n");
}

// Issue 18, defect 4: a GeoPackage copied while another program had it open comes with -wal and
// -shm files; SQLite merged the WAL into the file on close and deleted both, though GDAL opened it
// read-only, and summary.json hashed the rewritten file.
TEST_CASE("badinput sources: a GeoPackage with -wal and -shm beside it is read whole and left as it was") {
  Case c("gpkg_with_wal");
  c.write_network(base_pipes(), base_structures());
  const std::string original = c.path("work.gpkg"), copied = c.path("structures.gpkg");
  copy_layer(c.path("structures.geojson"), original, "GPKG", "structures", 32631, false);
  {  // an editor with the file open in WAL mode: its last change still in the -wal when copied
    CPLSetConfigOption("OGR_SQLITE_JOURNAL", "WAL");
    std::unique_ptr<GDALDataset> ds(GDALDataset::Open(original.c_str(), GDAL_OF_VECTOR | GDAL_OF_UPDATE));
    CPLSetConfigOption("OGR_SQLITE_JOURNAL", nullptr);
    REQUIRE(ds);
    ds->ExecuteSQL("UPDATE structures SET RIM = 9.75 WHERE NODE_ID = 'M3'", nullptr, nullptr);
    ds->FlushCache();
    for (const char* ext : {"", "-wal", "-shm"}) std::filesystem::copy_file(original + ext, copied + ext);
  }
  REQUIRE(std::filesystem::file_size(copied + "-wal") > 0);
  c.write("project.toml", replace(base_project(), "structures.geojson", "structures.gpkg"));
  const auto before = reliability::hash_tree(c.dir);
  const auto r = c.run();
  // The -wal's change was read: M3's rim is the edited one.
  CHECK(r.read.network.structures[structure_index(r, "M3")].rim_m == Approx(9.75));
  // Every byte and both sidecars as they were.
  CHECK(reliability::hash_tree(c.dir) == before);
  // The summary names the database and its -wal, each hashed as read.
  std::vector<std::string> listed;
  for (const auto& f : r.inputs) {
    listed.push_back(f.path);
    if (f.path == copied || f.path == copied + "-wal") CHECK(f.sha256 == before.at(std::filesystem::path(f.path).filename().string()));
  }
  CHECK(std::count(listed.begin(), listed.end(), copied) == 1);
  CHECK(std::count(listed.begin(), listed.end(), copied + "-wal") == 1);
  // The same through the command line, whose summary.json is written.
  const Ran cli = run_cli({"check", c.path("project.toml"), "--out", c.dir.string() + "-out", "--fail-on", "error"});
  CHECK(cli.code == 0);
  CHECK(reliability::hash_tree(c.dir) == before);
}
