#pragma once
// A component of the network solve cut into pieces (network_solve.hpp, steps 1-2): bridges whose
// far side holds no outlet carry a known flow and are taken out; what stays connected is a piece.
// Private to src/solve.
#include <cstddef>
#include <cstdint>
#include <limits>
#include <vector>

namespace rimline::solve::detail {

inline constexpr std::uint32_t none32 = std::numeric_limits<std::uint32_t>::max();

// The component as a plain graph: nodes 0..n-1, pipes with their two ends.
struct LocalGraph {
  std::vector<std::uint32_t> end_a, end_b;  // per pipe
  std::vector<double> net_inflow_m3_s;      // per node
  std::vector<char> outlet;                 // per node: holds a level of its own
  // Pipes at each node (compressed rows), filled by build_adjacency().
  std::vector<std::uint32_t> adj_start, adj;
  std::size_t nodes() const { return net_inflow_m3_s.size(); }
  std::size_t pipes() const { return end_a.size(); }
  std::uint32_t other(std::uint32_t pipe, std::uint32_t node) const {
    return end_a[pipe] == node ? end_b[pipe] : end_a[pipe];
  }
  void build_adjacency();
};

struct Piece {
  std::vector<std::uint32_t> nodes;
  std::vector<std::uint32_t> pipes;        // its own pipes (solved together)
  std::uint32_t exit_pipe = none32;        // the known-flow pipe towards the outlets (none: outlet piece)
  std::uint32_t exit_node = none32;        // that pipe's end in this piece
  std::uint32_t parent = none32;           // the piece at its other end
  bool has_outlet = false;
  bool no_outlet = false;                  // its part of the component reaches no outlet at all
  bool needed = false;                     // its levels are needed (own pipes, or a piece hangs from it)
};

struct Decomposition {
  std::vector<Piece> pieces;        // each after its parent
  std::vector<double> known_flow;   // per pipe: signed end_a -> end_b; NaN when solved in a piece
  std::vector<double> inflow;       // per node: net inflow plus the known flows arriving there
  std::vector<std::uint32_t> piece_of;  // per node
  std::size_t bridges = 0;
};

// reduce_bridges off: no flow is taken as known; every connected part is one piece.
Decomposition decompose(const LocalGraph& graph, bool reduce_bridges);

}  // namespace rimline::solve::detail
