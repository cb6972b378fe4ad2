#pragma once
// Data-quality findings of build_topology that concern single pipes or pairs of pipes.
#include "rimline/finding.hpp"
#include "rimline/model/network.hpp"
#include "rimline/topology/build.hpp"

namespace rimline::topology {

// TOPOLOGY_DUPLICATE_ID for every conduit whose id an earlier conduit already has.
void report_duplicate_conduit_ids(const model::Network& network, Findings& findings);

// Plan length of the line: geometry_length_m when set, else measured along the vertices.
double plan_length_m(const model::Conduit& c);

// TOPOLOGY_ZERO_LENGTH for lines shorter than options.zero_length_m.
void report_zero_length(const model::Network& network, const TopologyOptions& options, Findings& findings);

// PARALLEL for every marched conduit joining the same two structures as an earlier one.
void report_parallels(const model::Network& network, const Topology& topology, Findings& findings);

}  // namespace rimline::topology
