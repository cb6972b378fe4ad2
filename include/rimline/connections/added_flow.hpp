#pragma once
// Where a flow added at one structure goes: every conduit downstream of it and the share of the
// added flow each carries, split at diversions by the run's rule (flows::diversion_shares), so an
// added inflow changes the design flows exactly as an inflow of that size at the structure would
// in flows mode "structure_inflows". The walk stops at a pump wet well: its force main carries the
// pumps' flow, not what arrives (the pump stations are not re-solved for an added flow).
// In the other flows modes (pipe_field, rational, sanitary) the added flow joins as a constant
// inflow on top of the design flows, as a pumped flow does.
#include <cstddef>
#include <utility>
#include <vector>

#include "rimline/config/proposal.hpp"
#include "rimline/flows/design_flows.hpp"
#include "rimline/model/network.hpp"
#include "rimline/topology/build.hpp"

namespace rimline::connections {

struct FlowShare {
  std::size_t conduit = model::no_index;
  double share = 0.0;  // of the flow added at the structure
};

// `rank`: solve::march_rank of the network (downstream first). Conduits in downstream order of
// their upstream structure; empty for an outfall or a structure no marched pipe leaves.
std::vector<FlowShare> added_flow_path(const model::Network& network, const topology::Topology& topo,
                                       const flows::SplitRule& split, const std::vector<std::size_t>& rank, std::size_t structure);

// Adds each inflow along its path to `flow_m3_s` (aligned with the conduits). An inflow at an
// unknown structure is an UNKNOWN_ID finding; one at a structure no pipe leaves, a warning
// (PROPOSAL_NOT_APPLIED), and is left out.
void add_inflows(const std::vector<config::AddedInflow>& inflows, const model::Network& network,
                 const topology::Topology& topo, const flows::SplitRule& split, std::vector<double>& flow_m3_s,
                 Findings& findings);

// [[proposal.pipes]]: sizes, Manning's n and inverts replaced in the network as read. A pipe id the
// network lacks is an UNKNOWN_ID finding; each change applied is a PROPOSAL_CHANGE info finding.
void apply_pipe_changes(const std::vector<config::PipeChange>& changes, model::Network& network, Findings& findings);

}  // namespace rimline::connections
