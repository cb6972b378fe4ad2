#pragma once
// The steady solve of a network that is not a tree: the water levels at the structures are the
// unknowns, each pipe's discharge follows from the levels at its two ends by the march's own
// physics (solve/network_pipe.hpp: GVF with its outlet controls, surcharged flow, inlet control;
// either direction), and continuity closes at every structure with its net inflow. Outfalls
// (tailwater or free) and pump wet wells (pump-on level or free) hold their levels (structure_level.hpp).
//
// Method, per connected component:
//  1. Bridges (pipes on no loop, Tarjan's low-link walk). A bridge whose far side holds no outlet
//     carries a known flow, the net inflow of that side; it is taken out, which cuts the component
//     into pieces: one holding every outlet (and the paths between them), the others each hanging
//     from the pipe that carries their water towards the outlets.
//  2. The pieces in order from the outlets: a hanging piece's exit structure gets its level from
//     its known-flow pipe (the march's relation), and becomes the fixed level of that piece.
//  3. In a piece with loops or several outlets, Newton's method on the levels: the Jacobian of the
//     continuity residuals is sparse (each pipe touches two levels) with the pipes' derivatives from
//     their root solves; each step solved by a sparse LU (Eigen), limited to 1 m, then halved until
//     the residual norm falls (Armijo line search). Near no flow a pipe's derivative is capped
//     (dQ/dH is unbounded at zero head for a Q^2 law), and a dry pipe keeps a small one, so that
//     the matrix stays regular; the residuals themselves are never regularised.
//  4. Converged when the largest continuity error is below continuity_tolerance and the last step
//     moved no level by more than level_tolerance. First guess: the previous solution where there
//     is one, else every structure's flow routed down a breadth-first spanning tree of the piece
//     towards its fixed levels, and the levels marched up that tree.
// A tree through the solve gives the march's levels (to the root solves' tolerance): every pipe
// of a tree is a bridge with a known flow, and with reduce_bridges off Newton finds the same.
#include <cstddef>
#include <vector>

#include "rimline/model/network.hpp"
#include "rimline/solve/march.hpp"
#include "rimline/topology/build.hpp"

namespace rimline::solve {

struct NetworkSolveOptions {
  double continuity_tolerance_m3_s = 1.0e-5;  // 0.01 L/s at every structure
  double level_tolerance_m = 1.0e-5;          // 0.01 mm: the last step's largest level change
  // Accepted when the steps fall below what the profiles resolve (1 micrometre) before the above.
  double stagnation_tolerance_m3_s = 1.0e-3;  // 1 L/s
  int max_iterations = 50;                    // Newton steps per piece
  double max_step_m = 2.0;                    // a Newton step moves no level by more than this
  bool reduce_bridges = true;                 // off: every pipe in Newton (tests compare with the march)
  // Levels at every structure, not only where the flows need them (the march computes the rest).
  bool all_levels = false;
  unsigned threads = 0;                       // components on this many threads (0: one per core)
};

// One connected component: its structures and its gravity pipes (force mains are not in it: their
// flow enters as a net inflow at the structure they discharge into).
struct NetworkComponent {
  std::vector<std::size_t> structures;
  std::vector<std::size_t> conduits;
};

struct NetworkInputs {
  std::vector<double> net_inflow_m3_s;  // per structure: what enters there besides the pipes (may be < 0)
  std::vector<bool> outlet;             // per structure: an outfall or wet well holding its level
  std::vector<bool> wet_well;           // per structure: outlets that are pump wet wells
  // Optional first guess, per structure / conduit (NaN or empty: none): the last solution, or the
  // march's levels and the design flows.
  std::vector<double> level_m;
  std::vector<double> flow_m3_s;  // signed along from -> to
};

struct ComponentReport {
  std::size_t structures = 0, conduits = 0;
  std::size_t unknowns = 0;         // levels solved by Newton (the rest follow from known flows)
  std::size_t newton_pieces = 0;    // pieces with loops or several outlets
  int iterations = 0;               // the most Newton steps any piece took
  int evaluations = 0;              // water-surface profiles computed
  double max_continuity_error_m3_s = 0.0;
  double max_level_change_m = 0.0;  // of the last step (over the pieces)
  bool converged = true;
  bool no_outlet = false;           // part of it reaches no outfall or wet well: not solved
  std::vector<std::size_t> failed_structures;  // continuity above the tolerance, worst first
  std::vector<double> failed_error_m3_s;
};

struct NetworkSolution {
  std::vector<double> flow_m3_s;   // per conduit, signed along from -> to; NaN outside or not solved
  std::vector<double> level_m;     // per structure; NaN where the solve did not need it
  std::vector<ComponentReport> components;  // aligned with the components given
};

NetworkSolution solve_network(const model::Network& network, const topology::Topology& topology,
                              const std::vector<NetworkComponent>& components, const NetworkInputs& inputs,
                              const MarchOptions& march, const NetworkSolveOptions& options);

}  // namespace rimline::solve
