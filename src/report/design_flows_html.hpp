#pragma once
// The report's "Design flows" section for flows modes "rational" and "sanitary": the method, the
// IDF relation or sanitary parameters, the catchments and the per-pipe figures. Private to src/report.
#include <string>

#include "rimline/run/check_run.hpp"

namespace rimline::report {

// "" when the run's flows do not come from catchments.
std::string design_flows_section(const run::CheckRun& run);

}  // namespace rimline::report
