#pragma once
// Newton's method on the levels of one piece of a component (network_solve.hpp, step 3).
// Private to src/solve.
#include <vector>

#include "rimline/model/network.hpp"
#include "rimline/solve/network_solve.hpp"
#include "solve/network_pieces.hpp"
#include "solve/network_pipe.hpp"

namespace rimline::solve::detail {

// What a piece needs besides the graph: each pipe's law, and how to reach the physics.
struct PieceContext {
  const model::Network& network;
  const LocalGraph& graph;
  const Decomposition& decomposition;
  const std::vector<PipeLaw>& laws;          // per local pipe
  const StructureRelation& relation;
  const hydraulics::GvfOptions& gvf;
  const NetworkSolveOptions& options;
  PipeFlowSettings pipe_settings;
  // Per local node, -1 on entry and on return: scratch for the unknowns' numbering and the tree walk.
  std::vector<std::int32_t>& index;
  std::vector<std::int32_t>& position;
};

struct PieceResult {
  int iterations = 0;
  int evaluations = 0;
  int sweeps = 0;  // node-by-node sweeps that rescued refused Newton steps
  std::size_t unknowns = 0;
  double max_residual_m3_s = 0.0;
  double last_step_m = 0.0;
  bool converged = true;
  std::vector<std::uint32_t> failed;  // local nodes whose continuity error stays above the tolerance
  std::vector<double> failed_error;
};

// Solves the levels of piece `piece` (its fixed nodes already in `level`) and the flows of its
// pipes. `level` (per local node; NaN: none yet) and `flow` (per local pipe, signed end_a -> end_b)
// hold the first guess where known, and receive the solution.
PieceResult solve_piece(const PieceContext& ctx, const Piece& piece, const std::vector<char>& fixed,
                        std::vector<double>& level, std::vector<double>& flow);

}  // namespace rimline::solve::detail
