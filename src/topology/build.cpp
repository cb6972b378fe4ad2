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

}  // namespace rimline::topology
