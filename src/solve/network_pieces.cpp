// Bridges by Tarjan's low-link walk (iterative: a city's component is deep), then the bridge tree
// of the 2-edge-connected blocks rooted at an outlet, the known flows and the pieces. O(n + m).
#include "solve/network_pieces.hpp"

#include <cmath>
#include <numeric>
#include <utility>

namespace rimline::solve::detail {

void LocalGraph::build_adjacency() {
  const std::size_t n = nodes();
  adj_start.assign(n + 1, 0);
  for (std::size_t p = 0; p < pipes(); ++p) {
    ++adj_start[end_a[p] + 1];
    ++adj_start[end_b[p] + 1];
  }
  std::partial_sum(adj_start.begin(), adj_start.end(), adj_start.begin());
  adj.assign(adj_start.back(), 0);
  std::vector<std::uint32_t> fill(adj_start.begin(), adj_start.end() - 1);
  for (std::uint32_t p = 0; p < pipes(); ++p) {
    adj[fill[end_a[p]]++] = p;
    adj[fill[end_b[p]]++] = p;
  }
}

namespace {

// A pipe is a bridge when no other path joins its ends. Parallel pipes are distinct edges, so a
// twin pipe is never a bridge: the walk skips only the very pipe it arrived by.
std::vector<char> find_bridges(const LocalGraph& g) {
  const std::size_t n = g.nodes();
  std::vector<char> bridge(g.pipes(), 0);
  std::vector<std::uint32_t> disc(n, none32), low(n, 0);
  struct Frame {
    std::uint32_t node, via, next;  // via: the pipe it was reached by
  };
  std::vector<Frame> stack;
  std::uint32_t time = 0;
  for (std::uint32_t root = 0; root < n; ++root) {
    if (disc[root] != none32) continue;
    disc[root] = low[root] = time++;
    stack.push_back({root, none32, g.adj_start[root]});
    while (!stack.empty()) {
      Frame& f = stack.back();
      if (f.next < g.adj_start[f.node + 1]) {
        const std::uint32_t p = g.adj[f.next++];
        if (p == f.via) continue;
        const std::uint32_t v = g.other(p, f.node);
        if (disc[v] == none32) {
          disc[v] = low[v] = time++;
          stack.push_back({v, p, g.adj_start[v]});
        } else {
          low[f.node] = std::min(low[f.node], disc[v]);
        }
        continue;
      }
      const Frame done = f;
      stack.pop_back();
      if (stack.empty()) continue;
      Frame& up = stack.back();
      low[up.node] = std::min(low[up.node], low[done.node]);
      if (low[done.node] > disc[up.node]) bridge[done.via] = 1;
    }
  }
  return bridge;
}

// Labels of the connected parts when the pipes `cut` are left out.
std::vector<std::uint32_t> parts_without(const LocalGraph& g, const std::vector<char>& cut, std::uint32_t& count) {
  std::vector<std::uint32_t> label(g.nodes(), none32), queue;
  count = 0;
  for (std::uint32_t s = 0; s < g.nodes(); ++s) {
    if (label[s] != none32) continue;
    label[s] = count;
    queue.assign(1, s);
    for (std::size_t h = 0; h < queue.size(); ++h) {
      const std::uint32_t u = queue[h];
      for (std::uint32_t k = g.adj_start[u]; k < g.adj_start[u + 1]; ++k) {
        const std::uint32_t p = g.adj[k];
        if (cut[p]) continue;
        const std::uint32_t v = g.other(p, u);
        if (label[v] == none32) label[v] = count, queue.push_back(v);
      }
    }
    ++count;
  }
  return label;
}

}  // namespace

Decomposition decompose(const LocalGraph& g, bool reduce_bridges) {
  Decomposition d;
  const std::size_t n = g.nodes(), m = g.pipes();
  d.known_flow.assign(m, std::nan(""));
  d.inflow = g.net_inflow_m3_s;
  const std::vector<char> bridge = find_bridges(g);
  std::uint32_t nblocks = 0;
  const auto block = parts_without(g, bridge, nblocks);
  // The bridge tree: blocks joined by bridges, walked breadth-first from a block holding an outlet
  // in each connected part (a part without one stays unrooted).
  std::vector<std::vector<std::uint32_t>> block_bridges(nblocks);
  for (std::uint32_t p = 0; p < m; ++p) {
    if (!bridge[p]) continue;
    ++d.bridges;
    block_bridges[block[g.end_a[p]]].push_back(p);
    block_bridges[block[g.end_b[p]]].push_back(p);
  }
  std::vector<double> sub_q(nblocks, 0.0);
  std::vector<std::uint32_t> sub_outlets(nblocks, 0);
  for (std::uint32_t s = 0; s < n; ++s) {
    sub_q[block[s]] += g.net_inflow_m3_s[s];
    sub_outlets[block[s]] += g.outlet[s] ? 1 : 0;
  }
  std::vector<std::uint32_t> parent_bridge(nblocks, none32), order;
  std::vector<char> seen(nblocks, 0);
  for (std::uint32_t s = 0; s < n; ++s) {
    if (!g.outlet[s] || seen[block[s]]) continue;
    const std::size_t first = order.size();
    seen[block[s]] = 1;
    order.push_back(block[s]);
    for (std::size_t h = first; h < order.size(); ++h) {
      const std::uint32_t b = order[h];
      for (std::uint32_t p : block_bridges[b]) {
        if (p == parent_bridge[b]) continue;
        const std::uint32_t other = block[g.end_a[p]] == b ? block[g.end_b[p]] : block[g.end_a[p]];
        if (seen[other]) continue;
        seen[other] = 1;
        parent_bridge[other] = p;
        order.push_back(other);
      }
    }
  }
  // Upward sums; a bridge whose child side holds no outlet carries that side's net inflow.
  std::vector<char> known(m, 0);
  for (std::size_t k = order.size(); k-- > 0;) {
    const std::uint32_t b = order[k];
    const std::uint32_t p = parent_bridge[b];
    if (p == none32) continue;
    const bool a_side_child = block[g.end_a[p]] == b;
    const std::uint32_t parent_block = a_side_child ? block[g.end_b[p]] : block[g.end_a[p]];
    sub_q[parent_block] += sub_q[b];
    sub_outlets[parent_block] += sub_outlets[b];
    if (reduce_bridges && sub_outlets[b] == 0) {
      known[p] = 1;
      d.known_flow[p] = a_side_child ? sub_q[b] : -sub_q[b];
      d.inflow[a_side_child ? g.end_b[p] : g.end_a[p]] += sub_q[b];
    }
  }
  // Pieces: what stays joined once the known-flow pipes are out.
  std::uint32_t npieces = 0;
  d.piece_of = parts_without(g, known, npieces);
  std::vector<Piece> pieces(npieces);
  for (std::uint32_t s = 0; s < n; ++s) {
    Piece& pc = pieces[d.piece_of[s]];
    pc.nodes.push_back(s);
    pc.has_outlet = pc.has_outlet || g.outlet[s];
  }
  for (std::uint32_t p = 0; p < m; ++p) {
    if (!known[p]) {
      pieces[d.piece_of[g.end_a[p]]].pipes.push_back(p);
      continue;
    }
    // The child end (no outlet beyond it) is the one the flow leaves towards the parent block.
    const std::uint32_t b = parent_bridge[block[g.end_a[p]]] == p ? block[g.end_a[p]] : block[g.end_b[p]];
    const std::uint32_t child_node = block[g.end_a[p]] == b ? g.end_a[p] : g.end_b[p];
    Piece& child = pieces[d.piece_of[child_node]];
    child.exit_pipe = p;
    child.exit_node = child_node;
    child.parent = d.piece_of[g.other(p, child_node)];
  }
  for (auto& pc : pieces) pc.no_outlet = !pc.has_outlet && pc.exit_pipe == none32;
  // Order: outlet pieces first, then each piece after its parent; needed from the leaves up.
  std::vector<std::vector<std::uint32_t>> children(npieces);
  std::vector<std::uint32_t> piece_order;
  for (std::uint32_t k = 0; k < npieces; ++k) {
    if (pieces[k].parent != none32) children[pieces[k].parent].push_back(k);
    else piece_order.push_back(k);
  }
  for (std::size_t h = 0; h < piece_order.size(); ++h)
    for (std::uint32_t c : children[piece_order[h]]) piece_order.push_back(c);
  for (std::size_t k = piece_order.size(); k-- > 0;) {
    Piece& pc = pieces[piece_order[k]];
    pc.needed = pc.needed || !pc.pipes.empty();
    if (pc.needed && pc.parent != none32) pieces[pc.parent].needed = true;
  }
  std::vector<std::uint32_t> new_index(npieces);
  for (std::uint32_t k = 0; k < piece_order.size(); ++k) new_index[piece_order[k]] = k;
  d.pieces.resize(npieces);
  for (std::uint32_t k = 0; k < npieces; ++k) {
    Piece pc = std::move(pieces[k]);
    if (pc.parent != none32) pc.parent = new_index[pc.parent];
    d.pieces[new_index[k]] = std::move(pc);
  }
  for (auto& p : d.piece_of) p = new_index[p];
  return d;
}

}  // namespace rimline::solve::detail
