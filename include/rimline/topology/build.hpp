#pragma once
// Connects pipes to structures, orients them with the flow, finds outfalls and their
// upstream trees, and reports what does not fit (loops, parallels, unsnapped ends ...).
#include <vector>

#include "rimline/finding.hpp"
#include "rimline/model/network.hpp"

namespace rimline::topology {

struct TopologyOptions {
  double snap_tolerance_m = 0.5;
};

struct Node {
  std::vector<std::size_t> inflows;   // conduit indices arriving here
  std::vector<std::size_t> outflows;  // conduit indices leaving here
  bool diversion = false;             // more than one outflow
  bool outfall = false;
};

// One outfall and everything upstream of it, in march order: structures from the outfall
// upstream (each after the structure it drains to), conduits likewise.
struct Tree {
  std::size_t outfall = model::no_index;
  std::vector<std::size_t> structures;  // march order (outfall first)
  std::vector<std::size_t> conduits;    // march order (the outfall's inflows first)
};

struct Topology {
  std::vector<Node> nodes;   // aligned with Network::structures
  std::vector<Tree> trees;
  // Deflection [deg] of each conduit's arrival direction against the main outflow of its
  // downstream structure (0 = straight through); NaN where undefined. Aligned with conduits.
  std::vector<double> deflection_deg;
};

// Completes the network in place (from/to indices, orientation, derived structures) and
// returns the topology. Never throws for data problems; they are appended to findings.
Topology build_topology(model::Network& network, const TopologyOptions& options, Findings& findings);

}  // namespace rimline::topology
