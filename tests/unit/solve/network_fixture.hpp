#pragma once
// Networks from literals for the network-solve tests: structures and pipes with their from/to
// indices, the topology built from them (no files, no snapping), and a solve of every component.
#include <string>
#include <vector>

#include "rimline/flows/design_flows.hpp"
#include "rimline/solve/march.hpp"
#include "rimline/solve/network_solve.hpp"
#include "rimline/topology/build.hpp"
#include "rimline/topology/components.hpp"

namespace rimline::test {

struct Net {
  model::Network net;
  topology::Topology topo;
  std::vector<double> inflow;  // per structure [m3/s]

  std::size_t structure(const std::string& id, double invert_m, double rim_m,
                        model::StructureKind kind = model::StructureKind::manhole, model::Point2 at = {}) {
    model::Structure s;
    s.id = id;
    s.kind = kind;
    s.invert_m = invert_m;
    s.rim_m = rim_m;
    s.location = at;
    net.structures.push_back(s);
    inflow.push_back(0.0);
    return net.structures.size() - 1;
  }
  // A circular pipe, Manning n, from -> to as digitised (inverts at from / to).
  std::size_t pipe(const std::string& id, std::size_t from, std::size_t to, double diameter_m, double invert_from_m,
                   double invert_to_m, double length_m, double manning_n = 0.013) {
    model::Conduit c;
    c.id = id;
    c.from = from;
    c.to = to;
    c.from_id = net.structures[from].id;
    c.to_id = net.structures[to].id;
    c.section.diameter_m = diameter_m;
    c.roughness.manning_n = manning_n;
    c.invert_up_m = invert_from_m;
    c.invert_down_m = invert_to_m;
    c.length_m = length_m;
    c.geometry_length_m = length_m;
    net.conduits.push_back(c);
    return net.conduits.size() - 1;
  }
  void build() {
    topo = {};
    topology::rebuild_march_order(net, topo);
  }
  // Every component's structures and gravity pipes, and the inputs (outlets by the components' rule).
  std::vector<solve::NetworkComponent> components(solve::NetworkInputs& in) const {
    const auto comps = topology::gravity_components(net, topo, true);
    std::vector<solve::NetworkComponent> out;
    in.net_inflow_m3_s = inflow;
    in.outlet.assign(net.structures.size(), false);
    in.wet_well.assign(net.structures.size(), false);
    for (const auto& c : comps.list) {
      out.push_back({c.structures, c.conduits});
      for (std::size_t s : c.outlets) {
        in.outlet[s] = true;
        in.wet_well[s] = topology::wet_well(net, topo, s);
      }
    }
    return out;
  }
  solve::NetworkSolution solve(const solve::MarchOptions& m, const solve::NetworkSolveOptions& o = {}) const {
    solve::NetworkInputs in;
    const auto comps = components(in);
    return solve::solve_network(net, topo, comps, in, m, o);
  }
  // Flows accumulated down the (tree) topology from the inflows, for the march.
  std::vector<double> accumulated() const {
    std::vector<double> q(net.conduits.size(), 0.0), arriving(net.structures.size(), 0.0);
    for (std::size_t ci : flows::upstream_first_order(net, topo)) {
      const auto& c = net.conduits[ci];
      q[ci] = arriving[c.from] + inflow[c.from];
      arriving[c.to] += q[ci];
    }
    return q;
  }
};

}  // namespace rimline::test
