#pragma once
// Pump stations and their force mains: the operating point of each station at its low and high
// wet-well level with one and with all duty pumps running, and the HGL, EGL and pressure head at
// every profile point of the main. Pressure flow: friction by Hazen-Williams or Darcy-Weisbach
// along the main, the fittings' K at the pump end (valves and bends of the station), the velocity
// head lost at the outlet (exit K = 1). The main discharges at the receiving structure's HGL, or
// as a free jet at its outlet centreline when that is higher, or at a fixed level.
//
// Finding codes (layer force_mains unless said):
//   FM_SUBATMOSPHERIC  warning  pressure head below the limit (default 0 m) at a high point:
//                               air entry / column separation, an air-release valve candidate
//   FM_PRESSURE_RATING error    peak operating pressure head above the pipe's rated pressure
//   FM_VELOCITY_LOW    warning  the lowest operating velocity below the scour minimum
//   FM_VELOCITY_HIGH   warning  the highest operating velocity above the maximum
//   FM_NO_OPERATING_POINT warning/error  a case where pump and system curves do not meet (error
//                               when no case has an operating point)
//   FM_NOT_CHECKED     error    (layer project) the station cannot be laid out: unknown wet well,
//                               no force main leaving it, discharge structure not on the main, no profile;
//                      info     (layer force_mains, from src/run) a force main no station reaches
//   PUMP_CAPACITY      warning  (layer structures) the wet well's design inflow exceeds what all
//                               duty pumps deliver at the low wet-well level
//   FM_NOT_CONVERGED   warning  (run) the pumped flow and the receiving level did not settle
#include <functional>
#include <string>
#include <vector>

#include "rimline/finding.hpp"
#include "rimline/model/network.hpp"
#include "rimline/model/pump_station.hpp"
#include "rimline/topology/build.hpp"

namespace rimline::solve {

struct ForceMainPoint {
  std::size_t conduit = model::no_index;  // the force-main conduit the point lies on
  double station_m = 0.0;                 // along the main from the pump end
  double centreline_m = 0.0;              // pipe centreline elevation
  model::Point2 xy;
};

// Where a station's force main runs; found once per run.
struct StationLayout {
  bool ok = false;
  std::string note;                        // why not, when !ok
  std::size_t wet_well = model::no_index;  // structure index
  std::size_t discharge = model::no_index; // receiving structure index
  std::vector<std::size_t> chain;          // force-main conduits from the wet well to the discharge
  std::vector<ForceMainPoint> points;      // profile points along the chain, pump end first
  std::vector<model::ProfileSource> sources;  // per chain conduit
};

struct PumpCase {
  std::string label;          // "wet well high (pump on), 2 pumps"
  double wet_well_m = 0.0;
  int pumps = 1;
  bool exists = false;        // the pump and system curves meet
  double flow_m3_s = 0.0;     // total through the main
  double head_m = 0.0;        // pump total head
  double static_lift_m = 0.0; // discharge level - wet-well level
  std::vector<double> velocity_m_s;  // per chain conduit
  std::vector<double> hgl_m, egl_m, pressure_head_m;  // per profile point
};

struct StationResult {
  StationLayout layout;
  double discharge_level_m = 0.0;  // the HGL the main discharges into
  std::string discharge_basis;     // "receiving structure T-12 (gravity march)", "free outlet", "fixed level"
  std::vector<PumpCase> cases;
  std::size_t design_case = 0;     // the case with the largest flow: its flow enters the gravity network
  double design_flow_m3_s = 0.0;   // 0 when no case exists
};

// Lays out every station (findings FM_NOT_CHECKED for those that cannot be). Stations align with `specs`.
std::vector<StationLayout> lay_out_stations(const model::Network& network, const topology::Topology& topo,
                                            const std::vector<model::PumpStation>& specs,
                                            const std::vector<model::ForceMainProfile>& profiles, Findings& findings);

// The roughness a force-main conduit is solved with under the settings' friction law.
hydraulics::Roughness force_main_roughness(const model::Conduit& c, const model::ForceMainSettings& settings);

// The operating cases of one station. `receiving_hgl_m` is the receiving structure's level from the
// gravity march (NaN when not known yet).
StationResult solve_station(const model::Network& network, const model::PumpStation& spec, const StationLayout& layout,
                            const model::ForceMainSettings& settings, double receiving_hgl_m);

// Criteria findings of a solved station; `wet_well_inflow_m3_s` is the design inflow reaching the wet well.
Findings check_station(const model::Network& network, const model::PumpStation& spec, const StationResult& result,
                       const model::ForceMainSettings& settings, double wet_well_inflow_m3_s);

}  // namespace rimline::solve
