#pragma once
// Design flow in every conduit: read per pipe, or local inflows at structures accumulated
// downstream through the network, split at diversions by a rule.
#include <map>
#include <vector>

#include "rimline/finding.hpp"
#include "rimline/model/network.hpp"
#include "rimline/topology/build.hpp"

namespace rimline::flows {

enum class Mode { pipe_field, structure_inflows };
// How a diversion's flow is shared among its outflows: in proportion to full capacity, by the
// pipes' split fractions (a field, or [flows.shares] in the project), or by the network solve
// (the shares of the flows it found, solve/network_solve.hpp).
enum class Split { capacity, field, hydraulic };

struct SplitRule {
  Split split = Split::capacity;
  // Split::hydraulic: each conduit's share of the flow leaving its upstream structure, aligned
  // with conduits; NaN (or an empty vector, or shares at a structure summing to zero) falls back
  // to the capacity rule, which is also the first guess before any solve.
  std::vector<double> share;
  SplitRule() = default;
  SplitRule(Split s) : split(s) {}  // NOLINT(google-explicit-constructor): a bare rule reads as itself
};

struct FlowOptions {
  Mode mode = Mode::pipe_field;
  SplitRule split;
  hydraulics::FrictionLaw friction = hydraulics::FrictionLaw::manning;
  double default_inflow_m3_s = 0.0;  // structures without an inflow value (structure_inflows mode)
  // Conduits whose flow is set from outside, by conduit index: force mains carry the pumped flow
  // (solve/force_main.hpp), which replaces the field or the accumulated flow in every mode.
  std::map<std::size_t, double> fixed_conduit_flow_m3_s;
};

struct DesignFlows {
  std::vector<double> flow_m3_s;    // aligned with conduits; NaN where it could not be set
  std::vector<bool> filled;         // pipe_field mode: value missing, set to the sum of inflows
};

// Conduits in an order where every conduit comes after all conduits draining into its
// upstream structure (Kahn's algorithm over usable conduits). Conduits on a cycle are left out.
std::vector<std::size_t> upstream_first_order(const model::Network& network, const topology::Topology& topo);

// Share of each of a structure's outflows (`outs`, conduit indices) at a diversion, summing to 1:
// the split fractions, the solved shares, or in proportion to full capacity; one outflow takes all.
std::vector<double> diversion_shares(const model::Network& network, const std::vector<std::size_t>& outs,
                                     const SplitRule& split);

DesignFlows design_flows(const model::Network& network, const topology::Topology& topo, const FlowOptions& options,
                         Findings& findings);

}  // namespace rimline::flows
