#include "rimline/topology/summary.hpp"

namespace rimline::topology {

NetworkSummary summarize(const model::Network& network, const Topology& topology) {
  NetworkSummary s;
  s.structures = network.structures.size();
  for (const model::Structure& st : network.structures) s.derived_structures += st.kind == model::StructureKind::derived;
  s.conduits = network.conduits.size();
  for (std::size_t i = 0; i < network.conduits.size(); ++i) {
    const model::Conduit& c = network.conduits[i];
    s.total_length_m += c.length_m;
    bool cut = false;
    if (i < topology.status.size()) {
      s.loops_cut += topology.status[i] == MarchStatus::loop_cut;
      s.self_loops += topology.status[i] == MarchStatus::self_loop;
      cut = topology.status[i] == MarchStatus::loop_cut || topology.status[i] == MarchStatus::self_loop;
    }
    s.usable_conduits += c.usable || cut;
    if (i < topology.conduit_tree.size()) s.marched_conduits += topology.conduit_tree[i] != model::no_index;
  }
  s.turned_conduits = topology.turned_conduits;
  for (const Node& n : topology.nodes) {
    s.outfalls += n.outfall;
    s.diversions += n.diversion;
  }
  s.trees = topology.trees.size();
  s.per_tree.reserve(topology.trees.size());
  for (const Tree& t : topology.trees) {
    if (t.outfall < network.structures.size() && network.structures[t.outfall].kind != model::StructureKind::outfall)
      ++s.outfalls_assumed;
    TreeSummary ts;
    if (t.outfall < network.structures.size()) ts.outfall_id = network.structures[t.outfall].id;
    ts.structures = t.structures.size();
    ts.conduits = t.conduits.size();
    for (std::size_t c : t.conduits) ts.length_m += network.conduits[c].length_m;
    s.per_tree.push_back(std::move(ts));
  }
  return s;
}

}  // namespace rimline::topology
