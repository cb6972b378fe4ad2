#pragma once
// Pump stations inside one check: laying them out on the network, solving them against the
// receiving structures' levels, and what their wet wells receive. Private to src/run.
#include <vector>

#include "rimline/run/check_run.hpp"

namespace rimline::run {

// Adds the stations of a point layer to run.project, reads the force-main profiles and lays the
// stations out on the network; FM_NOT_CHECKED for force mains no station reaches.
std::vector<solve::StationLayout> lay_out_pump_stations(const config::Project& project, CheckRun& run);

// Fills run.pump_stations: each station solved against its receiving structure's level (NaN: none yet).
void solve_pump_stations(const config::Project& project, const std::vector<solve::StationLayout>& layouts,
                         const std::vector<double>& receiving_level_m, CheckRun& run);

// The receiving structures' levels after the march: the highest HGL over the tailwater cases.
std::vector<double> receiving_levels(const std::vector<solve::StationLayout>& layouts, const CheckRun& run);

// Design inflow reaching each station's wet well: the gravity pipes arriving there, plus the
// structure's own inflow in mode structure_inflows.
std::vector<double> wet_well_inflows(const std::vector<solve::StationLayout>& layouts,
                                     const flows::FlowOptions& flow_opt, const CheckRun& run);

}  // namespace rimline::run
