#pragma once
// Flows modes "rational" and "sanitary": outlets for the catchments read, then the accumulation
// along the trees (include/rimline/flows/catchment_flows.hpp). Private to src/run.
#include "rimline/run/check_run.hpp"

namespace rimline::run {

// Fills run.catchments with the catchments read and their outlets (also on a dry run, so its
// findings show before any march).
void assign_catchment_outlets(const config::Project& project, CheckRun& run);

// Fills run.catchment_flows (after assign_catchment_outlets); returns the design flows for the march.
flows::DesignFlows catchment_design_flows(const config::Project& project, const flows::SplitRule& split,
                                          const flows::FixedFlows& fixed, CheckRun& run, Findings& findings);

// What each structure's own catchments (and own inflow) would send down a pipe that receives
// nothing from upstream: the net inflow the network solve takes at a structure no pipe leaves yet.
std::vector<double> own_catchment_flows(const config::Project& project, const CheckRun& run);

}  // namespace rimline::run
