#pragma once
// Second stage of build_topology: sets Conduit::from / to and turns pipes digitised against
// the flow, by the orientation rule documented in build.hpp.
#include <cstddef>

#include "rimline/finding.hpp"
#include "rimline/model/network.hpp"
#include "rimline/topology/build.hpp"
#include "rimline/topology/connect.hpp"

namespace rimline::topology {

// Reverses the plan geometry only: end points, directions (negated and swapped), vertices, Z.
void turn_geometry(model::Conduit& c);
// turn_geometry plus the inverts (invert_up_m <-> invert_down_m), for inverts tied to the line's ends.
void turn_conduit(model::Conduit& c);

// Sets from/to (indices and ids) of every conduit; returns how many were turned.
std::size_t orient_conduits(model::Network& network, const Connection& connection, const TopologyOptions& options,
                            Findings& findings);

}  // namespace rimline::topology
