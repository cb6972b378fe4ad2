// Loops are cut by one iterative depth-first walk (a back edge closes a directed cycle), then
// the march order is Kahn's topological sort run upstream from the outfalls: a structure is
// released once every structure its outflows reach is placed. Both are O(structures + pipes).
#include "rimline/topology/march_order.hpp"

#include <numbers>
#include <numeric>
#include <string>
#include <utility>

#include "rimline/error.hpp"
#include "rimline/topology/finding_text.hpp"

namespace rimline::topology {

using model::Conduit;
using model::no_index;

double flow_area_m2(const hydraulics::Section& s) {
  switch (s.shape) {
    case hydraulics::Shape::circular: return s.diameter_m > 0.0 ? std::numbers::pi * s.diameter_m * s.diameter_m / 4.0 : 0.0;
    case hydraulics::Shape::box: return s.width_m > 0.0 && s.height_m > 0.0 ? s.width_m * s.height_m : 0.0;
    case hydraulics::Shape::egg:
    case hydraulics::Shape::table: break;
  }
  // Egg and table sections: their full area when the section is valid, else 0 (left to the march's finding).
  try {
    return hydraulics::full_geometry(s).area_m2;
  } catch (const Error&) {
    return 0.0;
  }
}

namespace {

class MarchOrder {
 public:
  MarchOrder(const model::Network& n, Topology& t, Findings& f) : net_(n), topo_(t), findings_(f) {}

  void run() {
    mark_status();
    build_adjacency();
    cut_loops();
    fill_nodes();
    sort_upstream();
  }

 private:
  std::string name(std::size_t s) const { return label(net_.structures[s], s); }

  void mark_status() {
    topo_.status.assign(net_.conduits.size(), MarchStatus::marched);
    for (std::size_t i = 0; i < net_.conduits.size(); ++i) {
      const Conduit& c = net_.conduits[i];
      if (!c.usable || c.from == no_index || c.to == no_index) {
        topo_.status[i] = MarchStatus::unusable;
      } else if (c.from == c.to) {
        topo_.status[i] = MarchStatus::self_loop;
        findings_.push_back(conduit_finding(c, "TOPOLOGY_SELF_LOOP", Severity::warning,
                                            "pipe " + label(c, i) + " starts and ends at structure " + name(c.from) +
                                                "; it is left out of the march"));
      }
    }
  }

  bool marched(std::size_t c) const { return topo_.status[c] == MarchStatus::marched; }

  void build_adjacency() {
    const std::size_t ns = net_.structures.size();
    out_start_.assign(ns + 1, 0);
    for (std::size_t i = 0; i < net_.conduits.size(); ++i)
      if (marched(i)) ++out_start_[net_.conduits[i].from + 1];
    std::partial_sum(out_start_.begin(), out_start_.end(), out_start_.begin());
    out_list_.resize(out_start_.back());
    std::vector<std::size_t> fill(out_start_.begin(), out_start_.end() - 1);
    for (std::size_t i = 0; i < net_.conduits.size(); ++i)
      if (marched(i)) out_list_[fill[net_.conduits[i].from]++] = i;
  }

  // Depth-first downstream from each unvisited structure in index order; an edge to a
  // structure still on the walk's stack closes a cycle and is cut.
  void cut_loops() {
    const std::size_t ns = net_.structures.size();
    enum : char { unseen, on_stack, done };
    std::vector<char> state(ns, unseen);
    std::vector<std::size_t> depth(ns, 0);
    std::vector<std::pair<std::size_t, std::size_t>> stack;  // structure, next position in out_list_
    for (std::size_t root = 0; root < ns; ++root) {
      if (state[root] != unseen) continue;
      state[root] = on_stack;
      stack.emplace_back(root, out_start_[root]);
      while (!stack.empty()) {
        auto& [u, pos] = stack.back();
        if (pos == out_start_[u + 1]) {
          state[u] = done;
          stack.pop_back();
          continue;
        }
        const std::size_t c = out_list_[pos++];
        const std::size_t v = net_.conduits[c].to;
        if (state[v] == unseen) {
          state[v] = on_stack;
          depth[v] = stack.size();
          stack.emplace_back(v, out_start_[v]);
        } else if (state[v] == on_stack) {
          topo_.status[c] = MarchStatus::loop_cut;
          report_loop(c, stack.size() - depth[v]);
        }
      }
    }
  }

  void report_loop(std::size_t c, std::size_t pipes) {
    const Conduit& p = net_.conduits[c];
    Finding f = conduit_finding(p, "TOPOLOGY_LOOP", Severity::warning,
                                "pipe " + label(p, c) + " (" + name(p.from) + " to " + name(p.to) + ") closes a loop of " +
                                    std::to_string(pipes) + " pipe(s) that flows back to " + name(p.to) +
                                    "; it is cut (left out of the march) so the march ends");
    f.value = static_cast<double>(pipes);
    findings_.push_back(std::move(f));
  }

  void fill_nodes() {
    topo_.nodes.assign(net_.structures.size(), Node{});
    for (std::size_t i = 0; i < net_.conduits.size(); ++i) {
      if (!marched(i)) continue;
      topo_.nodes[net_.conduits[i].from].outflows.push_back(i);
      topo_.nodes[net_.conduits[i].to].inflows.push_back(i);
    }
    for (std::size_t s = 0; s < topo_.nodes.size(); ++s) {
      Node& n = topo_.nodes[s];
      double best = -1.0;
      for (std::size_t c : n.outflows) {
        const double area = flow_area_m2(net_.conduits[c].section);
        if (area > best) {
          best = area;
          n.main_outflow = c;
        }
      }
      n.diversion = n.outflows.size() > 1;
      n.outfall = n.outflows.empty() && !n.inflows.empty();
      report_node(s, n);
    }
  }

  void report_node(std::size_t s, const Node& n) {
    const model::Structure& st = net_.structures[s];
    if (n.diversion) {
      Finding f = structure_finding(st, "DIVERSION", Severity::info,
                                    "structure " + name(s) + " has " + std::to_string(n.outflows.size()) +
                                        " outflow pipes; the largest, " + label(net_.conduits[n.main_outflow], n.main_outflow) +
                                        ", is its main outflow");
      f.value = static_cast<double>(n.outflows.size());
      findings_.push_back(std::move(f));
    }
    if (st.kind == model::StructureKind::outfall && !n.outflows.empty())
      findings_.push_back(structure_finding(st, "TOPOLOGY_OUTFALL_HAS_OUTFLOW", Severity::warning,
                                            "structure " + name(s) + " is an outfall but pipe " +
                                                label(net_.conduits[n.outflows.front()], n.outflows.front()) +
                                                " leaves it; it is marched as an ordinary structure"));
    if (n.inflows.empty() && n.outflows.empty())
      findings_.push_back(structure_finding(st, "TOPOLOGY_ISOLATED", Severity::info,
                                            "structure " + name(s) + " is not joined to any pipe that is marched; it is in no tree"));
  }

  void sort_upstream() {
    const std::size_t ns = net_.structures.size();
    topo_.conduit_tree.assign(net_.conduits.size(), no_index);
    std::vector<std::size_t> remaining(ns);
    std::vector<std::size_t> queue;
    queue.reserve(ns);
    for (std::size_t s = 0; s < ns; ++s) {
      remaining[s] = topo_.nodes[s].outflows.size();
      if (topo_.nodes[s].outfall) {
        topo_.nodes[s].tree = topo_.trees.size();
        topo_.trees.push_back(Tree{s, {}, {}});
        queue.push_back(s);
      }
    }
    for (std::size_t head = 0; head < queue.size(); ++head) {
      const std::size_t d = queue[head];
      Tree& tree = topo_.trees[topo_.nodes[d].tree];
      tree.structures.push_back(d);
      for (std::size_t c : topo_.nodes[d].inflows) {
        tree.conduits.push_back(c);
        topo_.conduit_tree[c] = topo_.nodes[d].tree;
        const std::size_t u = net_.conduits[c].from;
        if (--remaining[u] == 0) {
          Node& up = topo_.nodes[u];
          up.tree = topo_.nodes[net_.conduits[up.main_outflow].to].tree;
          queue.push_back(u);
        }
      }
    }
    for (std::size_t s = 0; s < ns; ++s)
      if (remaining[s] != 0)
        throw Error(ErrorKind::internal, "topology: structure " + name(s) + " is still on a loop after loop cutting");
  }

  const model::Network& net_;
  Topology& topo_;
  Findings& findings_;
  std::vector<std::size_t> out_start_, out_list_;
};

}  // namespace

void build_march_order(const model::Network& network, Topology& topology, Findings& findings) {
  MarchOrder(network, topology, findings).run();
}

}  // namespace rimline::topology
