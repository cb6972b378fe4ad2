#pragma once
// The report's network-solve section: which components the solve took, how the design flows
// settled with it, and the convergence of every tailwater case. Private to src/report.
#include <string>

#include "rimline/run/check_run.hpp"

namespace rimline::report {

// "" when no component went to the network solve (every one a tree the march took as it is).
std::string network_solve_section(const run::CheckRun& run);

// Units for the small figures of the solve (continuity error, level change): L/s and mm, or gpm
// and in (the run's unit system, a finer unit than its flows and levels).
units::Unit small_flow_unit(units::System s);
units::Unit small_length_unit(units::System s);

}  // namespace rimline::report
