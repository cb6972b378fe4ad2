#pragma once
// Catchments (sub-basins draining to one inlet) and the design storm, as plain SI data.
// Read by io, used by flows (Rational Method, sanitary peak flows). No I/O, no hydraulics.
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "rimline/model/network.hpp"

namespace rimline::model {

struct Catchment {
  std::string id;  // the source layer's own id (or "fid N")
  std::int64_t fid = -1;
  double area_m2 = 0.0;                    // plan area of the polygon in the run CRS
  double runoff_c = 0.0;                   // Rational runoff coefficient, 0..1 (field, land-use composite or default)
  double inlet_time_s = 0.0;               // time for runoff to reach the inlet
  std::optional<double> population;        // persons (sanitary mode)
  std::string structure_id;                // the inlet structure named by a field, "" when not mapped / empty
  std::size_t structure = no_index;        // index into Network::structures, set by flows::assign_outlets
  std::vector<std::vector<Point2>> rings;  // exterior rings (one per part), run CRS [m]
  std::vector<std::vector<Point2>> holes;  // interior rings of all parts
  Point2 centroid;                         // [m], run CRS
};

// An intensity-duration-frequency relation for one return period:
//   formula: i = a / (t + b)^c, t and b in minutes, i in `intensity_unit` (a carries that unit x min^c);
//   table:   durations and intensities, interpolated linearly in log(t)-log(i).
struct IdfCurve {
  enum class Kind { formula, table };
  Kind kind = Kind::formula;
  std::string label;  // the return period's key in the project, e.g. "10yr"
  double a = 0.0;
  double b_min = 0.0;
  double c = 1.0;
  double intensity_si_per_unit = 1.0;   // m/s per unit of i (mm/h -> 1/3.6e6)
  std::string intensity_unit;           // its symbol, for the report
  std::vector<double> durations_s;      // table, ascending
  std::vector<double> intensities_m_s;  // table, same length
};

}  // namespace rimline::model
