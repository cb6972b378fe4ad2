#include "rimline/topology/components.hpp"

#include <algorithm>
#include <numeric>

namespace rimline::topology {

bool gravity_link(const model::Network& net, const Topology& topo, std::size_t ci) {
  if (ci >= topo.status.size()) return false;
  const auto st = topo.status[ci];
  if (st != MarchStatus::marched && st != MarchStatus::loop_cut) return false;
  const auto& c = net.conduits[ci];
  return !c.force_main && c.from != model::no_index && c.to != model::no_index && c.from != c.to;
}

bool wet_well(const model::Network& net, const Topology& topo, std::size_t s) {
  if (s >= topo.nodes.size()) return false;
  bool force_main = false;
  for (std::size_t ci : topo.nodes[s].outflows) {
    if (net.conduits[ci].from != s) continue;
    if (!net.conduits[ci].force_main) return false;
    force_main = true;
  }
  return force_main;
}

bool Component::simple_tree() const {
  return loops == 0 && diversions == 0 && outlets.size() == 1 && low_points.empty();
}

std::string Component::why_not_tree() const {
  std::vector<std::string> parts;
  auto count = [&parts](std::size_t n, const char* one, const char* many) {
    if (n) parts.push_back(std::to_string(n) + " " + (n == 1 ? one : many));
  };
  count(loops, "loop", "loops");
  count(diversions, "diversion", "diversions");
  if (outlets.size() != 1) parts.push_back(std::to_string(outlets.size()) + " outlets");
  count(low_points.size(), "low point without an outlet", "low points without an outlet");
  std::string out;
  for (std::size_t k = 0; k < parts.size(); ++k) out += (k ? ", " : "") + parts[k];
  return out.empty() ? "a simple tree" : out;
}

Components gravity_components(const model::Network& net, const Topology& topo, bool typed) {
  const std::size_t ns = net.structures.size(), nc = net.conduits.size();
  std::vector<std::size_t> parent(ns);
  std::iota(parent.begin(), parent.end(), std::size_t{0});
  auto root = [&parent](std::size_t s) {
    while (parent[s] != s) s = parent[s] = parent[parent[s]];
    return s;
  };
  std::vector<std::size_t> gravity_out(ns, 0), any_out(ns, 0);
  std::vector<char> linked(ns, 0), link(nc, 0);
  for (std::size_t ci = 0; ci < nc; ++ci) {
    if (!gravity_link(net, topo, ci)) continue;
    link[ci] = 1;
    const auto& c = net.conduits[ci];
    linked[c.from] = linked[c.to] = 1;
    if (topo.status[ci] == MarchStatus::marched) ++gravity_out[c.from];
    ++any_out[c.from];
    const std::size_t a = root(c.from), b = root(c.to);
    if (a != b) parent[std::max(a, b)] = std::min(a, b);
  }
  Components out;
  out.of_structure.assign(ns, model::no_index);
  out.of_conduit.assign(nc, model::no_index);
  for (std::size_t s = 0; s < ns; ++s) {
    if (!linked[s]) continue;
    const std::size_t r = root(s);
    if (out.of_structure[r] == model::no_index) {
      out.of_structure[r] = out.list.size();
      out.list.emplace_back();
    }
    out.of_structure[s] = out.of_structure[r];
    out.list[out.of_structure[s]].structures.push_back(s);
  }
  for (std::size_t ci = 0; ci < nc; ++ci) {
    if (!link[ci]) continue;
    out.of_conduit[ci] = out.of_structure[net.conduits[ci].from];
    out.list[out.of_conduit[ci]].conduits.push_back(ci);
  }
  for (auto& comp : out.list) {
    // Dead ends: no pipe leaves them at all; cut ends: only a pipe cut from a loop leaves them
    // (not an outlet of anything: the solve takes them as ordinary structures).
    std::vector<std::size_t> dead_ends, cut_ends, wells;
    for (std::size_t s : comp.structures) {
      if (gravity_out[s] > 1) ++comp.diversions;
      const auto kind = net.structures[s].kind;
      const bool well = wet_well(net, topo, s);
      const bool typed_outlet =
          typed && (kind == model::StructureKind::outfall || kind == model::StructureKind::pump_station);
      if (typed_outlet || well) comp.outlets.push_back(s);
      if (well && !typed_outlet) wells.push_back(s);
      if (gravity_out[s] == 0 && !typed_outlet && !well) (any_out[s] == 0 ? dead_ends : cut_ends).push_back(s);
    }
    if (comp.outlets.size() == wells.size()) {
      comp.outlets.insert(comp.outlets.end(), dead_ends.begin(), dead_ends.end());
      if (comp.outlets.empty()) comp.outlets = cut_ends;  // a ring of pipes and nothing else: the march's end
    } else {
      comp.low_points = dead_ends;
    }
    std::sort(comp.outlets.begin(), comp.outlets.end());
    comp.loops = comp.conduits.size() + 1 - comp.structures.size();
  }
  return out;
}

}  // namespace rimline::topology
