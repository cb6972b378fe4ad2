// Force-main profiles: a DEM written by the test (known elevations) sampled along a line equals the
// bilinear interpolation of those elevations; vertex Z and end inverts; the messages when the DEM
// does not cover the line or cannot be opened.
#include <catch2/catch.hpp>

#include <gdal_priv.h>
#include <ogr_spatialref.h>

#include <cmath>
#include <filesystem>

#include "rimline/error.hpp"
#include "rimline/gis/force_main_profile.hpp"

using namespace rimline;

namespace {

// 10 x 8 pixels of 2 m, top-left corner (1000, 2000), north up; EPSG:32631.
constexpr int cols = 10, rows = 8;
constexpr double dem_x0 = 1000.0, dem_y0 = 2000.0, px = 2.0;
// Known, non-planar elevations at the pixel centres.
double known(int c, int r) { return 50.0 + 0.5 * c + 0.25 * r + 0.1 * ((c * r) % 3); }

std::string wkt_32631() {
  OGRSpatialReference srs;
  srs.importFromEPSG(32631);
  char* w = nullptr;
  srs.exportToWkt(&w);
  std::string out(w);
  CPLFree(w);
  return out;
}

std::string write_dem() {
  GDALAllRegister();
  const auto path = (std::filesystem::temp_directory_path() / "rimline_dem_test.tif").string();
  auto* drv = GetGDALDriverManager()->GetDriverByName("GTiff");
  GDALDataset* ds = drv->Create(path.c_str(), cols, rows, 1, GDT_Float32, nullptr);
  double gt[6] = {dem_x0, px, 0.0, dem_y0, 0.0, -px};
  ds->SetGeoTransform(gt);
  OGRSpatialReference srs;
  srs.importFromEPSG(32631);
  ds->SetSpatialRef(&srs);
  std::vector<float> z(cols * rows);
  for (int r = 0; r < rows; ++r)
    for (int c = 0; c < cols; ++c) z[r * cols + c] = static_cast<float>(known(c, r));
  CHECK(ds->GetRasterBand(1)->RasterIO(GF_Write, 0, 0, cols, rows, z.data(), cols, rows, GDT_Float32, 0, 0, nullptr) ==
        CE_None);
  GDALClose(ds);
  return path;
}

// Bilinear interpolation of the known elevations at (x, y), by hand: pixel centres at dem_x0 + (c + 0.5) px.
double bilinear(double x, double y) {
  const double fc = (x - dem_x0) / px - 0.5, fr = (dem_y0 - y) / px - 0.5;
  const int c = static_cast<int>(std::floor(fc)), r = static_cast<int>(std::floor(fr));
  const double tx = fc - c, ty = fr - r;
  return known(c, r) * (1 - tx) * (1 - ty) + known(c + 1, r) * tx * (1 - ty) + known(c, r + 1) * (1 - tx) * ty +
         known(c + 1, r + 1) * tx * ty;
}

model::Network network_with_main(std::vector<model::Point2> vertices) {
  model::Network n;
  n.crs_wkt = wkt_32631();
  n.structures.resize(2);
  n.structures[0].id = "WW";
  n.structures[1].id = "MH";
  model::Conduit c;
  c.id = "FM-1";
  c.force_main = true;
  c.from = 0, c.to = 1;
  c.section.diameter_m = 0.2;
  c.invert_up_m = 40.0, c.invert_down_m = 41.0;
  c.vertices = std::move(vertices);
  for (std::size_t k = 1; k < c.vertices.size(); ++k)
    c.length_m += std::hypot(c.vertices[k].x - c.vertices[k - 1].x, c.vertices[k].y - c.vertices[k - 1].y);
  n.conduits.push_back(c);
  return n;
}

}  // namespace

TEST_CASE("DEM profile: samples equal the known elevations at pixel centres and their bilinear blend between",
          "[force_main][dem]") {
  const std::string dem = write_dem();
  // Pixel centres: exactly the known values (float32 storage: 1e-5 m).
  std::vector<model::Point2> centres{{dem_x0 + 1.0, dem_y0 - 1.0}, {dem_x0 + 2 * 4 + 1.0, dem_y0 - 2 * 3 - 1.0}, {dem_x0 + 19.0, dem_y0 - 15.0}};
  const auto at_centres = gis::sample_dem(dem, 1.0, network_with_main({{0, 0}, {1, 0}}), centres);
  CHECK(at_centres[0] == Approx(known(0, 0)).margin(1e-5));
  CHECK(at_centres[1] == Approx(known(4, 3)).margin(1e-5));
  CHECK(at_centres[2] == Approx(known(9, 7)).margin(1e-5));
  // Outside the raster: NaN.
  CHECK(std::isnan(gis::sample_dem(dem, 1.0, network_with_main({{0, 0}, {1, 0}}), {{dem_x0 - 5.0, dem_y0 - 5.0}})[0]));

  // A line across the raster sampled every 3 m: centreline = ground - cover (1 m) - D/2 (0.1 m).
  auto net = network_with_main({{dem_x0 + 2.3, dem_y0 - 2.9}, {dem_x0 + 14.6, dem_y0 - 2.9}, {dem_x0 + 17.1, dem_y0 - 13.4}});
  model::ForceMainSettings s;
  s.dem_source = dem;
  s.cover_m = 1.0;
  s.spacing_m = 3.0;
  Findings findings;
  const auto profiles = gis::force_main_profiles(net, s, findings);
  CHECK(findings.empty());
  REQUIRE(profiles.size() == 1);
  const auto& p = profiles[0];
  CHECK(p.source == model::ProfileSource::dem);
  // 12.3 m first leg -> samples at 0, 3, 6, 9, 12, 12.3; second leg (10.79 m) -> +3, +6, +9, end.
  REQUIRE(p.station_m.size() == 10);
  CHECK(p.station_m[4] == Approx(12.0));
  CHECK(p.station_m[5] == Approx(12.3));
  CHECK(p.station_m.back() == Approx(net.conduits[0].length_m));
  for (std::size_t k = 0; k < p.xy.size(); ++k) {
    INFO("station " << p.station_m[k]);
    CHECK(p.centreline_m[k] == Approx(bilinear(p.xy[k].x, p.xy[k].y) - 1.1).margin(1e-5));
  }
  std::filesystem::remove(dem);
}

TEST_CASE("DEM profile: a line the DEM does not cover falls back to its end inverts with a warning",
          "[force_main][dem][bad]") {
  const std::string dem = write_dem();
  auto net = network_with_main({{dem_x0 + 2.0, dem_y0 - 3.0}, {dem_x0 + 30.0, dem_y0 - 3.0}});  // runs 10 m past the east edge
  model::ForceMainSettings s;
  s.dem_source = dem;
  s.spacing_m = 5.0;
  Findings findings;
  const auto profiles = gis::force_main_profiles(net, s, findings);
  REQUIRE(findings.size() == 1);
  CHECK(findings[0].code == "FM_PROFILE_COARSE");
  CHECK(findings[0].severity == Severity::warning);
  CHECK(findings[0].layer == LayerRole::force_mains);
  CHECK(findings[0].feature_id == "FM-1");
  CHECK(render_message(findings[0].message, units::System::si) ==
        "force main FM-1: the DEM " + dem +
            " does not cover the line at station 20.000 m (outside the raster or no-data); its profile runs straight "
            "between the end inverts, so high points between them are not seen.");
  REQUIRE(profiles.size() == 1);
  CHECK(profiles[0].source == model::ProfileSource::end_inverts);
  CHECK(profiles[0].centreline_m == std::vector<double>{40.1, 41.1});
  std::filesystem::remove(dem);
}

TEST_CASE("force-main profile from vertex Z, or from end inverts when there is nothing else", "[force_main]") {
  auto net = network_with_main({{0, 0}, {30, 40}, {60, 80}});
  net.conduits[0].vertex_z_m = {40.0, 45.0, 41.0};
  net.conduits[0].length_m = 110.0;  // mapped length: stations scale to it
  Findings findings;
  auto profiles = gis::force_main_profiles(net, {}, findings);
  CHECK(findings.empty());
  REQUIRE(profiles.size() == 1);
  CHECK(profiles[0].source == model::ProfileSource::vertex_z);
  REQUIRE(profiles[0].station_m.size() == 3);
  CHECK(profiles[0].station_m[1] == Approx(55.0));
  CHECK(profiles[0].station_m[2] == Approx(110.0));
  CHECK(profiles[0].centreline_m[1] == Approx(45.1));
  net.conduits[0].vertex_z_m.clear();
  profiles = gis::force_main_profiles(net, {}, findings);
  REQUIRE(findings.size() == 1);
  CHECK(findings[0].severity == Severity::info);
  CHECK(findings[0].message ==
        "force main FM-1: the line has no vertex Z and no DEM is given ([force_mains] dem); its profile runs straight "
        "between the end inverts, so high points between them are not seen.");
  CHECK(profiles[0].source == model::ProfileSource::end_inverts);
}

TEST_CASE("a DEM that cannot be opened stops the run naming the file", "[force_main][dem][bad]") {
  auto net = network_with_main({{0, 0}, {10, 0}});
  model::ForceMainSettings s;
  s.dem_source = "/nonexistent/ground.tif";
  Findings findings;
  try {
    gis::force_main_profiles(net, s, findings);
    FAIL("no error");
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::bad_input);
    CHECK(std::string(e.what()).rfind("/nonexistent/ground.tif: cannot open the ground DEM as a raster", 0) == 0);
  }
}
