#include "gis/run_crs.hpp"

#include <cpl_conv.h>

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "gis/value_checks.hpp"
#include "rimline/error.hpp"

namespace rimline::gis::detail {
namespace {

std::string to_wkt(const OGRSpatialReference& srs) {
  char* text = nullptr;
  const char* options[] = {"FORMAT=WKT2_2018", nullptr};
  srs.exportToWkt(&text, options);
  std::string out = text ? text : "";
  CPLFree(text);
  return out;
}

// "WGS 84 (EPSG:4326)" or just the name when the CRS has no authority code.
std::string label(const OGRSpatialReference& srs) {
  std::string out = srs.GetName() ? srs.GetName() : "unnamed CRS";
  const char* auth = srs.GetAuthorityName(nullptr);
  const char* code = srs.GetAuthorityCode(nullptr);
  if (auth && code) out += std::string(" (") + auth + ":" + code + ")";
  return out;
}

// The layer's CRS, or the project's crs when the layer has none.
OGRSpatialReference layer_crs(const OpenLayer& l, const std::string& crs_override) {
  OGRSpatialReference srs;
  const OGRSpatialReference* own = l.layer->GetSpatialRef();
  // A GeoPackage layer without a CRS points at srs_id 0 or -1, which GDAL reads back as
  // "Undefined geographic SRS" / "Undefined Cartesian SRS" (OGC GeoPackage 1.3, Requirement 11):
  // no CRS at all, not a geographic one.
  if (own && !own->GetAuthorityCode(nullptr) && own->GetName() &&
      (std::string(own->GetName()) == "Undefined geographic SRS" || std::string(own->GetName()) == "Undefined Cartesian SRS"))
    own = nullptr;
  if (own) {
    srs = *own;
  } else if (!crs_override.empty()) {
    GdalErrorCapture capture;
    if (srs.SetFromUserInput(crs_override.c_str()) != OGRERR_NONE)
      throw Error(ErrorKind::bad_config, ErrorContext{l.source, l.layer_name, "", ""},
                  "the project's crs \"" + crs_override + "\" is not a CRS GDAL/PROJ knows: " + capture.last_error());
  } else {
    throw Error(ErrorKind::bad_input, ErrorContext{l.source, l.layer_name, "", ""},
                "the layer has no CRS; set crs = \"EPSG:....\" in [project] to say which one its coordinates are in");
  }
  // Coordinates from OGR geometries are x = easting/longitude, y = northing/latitude.
  srs.SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
  return srs;
}

TransformPtr make_transform(const OGRSpatialReference& from, const OGRSpatialReference& to, const OpenLayer& l) {
  GdalErrorCapture capture;
  TransformPtr t(OGRCreateCoordinateTransformation(&from, &to));
  if (!t)
    throw Error(ErrorKind::bad_input, ErrorContext{l.source, l.layer_name, "", ""},
                "cannot transform from " + label(from) + " to " + label(to) + ": " + capture.last_error());
  return t;
}

std::string format_factor(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.10g", v);
  return buf;
}

}  // namespace

int utm_zone(double longitude_deg) {
  const int zone = static_cast<int>(std::floor((longitude_deg + 180.0) / 6.0)) + 1;
  return std::clamp(zone, 1, 60);
}

int utm_epsg(double longitude_deg, double latitude_deg) {
  return (latitude_deg < 0.0 ? 32700 : 32600) + utm_zone(longitude_deg);
}

namespace {

// Projected coordinates (metres, feet) declared as a geographic CRS: every feature failed its
// transform one by one and the run ended with an empty network (issue 18). Said once instead:
// longitude and latitude have their ranges, and the CRS its area of use (EPSG, in degrees; 1 degree
// of slack for features drawn just past its edge).
void require_in_area_of_use(const OpenLayer& pipes, const OGRSpatialReference& crs, const OGREnvelope& e) {
  double west = -180.0, south = -90.0, east = 180.0, north = 90.0;
  const char* area = nullptr;
  const bool known = crs.GetAreaOfUse(&west, &south, &east, &north, &area) && west <= east;  // not across 180
  const bool in_range = e.MinX >= -180.0 && e.MaxX <= 360.0 && e.MinY >= -90.0 && e.MaxY <= 90.0;
  const bool in_area = !known || (e.MinX >= west - 1.0 && e.MaxX <= east + 1.0 && e.MinY >= south - 1.0 &&
                                  e.MaxY <= north + 1.0);
  if (in_range && in_area) return;
  const std::string extent = "x " + format_number(e.MinX) + " to " + format_number(e.MaxX) + ", y " +
                             format_number(e.MinY) + " to " + format_number(e.MaxY);
  std::string why = in_range ? "outside its area of use (" + std::string(area ? area : "") + ": longitude " +
                                   format_number(west) + " to " + format_number(east) + ", latitude " +
                                   format_number(south) + " to " + format_number(north) + ")"
                             : "not longitudes and latitudes (they look like projected metres or feet)";
  throw Error(ErrorKind::bad_input, ErrorContext{pipes.source, pipes.layer_name, "", ""},
              "the layer's CRS " + label(crs) + " is geographic, but its coordinates (" + extent + ") are " + why +
                  "; declare the CRS the coordinates are in ([project] crs = \"EPSG:...\")");
}

}  // namespace

RunCrs plan_run_crs(const OpenLayer& pipes, const std::string& crs_override) {
  RunCrs r;
  r.source = layer_crs(pipes, crs_override);
  r.source_wkt = to_wkt(r.source);
  if (r.source.IsGeographic()) {
    OGREnvelope extent;
    {
      GdalErrorCapture capture;
      if (pipes.layer->GetExtent(&extent, TRUE) != OGRERR_NONE)
        throw Error(ErrorKind::bad_input, ErrorContext{pipes.source, pipes.layer_name, "", ""},
                    "the layer's CRS is geographic and its extent cannot be computed to choose a projection");
    }
    require_in_area_of_use(pipes, r.source, extent);
    const double lon = 0.5 * (extent.MinX + extent.MaxX);
    const double lat = 0.5 * (extent.MinY + extent.MaxY);
    const int epsg = utm_epsg(lon, lat);
    r.run.importFromEPSG(epsg);
    r.run.SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
    r.to_run = make_transform(r.source, r.run, pipes);
    r.note = "The pipe layer's CRS " + label(r.source) + " is geographic; coordinates were reprojected to " +
             label(r.run) + ", the UTM zone of the layer's extent centre, to measure lengths.";
  } else if (r.source.IsProjected() || r.source.IsLocal()) {
    r.run = r.source;
    const char* unit_name = nullptr;
    r.metres_per_unit = r.source.GetLinearUnits(&unit_name);
    if (!(r.metres_per_unit > 0.0)) r.metres_per_unit = 1.0;
    if (r.metres_per_unit != 1.0)
      r.note = "The pipe layer's CRS " + label(r.source) + " is in " + (unit_name ? unit_name : "a non-metre unit") +
               "; coordinates were scaled to metres (1 unit = " + format_factor(r.metres_per_unit) + " m).";
  } else {
    throw Error(ErrorKind::bad_input, ErrorContext{pipes.source, pipes.layer_name, "", ""},
                "the layer's CRS " + label(r.source) + " is neither projected nor geographic");
  }
  // Z: the vertical CRS's unit when the CRS is compound; otherwise assumed in the horizontal
  // unit of a projected CRS (US state-plane exports carry elevations in feet) and metres otherwise.
  if (r.source.IsCompound())
    r.z_metres_per_unit = r.source.GetTargetLinearUnits("VERT_CS");
  else
    r.z_metres_per_unit = r.to_run ? 1.0 : r.metres_per_unit;
  if (!(r.z_metres_per_unit > 0.0)) r.z_metres_per_unit = 1.0;
  r.run_wkt = to_wkt(r.run);
  r.description = r.run.GetName() ? r.run.GetName() : "";
  return r;
}

TransformPtr transform_into_run(const OpenLayer& layer, const RunCrs& run, const std::string& crs_override) {
  const OGRSpatialReference srs = layer_crs(layer, crs_override);
  if (srs.IsGeographic()) {  // every layer, not only the pipes, may declare the wrong CRS
    OGREnvelope extent;
    GdalErrorCapture capture;
    if (layer.layer->GetExtent(&extent, TRUE) == OGRERR_NONE) require_in_area_of_use(layer, srs, extent);
  }
  if (srs.IsSame(&run.source)) {
    if (!run.to_run) return nullptr;
    return make_transform(srs, run.run, layer);
  }
  if (srs.IsSame(&run.run)) return nullptr;
  return make_transform(srs, run.run, layer);
}

}  // namespace rimline::gis::detail
