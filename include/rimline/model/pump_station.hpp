#pragma once
// Pump stations and force mains as plain SI data: what the project file says about each station
// (levels, pump curve, fittings, discharge), the force-main criteria, and the vertical profile of a
// force main as the reader produced it. No I/O, no hydraulics.
#include <optional>
#include <string>
#include <vector>

#include "rimline/hydraulics/friction.hpp"
#include "rimline/hydraulics/pump.hpp"
#include "rimline/model/network.hpp"

namespace rimline::model {

struct PumpStation {
  std::string id;                 // the wet-well structure's id (the force main leaves it)
  double pump_on_m = 0.0;         // high wet-well level (pumps start) [m, datum of the inverts]
  double pump_off_m = 0.0;        // low wet-well level (pumps stop)
  int duty_pumps = 1;             // identical pumps that may run together (standby pumps excluded)
  std::vector<hydraulics::CurvePoint> curve;  // one pump: flow [m3/s] -> total head [m], head falling
  std::string discharge_id;       // receiving structure; empty: the end of the force-main chain
  std::optional<double> discharge_level_m;    // fixed discharge HGL instead of the gravity march's level
  double fittings_k = 0.0;        // sum of fitting K (count x K) on the main's velocity
  std::string where;              // "project.toml: line 40: pump_stations[1]" for messages
};

struct ForceMainSettings {
  std::string dem_source;         // ground DEM raster (GDAL), empty: none
  double dem_metres_per_unit = 1.0;  // the DEM's elevation unit
  double cover_m = 1.2;           // ground to pipe crown where the profile comes from the DEM
  double spacing_m = 10.0;        // DEM sample spacing along the line
  double pressure_min_m = 0.0;    // pressure head below which a point is sub-atmospheric
  double velocity_min_m_s = 0.6;  // scour (see method registry)
  double velocity_max_m_s = 2.5;
  hydraulics::FrictionLaw friction = hydraulics::FrictionLaw::hazen_williams;
  double hazen_c = 120.0;         // pipes without a project-wide C
};

enum class ProfileSource { vertex_z, dem, end_inverts };
std::string_view profile_source_name(ProfileSource s);

// One force-main conduit's vertical profile, upstream (pump) end first.
struct ForceMainProfile {
  std::size_t conduit = no_index;
  ProfileSource source = ProfileSource::end_inverts;
  std::vector<double> station_m;      // along the main from its upstream end, scaled to the conduit length
  std::vector<double> centreline_m;   // pipe centreline elevation
  std::vector<Point2> xy;             // plan position (run CRS, m)
  std::string note;                   // why a finer source was not used
};

}  // namespace rimline::model
