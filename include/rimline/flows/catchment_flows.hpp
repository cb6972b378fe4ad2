#pragma once
// Design flows from catchments, along each tree in upstream-first order:
//  - storm: the Rational Method. Tc at a pipe = the longest of (inlet time + travel time through
//    the pipes between) over the catchments upstream; Q = i(Tc) * sum(C A) upstream, SI throughout
//    (i in m/s, A in m^2, so no unit constant). Travel time = length / velocity, the velocity at normal
//    depth for the pipe's own design flow (known before the pipe's travel time is needed, so the
//    march need not iterate), or full-flow velocity by option; full flow also where normal depth does
//    not exist (Q above the partly-full peak), none at all (slope <= 0, no inverts): travel time 0,
//    which keeps Tc short and the intensity high.
//  - sanitary: population accumulated downstream; Q = PF(P) * q * P + infiltration allowance (per
//    length of the pipes upstream, this one included, or per contributing catchment area).
// Both add the structures' own inflows (Structure::inflow_m3_s) accumulated downstream.
// A conduit with a fixed flow (a force main carrying its pump station's design flow) passes that
// flow on as a constant inflow and stops the catchment quantities (area, C A, Tc, population): the
// wet well's storage decouples the pumped flow from the storm's timing.
// At a diversion every accumulated quantity (area, C A, population, lengths, inflows) is split by
// the same shares as the design flows (flows::diversion_shares).
// Findings: IDF_EXTRAPOLATED (warning) Tc outside the IDF table; TRAVEL_VELOCITY (info) a pipe whose
// travel time falls back as above.
#include <functional>
#include <limits>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "rimline/finding.hpp"
#include "rimline/flows/design_flows.hpp"
#include "rimline/model/catchment.hpp"

namespace rimline::flows {

enum class TravelVelocity { normal_depth, full_flow };
enum class Peaking { harmon, constant };

struct StormOptions {
  model::IdfCurve idf;
  TravelVelocity velocity = TravelVelocity::normal_depth;
};

struct SanitaryOptions {
  double per_capita_m3_s = 0.0;  // average daily flow per person
  Peaking peaking = Peaking::harmon;
  double peaking_constant = 1.0;  // Peaking::constant
  std::optional<double> infiltration_per_length_m3_s_m;
  std::optional<double> infiltration_per_area_m3_s_m2;
};

// What arrives locally at one structure (the sum of its catchments).
struct LocalInflow {
  double area_m2 = 0.0;
  double ca_m2 = 0.0;
  double inlet_time_s = std::numeric_limits<double>::quiet_NaN();  // longest inlet time; NaN: no catchment
  double population = 0.0;
  double inflow_m3_s = 0.0;  // the structure's own inflow
};

struct PipeDesign {
  double area_m2 = 0.0;                                    // contributing area
  double ca_m2 = 0.0;                                      // sum of C A
  double tc_s = std::numeric_limits<double>::quiet_NaN();  // at the pipe's upstream end
  double intensity_m_s = std::numeric_limits<double>::quiet_NaN();
  double travel_time_s = 0.0;  // through this pipe
  double travel_velocity_m_s = std::numeric_limits<double>::quiet_NaN();
  double population = 0.0;
  double peaking_factor = std::numeric_limits<double>::quiet_NaN();
  double infiltration_m3_s = 0.0;
  double flow_m3_s = std::numeric_limits<double>::quiet_NaN();
};

enum class CatchmentMode { storm, sanitary };

struct CatchmentFlows {
  CatchmentMode mode = CatchmentMode::storm;
  DesignFlows flows;              // aligned with conduits, fed to the march
  std::vector<PipeDesign> pipes;  // aligned with conduits
  std::string method;             // one line for the summary and the report
};

// Per-pipe travel time [s] for its design flow; the hand-checked tests pass their own.
using TravelTimeFn = std::function<double(std::size_t conduit, double flow_m3_s, PipeDesign& out)>;

// The accumulation itself, on given local inflows (aligned with structures).
using FixedFlows = std::map<std::size_t, double>;  // conduit index -> flow [m3/s]
CatchmentFlows storm_along_tree(const model::Network& network, const topology::Topology& topo,
                                const std::vector<LocalInflow>& local, const model::IdfCurve& idf,
                                const TravelTimeFn& travel, const SplitRule& split, Findings& findings,
                                const FixedFlows& fixed = {});
CatchmentFlows sanitary_along_tree(const model::Network& network, const topology::Topology& topo,
                                   const std::vector<LocalInflow>& local, const SanitaryOptions& options, const SplitRule& split,
                                   const FixedFlows& fixed = {});

// Local inflows from the catchments (each with its outlet structure set) and the structures' own
// inflows and populations.
std::vector<LocalInflow> local_inflows(const model::Network& network, const std::vector<model::Catchment>& catchments);

// Travel time from the pipe's velocity, as stated at the top.
TravelTimeFn velocity_travel_time(const model::Network& network, TravelVelocity velocity, Findings& findings);

}  // namespace rimline::flows
