#pragma once
// Flows modes "rational" and "sanitary": outlets for the catchments read, then the accumulation
// along the trees (include/rimline/flows/catchment_flows.hpp). Private to src/run.
#include "rimline/run/check_run.hpp"

namespace rimline::run {

// Fills run.catchments and run.catchment_flows; returns the design flows for the march.
flows::DesignFlows catchment_design_flows(const io::Project& project, flows::Split split, CheckRun& run);

}  // namespace rimline::run
