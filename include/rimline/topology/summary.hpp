#pragma once
// Counts that describe a built network, for the run summary and the report. Plain data.
#include <cstddef>
#include <string>
#include <vector>

#include "rimline/model/network.hpp"
#include "rimline/topology/build.hpp"

namespace rimline::topology {

struct TreeSummary {
  std::string outfall_id;
  std::size_t structures = 0;
  std::size_t conduits = 0;
  double length_m = 0.0;  // sum of Conduit::length_m of its conduits
};

struct NetworkSummary {
  std::size_t structures = 0;          // including derived ones
  std::size_t derived_structures = 0;  // kind derived
  std::size_t conduits = 0;
  std::size_t usable_conduits = 0;     // usable as read (before loop cuts and self-loops)
  std::size_t marched_conduits = 0;    // in a tree
  std::size_t loops_cut = 0;
  std::size_t self_loops = 0;
  std::size_t turned_conduits = 0;
  std::size_t outfalls = 0;
  std::size_t outfalls_assumed = 0;    // tree ends that are not typed or named outfalls
  std::size_t trees = 0;
  std::size_t diversions = 0;          // structures with more than one outflow
  double total_length_m = 0.0;         // sum of Conduit::length_m over all conduits
  std::vector<TreeSummary> per_tree;   // aligned with Topology::trees
};

NetworkSummary summarize(const model::Network& network, const Topology& topology);

}  // namespace rimline::topology
