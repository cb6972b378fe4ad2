#pragma once
// The energy budget of one structure in report.html, written to teach as well as to check: the level
// at the outfall, then every term up the governing route (velocity, V^2/2g, K, length and friction
// slope per step), the structure's HGL, and how it stands against the rim: freeboard, the required
// freeboard and the shortfall. A sentence above the table splits the height of the HGL above the
// outfall's invert into the tailwater's share and the losses' (structures, pipe friction, exits),
// so a reviewer sees at once whether the tailwater or the network decides the level here.
// Private to src/report.
#include <cstddef>
#include <string>

#include "rimline/run/check_run.hpp"

namespace rimline::report {

// Empty when the structure was not solved in the case that governs its HGL.
std::string budget_html(const run::CheckRun& run, std::size_t structure);

}  // namespace rimline::report
