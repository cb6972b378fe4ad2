#pragma once
// Where rimline's result layers are placed: the run works in metres of its own CRS, the layers are
// written in the input's CRS and its unit (results.gpkg's own layers and those src/connections adds
// to it). Private to src/report and src/connections: it includes GDAL.
#include <memory>

#include <ogr_geometry.h>
#include <ogr_spatialref.h>

#include "rimline/run/check_run.hpp"

namespace rimline::report {

// Sets `out_srs` to the input's CRS (or the run's when the input had none) and, where the two
// differ, `to_source` to the transformation from the run's CRS (`run_srs`) to it.
inline void place_layers(const run::CheckRun& run, OGRSpatialReference& out_srs, OGRSpatialReference& run_srs,
                         std::unique_ptr<OGRCoordinateTransformation>& to_source) {
  const auto& net = run.read.network;
  if (!run.read.source_crs_wkt.empty()) out_srs.importFromWkt(run.read.source_crs_wkt.c_str());
  else if (!net.crs_wkt.empty()) out_srs.importFromWkt(net.crs_wkt.c_str());
  out_srs.SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
  if (!net.crs_wkt.empty() && !run.read.source_crs_wkt.empty()) {
    run_srs.importFromWkt(net.crs_wkt.c_str());
    run_srs.SetAxisMappingStrategy(OAMS_TRADITIONAL_GIS_ORDER);
    if (!run_srs.IsSame(&out_srs)) to_source.reset(OGRCreateCoordinateTransformation(&run_srs, &out_srs));
  }
}

// A point of the run (metres of its CRS) in the layers' CRS and unit.
inline void place_point(const run::CheckRun& run, OGRCoordinateTransformation* to_source, double& x, double& y) {
  const double k = run.read.network.crs_metres_per_unit;
  x /= k;
  y /= k;
  if (to_source) to_source->Transform(1, &x, &y);  // GDAL's Transform is not const
}

// A pipe's plan line in the layers' CRS (fewer than two points: the caller leaves it without geometry).
inline OGRLineString plan_line(const run::CheckRun& run, OGRCoordinateTransformation* to_source,
                               const model::Conduit& c) {
  OGRLineString line;
  for (const auto& v : c.vertices) {
    double x = v.x, y = v.y;
    place_point(run, to_source, x, y);
    line.addPoint(x, y);
  }
  return line;
}

}  // namespace rimline::report
