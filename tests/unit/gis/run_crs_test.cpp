#include <catch2/catch.hpp>

#include "gis/run_crs.hpp"
#include "layer_fixture.hpp"
#include "rimline/gis/read_network.hpp"

using namespace rimline;
using rimline::test::FieldSpec;

namespace {

config::Project project_for(const std::filesystem::path& dir, const std::string& file, const std::string& extra = "") {
  return config::parse_project(extra + "[pipes]\nsource = \"" + file +
                               "\"\n[pipes.fields]\nid = \"ID\"\n[pipes.defaults]\ndiameter = \"300 mm\"\n"
                               "manning_n = 0.013\n",
                           (dir / "run.toml").string());
}

}  // namespace

TEST_CASE("UTM zones are the 6-degree bands counted from 180 W", "[io][crs]") {
  // Zone n spans longitudes 6n - 186 .. 6n - 180 degrees E; EPSG 326nn north, 327nn south
  // (the WGS 84 / UTM definitions in the EPSG dataset, from memory).
  CHECK(gis::detail::utm_zone(-180.0) == 1);
  CHECK(gis::detail::utm_zone(144.96) == 55);
  CHECK(gis::detail::utm_zone(-75.0) == 18);
  CHECK(gis::detail::utm_zone(179.99) == 60);
  CHECK(gis::detail::utm_zone(180.0) == 60);
  CHECK(gis::detail::utm_epsg(144.96, -37.8) == 32755);
  CHECK(gis::detail::utm_epsg(-75.0, 40.5) == 32618);
}

TEST_CASE("a geographic pipe layer is reprojected to the UTM zone of its extent centre", "[io][crs]") {
  const auto dir = test::fresh_dir("geographic");
  test::write_layer(dir / "p.geojson", "GeoJSON", "p", 4326, wkbLineString, {{"ID", OFTString}},
                    {{"LINESTRING (144.9631 -37.8136,144.97 -37.81)", {"a"}}});
  const gis::ReadResult r = gis::read_network(project_for(dir, "p.geojson"));
  REQUIRE(r.network.conduits.size() == 1);
  const auto& c = r.network.conduits[0];
  // Reference: PROJ 9.1.1 command line (not rimline's code path through GDAL):
  //   echo "-37.8136 144.9631" | cs2cs -f %.4f EPSG:4326 EPSG:32755  ->  320704.4463 5812911.6995
  //   echo "-37.8100 144.9700" | cs2cs -f %.4f EPSG:4326 EPSG:32755  ->  321303.1931 5813324.3996
  // Tolerance 1 mm: the reference is printed to 0.1 mm.
  CHECK(c.up_point.x == Approx(320704.4463).epsilon(0).margin(1e-3));
  CHECK(c.up_point.y == Approx(5812911.6995).epsilon(0).margin(1e-3));
  CHECK(c.down_point.x == Approx(321303.1931).epsilon(0).margin(1e-3));
  CHECK(c.down_point.y == Approx(5813324.3996).epsilon(0).margin(1e-3));
  CHECK(c.geometry_length_m ==
        Approx(std::hypot(321303.1931 - 320704.4463, 5813324.3996 - 5812911.6995)).epsilon(0).margin(2e-3));
  CHECK(r.network.crs_description == "WGS 84 / UTM zone 55S");
  CHECK(r.network.crs_note ==
        "The pipe layer's CRS WGS 84 (EPSG:4326) is geographic; coordinates were reprojected to WGS 84 / UTM zone 55S "
        "(EPSG:32755), the UTM zone of the layer's extent centre, to measure lengths.");
  CHECK(r.network.crs_metres_per_unit == 1.0);
  CHECK(r.source_crs_wkt.find("WGS 84") != std::string::npos);
  CHECK(r.network.crs_wkt.find("UTM zone 55S") != std::string::npos);
}

TEST_CASE("a projected layer in US survey feet is scaled to metres by the CRS's own unit", "[io][crs]") {
  const auto dir = test::fresh_dir("us_feet");
  // EPSG:2227, NAD83 / California zone 3 (ftUS).
  test::write_layer(dir / "p.gpkg", "GPKG", "p", 2227, wkbUnknown, {{"ID", OFTString}},
                    {{"LINESTRING Z (6000000 2000000 100,6001000 2000000 99)", {"a"}}});
  const gis::ReadResult r = gis::read_network(project_for(dir, "p.gpkg"));
  REQUIRE(r.network.conduits.size() == 1);
  const auto& c = r.network.conduits[0];
  // 1 US survey foot = 1200/3937 m (NIST SP 811, 2008 ed., B.6).
  const double ft_us = 1200.0 / 3937.0;
  CHECK(c.geometry_length_m == Approx(1000.0 * ft_us).epsilon(1e-12));
  CHECK(c.up_point.x == Approx(6000000.0 * ft_us).epsilon(1e-14));
  CHECK(c.vertex_z_m[1] == Approx(99.0 * ft_us).epsilon(1e-14));
  CHECK(r.network.crs_metres_per_unit == Approx(ft_us).epsilon(1e-12));
  CHECK(r.network.crs_note ==
        "The pipe layer's CRS NAD83 / California zone 3 (ftUS) (EPSG:2227) is in US survey foot; coordinates were "
        "scaled to metres (1 unit = 0.3048006096 m).");
}

TEST_CASE("structures in another CRS are moved into the pipes' run CRS", "[io][crs]") {
  const auto dir = test::fresh_dir("structures_crs");
  test::write_layer(dir / "p.gpkg", "GPKG", "p", 32755, wkbLineString, {{"ID", OFTString}},
                    {{"LINESTRING (320704.4463 5812911.6995,321303.1931 5813324.3996)", {"a"}}});
  test::write_layer(dir / "s.geojson", "GeoJSON", "s", 4326, wkbPoint, {{"MH", OFTString}},
                    {{"POINT (144.9631 -37.8136)", {"MH1"}}});
  const config::Project with_structures = config::parse_project(
      "[structures]\nsource = \"s.geojson\"\n[structures.fields]\nid = \"MH\"\n[pipes]\nsource = "
      "\"p.gpkg\"\n[pipes.fields]\nid = \"ID\"\n[pipes.defaults]\ndiameter = \"300 mm\"\n"
      "manning_n = 0.013\n",
      (dir / "run.toml").string());
  const gis::ReadResult r = gis::read_network(with_structures);
  REQUIRE(r.network.structures.size() == 1);
  // Same cs2cs reference as the reprojection case above.
  CHECK(r.network.structures[0].location.x == Approx(320704.4463).epsilon(0).margin(1e-3));
  CHECK(r.network.structures[0].location.y == Approx(5812911.6995).epsilon(0).margin(1e-3));
  CHECK(r.network.crs_note.empty());
  CHECK(r.input_files.size() == 2);
}
