#pragma once
// The report's pump-station section: per station its inputs, the discharge level it was solved
// against, and the operating point of every case. Private to src/report.
#include <string>

#include "rimline/run/check_run.hpp"

namespace rimline::report {

// "" when the project has no pump stations.
std::string pump_stations_section(const run::CheckRun& run);

}  // namespace rimline::report
