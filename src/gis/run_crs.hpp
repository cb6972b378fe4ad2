#pragma once
// The run CRS: lengths need a projected CRS in metres. A projected pipe layer is used as it is
// (coordinates scaled by its linear unit); a geographic one is reprojected to the WGS 84 / UTM
// zone of its extent centre. Private to src/gis.
#include <ogr_spatialref.h>

#include <memory>
#include <string>

#include "gis/gdal_source.hpp"

namespace rimline::gis::detail {

struct CoordinateTransformDeleter {
  void operator()(OGRCoordinateTransformation* t) const { OGRCoordinateTransformation::DestroyCT(t); }
};
using TransformPtr = std::unique_ptr<OGRCoordinateTransformation, CoordinateTransformDeleter>;

struct RunCrs {
  OGRSpatialReference source;    // the pipe layer's CRS (or the project's crs), traditional GIS axis order
  OGRSpatialReference run;       // the CRS coordinates are computed in
  TransformPtr to_run;           // source -> run; null when they are the same
  double metres_per_unit = 1.0;  // linear unit of the run CRS, from the CRS
  double z_metres_per_unit = 1.0;
  std::string description;  // name of the run CRS
  std::string note;         // what was done to the coordinates, "" when nothing
  std::string source_wkt;
  std::string run_wkt;
};

// UTM zone (1..60) of a longitude [deg]; the Norway/Svalbard exceptions are not applied.
int utm_zone(double longitude_deg);
// EPSG code of the WGS 84 / UTM zone containing (lon, lat): 326zz north, 327zz south.
int utm_epsg(double longitude_deg, double latitude_deg);

// Decides the run CRS from the pipe layer. Throws Error(bad_input) when the layer has no CRS
// and the project gives none, or the CRS is neither projected nor geographic.
RunCrs plan_run_crs(const OpenLayer& pipes, const std::string& crs_override);

// Transformation from another layer (structures) into the run CRS; null when it is already in it.
// The same rules for a missing CRS apply.
TransformPtr transform_into_run(const OpenLayer& layer, const RunCrs& run, const std::string& crs_override);

}  // namespace rimline::gis::detail
