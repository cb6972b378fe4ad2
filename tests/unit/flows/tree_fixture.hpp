#pragma once
// Small networks from literals for the catchment-flow tests: structures, pipes and the topology
// nodes the accumulation reads (outflows / inflows), no files.
#include <string>
#include <utility>
#include <vector>

#include "rimline/model/network.hpp"
#include "rimline/topology/build.hpp"

namespace rimline::test {

struct Tree {
  model::Network net;
  topology::Topology topo;

  std::size_t structure(const std::string& id, model::StructureKind kind = model::StructureKind::manhole,
                        model::Point2 at = {}) {
    model::Structure s;
    s.id = id;
    s.kind = kind;
    s.location = at;
    net.structures.push_back(s);
    topo.nodes.emplace_back();
    return net.structures.size() - 1;
  }
  // A circular pipe, n = 0.013, from -> to.
  std::size_t pipe(const std::string& id, std::size_t from, std::size_t to, double length_m = 100.0,
                   double diameter_m = 0.45, double slope = 0.01) {
    model::Conduit c;
    c.id = id;
    c.from = from;
    c.to = to;
    c.length_m = length_m;
    c.section.diameter_m = diameter_m;
    c.roughness.manning_n = 0.013;
    c.invert_down_m = 10.0;
    c.invert_up_m = 10.0 + slope * length_m;
    net.conduits.push_back(c);
    const std::size_t ci = net.conduits.size() - 1;
    topo.nodes[from].outflows.push_back(ci);
    topo.nodes[to].inflows.push_back(ci);
    return ci;
  }
};

}  // namespace rimline::test
