// Bad-input catalogue, sources: geographic CRS, two CRSs, no CRS, a corrupt GeoPackage, an empty
// layer. Expected messages follow include/rimline/error.hpp ("file:layer:fid:field:" prefix);
// inputs invented for the test.
#include <filesystem>

#include "e2e/badinput/gpkg_fixture.hpp"

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
