// build_topology: the stages in order. Each stage has its own header and file.
#include "rimline/topology/build.hpp"

#include <algorithm>

#include "rimline/topology/connect.hpp"
#include "rimline/topology/march_order.hpp"
#include "rimline/topology/network_checks.hpp"
#include "rimline/topology/orient.hpp"
#include "rimline/topology/structure_geometry.hpp"

namespace rimline::topology {

Topology build_topology(model::Network& network, const TopologyOptions& options, Findings& findings) {
  Topology topology;
  report_duplicate_conduit_ids(network, findings);
  const Connection connection = connect_network(network, options, findings);
  topology.derived_structures = connection.derived_structures;
  // Outfalls the project names: before orientation, whose rule 2a looks for them.
  if (!options.outfall_ids.empty())
    for (auto& s : network.structures)
      if (std::find(options.outfall_ids.begin(), options.outfall_ids.end(), s.id) != options.outfall_ids.end())
        s.kind = model::StructureKind::outfall;
  topology.turned_conduits = orient_conduits(network, connection, options, findings);
  topology.source_upstream.assign(network.conduits.size(), model::no_index);
  topology.source_from_ids.assign(network.conduits.size(), 0);
  for (std::size_t i = 0; i < network.conduits.size(); ++i) {
    topology.source_upstream[i] =
        connection.ids[i] == IdDirection::last_vertex_upstream ? connection.at_last[i] : connection.at_first[i];
    topology.source_from_ids[i] = connection.ids[i] != IdDirection::none;
  }
  report_zero_length(network, options, findings);
  build_march_order(network, topology, findings);
  // A pipe left out for a loop is out for a data problem, which is what usable = false means
  // (network.hpp); clearing it lets every later stage that filters on usable skip it too.
  for (std::size_t i = 0; i < network.conduits.size(); ++i)
    if (topology.status[i] == MarchStatus::self_loop || topology.status[i] == MarchStatus::loop_cut)
      network.conduits[i].usable = false;
  report_parallels(network, topology, findings);
  compute_structure_geometry(network, topology);
  return topology;
}

void rebuild_march_order(const model::Network& network, Topology& topology) {
  const std::vector<MarchStatus> before = topology.status;
  Topology fresh;
  Findings scratch;  // what the first build reported stays; nothing new is found by turning pipes
  build_march_order(network, fresh, scratch);
  compute_structure_geometry(network, fresh);
  for (std::size_t i = 0; i < before.size() && i < fresh.status.size(); ++i)
    if (before[i] == MarchStatus::loop_cut && !network.conduits[i].usable) fresh.status[i] = MarchStatus::loop_cut;
  topology.nodes = std::move(fresh.nodes);
  topology.trees = std::move(fresh.trees);
  topology.deflection_deg = std::move(fresh.deflection_deg);
  topology.invert_drop_m = std::move(fresh.invert_drop_m);
  topology.status = std::move(fresh.status);
  topology.conduit_tree = std::move(fresh.conduit_tree);
}

}  // namespace rimline::topology
