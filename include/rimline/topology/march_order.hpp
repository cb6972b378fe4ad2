#pragma once
// Third stage of build_topology: which conduits are marched, loop cuts, node in/outflows,
// main outflows, outfalls and the trees in march order (rules in build.hpp).
#include "rimline/finding.hpp"
#include "rimline/hydraulics/section.hpp"
#include "rimline/model/network.hpp"
#include "rimline/topology/build.hpp"

namespace rimline::topology {

// Full cross-section area [m^2], the measure that picks a structure's main outflow. Computed
// here from the dimensions (pi D^2 / 4, or width x height) so a bad section only yields 0.
double flow_area_m2(const hydraulics::Section& s);

// Needs Conduit::from / to set (orient_conduits). Fills status, nodes, trees, conduit_tree.
void build_march_order(const model::Network& network, Topology& topology, Findings& findings);

}  // namespace rimline::topology
