// Force-main vertical profiles: vertex Z, else DEM minus cover, else end inverts. GDAL stays here.
#include "rimline/gis/force_main_profile.hpp"

#include <gdal_priv.h>
#include <ogr_spatialref.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <mutex>

#include "gis/gdal_source.hpp"
#include "gis/run_crs.hpp"
#include "rimline/error.hpp"

namespace rimline::gis {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();
using units::Dimension;

double distance(model::Point2 a, model::Point2 b) { return std::hypot(b.x - a.x, b.y - a.y); }

// Vertices plus points every `spacing` between them, with plan stations from the upstream end.
void densify(const std::vector<model::Point2>& vertices, double spacing, std::vector<model::Point2>& xy,
             std::vector<double>& plan_station) {
  double s = 0.0;
  for (std::size_t k = 0; k < vertices.size(); ++k) {
    if (k > 0) {
      const double seg = distance(vertices[k - 1], vertices[k]);
      const int steps = spacing > 0.0 ? static_cast<int>(std::floor(seg / spacing)) : 0;
      for (int i = 1; i <= steps; ++i) {
        const double t = i * spacing / seg;
        if (t >= 1.0 - 1e-9) break;
        xy.push_back({vertices[k - 1].x + t * (vertices[k].x - vertices[k - 1].x),
                      vertices[k - 1].y + t * (vertices[k].y - vertices[k - 1].y)});
        plan_station.push_back(s + t * seg);
      }
      s += seg;
    }
    xy.push_back(vertices[k]);
    plan_station.push_back(s);
  }
}

// Plan stations scaled so the profile's end station equals the conduit's (mapped) length.
std::vector<double> scaled(std::vector<double> plan, double length_m) {
  const double total = plan.empty() ? 0.0 : plan.back();
  if (total > 0.0)
    for (double& s : plan) s *= length_m / total;
  return plan;
}

std::optional<double> end_invert(const model::Network& n, const model::Conduit& c, bool up) {
  if (up ? c.invert_up_m : c.invert_down_m) return up ? c.invert_up_m : c.invert_down_m;
  const std::size_t s = up ? c.from : c.to;
  if (s != model::no_index) return n.structures[s].invert_m;
  return std::nullopt;
}

bool has_vertex_z(const model::Conduit& c) {
  if (c.vertex_z_m.size() != c.vertices.size() || c.vertices.size() < 2) return false;
  for (double z : c.vertex_z_m)
    if (!std::isfinite(z) || z != 0.0) return true;  // an all-zero Z is a 2D line stored as 3D
  return false;
}

struct Dem {
  GDALDatasetUniquePtr dataset;
  GDALRasterBand* band = nullptr;
  double inverse[6] = {};
  detail::TransformPtr to_dem;  // run CRS -> DEM CRS; null when the same or unknown
  int has_nodata = 0;
  double nodata = 0.0;
};

Dem open_dem(const std::string& source, const model::Network& network, int band = 1) {
  static std::once_flag once;
  std::call_once(once, [] { GDALAllRegister(); });
  detail::check_source_files(source, "force-main ground DEM");  // a FIFO would block the open
  detail::GdalErrorCapture capture;
  Dem d;
  d.dataset.reset(GDALDataset::Open(source.c_str(), GDAL_OF_RASTER | GDAL_OF_READONLY));
  if (!d.dataset || d.dataset->GetRasterCount() < 1)
    throw Error(ErrorKind::bad_input, ErrorContext{source, "", "", ""},
                "cannot open the ground DEM as a raster" +
                    (capture.last_error().empty() ? std::string() : ": " + capture.last_error()));
  if (band < 1 || band > d.dataset->GetRasterCount())
    throw Error(ErrorKind::bad_input, ErrorContext{source, "", "", ""},
                "the raster has " + std::to_string(d.dataset->GetRasterCount()) + " band(s); band " +
                    std::to_string(band) + " was asked for");
  d.band = d.dataset->GetRasterBand(band);
  double gt[6];
  if (d.dataset->GetGeoTransform(gt) != CE_None || !GDALInvGeoTransform(gt, d.inverse))
    throw Error(ErrorKind::bad_input, ErrorContext{source, "", "", ""}, "the DEM has no usable geotransform");
  d.nodata = d.band->GetNoDataValue(&d.has_nodata);
  const OGRSpatialReference* dem_srs = d.dataset->GetSpatialRef();
  if (dem_srs && !network.crs_wkt.empty()) {
    OGRSpatialReference run, dem(*dem_srs);
    run.importFromWkt(network.crs_wkt.c_str());
    run.SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
    dem.SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
    if (!run.IsSame(&dem)) {
      d.to_dem.reset(OGRCreateCoordinateTransformation(&run, &dem));
      if (!d.to_dem)
        throw Error(ErrorKind::bad_input, ErrorContext{source, "", "", ""},
                    "the DEM's CRS cannot be reached from the run CRS " + network.crs_description);
    }
  }
  return d;
}

double sample(Dem& d, const model::Network& network, model::Point2 p_m, double metres_per_unit) {
  double x = p_m.x / network.crs_metres_per_unit, y = p_m.y / network.crs_metres_per_unit;
  if (d.to_dem && !d.to_dem->Transform(1, &x, &y)) return nan;
  // Continuous pixel coordinates; pixel centres sit at .5, so bilinear weights come from x - 0.5.
  const double col = d.inverse[0] + d.inverse[1] * x + d.inverse[2] * y - 0.5;
  const double row = d.inverse[3] + d.inverse[4] * x + d.inverse[5] * y - 0.5;
  const int w = d.band->GetXSize(), h = d.band->GetYSize();
  if (w < 2 || h < 2 || col < -0.5 || row < -0.5 || col > w - 0.5 || row > h - 0.5) return nan;
  // Within half a pixel of the edge the edge pair of pixels is used (the weight clamps to 0 or 1).
  const int c0 = std::clamp(static_cast<int>(std::floor(col)), 0, w - 2);
  const int r0 = std::clamp(static_cast<int>(std::floor(row)), 0, h - 2);
  double v[4] = {0, 0, 0, 0};
  if (d.band->RasterIO(GF_Read, c0, r0, 2, 2, v, 2, 2, GDT_Float64, 0, 0, nullptr) != CE_None) return nan;
  for (double z : v)
    if (!std::isfinite(z) || (d.has_nodata && z == d.nodata)) return nan;
  const double fx = std::clamp(col - c0, 0.0, 1.0), fy = std::clamp(row - r0, 0.0, 1.0);
  const double top = v[0] * (1 - fx) + v[1] * fx, bottom = v[2] * (1 - fx) + v[3] * fx;
  return (top * (1 - fy) + bottom * fy) * metres_per_unit;
}

void coarse(const model::Conduit& c, Severity sev, const std::string& why, Findings& findings) {
  findings.push_back({"FM_PROFILE_COARSE", sev, LayerRole::force_mains, c.id, "", nan, nan, Dimension::length,
                      "force main " + c.id + ": " + why +
                          "; its profile runs straight between the end inverts, so high points between them are not seen."});
}

}  // namespace

std::vector<double> sample_dem(const std::string& dem_source, double dem_metres_per_unit, const model::Network& network,
                               const std::vector<model::Point2>& points_m, int band) {
  Dem d = open_dem(dem_source, network, band);
  std::vector<double> out;
  out.reserve(points_m.size());
  for (const auto& p : points_m) out.push_back(sample(d, network, p, dem_metres_per_unit));
  return out;
}

std::vector<model::ForceMainProfile> force_main_profiles(const model::Network& network,
                                                         const model::ForceMainSettings& settings, Findings& findings) {
  std::vector<model::ForceMainProfile> out;
  std::optional<Dem> dem;
  for (std::size_t ci = 0; ci < network.conduits.size(); ++ci) {
    const auto& c = network.conduits[ci];
    if (!c.force_main || !c.usable || c.vertices.size() < 2) continue;
    model::ForceMainProfile p;
    p.conduit = ci;
    const double half = 0.5 * hydraulics::rise_m(c.section);
    if (has_vertex_z(c)) {
      p.source = model::ProfileSource::vertex_z;
      std::vector<double> plan{0.0};
      for (std::size_t k = 1; k < c.vertices.size(); ++k) plan.push_back(plan.back() + distance(c.vertices[k - 1], c.vertices[k]));
      p.station_m = scaled(plan, c.length_m);
      p.xy = c.vertices;
      for (double z : c.vertex_z_m) p.centreline_m.push_back(z + half);
      out.push_back(std::move(p));
      continue;
    }
    std::string why = "the line has no vertex Z and no DEM is given ([force_mains] dem)";
    if (!settings.dem_source.empty()) {
      if (!dem) dem = open_dem(settings.dem_source, network);
      std::vector<model::Point2> xy;
      std::vector<double> plan;
      densify(c.vertices, settings.spacing_m, xy, plan);
      std::vector<double> ground;
      std::size_t uncovered = model::no_index;
      for (std::size_t k = 0; k < xy.size(); ++k) {
        ground.push_back(sample(*dem, network, xy[k], settings.dem_metres_per_unit));
        if (!std::isfinite(ground.back()) && uncovered == model::no_index) uncovered = k;
      }
      const auto stations = scaled(plan, c.length_m);
      if (uncovered == model::no_index) {
        p.source = model::ProfileSource::dem;
        p.station_m = stations;
        p.xy = std::move(xy);
        for (double g : ground) p.centreline_m.push_back(g - settings.cover_m - half);
        out.push_back(std::move(p));
        continue;
      }
      why = "the DEM " + settings.dem_source + " does not cover the line at station " +
            q(stations[uncovered], Dimension::length) + " (outside the raster or no-data)";
      coarse(c, Severity::warning, why, findings);
    } else {
      coarse(c, Severity::info, why, findings);
    }
    p.source = model::ProfileSource::end_inverts;
    p.note = why;
    const auto up = end_invert(network, c, true), down = end_invert(network, c, false);
    if (!up || !down) {
      p.note = "no invert at one of its ends";
      out.push_back(std::move(p));  // empty profile: the solve reports it
      continue;
    }
    p.station_m = {0.0, c.length_m};
    p.centreline_m = {*up + half, *down + half};
    p.xy = {c.vertices.front(), c.vertices.back()};
    out.push_back(std::move(p));
  }
  return out;
}

}  // namespace rimline::gis
