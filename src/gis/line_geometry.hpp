#pragma once
// Pipe and structure geometry from OGR: transformed into the run CRS, scaled to metres, and a
// MultiLineString whose parts join end to end merged into one line. Private to src/gis.
#include <ogr_geometry.h>

#include <string>
#include <vector>

#include "rimline/model/network.hpp"

namespace rimline::gis::detail {

struct Placement {
  OGRCoordinateTransformation* to_run = nullptr;  // null: already in the run CRS
  double metres_per_unit = 1.0;
  double z_metres_per_unit = 1.0;
};

enum class LineStatus { ok, merged, missing, wrong_type, gap, transform_failed };

struct LineOutcome {
  LineStatus status = LineStatus::ok;
  std::string type_name;  // the OGR geometry type, for messages ("Point", "MultiLineString")
  int parts = 1;
  double gap_m = 0.0;  // smallest gap left when the parts could not be joined
};

// Fills xy (and z when the geometry has Z; else z is cleared) with the line as digitised.
// Parts of a MultiLineString are chained greedily by their nearest free ends (turning a part
// when needed) while the gap is within tolerance_m. `g` may be modified (transformed in place).
LineOutcome read_line(OGRGeometry* g, const Placement& where, double tolerance_m, std::vector<model::Point2>& xy,
                      std::vector<double>& z);

// Plan length of a polyline [m].
double plan_length_m(const std::vector<model::Point2>& xy);

// Unit vector of the first (leaving the first vertex) and last (arriving at the last vertex)
// non-degenerate segments; (0, 0) when the line has no length.
model::Point2 start_direction(const std::vector<model::Point2>& xy);
model::Point2 end_direction(const std::vector<model::Point2>& xy);

enum class PointStatus { ok, missing, wrong_type, transform_failed };
PointStatus read_point(OGRGeometry* g, const Placement& where, model::Point2& out, std::string& type_name);

}  // namespace rimline::gis::detail
